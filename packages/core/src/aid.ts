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
import type { Decoration, Observations, Origin, Period, Technique } from './types.js';

/** What the aid looks at: the lot's clues, its decoration, and optionally an opinion being drafted. */
export interface AidInput {
  observations?: Observations;
  decoration?: Decoration[];
  draft?: { origin?: Origin; technique?: Technique; period?: Pick<Period, 'from' | 'to'> };
}

/** One ranked pointer towards an origin or technique, with every reason behind it. */
export interface Indication {
  origin?: Origin;
  technique?: Technique;
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
  'common-practice',
  'from-memory',
];

function bySourceStanding(sources: readonly AidSource[]): AidSource[] {
  return [...sources].sort((a, b) => STANDING_ORDER.indexOf(a.standing) - STANDING_ORDER.indexOf(b.standing));
}

function holds(when: AidCondition, input: AidInput): boolean {
  for (const [key, allowed] of Object.entries(when.observations ?? {})) {
    const value = input.observations?.[key as keyof Observations];
    if (value === undefined || !(allowed as string[]).includes(value as string)) return false;
  }
  if (when.decoration && !when.decoration.some((d) => input.decoration?.includes(d))) return false;
  if (when.origin && !(input.draft?.origin && when.origin.includes(input.draft.origin))) return false;
  if (when.technique && !(input.draft?.technique && when.technique.includes(input.draft.technique)))
    return false;
  return true;
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
    if (!holds(rule.when, input)) continue;
    const reason = { rule: rule.id, text: rule.reason, sources: bySourceStanding(rule.sources) };
    for (const origin of rule.points.origins ?? []) add(`origin:${origin}`, { origin }, rule.weight, reason);
    if (rule.points.technique)
      add(`technique:${rule.points.technique}`, { technique: rule.points.technique }, rule.weight, reason);
  }
  const indications = [...byKey.values()].sort(
    (a, b) =>
      b.score - a.score || (a.origin ?? a.technique ?? '').localeCompare(b.origin ?? b.technique ?? ''),
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
        sources: bySourceStanding(rule.sources),
      });
    }
  }

  const uvTested = input.observations?.uvA !== undefined && input.observations.uvA !== 'not-tested';
  const cautions = CAUTION_RULES.filter((rule) =>
    rule.when === 'always-with-uv-test' ? uvTested : holds(rule.when, input),
  ).map((rule) => ({
    rule: rule.id,
    text: rule.text,
    sources: bySourceStanding(rule.sources),
  }));

  return { indications, warnings, cautions, disclaimer: AID_DISCLAIMER };
}

/** The UV-A caution on its own, for screens where a UV test is chosen. */
export function uvCaution(): { text: string; points: readonly string[]; sources: AidSource[] } {
  const rule = CAUTION_RULES.find((r) => r.id === 'uv-a-torch')!;
  return { text: rule.text, points: UV_A_POINTS, sources: bySourceStanding(rule.sources) };
}
