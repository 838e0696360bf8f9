import { AppError } from '../../common/app-error';
import { createValidationPipe } from '../../common/validation';
import { CreateLotDto, ListLotsQueryDto } from './lot-requests.dto';

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
