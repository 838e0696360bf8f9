import { ApiProperty } from '@nestjs/swagger';

const HASHES = 'base64 SHA-256 hashes (RFC 9162 §2.1)';

/** An inclusion proof of one leaf in a tree of `size` leaves. */
export class InclusionProofResponse {
  @ApiProperty({ description: 'the leaf’s index, from 0' }) index: number;
  @ApiProperty({ description: 'the tree size the proof is for' }) size: number;
  @ApiProperty({ type: [String], description: `${HASHES}, leaf side first` }) proof: string[];
}

/** A consistency proof between two tree sizes. */
export class ConsistencyProofResponse {
  @ApiProperty() from: number;
  @ApiProperty() to: number;
  @ApiProperty({ type: [String], description: HASHES }) proof: string[];
}

/** The leaves start to end − 1: each an entry hash, in log order. */
export class LeavesResponse {
  @ApiProperty() start: number;
  @ApiProperty() end: number;
  @ApiProperty({ type: [String], description: 'entry hashes (hex), one per leaf' }) leaves: string[];
}

/** A witness's cosignature, accepted. */
export class CosignatureResponse {
  @ApiProperty({ description: 'the tree size of the cosigned checkpoint' }) size: number;
  @ApiProperty({ description: 'the witness’s name' }) witness: string;
}
