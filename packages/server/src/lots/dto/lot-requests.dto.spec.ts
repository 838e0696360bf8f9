import { AppError } from '../../common/app-error';
import { createValidationPipe } from '../../common/validation';
import { CombineLotsDto, SplitLotDto } from '../../lineage/dto/lineage-requests.dto';
import { RecordOpinionDto } from '../../opinions/dto/opinion-requests.dto';
import { CreateOfferDto, RecordSaleDto } from '../../transfers/dto/transfer-requests.dto';
import { CreateLotDto, DescribeLotDto, ListLotsQueryDto, ObserveLotDto } from './lot-requests.dto';

const good = {
  description: {
    title: 'Wound beads with pink roses',
    form: 'strand',
    count: { value: 40, estimated: false },
    diameterMm: { min: 8, max: 10.5 },
    colours: ['white'],
    baseGlass: ['opaque'],
    decoration: ['roses'],
    listed: true,
  },
  sealed: { acquisition: { cost: { amount: 4500, currency: 'EUR' } } },
};

async function fieldsOf(value: unknown, metatype: new () => object = CreateLotDto) {
  try {
    await createValidationPipe().transform(value, { type: 'body', metatype });
  } catch (e) {
    expect(e).toBeInstanceOf(AppError);
    return (e as AppError).fields!.map((f) => f.field);
  }
  return [];
}

function withDescription(over: Record<string, unknown>) {
  return { ...good, description: { ...good.description, ...over } };
}

describe('lot request validation', () => {
  it('accepts a good registration', async () => {
    expect(await fieldsOf(good)).toEqual([]);
  });

  it('names missing required parts', async () => {
    expect(await fieldsOf({})).toEqual(['description']);
    expect(await fieldsOf(withDescription({ count: undefined }))).toEqual(['description.count']);
  });

  it('names a nested part that is missing or not an object, once', async () => {
    const problems = async (value: unknown, metatype: new () => object = CreateLotDto) => {
      try {
        await createValidationPipe().transform(value, { type: 'body', metatype });
      } catch (e) {
        return (e as AppError).fields!;
      }
      return [];
    };
    for (const description of [undefined, null]) {
      expect(await problems({ description })).toEqual([
        { field: 'description', reason: 'description should not be null or undefined' },
      ]);
    }
    for (const description of ['a lot', 5, true, [], [good.description]]) {
      expect(await problems({ description })).toEqual([
        { field: 'description', reason: 'description must be an object' },
      ]);
    }
    expect(await fieldsOf({ description: [] }, DescribeLotDto)).toEqual(['description']);
    expect(await fieldsOf({ observations: [] }, ObserveLotDto)).toEqual(['observations']);
    expect(await fieldsOf({ ...good, observations: ['powder'] })).toEqual(['observations']);
    expect(await fieldsOf({ ...good, sealed: [] })).toEqual(['sealed']);
    expect(await fieldsOf({ ...good, sealed: { acquisition: 'an estate' } })).toEqual(['sealed.acquisition']);
    expect(await fieldsOf(withDescription({ count: [{ value: 1, estimated: false }] }))).toEqual([
      'description.count',
    ]);
    expect(await fieldsOf(withDescription({ diameterMm: [8, 10] }))).toEqual(['description.diameterMm']);
  });

  it('names a missing or non-object part in the other writes that nest objects', async () => {
    const child = { description: good.description };
    expect(await fieldsOf({ children: [child, {}] }, SplitLotDto)).toEqual(['children.1.description']);
    expect(await fieldsOf({ children: [child, 'x'] }, SplitLotDto)).toEqual(['children']);
    expect(
      await fieldsOf({ parts: [{ lot: 'A' }, { lot: 'B', count: [] }], description: [] }, CombineLotsDto),
    ).toEqual(['parts.1.count', 'description']);
    expect(await fieldsOf({ parts: [{ lot: 'A' }, { lot: 'B' }] }, CombineLotsDto)).toEqual(['description']);
    const opinion = await fieldsOf(
      { origin: 'venice', technique: 'wound', confidence: 'probable' },
      RecordOpinionDto,
    );
    expect(opinion).toContain('period');
    expect(await fieldsOf({ to: 'someone', price: [] }, CreateOfferDto)).toContain('price');
    expect(await fieldsOf({ date: '2026-05-01', price: 'EUR 40' }, RecordSaleDto)).toContain('price');
  });

  it('names a negative count', async () => {
    expect(await fieldsOf(withDescription({ count: { value: -1, estimated: false } }))).toEqual([
      'description.count.value',
    ]);
  });

  it('names a minimum diameter above the maximum', async () => {
    expect(await fieldsOf(withDescription({ diameterMm: { min: 12, max: 8 } }))).toEqual([
      'description.diameterMm.min',
    ]);
  });

  it('names an unknown currency and one written in lower case', async () => {
    // ISO 4217 has no code "ABC"; "eur" is the euro's code in the wrong case (ISO 4217 codes are capitals).
    const bad = (currency: string) => ({
      ...good,
      sealed: { acquisition: { cost: { amount: 1, currency } } },
    });
    expect(await fieldsOf(bad('ABC'))).toEqual(['sealed.acquisition.cost.currency']);
    expect(await fieldsOf(bad('eur'))).toEqual(['sealed.acquisition.cost.currency']);
    expect(await fieldsOf(bad('CHF'))).toEqual([]);
  });

  it('names over-long strings', async () => {
    expect(
      await fieldsOf(
        withDescription({ title: 'x'.repeat(201), colours: ['y'.repeat(201)], summary: 'z'.repeat(5001) }),
      ),
    ).toEqual(['description.title', 'description.summary', 'description.colours']);
  });

  it('names every unknown field, nested ones included', async () => {
    const fields = await fieldsOf({
      ...withDescription({ price: 12 }),
      cost: 3,
      sealed: { acquisition: { cost: { amount: 1, currency: 'EUR', salt: 'x' } } },
    });
    expect(fields.sort()).toEqual(['cost', 'description.price', 'sealed.acquisition.cost.salt']);
  });

  it('reads list filters from the query string', async () => {
    const q = (await createValidationPipe().transform(
      { listed: 'false', page: '2', form: 'strand' },
      { type: 'query', metatype: ListLotsQueryDto },
    )) as ListLotsQueryDto;
    expect(q).toMatchObject({ listed: false, page: 2, form: 'strand' });
    expect(await fieldsOf({ sort: 'price', pageSize: '1000' }, ListLotsQueryDto)).toEqual([
      'pageSize',
      'sort',
    ]);
  });
});
