import { ApiExtraModels, ApiProperty, getSchemaPath, PickType } from '@nestjs/swagger';

/**
 * What the registry reports about an account that was ever verified, for public pages.
 * `former` means the account was verified once and is now closed. Every screen that names a
 * dealer or assessor shows this card or one of the parts of it below.
 */
export class DealerCard {
  @ApiProperty() id: string;
  @ApiProperty() handle: string;
  @ApiProperty() displayName: string;
  @ApiProperty() business: string;
  @ApiProperty() town: string;
  @ApiProperty() country: string;
  @ApiProperty({ description: 'RFC 3339 time the registrar first verified the account' })
  verifiedSince: string;
  @ApiProperty({ enum: ['verified', 'suspended', 'former'] }) status: 'verified' | 'suspended' | 'former';
  @ApiProperty({
    enum: ['dealer', 'assessor', 'registrar'],
    description: 'what the account does: a dealer, an independent assessor, or the registrar',
  })
  role: 'dealer' | 'assessor' | 'registrar';
}

/** A dealer or assessor as named beside their work (transfers, opinions): the card without its dates and role. */
export class PartyCard extends PickType(DealerCard, [
  'id',
  'handle',
  'displayName',
  'business',
  'town',
  'country',
  'status',
] as const) {}

/** The card's names alone, for lists that only need to say who. */
export class PartyName extends PickType(DealerCard, ['id', 'handle', 'displayName', 'business'] as const) {}

/** Cards by account id. */
@ApiExtraModels(DealerCard)
export class DealerCardsResponse {
  @ApiProperty({
    type: 'object',
    additionalProperties: { $ref: getSchemaPath(DealerCard) },
    description: 'cards by account id; ids never verified are left out',
  })
  cards: Record<string, DealerCard>;
}

/** The party part of a card. */
export function partyCard(card: DealerCard): PartyCard {
  const { id, handle, displayName, business, town, country, status } = card;
  return { id, handle, displayName, business, town, country, status };
}
