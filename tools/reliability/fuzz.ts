// Fuzz: every route of the OpenAPI document gets bodies, queries and path parameters derived
// from its schemas and then made hostile (wrong types, NUL, lone surrogates, huge and deeply
// nested values, unknown fields, broken JSON), from an anonymous client and a signed-in dealer.
// No answer may be 500 or more.
import fc from 'fast-check';
import type { PgTarget } from '../lib/pg.ts';
import { Client, description, type Row, type ServerProcess, signedIn } from './harness.ts';

type Schema = {
  $ref?: string;
  type?: string;
  properties?: Record<string, Schema>;
  required?: string[];
  items?: Schema;
  enum?: unknown[];
  allOf?: Schema[];
  oneOf?: Schema[];
  anyOf?: Schema[];
  format?: string;
};
interface Operation {
  parameters?: Array<{ name: string; in: string; schema?: Schema }>;
  requestBody?: { content?: Record<string, { schema?: Schema }> };
}
type OpenApi = {
  paths: Record<string, Record<string, Operation>>;
  components?: { schemas?: Record<string, Schema> };
};

const NUL = String.fromCharCode(0);
const hostileText = fc.oneof(
  fc.string({ maxLength: 40 }),
  fc.string({ unit: 'binary', maxLength: 20 }),
  fc.constantFrom(
    NUL,
    `a${NUL}b`,
    '\uD800',
    'x\uDC00y',
    '\uD83D',
    '',
    ' ',
    '../../../etc/passwd',
    '<img src=x onerror=alert(1)>',
    "'; DROP TABLE lots; --",
    '%00',
    '0'.repeat(5000),
    'é'.repeat(3000),
    '1e309',
    'NaN',
    '00000000-0000-4000-8000-000000000000',
    'not-an-email@',
  ),
);
const hostileScalar = fc.oneof(
  hostileText,
  fc.integer(),
  fc.double(),
  fc.boolean(),
  fc.constant(null),
  fc.constantFrom(-1, 0, 2 ** 31, Number.MAX_SAFE_INTEGER, -Number.MAX_SAFE_INTEGER, 1e300, 0.5),
);
const hostileValue: fc.Arbitrary<unknown> = fc.letrec((tie) => ({
  value: fc.oneof(
    { depthSize: 'small' },
    hostileScalar,
    fc.array(tie('value'), { maxLength: 4 }),
    fc.dictionary(hostileText, tie('value'), { maxKeys: 4 }),
  ),
})).value;

function resolve(s: Schema | undefined, doc: OpenApi): Schema {
  let out = s ?? {};
  for (let i = 0; out.$ref && i < 20; i++) out = doc.components?.schemas?.[out.$ref.split('/').pop()!] ?? {};
  if (out.allOf?.length) return resolve(out.allOf[0], doc);
  if (out.oneOf?.length) return resolve(out.oneOf[0], doc);
  if (out.anyOf?.length) return resolve(out.anyOf[0], doc);
  return out;
}

/** A value shaped like the schema, each part of it sometimes replaced by something hostile. */
function fromSchema(s0: Schema | undefined, doc: OpenApi, depth = 0): fc.Arbitrary<unknown> {
  const s = resolve(s0, doc);
  if (depth > 6) return hostileScalar;
  let good: fc.Arbitrary<unknown>;
  if (s.enum?.length) good = fc.constantFrom(...s.enum);
  else if (s.type === 'object' || s.properties) {
    const props = s.properties ?? {};
    const shape: Record<string, fc.Arbitrary<unknown>> = {};
    for (const [k, v] of Object.entries(props)) shape[k] = fromSchema(v, doc, depth + 1);
    good = fc
      .tuple(
        fc.record(shape, { requiredKeys: [] }),
        fc.option(fc.dictionary(hostileText, hostileValue, { maxKeys: 2 }), { nil: undefined }),
      )
      .map(([o, extra]) => ({ ...(extra ?? {}), ...o }));
  } else if (s.type === 'array') good = fc.array(fromSchema(s.items, doc, depth + 1), { maxLength: 5 });
  else if (s.type === 'integer') good = fc.oneof(fc.integer({ min: -5, max: 50 }), fc.integer());
  else if (s.type === 'number')
    good = fc.oneof(fc.double({ noNaN: true, noDefaultInfinity: true }), fc.integer());
  else if (s.type === 'boolean') good = fc.boolean();
  else good = hostileText;
  return fc.oneof({ weight: 4, arbitrary: good }, { weight: 1, arbitrary: hostileValue });
}

/** Whole bodies no schema describes: deep nesting, broken JSON, a body too large, a lie about the type. */
const RAW_BODIES: Array<{ raw: string; type: string }> = [
  { raw: `${'['.repeat(30_000)}${']'.repeat(30_000)}`, type: 'application/json' },
  { raw: `{"a":${'{"a":'.repeat(5_000)}1${'}'.repeat(5_000)}}`, type: 'application/json' },
  { raw: '{"description": ', type: 'application/json' },
  { raw: JSON.stringify({ x: 'y'.repeat(2_000_000) }), type: 'application/json' },
  { raw: '<xml/>', type: 'application/xml' },
  { raw: 'a=1&a=2&b[c]=3', type: 'application/x-www-form-urlencoded' },
  { raw: '"just a string"', type: 'application/json' },
  { raw: 'null', type: 'application/json' },
  { raw: '{"__proto__":{"polluted":true},"constructor":{"prototype":{"x":1}}}', type: 'application/json' },
  {
    raw: '--x\r\nContent-Disposition: form-data; name="file"\r\n\r\n',
    type: 'multipart/form-data; boundary=x',
  },
];

/** Percent-encodes a path segment; one holding a lone surrogate becomes bytes that are not UTF-8 at all. */
function segment(value: string): string {
  try {
    return encodeURIComponent(value);
  } catch {
    return '%ED%A0%80';
  }
}

function concretePath(path: string, values: Record<string, string>): string {
  return path.replace(/\{([^}]+)\}/g, (_m, name: string) => segment(values[name] ?? 'x'));
}

export async function fuzzSection(
  server: ServerProcess,
  target: PgTarget,
  database: string,
  runsPerRoute: number,
  seed: number,
): Promise<Row[]> {
  const rows: Row[] = [];
  const dealer = await signedIn(server, target, database, 'dealer');
  const registrar = await signedIn(server, target, database, 'registrar');
  const anonymous = new Client(server);
  const lot = await dealer.write('POST', '/api/lots', { description: description('Fuzzed lot') });
  const realCode = (lot.body as { code: string }).code;
  const doc = (await anonymous.send('GET', '/api/docs-json')).body as OpenApi;
  const failures: string[] = [];
  let requests = 0;
  let routes = 0;
  const send = async (
    c: Client,
    method: string,
    path: string,
    body?: unknown,
    raw?: { raw: string; type: string },
    key?: string,
  ) => {
    requests++;
    try {
      const a = raw
        ? await c.send(method, path, undefined, { raw: raw.raw, contentType: raw.type, key })
        : await c.send(method, path, body, { key });
      if (a.status >= 500)
        failures.push(
          `${method} ${path} → ${a.status} ${JSON.stringify(body ?? raw?.raw ?? '').slice(0, 100)}`,
        );
    } catch (err) {
      failures.push(`${method} ${path} → no answer (${(err as Error).message})`);
    }
  };
  let n = 0;
  for (const [path, ops] of Object.entries(doc.paths)) {
    for (const [method, op] of Object.entries(ops)) {
      const m = method.toUpperCase();
      if (!['GET', 'POST', 'PUT', 'PATCH', 'DELETE'].includes(m)) continue;
      // Signing out would end the dealer's session for the rest of the run: anonymous only there.
      const who =
        path.includes('sign-out') || path.includes('/account/close')
          ? [anonymous]
          : [anonymous, dealer, registrar];
      routes++;
      const params = op.parameters ?? [];
      const pathParams = params.filter((p) => p.in === 'path');
      const queryParams = params.filter((p) => p.in === 'query');
      const bodySchema = Object.values(op.requestBody?.content ?? {})[0]?.schema;
      const arb = fc.record({
        path: fc.record(
          Object.fromEntries(
            pathParams.map((p) => [
              p.name,
              p.name === 'code' ? fc.oneof(fc.constant(realCode), hostileText) : hostileText.map(String),
            ]),
          ),
        ),
        query: fc.record(Object.fromEntries(queryParams.map((p) => [p.name, fromSchema(p.schema, doc)])), {
          requiredKeys: [],
        }),
        body: bodySchema ? fromSchema(bodySchema, doc) : fc.option(hostileValue, { nil: undefined }),
        key: fc.option(fc.oneof(fc.uuid(), hostileText), { nil: undefined }),
      });
      for (const sample of fc.sample(arb, { numRuns: runsPerRoute, seed: seed + n++ })) {
        const query: string[] = [];
        for (const [k, v] of Object.entries(sample.query as Record<string, unknown>))
          if (v !== undefined)
            query.push(`${k}=${segment(typeof v === 'string' ? v : (JSON.stringify(v) ?? ''))}`);
        const url =
          concretePath(path, sample.path as Record<string, string>) +
          (query.length ? `?${query.join('&')}` : '');
        const key =
          typeof sample.key === 'string' && /^[\x21-\x7e]*$/.test(sample.key) ? sample.key : undefined;
        for (const c of who) await send(c, m, url, m === 'GET' ? undefined : sample.body, undefined, key);
      }
      if (m !== 'GET')
        for (const raw of RAW_BODIES)
          for (const c of who) await send(c, m, concretePath(path, { code: realCode }), undefined, raw);
    }
  }
  rows.push({
    section: 'fuzz',
    check: `${routes} routes of the OpenAPI document`,
    detail: `${requests} hostile requests; ${failures.length} answered 500 or more${failures.length ? `: ${failures.slice(0, 3).join(' | ')}` : ''}`,
    ok: failures.length === 0 && routes > 10,
  });
  const health = await anonymous.send('GET', '/api/health').catch(() => ({ status: 0 }));
  rows.push({
    section: 'fuzz',
    check: 'server still answers afterwards',
    detail: `health ${health.status}`,
    ok: health.status === 200,
  });
  return rows;
}
