import type {
  AnyBody,
  CombinedBody,
  DescribedBody,
  ObservedBody,
  SaleVoidedBody,
  EntryKind,
  ExhibitAddedBody,
  NoteBody,
  OpinionBody,
  OpinionRequestClosedBody,
  OpinionRequestedBody,
  OpinionWithdrawnBody,
  RedactedBody,
  RegisteredBody,
  RuleFacts,
  SplitBody,
  TransferAnswerBody,
  TransferOfferedBody,
} from './types.js';

/**
 * The rule facts of a body (format version 2 and later): the members the roll rules read, copied under
 * the same names. Pure. Precondition: `body` has the shape of `kind` (see `bodyIssues`); the
 * nonce and free text never appear in the result.
 */
export function factsOf(kind: EntryKind, body: AnyBody | Omit<AnyBody, 'nonce'>): RuleFacts {
  switch (kind) {
    case 'registered':
    case 'described': {
      const d = (body as RegisteredBody).description;
      const c = (body as DescribedBody).corrects;
      return {
        count: { value: d.count.value, estimated: d.count.estimated },
        listed: d.listed,
        ...(c ? { corrects: c.seq } : {}),
      };
    }
    case 'exhibit-added': {
      const b = body as ExhibitAddedBody;
      const request = b.request === undefined ? {} : { request: b.request };
      return 'exhibit' in b
        ? { original: b.exhibit.original.sha256, ...request }
        : { sealedOnly: true, ...request };
    }
    case 'opinion': {
      const b = body as OpinionBody;
      return { exhibits: [...b.exhibits], ...(b.request === undefined ? {} : { request: b.request }) };
    }
    case 'opinion-requested':
      return { assessor: (body as OpinionRequestedBody).assessor };
    case 'opinion-request-closed':
      return { request: (body as OpinionRequestClosedBody).request };
    case 'opinion-withdrawn':
      return { opinionSeq: (body as OpinionWithdrawnBody).opinionSeq };
    case 'transfer-offered':
      return { recipient: (body as TransferOfferedBody).recipient };
    case 'transfer-accepted':
    case 'transfer-declined':
    case 'transfer-withdrawn':
    case 'transfer-lapsed':
      return { offerSeq: (body as TransferAnswerBody).offerSeq };
    case 'split':
      return {
        children: (body as SplitBody).children.map((c) => ({
          lot: c.lot,
          count: { value: c.count.value, estimated: c.count.estimated },
        })),
      };
    case 'combined': {
      const b = body as CombinedBody;
      return { child: b.child, count: { value: b.count.value, estimated: b.count.estimated } };
    }
    case 'redacted':
      return { target: (body as RedactedBody).target };
    case 'note': {
      const ref = (body as NoteBody).ref;
      return ref === undefined ? {} : { ref };
    }
    case 'observed': {
      const c = (body as ObservedBody).corrects;
      return c ? { corrects: c.seq } : {};
    }
    case 'sale-voided':
      return { saleSeq: (body as SaleVoidedBody).saleSeq };
    case 'sold':
    case 'retired':
      return {};
  }
}

/**
 * True when a header's rule facts are exactly those of its body: the same members and values,
 * as their canonical texts would be equal (a member whose value is undefined is absent, as in
 * JSON). Compares the values themselves, so nothing is written out for each entry.
 */
export function factsMatchBody(
  kind: EntryKind,
  body: AnyBody | Omit<AnyBody, 'nonce'>,
  facts: RuleFacts,
): boolean {
  return sameJsonValue(factsOf(kind, body), facts);
}

function sameJsonValue(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (a === null || b === null || typeof a !== 'object' || typeof b !== 'object') return false;
  if (Array.isArray(a) !== Array.isArray(b)) return false;
  if (Array.isArray(a)) {
    const list = b as unknown[];
    if (a.length !== list.length) return false;
    for (let i = 0; i < a.length; i++) if (!sameJsonValue(a[i], list[i])) return false;
    return true;
  }
  const x = a as Record<string, unknown>;
  const y = b as Record<string, unknown>;
  let members = 0;
  for (const k in x) {
    if (!Object.prototype.hasOwnProperty.call(x, k) || x[k] === undefined) continue;
    members++;
    if (!Object.prototype.hasOwnProperty.call(y, k) || !sameJsonValue(x[k], y[k])) return false;
  }
  for (const k in y) if (Object.prototype.hasOwnProperty.call(y, k) && y[k] !== undefined) members--;
  return members === 0;
}
