import { Column, CreateDateColumn, Entity, Index, PrimaryGeneratedColumn } from 'typeorm';

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
  @PrimaryGeneratedColumn('uuid', { primaryKeyConstraintName: 'pk_reports' })
  id: string;

  @Column({ type: 'varchar', length: 9 })
  lot: string;

  @Column({ type: 'varchar', length: 32 })
  category: ReportCategory;

  @Column({ type: 'varchar', length: 2000 })
  text: string;

  /** Only for the registrar's answer; never shown to the holder. */
  @Column({ name: 'reporter_email', type: 'varchar', length: 254, nullable: true })
  reporterEmail: string | null;

  @Column({ type: 'varchar', length: 16, default: 'open' })
  status: ReportStatus;

  @Column({ type: 'varchar', length: 2000, nullable: true })
  resolution: string | null;

  @Column({ name: 'closed_by', type: 'uuid', nullable: true })
  closedBy: string | null;

  @Column({ name: 'closed_at', type: 'timestamptz', nullable: true })
  closedAt: Date | null;

  @CreateDateColumn({ name: 'created_at', type: 'timestamptz' })
  createdAt: Date;
}
