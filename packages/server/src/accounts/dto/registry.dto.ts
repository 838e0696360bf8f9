import { ApiProperty } from '@nestjs/swagger';
import { PageQueryDto } from '../../common/page-query.dto';
import type { Account } from '../entities/account.entity';
import { AccountIdentity, toAccountIdentity } from './account-identity.dto';
import { Page } from '../../common/page.dto';
import { Reason } from '../../common/text-fields';
import { OptionalChoice } from '../../common/validation';

export const QUEUE_STATUSES = ['pending', 'verified', 'suspended', 'rejected'] as const;
export const QUEUE_SORTS = ['applied', '-applied', 'business', '-business', 'town', '-town'] as const;

export class RegistryQueryDto extends PageQueryDto {
  @OptionalChoice(QUEUE_STATUSES, { default: 'pending', listed: true })
  status: (typeof QUEUE_STATUSES)[number] = 'pending';

  @OptionalChoice(QUEUE_SORTS, { default: 'applied', listed: true })
  sort: (typeof QUEUE_SORTS)[number] = 'applied';
}

export class ReasonDto {
  @ApiProperty({ description: 'Sent to the account holder by e-mail' })
  @Reason(500)
  reason: string;
}

/** The document an applicant sent with the application. */
export class ApplicantDocumentResponse {
  @ApiProperty({ description: 'SHA-256 of the file, hex' }) sha256: string;
  @ApiProperty({ enum: ['application/pdf', 'image/jpeg', 'image/png'] }) mediaType: string;
  @ApiProperty({ description: 'bytes' }) size: number;
  @ApiProperty() name: string;
}

export class ApplicantResponse extends AccountIdentity {
  @ApiProperty() address: string;
  @ApiProperty({ type: String, nullable: true }) website: string | null;
  @ApiProperty() tradeReferences: string;
  /** The applicant's optional document (download it from `…/document`), or null. */
  @ApiProperty({ type: () => ApplicantDocumentResponse, nullable: true })
  document: ApplicantDocumentResponse | null;
  @ApiProperty() appliedAt: string;
  @ApiProperty({ type: String, nullable: true }) verifiedSince: string | null;
  @ApiProperty({ type: String, nullable: true }) statusReason: string | null;
}

export class RegistryPage extends Page(ApplicantResponse) {}

/** The document an applicant sent with the application, as the registrar and the applicant see it; null when none. */
export function applicantDocumentOf(a: Account): ApplicantResponse['document'] {
  return a.documentSha256 && a.documentType
    ? {
        sha256: a.documentSha256,
        mediaType: a.documentType,
        size: a.documentSize ?? 0,
        name: a.documentName ?? 'document',
      }
    : null;
}

export function toApplicantResponse(a: Account): ApplicantResponse {
  return {
    ...toAccountIdentity(a),
    address: a.address,
    website: a.website,
    tradeReferences: a.tradeReferences,
    document: applicantDocumentOf(a),
    appliedAt: a.createdAt.toISOString(),
    verifiedSince: a.verifiedAt?.toISOString() ?? null,
    statusReason: a.statusReason,
  };
}
