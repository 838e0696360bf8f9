import { Column, Entity, Index, Unique } from 'typeorm';
import * as Col from '../../database/columns';

/** One `sold` entry, for the seller's list of sales (the price stays a sealed field). */
@Entity({ name: 'sales' })
@Unique('uq_sales_lot', ['lotId'])
@Index('ix_sales_seller', ['seller', 'soldOn'])
export class SaleEntity extends Col.LotRowColumns('sales') {
  @Col.Varchar(200)
  title: string;

  @Col.Integer()
  seq: number;

  @Col.Actor()
  seller: string;

  @Column({ name: 'sold_on', type: 'date' })
  soldOn: string;

  @Col.Timestamp()
  recordedAt: Date;

  /** When a receipt went to the buyer (the address itself is never stored). */
  @Col.Timestamp({ nullable: true })
  receiptSentAt: Date | null;
}
