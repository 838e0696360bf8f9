import { ApiProperty } from '@nestjs/swagger';

/** Lots and what they cost, in one currency. */
export class CostTotal {
  @ApiProperty() lots: number;
  @ApiProperty({ description: 'sum of acquisition costs, integer minor units' }) cost: number;
}

/** Stock held in one group (an origin, or a century of the attribution on record). */
export class StockGroup extends CostTotal {
  @ApiProperty({ description: 'origin code, century start year as text, or "none"' }) key: string;
}

/** Sales in one month ("2026-11") or year ("2026"), in one currency. */
export class SalesPeriod {
  @ApiProperty() period: string;
  @ApiProperty() sales: number;
  @ApiProperty({ description: 'sum of sale prices, integer minor units' }) revenue: number;
  @ApiProperty({ description: 'acquisition cost of the sales that have one in this currency' }) cost: number;
  @ApiProperty({ description: 'revenue minus cost, over the sales with a known cost only' }) margin: number;
  @ApiProperty({ description: 'sales whose cost is unknown or in another currency' }) withoutCost: number;
}

/** Figures in one currency. */
export class CurrencyFigures {
  @ApiProperty({ description: 'ISO 4217 code' }) currency: string;
  @ApiProperty({ description: 'ISO 4217 minor digits' }) minorDigits: number;
  @ApiProperty({ type: CostTotal }) stock: CostTotal;
  @ApiProperty({ type: [StockGroup] }) stockByOrigin: StockGroup[];
  @ApiProperty({ type: [StockGroup] }) stockByCentury: StockGroup[];
  @ApiProperty({ type: [SalesPeriod] }) salesByMonth: SalesPeriod[];
  @ApiProperty({ type: [SalesPeriod] }) salesByYear: SalesPeriod[];
}

/** The dealer's own stock and sales figures, from their own sealed values only. */
export class StockSummaryResponse {
  @ApiProperty({ type: [CurrencyFigures] }) currencies: CurrencyFigures[];
  @ApiProperty({ description: 'lots held with no acquisition cost recorded' }) lotsWithoutCost: number;
  @ApiProperty({ description: 'lots held (held or offered)' }) lotsHeld: number;
  @ApiProperty({ description: 'sales whose price the dealer did not record' }) salesWithoutPrice: number;
}
