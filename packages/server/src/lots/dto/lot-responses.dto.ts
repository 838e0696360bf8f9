import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import {
  LOT_FORMS,
  ORIGINS,
  TECHNIQUES,
  type BeadCount,
  type LotDescription,
  type LotStatus,
  type Observations,
} from '@beadroll/core';
import { MoneyDto } from './sealed-details.dto';
import { Page } from '../../common/page.dto';

/** Every status a lot can be in (core's `LotStatus`). */
export const LOT_STATUSES: readonly LotStatus[] = ['held', 'offered', 'sold', 'split', 'combined', 'retired'];

/** A count of beads, exact or estimated (core's `BeadCount`). */
export class BeadCountResponse implements BeadCount {
  @ApiProperty() value: number;
  @ApiProperty() estimated: boolean;
}

/** A range of years. */
export class PeriodResponse {
  @ApiProperty() from: number;
  @ApiProperty() to: number;
}

/** The holder's attribution on the roll. */
export class LotAttributionResponse {
  @ApiProperty() seq: number;
  @ApiProperty() author: string;
  @ApiProperty({ enum: ORIGINS }) origin: string;
}

/** The lot's open transfer offer. */
export class OpenOfferResponse {
  @ApiProperty() seq: number;
  @ApiProperty() offerer: string;
  @ApiProperty({ type: String, nullable: true }) recipient: string | null;
}

/** One row of the lot list. */
export class LotSummaryResponse {
  @ApiProperty({ description: 'canonical lot code' }) code: string;
  @ApiProperty({ description: 'grouped for people, XXXX-XXXX-X' }) displayCode: string;
  @ApiProperty() title: string;
  @ApiProperty({ nullable: true, enum: LOT_FORMS }) form: string | null;
  @ApiProperty({ enum: LOT_STATUSES }) status: LotStatus;
  @ApiProperty() listed: boolean;
  @ApiProperty({ description: 'account id of the holder' }) holder: string;
  @ApiProperty({
    nullable: true,
    enum: ORIGINS,
    description:
      'origin of the attribution on record: the holder’s, else an earlier holder’s or an ancestor’s',
  })
  origin: string | null;
  @ApiProperty({ nullable: true, enum: ['holder', 'earlier-holder', 'ancestor'] })
  originSource: 'holder' | 'earlier-holder' | 'ancestor' | null;
  @ApiProperty({ nullable: true, enum: TECHNIQUES, description: 'technique of the attribution on record' })
  technique: string | null;
  @ApiProperty({ nullable: true, type: PeriodResponse, description: 'period of the attribution on record' })
  period: {
    from: number;
    to: number;
  } | null;
  @ApiProperty({ type: BeadCountResponse }) count: BeadCount;
  @ApiProperty() dissents: number;
  @ApiProperty() headSeq: number;
  @ApiProperty() registeredAt: string;
  @ApiProperty() updatedAt: string;
}

/** A page of the lot list. */
export class LotListResponse extends Page(LotSummaryResponse) {}

/** The viewer's own sealed details, newest value of each. */
export class OwnSealedDetails {
  @ApiPropertyOptional() storageLocation?: string;
  @ApiPropertyOptional() acquisitionDate?: string;
  @ApiPropertyOptional() acquisitionSource?: string;
  @ApiPropertyOptional({ type: MoneyDto }) acquisitionCost?: MoneyDto;
  @ApiPropertyOptional() privateNote?: string;
}

/** A lot as the signed-in viewer may see it (derived from its roll; the roll itself is at /roll). */
export class LotDetailResponse extends LotSummaryResponse {
  @ApiProperty({ nullable: true, type: Object, description: 'null while the newest description is redacted' })
  description: LotDescription | null;
  @ApiProperty({ nullable: true }) observations: Observations | null;
  @ApiProperty({ type: BeadCountResponse }) remaining: BeadCount;
  @ApiProperty({ nullable: true, type: LotAttributionResponse }) attribution: {
    seq: number;
    author: string;
    origin: string;
  } | null;
  @ApiProperty({ nullable: true, type: OpenOfferResponse }) openOffer: {
    seq: number;
    offerer: string;
    recipient: string | null;
  } | null;
  @ApiProperty() headHash: string;
  @ApiProperty({ description: 'true when the viewer holds the lot' }) viewerIsHolder: boolean;
  @ApiProperty({ type: OwnSealedDetails }) sealed: OwnSealedDetails;
  @ApiPropertyOptional({
    description:
      'set when the viewer may read the roll only up to this seq (a former holder, up to the handover)',
  })
  historyUpTo?: number;
}

/** One sealed field the viewer recorded (or, for a transfer price, is a party to). */
export class SealedFieldResponse {
  @ApiProperty() name: string;
  @ApiProperty() salt: string;
  @ApiProperty() value: unknown;
  @ApiProperty({ description: 'commitments of every sealed field of the entry, for disclosure' })
  commitments: Record<string, string>;
}

/** One stored entry, with the exact strings a verifier checks. */
export class RollEntryResponse {
  @ApiProperty() seq: number;
  @ApiProperty() kind: string;
  @ApiProperty() actor: string;
  @ApiProperty() time: string;
  @ApiProperty() hash: string;
  @ApiProperty({ description: 'canonical header string' }) header: string;
  @ApiProperty({ nullable: true, type: String, description: 'canonical body string; null when redacted' })
  body: string | null;
  @ApiProperty({ nullable: true, type: Number }) logIndex: number | null;
  @ApiPropertyOptional({ type: [SealedFieldResponse], description: "only the viewer's own sealed values" })
  sealed?: SealedFieldResponse[];
}

/** A lot's whole roll. */
export class RollResponse {
  @ApiProperty() lot: string;
  @ApiProperty({ type: [RollEntryResponse] }) entries: RollEntryResponse[];
}

/** Outcome of verifying a roll on the server with core's verifier. */
export class VerifyResponse {
  @ApiProperty() lot: string;
  @ApiProperty() ok: boolean;
  @ApiProperty() entries: number;
  @ApiPropertyOptional() headSeq?: number;
  @ApiPropertyOptional() headHash?: string;
  @ApiPropertyOptional({ description: 'the first failing entry' })
  failure?: { seq: number; reason: string; message: string };
}
