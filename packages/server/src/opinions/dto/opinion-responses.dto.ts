import { ApiExtraModels, ApiProperty, ApiPropertyOptional, getSchemaPath } from '@nestjs/swagger';
import { PartyCard } from '../../accounts/dto/dealer-card.dto';
import type { OpinionBody } from '@beadroll/core';

/** How an opinion stands against the holder's attribution, as core's reducer derives it now. */
export type OpinionRole = 'attribution' | 'dissent' | 'other';

/** A note on the roll that answers an opinion. */
export class OpinionReply {
  @ApiProperty() seq: number;
  @ApiProperty() author: string;
  @ApiProperty() time: string;
  @ApiProperty() text: string;
}

/** One standing opinion, its body as on the roll; `body` is null when the registrar redacted it. */
export class OpinionView {
  @ApiProperty() seq: number;
  @ApiProperty() author: string;
  @ApiProperty() time: string;
  @ApiProperty({ enum: ['attribution', 'dissent', 'other'] }) role: OpinionRole;
  @ApiProperty({ nullable: true, type: Object }) body: OpinionBody | null;
  @ApiProperty({ type: [OpinionReply] }) replies: OpinionReply[];
}

/** The opinions on a lot, derived from its verified roll. */
@ApiExtraModels(PartyCard)
export class LotOpinionsResponse {
  @ApiProperty() lot: string;
  @ApiProperty() holder: string;
  @ApiProperty() listed: boolean;
  @ApiProperty({
    description: 'seq of the holder’s attribution, or null: no attribution by the holder yet',
    nullable: true,
    type: Number,
  })
  attribution: number | null;
  @ApiProperty({ type: [Number], description: 'seqs of the dissents' }) dissents: number[];
  @ApiProperty({ type: [OpinionView] }) opinions: OpinionView[];
  @ApiProperty({
    type: 'object',
    additionalProperties: { $ref: getSchemaPath(PartyCard) },
    description: 'public cards of the authors, by account id',
  })
  cards: Record<string, PartyCard>;
}

/** What a write answers: the entry it put on the roll and the opinions after it. */
export class OpinionWriteResponse {
  @ApiProperty() seq: number;
  @ApiProperty() hash: string;
  @ApiPropertyOptional({
    description: 'true when the new opinion is a dissent from the holder’s attribution',
  })
  dissent?: boolean;
  @ApiProperty({ type: LotOpinionsResponse }) opinions: LotOpinionsResponse;
}
