/**
 * The level of a segment in one season, from a transparent rule table (settings.riskRules, or
 * defaultRiskRules when a scenario gives none). Every rule compares one measure of one indicator
 * with a number; the highest level among the matching rules sets the level; with no match the
 * level is "scant". Each match is kept as a hit whose text says which rule it was, so a bulletin
 * can show "why this level".
 *
 * Measures:
 * - assessment-median: the median of all values of the last four seasons (the EU macro-litter
 *   assessment uses the median, Van Loon et al. 2020).
 * - clean-coast-index: the median Clean Coast Index of the same surveys (Alkalay et al. 2007).
 * - region-percentile: where the segment sits among the region's segments this season (0 = lowest,
 *   100 = highest; see regionPercentile).
 * - probability-up: the bootstrap probability of an upward trend (Hirsch et al. 2015). It counts only
 *   where the rise also passes the Benjamini–Hochberg false-discovery check, so a level never rests
 *   on a rise the bulletin does not claim.
 */
import type { Direction, IndicatorId, LevelId, LevelResult, RuleHit } from '../model/types.ts';
import type { RiskRule } from '../scenario/settings.ts';
import { formatNumber, formatSignificant } from '../bulletin/numbers.ts';
import { chanceWords } from '../bulletin/phrase-trend.ts';
import { levelDefinition, levelRank } from './levels.ts';

export interface IndicatorMeasures {
  assessmentMedian: number | null;
  cleanCoastIndex: number | null;
  regionPercentile: number | null;
  probabilityUp: number | null;
  direction: Direction;
}

export type LevelInputs = Partial<Record<IndicatorId, IndicatorMeasures>>;

export function measureValue(rule: RiskRule, measures: IndicatorMeasures): number | null {
  switch (rule.measure) {
    case 'assessment-median':
      return measures.assessmentMedian;
    case 'clean-coast-index':
      return measures.cleanCoastIndex;
    case 'region-percentile':
      return measures.regionPercentile;
    case 'probability-up':
      return measures.direction === 'rising' ? measures.probabilityUp : null;
  }
}

function compare(value: number, op: RiskRule['op'], threshold: number): boolean {
  switch (op) {
    case '>=':
      return value >= threshold;
    case '>':
      return value > threshold;
    case '<=':
      return value <= threshold;
    case '<':
      return value < threshold;
  }
}

/** Print a measure the way the rule texts show it. */
export function formatMeasure(measure: RiskRule['measure'], value: number): string {
  if (measure === 'probability-up') return chanceWords(value);
  if (measure === 'region-percentile') return formatNumber(Math.round(value), 0);
  return formatSignificant(value, 2);
}

/** A threshold is an exact configured number: printed as written (20, 0.5), never padded to 2.0. */
export function formatThreshold(measure: RiskRule['measure'], value: number): string {
  if (measure === 'probability-up') return formatMeasure(measure, value);
  const decimals = (String(value).split('.')[1] ?? '').length;
  return formatNumber(value, decimals);
}

/** Fill {value} (measured, rounded to two significant figures) and {threshold} in a rule text. */
export function ruleText(rule: RiskRule, value: number): string {
  return rule.text.replaceAll('{value}', formatMeasure(rule.measure, value)).replaceAll('{threshold}', formatThreshold(rule.measure, rule.value));
}

/** Evaluate the rule table. Hits are ordered by level (highest first), then by table order. */
export function assessLevel(rules: readonly RiskRule[], inputs: LevelInputs): LevelResult {
  const hits: (RuleHit & { order: number })[] = [];
  rules.forEach((rule, order) => {
    const measures = inputs[rule.indicator];
    if (!measures) return;
    const value = measureValue(rule, measures);
    if (value === null || !Number.isFinite(value)) return;
    if (!compare(value, rule.op, rule.value)) return;
    hits.push({ ruleId: rule.id, level: rule.level, text: ruleText(rule, value), order });
  });
  hits.sort((a, b) => levelRank(b.level) - levelRank(a.level) || a.order - b.order);
  const top: LevelId = hits[0]?.level ?? 'scant';
  const definition = levelDefinition(top);
  return {
    id: definition.id,
    rank: definition.rank,
    label: definition.label,
    hits: hits.map(({ ruleId, level, text }) => ({ ruleId, level, text })),
  };
}

/**
 * Mid-rank percentile of `value` among `values` (which include it): 100 × (number below + half the
 * number of other equal values) / (n − 1). The highest segment gets 100, the lowest 0; a region of
 * one segment gets 50. Null when `value` is null.
 */
export function regionPercentile(value: number | null, values: readonly (number | null)[]): number | null {
  return percentileRanker(values)(value);
}

/**
 * regionPercentile of many values against one list: the list is sorted once and each value is
 * placed by binary search, so a whole region costs n log n instead of n² (same results).
 */
export function percentileRanker(values: readonly (number | null)[]): (value: number | null) => number | null {
  const known = values.filter((v): v is number => v !== null && Number.isFinite(v)).sort((a, b) => a - b);
  // index of the first element not less than (strict: greater than) x
  const bound = (x: number, strict: boolean): number => {
    let lo = 0;
    let hi = known.length;
    while (lo < hi) {
      const mid = (lo + hi) >>> 1;
      const v = known[mid] as number;
      if (v < x || (strict && v === x)) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  };
  return (value) => {
    if (value === null) return null;
    if (known.length <= 1) return 50;
    const below = bound(value, false);
    const equalOthers = Math.max(0, bound(value, true) - below - 1);
    return (100 * (below + equalOthers / 2)) / (known.length - 1);
  };
}
