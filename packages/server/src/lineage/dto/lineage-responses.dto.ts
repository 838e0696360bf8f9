import { BeadCountResponse, LOT_STATUSES } from '../../lots/dto/lot-responses.dto';
import { ApiProperty } from '@nestjs/swagger';
import type { BeadCount, LotStatus } from '@beadroll/core';

/** A lot written by a split or a combination. */
export class LinkedLotResponse {
  @ApiProperty() code: string;
  @ApiProperty() displayCode: string;
  @ApiProperty({ type: BeadCountResponse }) count: BeadCount;
}

/** What a split wrote: the parent's remaining count, and the new lots. */
export class SplitResponse {
  @ApiProperty() parent: string;
  @ApiProperty({ description: 'seq of the parent’s split entry' }) seq: number;
  @ApiProperty({
    type: BeadCountResponse,
    description: 'beads still in the parent (0: the parent is used up)',
  })
  remaining: BeadCount;
  @ApiProperty({ enum: LOT_STATUSES }) status: LotStatus;
  @ApiProperty({ type: [LinkedLotResponse] }) children: LinkedLotResponse[];
}

/** One parent of a combination after it. */
export class CombinedParentResponse {
  @ApiProperty() code: string;
  @ApiProperty({ description: 'seq of its combined entry' }) seq: number;
  @ApiProperty({ type: BeadCountResponse, description: 'beads taken' }) count: BeadCount;
  @ApiProperty({ type: BeadCountResponse }) remaining: BeadCount;
  @ApiProperty({ enum: LOT_STATUSES }) status: LotStatus;
}

/** What a combination wrote. */
export class CombineResponse {
  @ApiProperty({ type: LinkedLotResponse }) lot: LinkedLotResponse;
  @ApiProperty({ type: [CombinedParentResponse] }) parents: CombinedParentResponse[];
}

/** A lot in an ancestry graph. Lots the viewer may not read show only their code. */
export class AncestryNodeResponse {
  @ApiProperty() code: string;
  @ApiProperty() displayCode: string;
  @ApiProperty({ description: 'generations from the lot asked about: negative = ancestors' }) depth: number;
  @ApiProperty({ description: 'false: a lot the viewer may not open (only its code is known)' })
  readable: boolean;
  @ApiProperty({ nullable: true, type: String }) title: string | null;
  @ApiProperty({ nullable: true, enum: LOT_STATUSES }) status: LotStatus | null;
  @ApiProperty({ nullable: true, type: Boolean }) listed: boolean | null;
  @ApiProperty({ nullable: true, type: BeadCountResponse }) count: BeadCount | null;
}

/** A link: beads went from `from` to `to` by the entry `seq` of `from`. */
export class AncestryEdgeResponse {
  @ApiProperty() from: string;
  @ApiProperty() to: string;
  @ApiProperty({ enum: ['split', 'combined'] }) kind: 'split' | 'combined';
  @ApiProperty() seq: number;
  @ApiProperty({ type: BeadCountResponse }) count: BeadCount;
}

/** The ancestors and descendants of a lot as far as the viewer may follow them. */
export class AncestryResponse {
  @ApiProperty() code: string;
  @ApiProperty({ type: [AncestryNodeResponse] }) nodes: AncestryNodeResponse[];
  @ApiProperty({ type: [AncestryEdgeResponse] }) edges: AncestryEdgeResponse[];
  @ApiProperty({ description: 'true when the graph was cut at the node limit' }) truncated: boolean;
}
