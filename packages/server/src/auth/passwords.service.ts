import { randomBytes, scrypt, timingSafeEqual, type ScryptOptions } from 'node:crypto';
import { Inject, Injectable } from '@nestjs/common';
import pLimit from 'p-limit';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';

const KEY_LENGTH = 32;
const SALT_LENGTH = 16;

function derive(password: string, salt: Buffer, N: number, r: number, p: number): Promise<Buffer> {
  // scrypt needs about 128·N·r bytes; allow twice that so the production cost fits.
  const options: ScryptOptions = { N, r, p, maxmem: 256 * N * r + 128 * r * p };
  return new Promise((resolve, reject) =>
    scrypt(password.normalize('NFC'), salt, KEY_LENGTH, options, (err, key) =>
      err ? reject(err) : resolve(key),
    ),
  );
}

/**
 * Password hashing with node:crypto's scrypt (runs on the libuv pool, off the event loop).
 * Stored as `scrypt$N$r$p$salt$key` (base64url), so a later change of cost still verifies old hashes.
 * Each hash holds about 128·N·r bytes (128 MiB at the default cost) while it runs, so at most
 * `SCRYPT_CONCURRENCY` run at once and a burst of sign-ins waits in line instead of exhausting memory.
 */
@Injectable()
export class PasswordsService {
  private dummy?: Promise<string>;
  private readonly queue: pLimit.Limit;

  constructor(@Inject(APP_CONFIG) private readonly config: AppConfig) {
    this.queue = pLimit(config.scrypt.concurrency);
  }

  async hash(password: string): Promise<string> {
    const { cost, blockSize, parallelization } = this.config.scrypt;
    const salt = randomBytes(SALT_LENGTH);
    const key = await this.queue(() => derive(password, salt, cost, blockSize, parallelization));
    return [
      'scrypt',
      cost,
      blockSize,
      parallelization,
      salt.toString('base64url'),
      key.toString('base64url'),
    ].join('$');
  }

  async verify(password: string, stored: string | null): Promise<boolean> {
    if (!stored) {
      // Spend the same time as a real check, so a missing account or password is not revealed by timing.
      this.dummy ??= this.hash('no account has this password');
      await this.verify(password, await this.dummy);
      return false;
    }
    const [scheme, n, r, p, salt, key] = stored.split('$');
    if (scheme !== 'scrypt' || !key) return false;
    const expected = Buffer.from(key, 'base64url');
    const actual = await this.queue(() =>
      derive(password, Buffer.from(salt, 'base64url'), Number(n), Number(r), Number(p)),
    );
    return actual.length === expected.length && timingSafeEqual(actual, expected);
  }
}
