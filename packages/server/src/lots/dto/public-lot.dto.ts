import { ApiExtraModels, ApiProperty, getSchemaPath } from '@nestjs/swagger';
import { DealerCard } from '../../accounts/dto/dealer-card.dto';

/** One entry of a public bundle: exactly the four members of the ledger format, nothing else. */
export class PublicBundleEntry {
  @ApiProperty() hash: string;
  @ApiProperty({ description: 'canonical header string' }) header: string;
  @ApiProperty({ nullable: true, type: String }) body: string | null;
  @ApiProperty({ nullable: true, type: Number }) logIndex: number | null;
}

export class PublicBundleRoll {
  @ApiProperty() lot: string;
  @ApiProperty({ enum: ['full', 'link', 'inherited'] }) scope: 'full' | 'link' | 'inherited';
  @ApiProperty({ type: [PublicBundleEntry] }) entries: PublicBundleEntry[];
}

/** An inclusion proof of a roll's entry in the checkpoint (ledger format §14.5). */
export class PublicLogInclusion {
  @ApiProperty() lot: string;
  @ApiProperty() seq: number;
  @ApiProperty() logIndex: number;
  @ApiProperty({ type: [String], description: 'base64 hashes, leaf side first' }) proof: string[];
}

/** A signed checkpoint of the ledger-wide log with inclusion proofs (ledger format §14.5). */
export class PublicBundleCheckpoint {
  @ApiProperty({ description: 'signed checkpoint note, with witness cosignatures' }) note: string;
  @ApiProperty({ type: [PublicLogInclusion] }) inclusions: PublicLogInclusion[];
}

/** An export bundle as served publicly (ledger format §11); it never holds a sealed salt or value. */
export class PublicBundle {
  @ApiProperty({ enum: ['beadroll-bundle'] }) format: 'beadroll-bundle';
  @ApiProperty({ enum: [1, 2], description: 'bundle version; 2 is written now' }) version: 1 | 2;
  @ApiProperty({ type: [PublicBundleRoll] }) rolls: PublicBundleRoll[];
  @ApiProperty({ type: [PublicBundleCheckpoint] }) checkpoints: PublicBundleCheckpoint[];
}

/** What the public page of a listed lot is rendered from: the raw rolls and the dealers named on them. */
@ApiExtraModels(DealerCard)
export class PublicLotResponse {
  @ApiProperty() code: string;
  @ApiProperty({ type: PublicBundle }) bundle: PublicBundle;
  @ApiProperty({
    type: 'object',
    additionalProperties: { $ref: getSchemaPath(DealerCard) },
    description: 'cards by account id: every actor on the rolls, and the recipient of each transfer offer',
  })
  cards: Record<string, DealerCard>;
}
