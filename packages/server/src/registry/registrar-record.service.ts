import type { RegistrarActionResponse } from './dto/registry-responses.dto';
import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import type { EntityManager, Repository } from 'typeorm';
import { RegistrarAction, type RegistrarActionKind } from './entities/registrar-action.entity';

/** One decision as written to the record. */
export interface RecordedAction {
  actor: string;
  action: RegistrarActionKind;
  subject: string;
  reason: string | null;
  details?: Record<string, unknown>;
}

export function toRegistrarActionResponse(a: RegistrarAction): RegistrarActionResponse {
  return {
    id: a.id,
    at: a.at.toISOString(),
    actor: a.actor,
    action: a.action,
    subject: a.subject,
    reason: a.reason,
    details: a.details,
  };
}

const CSV_COLUMNS = ['id', 'at', 'actor', 'action', 'subject', 'reason', 'details'] as const;

/** One CSV field as RFC 4180 §2 quotes it: in double quotes, inner quotes doubled. */
function csvField(v: string): string {
  return /[",\r\n]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v;
}

/**
 * The registrar's record: every redaction, suspension and verification decision, append-only
 * (the database refuses changes), newest first for reading, oldest first for export.
 */
@Injectable()
export class RegistrarRecordService {
  constructor(@InjectRepository(RegistrarAction) private readonly actions: Repository<RegistrarAction>) {}

  /** Writes one action, inside `manager`'s transaction when given. */
  async record(a: RecordedAction, manager?: EntityManager): Promise<void> {
    const repo = manager ? manager.getRepository(RegistrarAction) : this.actions;
    await repo.insert({
      actor: a.actor,
      action: a.action,
      subject: a.subject,
      reason: a.reason,
      details: (a.details ?? {}) as never,
    });
  }

  async list(q: {
    page: number;
    pageSize: number;
    action?: RegistrarActionKind;
  }): Promise<{ items: RegistrarActionResponse[]; total: number; page: number; pageSize: number }> {
    const [rows, total] = await this.actions.findAndCount({
      where: q.action ? { action: q.action } : {},
      order: { at: 'DESC', id: 'DESC' },
      skip: (q.page - 1) * q.pageSize,
      take: q.pageSize,
    });
    return { items: rows.map(toRegistrarActionResponse), total, page: q.page, pageSize: q.pageSize };
  }

  /** The whole record, oldest first. */
  async all(): Promise<RegistrarActionResponse[]> {
    const rows = await this.actions.find({ order: { at: 'ASC', id: 'ASC' } });
    return rows.map(toRegistrarActionResponse);
  }

  /** The whole record as CSV (RFC 4180: CRLF line ends, a header line). */
  async csv(): Promise<string> {
    const lines = [CSV_COLUMNS.join(',')];
    for (const a of await this.all()) {
      const values = [a.id, a.at, a.actor, a.action, a.subject, a.reason ?? '', JSON.stringify(a.details)];
      lines.push(values.map(csvField).join(','));
    }
    return lines.join('\r\n') + '\r\n';
  }
}
