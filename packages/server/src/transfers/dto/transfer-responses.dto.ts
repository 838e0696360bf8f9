import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { PartyCard } from '../../accounts/dto/dealer-card.dto';
import { MoneyDto } from '../../lots/dto/sealed-details.dto';
import type { InvitationStatus } from '../entities/transfer-invitation.entity';
import type { OfferStatus } from '../entities/transfer-offer.entity';
import { Page } from '../../common/page.dto';

/** The lot an offer or sale is about. */
export class TransferLotResponse {
  @ApiProperty() code: string;
  @ApiProperty() displayCode: string;
  @ApiProperty({ description: 'title when it was offered or sold' }) title: string;
}

/** One offer, as either of its two dealers sees it. */
export class OfferResponse {
  @ApiProperty() id: string;
  @ApiProperty({ type: TransferLotResponse }) lot: TransferLotResponse;
  @ApiProperty({ description: 'seq of the transfer-offered entry' }) offerSeq: number;
  @ApiProperty({ enum: ['open', 'accepted', 'declined', 'withdrawn', 'lapsed'] }) status: OfferStatus;
  @ApiProperty({ type: PartyCard, nullable: true }) offerer: PartyCard | null;
  @ApiProperty({ type: PartyCard, nullable: true }) recipient: PartyCard | null;
  @ApiProperty({ enum: ['offerer', 'recipient'] }) viewerIs: 'offerer' | 'recipient';
  @ApiPropertyOptional() note?: string;
  @ApiProperty() offeredAt: string;
  @ApiPropertyOptional({ description: 'when an open offer lapses if nobody answers' }) lapsesAt?: string;
  @ApiPropertyOptional() answeredAt?: string;
  @ApiPropertyOptional() answerSeq?: number;
  @ApiPropertyOptional() answerNote?: string;
  @ApiPropertyOptional({
    type: MoneyDto,
    description: 'sealed transfer price, shown to the two dealers only',
  })
  price?: MoneyDto;
}

export class OfferListResponse extends Page(OfferResponse) {}

/** An offer waiting for the invited dealer to join and be verified. */
export class InvitationResponse {
  @ApiProperty() id: string;
  @ApiProperty({ type: TransferLotResponse }) lot: TransferLotResponse;
  @ApiProperty() email: string;
  @ApiProperty({ enum: ['waiting', 'offered', 'stalled', 'cancelled'] }) status: InvitationStatus;
  @ApiPropertyOptional() statusReason?: string;
  @ApiPropertyOptional() note?: string;
  @ApiPropertyOptional({ type: MoneyDto }) price?: MoneyDto;
  @ApiPropertyOptional({ description: 'the offer made from it' }) offerId?: string;
  @ApiProperty() createdAt: string;
}

/** What an offer request made: an offer on the roll, or an invitation waiting for the recipient. */
export class CreateOfferResponse {
  @ApiProperty({ enum: ['offer', 'invitation'] }) made: 'offer' | 'invitation';
  @ApiPropertyOptional({ type: OfferResponse }) offer?: OfferResponse;
  @ApiPropertyOptional({ type: InvitationResponse }) invitation?: InvitationResponse;
}

/** A sale to a private buyer, as its seller sees it. */
export class SaleResponse {
  @ApiProperty() id: string;
  @ApiProperty({ type: TransferLotResponse }) lot: TransferLotResponse;
  @ApiProperty({ description: 'seq of the sold entry' }) seq: number;
  @ApiProperty({ description: 'YYYY-MM-DD' }) date: string;
  @ApiPropertyOptional({ type: MoneyDto, description: 'sealed sale price' }) price?: MoneyDto;
  @ApiPropertyOptional({ description: 'sealed buyer note' }) buyerNote?: string;
  @ApiProperty() recordedAt: string;
  @ApiProperty() receiptSent: boolean;
  @ApiProperty() listed: boolean;
}

export class SaleListResponse extends Page(SaleResponse) {}

export class InvitationListResponse {
  @ApiProperty({ type: [InvitationResponse] }) items: InvitationResponse[];
}

export class DealerSearchResponse {
  @ApiProperty({ type: [PartyCard] }) items: PartyCard[];
}
