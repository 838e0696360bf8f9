import {
  AID_DISCLAIMER,
  CAUTION_RULES,
  INDICATION_RULES,
  PERIOD_RULES,
  SOURCE_STANDINGS,
  UV_A_POINTS,
  type AidCondition,
  type AidSource,
  type SourceStanding,
} from './aid-rules.js';
import type { Decoration, Observations, Origin, Period, Qualifier, Technique } from './types.js';
import type { VerifiedEntry } from './verify.js';

/**
 * What the aid looks at: the lot's clues, its decoration, what is written on it (title,
 * description, notes, opinions' words), the origins its recorded opinions name, and optionally
 * an opinion being drafted.
 */
export interface AidInput {
  observations?: Observations;
  decoration?: Decoration[];
  words?: string[];
  recordedOrigins?: Origin[];
  draft?: { origin?: Origin; technique?: Technique; period?: Pick<Period, 'from' | 'to'> };
}

/** One ranked pointer towards an origin, a technique or a later copy, with every reason behind it. */
export interface Indication {
  origin?: Origin;
  technique?: Technique;
  /** Set when the clues point to recent work in an older style rather than to a place. */
  qualifier?: Qualifier;
  score: number;
  reasons: { rule: string; text: string; sources: AidSource[] }[];
}

/** A period that starts before something it claims existed. */
export interface PlausibilityWarning {
  rule: string;
  message: string;
  notBefore: number;
  /** true: the whole period is earlier; false: only its start is. */
  wholePeriod: boolean;
  /** true when the clue behind it is itself only a hint: the period may, not must, be too early. */
  clueIsHint: boolean;
  sources: AidSource[];
}

export interface AidResult {
  indications: Indication[];
  warnings: PlausibilityWarning[];
  cautions: { rule: string; text: string; sources: AidSource[] }[];
  disclaimer: string;
}

function bySourceStanding(sources: readonly AidSource[]): AidSource[] {
  const rank = (s: SourceStanding) => SOURCE_STANDINGS.indexOf(s);
  return [...sources].sort((a, b) => rank(a.standing) - rank(b.standing));
}

/** Whether `text` holds `word` as a whole word or phrase, in any case. */
function mentions(text: string, word: string): boolean {
  const escaped = word.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  return new RegExp(`(^|[^\\p{L}\\p{N}])${escaped}($|[^\\p{L}\\p{N}])`, 'iu').test(text);
}

function holds(when: AidCondition, input: AidInput, indicated: readonly Origin[] = []): boolean {
  for (const [key, allowed] of Object.entries(when.observations ?? {})) {
    const value = input.observations?.[key as keyof Observations];
    if (value === undefined || !(allowed as string[]).includes(value as string)) return false;
  }
  if (when.decoration && !when.decoration.some((d) => input.decoration?.includes(d))) return false;
  if (when.origin && !(input.draft?.origin && when.origin.includes(input.draft.origin))) return false;
  if (when.technique && !(input.draft?.technique && when.technique.includes(input.draft.technique)))
    return false;
  if (when.words && !when.words.some((w) => (input.words ?? []).some((t) => mentions(t, w)))) return false;
  if (when.indicated && !when.indicated.some((o) => indicated.includes(o))) return false;
  if (when.recordedOrigin && !when.recordedOrigin.some((o) => input.recordedOrigins?.includes(o)))
    return false;
  return true;
}

function cautionsFor(input: AidInput, indicated: readonly Origin[]): AidResult['cautions'] {
  const uvTested = input.observations?.uvA !== undefined && input.observations.uvA !== 'not-tested';
  return CAUTION_RULES.filter((rule) =>
    rule.when === 'always-with-uv-test'
      ? uvTested
      : rule.when.some((condition) => holds(condition, input, indicated)),
  ).map((rule) => ({
    rule: rule.id,
    text: rule.text,
    sources: bySourceStanding(rule.sources),
  }));
}

/**
 * The attribution aid: ranked indications from the clues, plausibility warnings for a drafted
 * period, and the safety cautions that apply. Pure; the rules are data (aid-rules.ts), each with
 * its source. Preconditions: none — missing clues simply match no rule.
 */
export function attributionAid(input: AidInput): AidResult {
  const byKey = new Map<string, Indication>();
  const add = (
    key: string,
    seed: Omit<Indication, 'score' | 'reasons'>,
    weight: number,
    reason: Indication['reasons'][number],
  ) => {
    const ind = byKey.get(key) ?? { ...seed, score: 0, reasons: [] };
    ind.score += weight;
    ind.reasons.push(reason);
    byKey.set(key, ind);
  };
  for (const rule of INDICATION_RULES) {
    if (!holds(rule.when, input) || (rule.unless && holds(rule.unless, input))) continue;
    const reason = { rule: rule.id, text: rule.reason, sources: bySourceStanding(rule.sources) };
    for (const origin of rule.points.origins ?? []) add(`origin:${origin}`, { origin }, rule.weight, reason);
    const techniques = [
      ...(rule.points.technique ? [rule.points.technique] : []),
      ...(rule.points.techniques ?? []),
    ];
    for (const technique of techniques) add(`technique:${technique}`, { technique }, rule.weight, reason);
    if (rule.points.qualifier)
      add(`qualifier:${rule.points.qualifier}`, { qualifier: rule.points.qualifier }, rule.weight, reason);
  }
  const label = (i: Indication) => i.origin ?? i.technique ?? i.qualifier ?? '';
  const indications = [...byKey.values()].sort(
    (a, b) => b.score - a.score || label(a).localeCompare(label(b)),
  );

  const warnings: PlausibilityWarning[] = [];
  const period = input.draft?.period;
  if (period) {
    for (const rule of PERIOD_RULES) {
      if (period.from >= rule.notBefore || !holds(rule.when, input)) continue;
      warnings.push({
        rule: rule.id,
        message: rule.message,
        notBefore: rule.notBefore,
        wholePeriod: period.to < rule.notBefore,
        clueIsHint: rule.clueIsHint === true,
        sources: bySourceStanding(rule.sources),
      });
    }
  }

  const indicated = indications.flatMap((i) => (i.origin ? [i.origin] : []));
  const cautions = cautionsFor(input, indicated);

  return { indications, warnings, cautions, disclaimer: AID_DISCLAIMER };
}

/**
 * The safety cautions a lot's record calls for wherever it is shown (a dealer's lot page, the
 * public page, a form being filled in): uranium handling for a green glow or uranium named in
 * its words, lead for lead glass or crystal named, an origin in China recorded or suggested by
 * the clues, and the others of the aid. Pure; the same rules as `attributionAid`.
 */
export function safetyCautions(input: AidInput): AidResult['cautions'] {
  return attributionAid(input).cautions;
}

/** The UV-A caution on its own, for screens where a UV test is chosen. */
export function uvCaution(): { text: string; points: readonly string[]; sources: AidSource[] } {
  const rule = CAUTION_RULES.find((r) => r.id === 'uv-a-torch')!;
  return { text: rule.text, points: UV_A_POINTS, sources: bySourceStanding(rule.sources) };
}

/** The cautions about handling a lot itself, shown with its record: uranium, lead, foil. */
export const HANDLING_CAUTIONS: readonly string[] = ['uranium-handling', 'lead-glass', 'foil-cleaning'];

/**
 * What a lot's record says that bears on safety, gathered from its verified entries (bodies that
 * were redacted are skipped): every observation recorded, every word written (titles,
 * descriptions, notes, opinions, captions), every origin an opinion names. Feed it to
 * `safetyCautions`. Pure; reads only the bodies given.
 */
export function safetyInputOf(entries: readonly Pick<VerifiedEntry, 'body'>[]): AidInput {
  const observations: Observations = {};
  const decoration = new Set<Decoration>();
  const words: string[] = [];
  const recordedOrigins = new Set<Origin>();
  const add = (...texts: (string | undefined)[]) => {
    for (const t of texts) if (t) words.push(t);
  };
  for (const { body } of entries) {
    if (!body) continue;
    const b = body as unknown as Record<string, unknown>;
    const d = b.description as
      | {
          title?: string;
          summary?: string;
          colours?: string[];
          decoration?: Decoration[];
          decorationNote?: string;
          condition?: string;
        }
      | undefined;
    if (d) {
      add(d.title, d.summary, d.decorationNote, d.condition, ...(d.colours ?? []));
      for (const x of d.decoration ?? []) decoration.add(x);
    }
    const o = b.observations as Observations | undefined;
    if (o) {
      // A green glow recorded once stays on the record, even if a later look left the test out.
      for (const [k, v] of Object.entries(o)) {
        if (k === 'note') add(v as string);
        else if (!(k === 'uvA' && observations.uvA === 'green-glow'))
          (observations as Record<string, unknown>)[k] = v;
      }
    }
    if (typeof b.origin === 'string') {
      recordedOrigins.add(b.origin as Origin);
      add(b.originNote as string | undefined, b.rationale as string | undefined);
      if (typeof b.decoration === 'string') add(b.decoration);
    }
    if (typeof b.text === 'string') add(b.text);
    if (typeof b.note === 'string') add(b.note);
    const exhibit = b.exhibit as { caption?: string } | undefined;
    if (exhibit?.caption) add(exhibit.caption);
  }
  return { observations, decoration: [...decoration], words, recordedOrigins: [...recordedOrigins] };
}

/** The handling cautions a lot's verified record calls for (see `HANDLING_CAUTIONS`). */
export function recordCautions(entries: readonly Pick<VerifiedEntry, 'body'>[]): AidResult['cautions'] {
  return safetyCautions(safetyInputOf(entries)).filter((c) => HANDLING_CAUTIONS.includes(c.rule));
}
