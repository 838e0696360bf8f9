import { ApiProperty } from '@nestjs/swagger';

/** The document an applicant sent; its bytes are downloaded by the registrar only. */
export class PersonalDocument {
  @ApiProperty() sha256: string;
  @ApiProperty() mediaType: string;
  @ApiProperty() size: number;
  @ApiProperty() name: string;
}

/** The account as stored. */
export class PersonalAccount {
  @ApiProperty() id: string;
  @ApiProperty() role: string;
  @ApiProperty() status: string;
  @ApiProperty() handle: string;
  @ApiProperty() email: string;
  @ApiProperty() displayName: string;
  @ApiProperty() business: string;
  @ApiProperty() town: string;
  @ApiProperty() country: string;
  @ApiProperty() address: string;
  @ApiProperty({ type: String, nullable: true }) website: string | null;
  @ApiProperty() tradeReferences: string;
  @ApiProperty({ type: PersonalDocument, nullable: true }) document: PersonalDocument | null;
  @ApiProperty({ type: String, nullable: true }) emailConfirmedAt: string | null;
  @ApiProperty({ type: String, nullable: true }) verifiedSince: string | null;
  @ApiProperty({ type: String, nullable: true }) statusReason: string | null;
  @ApiProperty() createdAt: string;
}

export class PersonalSession {
  @ApiProperty() createdAt: string;
  @ApiProperty({ type: String, nullable: true }) revokedAt: string | null;
  @ApiProperty({ type: String, nullable: true }) revokedWhy: string | null;
}

/** A roll entry the account wrote, exactly as stored. */
export class PersonalEntry {
  @ApiProperty() lot: string;
  @ApiProperty() seq: number;
  @ApiProperty() kind: string;
  @ApiProperty() time: string;
  @ApiProperty() hash: string;
  @ApiProperty({ description: 'canonical header string' }) header: string;
  @ApiProperty({ type: String, nullable: true, description: 'canonical body string; null once redacted' })
  body: string | null;
}

/** A sealed value the account may read, with its salt and commitment. */
export class PersonalSealedDetail {
  @ApiProperty() lot: string;
  @ApiProperty() seq: number;
  @ApiProperty() name: string;
  @ApiProperty({ description: 'the value as recorded (any JSON value)' }) value: unknown;
  @ApiProperty() salt: string;
  @ApiProperty() commitment: string;
}

/** The SHA-256 of an exhibit file exactly as the account sent it, before it was normalised. */
export class PersonalExhibitAsSent {
  @ApiProperty() lot: string;
  @ApiProperty() seq: number;
  @ApiProperty() sha256: string;
}

export class PersonalRedactionRequest {
  @ApiProperty() lot: string;
  @ApiProperty() seq: number;
  @ApiProperty() note: string;
  @ApiProperty() status: string;
  @ApiProperty() createdAt: string;
}

export class PersonalRegistrarDecision {
  @ApiProperty() at: string;
  @ApiProperty() action: string;
  @ApiProperty({ type: String, nullable: true }) reason: string | null;
}

/** Everything Beadroll holds about one account, as the account's own download. */
export class PersonalDataResponse {
  @ApiProperty({ enum: ['beadroll-personal-data'] }) format: 'beadroll-personal-data';
  @ApiProperty({ enum: [1] }) version: 1;
  @ApiProperty() exportedAt: string;
  @ApiProperty({ type: PersonalAccount }) account: PersonalAccount;
  @ApiProperty({ type: [PersonalSession] }) sessions: PersonalSession[];
  @ApiProperty({ type: [PersonalEntry], description: 'every roll entry the account wrote' })
  entries: PersonalEntry[];
  @ApiProperty({
    type: [PersonalSealedDetail],
    description: 'the sealed values the account may read: its own, and transfer prices it was party to',
  })
  sealedDetails: PersonalSealedDetail[];
  @ApiProperty({ type: [String] }) lotsHeld: string[];
  @ApiProperty({
    type: [PersonalExhibitAsSent],
    description:
      'kept on the server only (never on a roll), so a file the registrar removed is refused if sent again',
  })
  exhibitsAsSent: PersonalExhibitAsSent[];
  @ApiProperty({ type: [PersonalRedactionRequest] }) redactionRequests: PersonalRedactionRequest[];
  @ApiProperty({ type: [PersonalRegistrarDecision] }) registrarDecisions: PersonalRegistrarDecision[];
}
