import { ApiProperty } from '@nestjs/swagger';

/** One entry of a public bundle: exactly the four members of the ledger format, nothing else. */
export class PublicBundleEntry {
  @ApiProperty() hash: string;
  @ApiProperty({ description: 'canonical header string' }) header: string;
  @ApiProperty({ nullable: true, type: String }) body: string | null;
  @ApiProperty({ nullable: true, type: Number }) logIndex: number | null;
}

export class PublicBundleRoll {
  @ApiProperty() lot: string;
  @ApiProperty({ enum: ['full', 'link'] }) scope: 'full' | 'link';
  @ApiProperty({ type: [PublicBundleEntry] }) entries: PublicBundleEntry[];
}

/** An export bundle as served publicly (ledger format §11); it never holds a sealed salt or value. */
export class PublicBundle {
  @ApiProperty({ enum: ['beadroll-bundle'] }) format: 'beadroll-bundle';
  @ApiProperty({ enum: [1, 2], description: 'bundle version; 2 is written now' }) version: 1 | 2;
  @ApiProperty({ type: [PublicBundleRoll] }) rolls: PublicBundleRoll[];
  @ApiProperty({ type: [Object] }) checkpoints: unknown[];
}

/** A public dealer card, keyed by account id in {@link PublicLotResponse.cards}. */
export class PublicDealerCard {
  @ApiProperty() id: string;
  @ApiProperty() handle: string;
  @ApiProperty() displayName: string;
  @ApiProperty() business: string;
  @ApiProperty() town: string;
  @ApiProperty() country: string;
  @ApiProperty() verifiedSince: string;
  @ApiProperty({ enum: ['verified', 'suspended', 'former'] }) status: 'verified' | 'suspended' | 'former';
}

/** What the public page of a listed lot is rendered from: the raw rolls and the dealers named on them. */
export class PublicLotResponse {
  @ApiProperty() code: string;
  @ApiProperty({ type: PublicBundle }) bundle: PublicBundle;
  @ApiProperty({ description: 'dealer cards by account id' }) cards: Record<string, PublicDealerCard>;
}
