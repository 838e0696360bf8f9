import type { ReportResponse } from './dto/registry-responses.dto';
import { Inject, Injectable } from '@nestjs/common';
import { InjectRepository } from '@nestjs/typeorm';
import type { Repository } from 'typeorm';
import { AppError } from '../common/app-error';
import type { AppConfig } from '../config/app-config';
import { APP_CONFIG } from '../config/config.module';
import { RollReaderService } from '../ledger/roll-reader.service';
import { MailService } from '../mail/mail.service';
import { Report, type ReportCategory, type ReportStatus } from './entities/report.entity';
import { RegistrarRecordService } from './registrar-record.service';
import { registryLetters } from './registry-letters';
import { LotViewsService } from '../lots/lot-views.service';
import { AccountContactsService } from '../accounts/account-contacts.service';

export function toReportResponse(r: Report): ReportResponse {
  return {
    id: r.id,
    lot: r.lot,
    category: r.category,
    text: r.text,
    answerWanted: r.reporterEmail !== null,
    reporterEmail: r.reporterEmail,
    status: r.status,
    resolution: r.resolution,
    closedBy: r.closedBy,
    closedAt: r.closedAt?.toISOString() ?? null,
    createdAt: r.createdAt.toISOString(),
  };
}

const SORTS = { created: 'createdAt', lot: 'lot', category: 'category' } as const;

/** Problems reported from public lot pages: the public form, the registrar's queue, the answer. */
@Injectable()
export class ReportsService {
  constructor(
    private readonly contacts: AccountContactsService,
    private readonly views: LotViewsService,
    @Inject(APP_CONFIG) private readonly config: AppConfig,
    @InjectRepository(Report) private readonly reports: Repository<Report>,
    private readonly mail: MailService,
    private readonly record: RegistrarRecordService,
  ) {}

  /** Files a report on a listed lot; anything else is the public pages' bare 404. Tells the holder. */
  async file(
    lotText: string,
    dto: { category: ReportCategory; text: string; email?: string },
  ): Promise<{ id: string; message: string }> {
    const code = RollReaderService.canonicalCode(lotText);
    const view = code ? await this.views.find({ code }, this.reports.manager) : null;
    if (!code || !view?.listed) throw new AppError('not_found', 'Not found.');
    const saved = await this.reports.save(
      this.reports.create({
        lot: code,
        category: dto.category,
        text: dto.text,
        reporterEmail: dto.email ?? null,
      }),
    );
    const holder = await this.contacts.contactOf(view.holder);
    if (holder) {
      await this.mail.send(
        holder.email,
        registryLetters.reportOnYourLot(
          holder.displayName,
          code,
          dto.category,
          dto.text,
          `${this.config.publicBaseUrl}/l/${code}`,
        ),
      );
    }
    return { id: saved.id, message: 'Thank you. The registrar will look at your report.' };
  }

  async list(q: {
    status?: ReportStatus;
    sort: string;
    page: number;
    pageSize: number;
  }): Promise<{ items: ReportResponse[]; total: number; page: number; pageSize: number }> {
    const desc = q.sort.startsWith('-');
    const column = SORTS[q.sort.replace('-', '') as keyof typeof SORTS];
    const [rows, total] = await this.reports.findAndCount({
      where: q.status ? { status: q.status } : {},
      order: { [column]: desc ? 'DESC' : 'ASC', id: 'ASC' },
      skip: (q.page - 1) * q.pageSize,
      take: q.pageSize,
    });
    return { items: rows.map(toReportResponse), total, page: q.page, pageSize: q.pageSize };
  }

  /** Closes a report with the registrar's answer, e-mailed to the reporter when they left an address. */
  async close(registrar: string, id: string, resolution: string): Promise<ReportResponse> {
    const r = await this.reports.findOne({ where: { id } });
    if (!r) throw new AppError('not_found', 'No such report.');
    if (r.status !== 'open') throw new AppError('conflict', 'This report is already closed.');
    await this.reports.manager.transaction(async (m) => {
      r.status = 'closed';
      r.resolution = resolution;
      r.closedBy = registrar;
      r.closedAt = new Date();
      await m.getRepository(Report).save(r);
      await this.record.record(
        {
          actor: registrar,
          action: 'report-closed',
          subject: `report:${r.id}`,
          reason: resolution,
          details: { lot: r.lot, category: r.category },
        },
        m,
      );
    });
    if (r.reporterEmail)
      await this.mail.send(r.reporterEmail, registryLetters.reportAnswered(r.lot, resolution));
    return toReportResponse(r);
  }
}
