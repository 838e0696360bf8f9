import { Entity, Index } from 'typeorm';
import * as Col from '../../database/columns';

/** What a buyer can report about a public lot page. */
export const REPORT_CATEGORIES = ['wrong-attribution', 'counterfeit', 'personal-data', 'other'] as const;
export type ReportCategory = (typeof REPORT_CATEGORIES)[number];
export const REPORT_STATUSES = ['open', 'closed'] as const;
export type ReportStatus = (typeof REPORT_STATUSES)[number];

/** A problem reported from a public lot page, waiting in the registrar's queue. */
@Entity({ name: 'reports' })
@Index('ix_reports_status_created', ['status', 'createdAt'])
@Index('ix_reports_lot', ['lot'])
export class Report {
  @Col.UuidPrimary('reports')
  id: string;

  @Col.LotCode()
  lot: string;

  @Col.Varchar(32)
  category: ReportCategory;

  @Col.Varchar(2000)
  text: string;

  /** Only for the registrar's answer; never shown to the holder. */
  @Col.Varchar(254, { nullable: true })
  reporterEmail: string | null;

  @Col.Word({ default: 'open' })
  status: ReportStatus;

  @Col.Varchar(2000, { nullable: true })
  resolution: string | null;

  @Col.Uuid({ nullable: true })
  closedBy: string | null;

  @Col.Timestamp({ nullable: true })
  closedAt: Date | null;

  @Col.CreatedAt()
  createdAt: Date;
}
