import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { REDACTION_REASONS, type RedactionReason } from '@beadroll/core';
import { Transform } from 'class-transformer';
import { IsEmail, IsIn, IsInt, IsOptional, IsString, Max, MaxLength, Min, MinLength } from 'class-validator';
import { PageParam, PageQueryDto } from '../../common/page-query.dto';
import { REGISTRAR_ACTIONS, type RegistrarActionKind } from '../entities/registrar-action.entity';
import { REQUEST_STATUSES, type RedactionRequestStatus } from '../entities/redaction-request.entity';
import {
  REPORT_CATEGORIES,
  REPORT_STATUSES,
  type ReportCategory,
  type ReportStatus,
} from '../entities/report.entity';
import { Reason, TrimmedText, trim } from '../../common/text-fields';
import { OptionalChoice } from '../../common/validation';

const emptyToUndefined = ({ value }: { value: unknown }) => {
  if (typeof value !== 'string') return value;
  const v = value.trim();
  return v === '' ? undefined : v;
};

export class RedactDto {
  @ApiProperty({ description: 'Lot code (hyphens and case as typed are fine)' })
  @IsString()
  @MaxLength(20)
  lot: string;

  @ApiProperty({ description: 'seq of the entry whose body is removed' })
  @IsInt({ message: 'must be a whole number' })
  @Min(0)
  @Max(10_000_000)
  seq: number;

  @ApiProperty({ enum: REDACTION_REASONS })
  @IsIn(REDACTION_REASONS, { message: `must be one of ${REDACTION_REASONS.join(', ')}` })
  reason: RedactionReason;

  @ApiPropertyOptional({ description: 'Why, for the registrar’s record (never on the roll)' })
  @IsOptional()
  @TrimmedText(2000)
  note?: string;
}

export class RedactionRequestDto {
  @ApiProperty({ description: 'seq of one of your own entries on this lot' })
  @IsInt({ message: 'must be a whole number' })
  @Min(0)
  @Max(10_000_000)
  seq: number;

  @ApiProperty({ description: 'Why the entry should be removed' })
  @Reason(1000)
  note: string;
}

export class DecisionNoteDto {
  @ApiPropertyOptional()
  @IsOptional()
  @TrimmedText(1000)
  note?: string;
}

export class DeclineDto {
  @ApiProperty()
  @Reason(1000)
  reason: string;
}

export class RequestQueryDto {
  @OptionalChoice(REQUEST_STATUSES, { default: 'open', listed: true })
  status: RedactionRequestStatus = 'open';
}

/** The longest report text the form takes. */
export const REPORT_TEXT_MAX = 2000;

export class ReportDto {
  @ApiProperty({ enum: REPORT_CATEGORIES })
  @IsIn(REPORT_CATEGORIES, { message: `must be one of ${REPORT_CATEGORIES.join(', ')}` })
  category: ReportCategory;

  @ApiProperty({ description: 'What is wrong, in a few sentences' })
  @Transform(trim)
  @IsString({ message: 'must say what is wrong' })
  @MinLength(3, { message: 'must say what is wrong, in at least 3 characters' })
  @MaxLength(REPORT_TEXT_MAX, { message: `must be at most ${REPORT_TEXT_MAX} characters` })
  text: string;

  @ApiPropertyOptional({ description: 'Only for the registrar’s answer; never passed on' })
  @IsOptional()
  @Transform(emptyToUndefined)
  @IsEmail({}, { message: 'must be an e-mail address' })
  @MaxLength(254)
  email?: string;
}

export const REPORT_SORTS = ['created', '-created', 'lot', '-lot', 'category', '-category'] as const;

export class ReportQueryDto extends PageQueryDto {
  @OptionalChoice(REPORT_STATUSES, { listed: true })
  status?: ReportStatus;

  @OptionalChoice(REPORT_SORTS, { default: '-created', listed: true })
  sort: (typeof REPORT_SORTS)[number] = '-created';
}

export class CloseReportDto {
  @ApiProperty({ description: 'The registrar’s answer; e-mailed to the reporter when they left an address' })
  @TrimmedText(2000, { length: 3, message: 'must say what was done, in at least 3 characters' })
  resolution: string;
}

export class ActionsQueryDto {
  @OptionalChoice(REGISTRAR_ACTIONS, { listed: true })
  action?: RegistrarActionKind;

  @ApiPropertyOptional({ type: Number, default: 1 })
  @PageParam(100000)
  page = 1;

  @ApiPropertyOptional({ type: Number, default: 50 })
  @PageParam(200)
  pageSize = 50;
}

export class ExportQueryDto {
  @ApiPropertyOptional({ enum: ['json', 'csv'], default: 'json' })
  @IsOptional()
  @IsIn(['json', 'csv'], { message: 'must be json or csv' })
  format: 'json' | 'csv' = 'json';
}

export class CloseAccountDto {
  @ApiProperty({ description: 'Your current password, to confirm' })
  @IsString()
  @MinLength(1, { message: 'is needed to confirm' })
  @MaxLength(128)
  password: string;
}
