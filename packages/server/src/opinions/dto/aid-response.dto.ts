import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import {
  type AidResult,
  type AidSource,
  type Indication,
  type Origin,
  ORIGINS,
  type PlausibilityWarning,
  type Qualifier,
  QUALIFIERS,
  type SourceStanding,
  type Technique,
  TECHNIQUES,
} from '@beadroll/core';

// Every standing core knows (the compiler holds this list to core's type).
const STANDINGS = Object.keys({
  museum: true,
  standard: true,
  scholar: true,
  'trade-page': true,
  'student-page': true,
  'common-practice': true,
  'from-memory': true,
} satisfies Record<SourceStanding, true>) as SourceStanding[];

/** Where a rule's fact comes from. */
export class AidSourceResponse implements AidSource {
  @ApiProperty() title: string;
  @ApiPropertyOptional() url?: string;
  @ApiProperty({ enum: STANDINGS, description: 'how much weight the source carries, strongest first' })
  standing: SourceStanding;
}

/** One rule's words and their sources. */
export class AidRuleTextResponse {
  @ApiProperty({ description: 'the rule’s id' }) rule: string;
  @ApiProperty() text: string;
  @ApiProperty({ type: [AidSourceResponse] }) sources: AidSourceResponse[];
}

/** Where and how the clues point, with the rules that say so. */
export class AidIndicationResponse implements Indication {
  @ApiPropertyOptional({ enum: ORIGINS }) origin?: Origin;
  @ApiPropertyOptional({ enum: TECHNIQUES }) technique?: Technique;
  @ApiPropertyOptional({
    enum: QUALIFIERS,
    description: 'set when the clues point to recent work in an older style rather than to a place',
  })
  qualifier?: Qualifier;
  @ApiProperty({ description: 'rank: higher is stronger' }) score: number;
  @ApiProperty({ type: [AidRuleTextResponse] }) reasons: AidRuleTextResponse[];
}

/** A period that starts before something it claims existed. */
export class AidWarningResponse implements PlausibilityWarning {
  @ApiProperty() rule: string;
  @ApiProperty() message: string;
  @ApiProperty({ description: 'the earliest plausible year' }) notBefore: number;
  @ApiProperty({ description: 'true: the whole period is earlier; false: only its start is' })
  wholePeriod: boolean;
  @ApiProperty({ description: 'true when the clue behind it is only a hint: the period may be too early' })
  clueIsHint: boolean;
  @ApiProperty({ type: [AidSourceResponse] }) sources: AidSourceResponse[];
}

/** The attribution aid's answer: an aid, not an authentication. */
export class AidResponse implements AidResult {
  @ApiProperty({ type: [AidIndicationResponse] }) indications: AidIndicationResponse[];
  @ApiProperty({ type: [AidWarningResponse] }) warnings: AidWarningResponse[];
  @ApiProperty({ type: [AidRuleTextResponse] }) cautions: AidRuleTextResponse[];
  @ApiProperty() disclaimer: string;
}
