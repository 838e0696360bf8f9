import type { RegistrarActionResponse } from './dto/registry-responses.dto';
import { Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import type { EntityManager, Repository } from 'typeorm';
import { exportFile, type ExportColumn, type ExportFile } from '../export/sheet-export';
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

const CSV_COLUMNS: readonly ExportColumn[] = [
  'id',
  'at',
  'actor',
  'action',
  'subject',
  'reason',
  'details',
].map((key) => ({ key, header: key }));

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

  /** The whole record as a CSV file (RFC 4180: CRLF line ends, a header line). */
  async csv(): Promise<ExportFile> {
    const rows = (await this.all()).map((a) => ({ ...a, details: JSON.stringify(a.details) }));
    return exportFile('csv', 'registrar-record', [{ name: 'Record', columns: CSV_COLUMNS, rows }]);
  }
}
