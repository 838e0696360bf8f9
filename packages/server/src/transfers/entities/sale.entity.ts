import { Column, Entity, Index, PrimaryGeneratedColumn, Unique } from 'typeorm';

/** One `sold` entry, for the seller's list of sales (the price stays a sealed field). */
@Entity({ name: 'sales' })
@Unique('uq_sales_lot', ['lotId'])
@Index('ix_sales_seller', ['seller', 'soldOn'])
export class SaleEntity {
  @PrimaryGeneratedColumn('uuid', { primaryKeyConstraintName: 'pk_sales' })
  id: string;

  @Column({ name: 'lot_id', type: 'uuid' })
  lotId: string;

  @Column({ type: 'varchar', length: 9 })
  code: string;

  @Column({ type: 'varchar', length: 200 })
  title: string;

  @Column({ type: 'integer' })
  seq: number;

  @Column({ type: 'varchar', length: 64 })
  seller: string;

  @Column({ name: 'sold_on', type: 'date' })
  soldOn: string;

  @Column({ name: 'recorded_at', type: 'timestamptz' })
  recordedAt: Date;

  /** When a receipt went to the buyer (the address itself is never stored). */
  @Column({ name: 'receipt_sent_at', type: 'timestamptz', nullable: true })
  receiptSentAt: Date | null;
}
