import { ApiProperty } from '@nestjs/swagger';
import { REDACTION_REASONS, type RedactionReason } from '@beadroll/core';
import { REGISTRAR_ACTIONS, type RegistrarActionKind } from '../entities/registrar-action.entity';
import { REQUEST_STATUSES, type RedactionRequestStatus } from '../entities/redaction-request.entity';
import {
  REPORT_CATEGORIES,
  REPORT_STATUSES,
  type ReportCategory,
  type ReportStatus,
} from '../entities/report.entity';
import { Page } from '../../common/page.dto';

/** A body removed from a roll by the registrar. */
export class RedactionResponse {
  @ApiProperty() lot: string;
  @ApiProperty({ description: 'the entry whose body was removed' }) seq: number;
  @ApiProperty({ description: 'the `redacted` entry now on the roll' }) redactionSeq: number;
  @ApiProperty({ enum: REDACTION_REASONS }) reason: RedactionReason;
  @ApiProperty() time: string;
  @ApiProperty({
    type: [String],
    description: 'SHA-256 of the files removed with an exhibit (now on the blocked list)',
  })
  blockedDigests: string[];
}

/** A holder's request to remove one of their own entries' bodies. */
export class RedactionRequestResponse {
  @ApiProperty() id: string;
  @ApiProperty() lot: string;
  @ApiProperty() seq: number;
  @ApiProperty() kind: string;
  @ApiProperty() requester: string;
  @ApiProperty() note: string;
  @ApiProperty({ enum: REQUEST_STATUSES }) status: RedactionRequestStatus;
  @ApiProperty({ type: String, nullable: true }) decidedBy: string | null;
  @ApiProperty({ type: String, nullable: true }) decidedAt: string | null;
  @ApiProperty({ type: String, nullable: true }) decisionNote: string | null;
  @ApiProperty() createdAt: string;
}

/** One line of the registrar's record. */
export class RegistrarActionResponse {
  @ApiProperty() id: string;
  @ApiProperty() at: string;
  @ApiProperty() actor: string;
  @ApiProperty({ enum: REGISTRAR_ACTIONS }) action: RegistrarActionKind;
  @ApiProperty() subject: string;
  @ApiProperty({ type: String, nullable: true }) reason: string | null;
  @ApiProperty({ type: 'object', additionalProperties: true }) details: Record<string, unknown>;
}

/** A page of the registrar's record. */
export class RegistrarActionPage extends Page(RegistrarActionResponse) {}

/** A report filed from a public page. */
export class ReportResponse {
  @ApiProperty() id: string;
  @ApiProperty() lot: string;
  @ApiProperty({ enum: REPORT_CATEGORIES }) category: ReportCategory;
  @ApiProperty() text: string;
  @ApiProperty({
    description:
      'whether the reporter left an address for the answer (the address itself stays with the report)',
  })
  answerWanted: boolean;
  @ApiProperty({ type: String, nullable: true }) reporterEmail: string | null;
  @ApiProperty({ enum: REPORT_STATUSES }) status: ReportStatus;
  @ApiProperty({ type: String, nullable: true }) resolution: string | null;
  @ApiProperty({ type: String, nullable: true }) closedBy: string | null;
  @ApiProperty({ type: String, nullable: true }) closedAt: string | null;
  @ApiProperty() createdAt: string;
}

/** A page of reports. */
export class ReportPage extends Page(ReportResponse) {}

/** The answer to a filed report. */
export class FiledReportResponse {
  @ApiProperty() id: string;
  @ApiProperty() message: string;
}
