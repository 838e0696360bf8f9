import {
  AID_DISCLAIMER,
  CAUTION_RULES,
  INDICATION_RULES,
  PERIOD_RULES,
  UV_A_POINTS,
  type AidCondition,
  type AidSource,
  type SourceStanding,
} from './aid-rules.js';
import type { Decoration, Observations, Origin, Period, Qualifier, Technique } from './types.js';

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

const STANDING_ORDER: SourceStanding[] = [
  'museum',
  'standard',
  'scholar',
  'trade-page',
  'student-page',
  'common-practice',
  'from-memory',
];

function bySourceStanding(sources: readonly AidSource[]): AidSource[] {
  return [...sources].sort((a, b) => STANDING_ORDER.indexOf(a.standing) - STANDING_ORDER.indexOf(b.standing));
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
