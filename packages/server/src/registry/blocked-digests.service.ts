import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import { In, type EntityManager, type Repository } from 'typeorm';
import { AppError } from '../common/app-error';
import { BlockedDigest } from './entities/blocked-digest.entity';

/** The digests of files the registrar removed; uploads consult it before storing anything. */
@Injectable()
export class BlockedDigestsService {
  constructor(@InjectRepository(BlockedDigest) private readonly blocked: Repository<BlockedDigest>) {}

  /**
   * Adds digests (already blocked ones are left as they are), inside `manager`'s transaction.
   * Sorted, so two redactions blocking some of the same bytes wait for each other in one order.
   */
  async block(
    digests: string[],
    from: { lot: string; seq: number; reason: string },
    manager: EntityManager,
  ): Promise<void> {
    const unique = [...new Set(digests)].sort();
    if (!unique.length) return;
    await manager
      .createQueryBuilder()
      .insert()
      .into(BlockedDigest)
      .values(unique.map((digest) => ({ digest, ...from })))
      .orIgnore()
      .execute();
  }

  async isBlocked(digest: string): Promise<boolean> {
    return (await this.blocked.count({ where: { digest } })) > 0;
  }

  /**
   * Refuses an upload whose bytes (any of the given digests) were removed by the registrar:
   * 409 `blocked_content`. Pass the upload's transaction as `manager` to see what it sees.
   */
  async assertAllowed(digests: string[], manager?: EntityManager): Promise<void> {
    if (!digests.length) return;
    const repo = manager ? manager.getRepository(BlockedDigest) : this.blocked;
    const hit = await repo.count({ where: { digest: In([...new Set(digests)]) } });
    if (hit > 0)
      throw new AppError(
        'blocked_content',
        'This file was removed by the registrar and cannot be uploaded again.',
      );
  }
}
