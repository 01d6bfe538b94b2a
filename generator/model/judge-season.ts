/**
 * What compares the segments of one season with each other: per indicator the
 * Benjamini–Hochberg q-values across the segments with a p-value (Benjamini & Hochberg 1995,
 * step-up procedure), the claimed direction, the region percentile and the count of segments
 * tested; per segment the modelled drift with its percentile and the level from the rule table.
 *
 * It reads only a small summary of each series (`SeriesSummary`), so a build that reuses the
 * summaries of unchanged series from an earlier build (generator/publish/cache/model-memo.ts) gets
 * exactly the values of a build that evaluated every series afresh: both run this same code.
 */
import { indicatorIds } from '../indicators/index.ts';
import { assessLevel, percentileRanker, type LevelInputs } from '../risk/assess-level.ts';
import type { RiskRule, ScenarioSettings } from '../scenario/settings.ts';
import type { DriftArrivals } from '../scenario/types.ts';
import { directionIfClear, directionWithQ } from './direction.ts';
import type { IndicatorEvaluation, TrendEngine } from './evaluation-types.ts';
import type { Direction, DriftBulletin, IndicatorId, LevelResult } from './types.ts';

/** The part of one series' evaluation that the comparison across segments reads. */
export interface SeriesSummary {
  /** false: the series is left out of the season (no values, or drift without a trend) */
  included: boolean;
  pValue: number | null;
  /** the direction claimed if the q-value passes (directionIfClear) */
  ifClear: Direction;
  probabilityUp: number | null;
  seasonValue: number | null;
  assessmentValue: number | null;
  cleanCoastIndex: number | null;
  /** at least one season value: the series takes part in the Regional Kendall test */
  hasValue: boolean;
}

export function summarizeSeries(evaluation: IndicatorEvaluation | null): SeriesSummary {
  if (evaluation === null) {
    return { included: false, pValue: null, ifClear: 'too-little-data', probabilityUp: null, seasonValue: null, assessmentValue: null, cleanCoastIndex: null, hasValue: false };
  }
  return {
    included: true,
    pValue: evaluation.pValue,
    ifClear: directionIfClear(evaluation.trend),
    probabilityUp: evaluation.probabilityUp,
    seasonValue: evaluation.seasonValue,
    assessmentValue: evaluation.assessmentValue,
    cleanCoastIndex: evaluation.cleanCoastIndex,
    hasValue: evaluation.values.some((v) => v.value !== null),
  };
}

/** The values of one included series that depend on the other segments. */
export interface IndicatorVerdict {
  indicator: IndicatorId;
  qValue: number | null;
  direction: Direction;
  regionPercentile: number | null;
  segmentsTested: number;
}

export interface SegmentVerdict {
  segmentId: string;
  /** the included indicators, in the order of indicatorIds */
  indicators: IndicatorVerdict[];
  drift: DriftBulletin | null;
  level: LevelResult;
  levelInputs: LevelInputs;
}

export interface SeasonVerdict {
  segments: Map<string, SegmentVerdict>;
  /** per indicator with at least one included series: the segments whose series has a value, in segment order */
  regionalSites: { indicator: IndicatorId; sites: string[] }[];
}

/**
 * Judges one season. `summaryOf(indicator, segmentId)` gives each series' summary; `segmentIds`
 * are sorted; `driftRows` are the season's modelled arrivals (the first row of a segment counts).
 */
export function judgeSeason(
  segmentIds: readonly string[],
  summaryOf: (indicator: IndicatorId, segmentId: string) => SeriesSummary,
  driftRows: readonly DriftArrivals[],
  settings: ScenarioSettings,
  rules: readonly RiskRule[],
  engine: Pick<TrendEngine, 'adjust'>,
): SeasonVerdict {
  const perSegment = new Map<string, { verdict: IndicatorVerdict; summary: SeriesSummary }[]>(segmentIds.map((id) => [id, []]));
  const regionalSites: SeasonVerdict['regionalSites'] = [];
  for (const indicator of indicatorIds) {
    const included: { segmentId: string; summary: SeriesSummary }[] = [];
    for (const segmentId of segmentIds) {
      const summary = summaryOf(indicator, segmentId);
      if (summary.included) included.push({ segmentId, summary });
    }
    // Benjamini–Hochberg across the region's segments with a p-value, this indicator, this season.
    const tested = included.filter((e) => e.summary.pValue !== null);
    const adjusted = tested.length > 0 ? engine.adjust(tested.map((e) => e.summary.pValue ?? 1)) : [];
    const qValues = new Map<string, number | null>();
    tested.forEach((e, i) => qValues.set(e.segmentId, adjusted[i] ?? null));
    const basis = (s: SeriesSummary): number | null => (indicator === 'drift-arrivals' ? s.seasonValue : s.assessmentValue);
    const percentileOf = percentileRanker(included.map((e) => basis(e.summary)));
    for (const e of included) {
      const qValue = qValues.get(e.segmentId) ?? null;
      perSegment.get(e.segmentId)?.push({
        summary: e.summary,
        verdict: {
          indicator,
          qValue,
          direction: directionWithQ(e.summary.ifClear, qValue, settings.trend.falseDiscoveryRate),
          regionPercentile: percentileOf(basis(e.summary)),
          segmentsTested: tested.length,
        },
      });
    }
    if (included.length > 0) regionalSites.push({ indicator, sites: included.filter((e) => e.summary.hasValue).map((e) => e.segmentId) });
  }

  // The first row of each segment this season (as a search through the rows would find it).
  const driftRowOf = new Map<string, DriftArrivals>();
  for (const row of driftRows) if (!driftRowOf.has(row.segmentId)) driftRowOf.set(row.segmentId, row);
  const driftPercentileOf = percentileRanker(segmentIds.map((id) => driftRowOf.get(id)?.arrivalsPerKm ?? 0));
  const segments = new Map<string, SegmentVerdict>();
  for (const segmentId of segmentIds) {
    const entries = perSegment.get(segmentId) ?? [];
    let drift: DriftBulletin | null = null;
    if (driftRows.length > 0) {
      const row = driftRowOf.get(segmentId);
      const own = row?.arrivalsPerKm ?? 0;
      drift = {
        arrivals: row?.arrivals ?? 0,
        arrivalsPerKm: own,
        regionPercentile: driftPercentileOf(own) ?? 50,
        nearestZone: row?.nearestZone ?? null,
      };
      const driftIndicator = entries.find((e) => e.verdict.indicator === 'drift-arrivals');
      if (driftIndicator) driftIndicator.verdict.regionPercentile = drift.regionPercentile;
    }
    const inputs: LevelInputs = {};
    for (const { verdict, summary } of entries) {
      inputs[verdict.indicator] = {
        assessmentMedian: summary.assessmentValue,
        cleanCoastIndex: summary.cleanCoastIndex,
        regionPercentile: verdict.regionPercentile,
        probabilityUp: summary.probabilityUp,
        direction: verdict.direction,
      };
    }
    if (drift && !inputs['drift-arrivals']) {
      inputs['drift-arrivals'] = {
        assessmentMedian: null,
        cleanCoastIndex: null,
        regionPercentile: drift.regionPercentile,
        probabilityUp: null,
        direction: 'too-little-data',
      };
    }
    segments.set(segmentId, { segmentId, indicators: entries.map((e) => e.verdict), drift, level: assessLevel(rules, inputs), levelInputs: inputs });
  }
  return { segments, regionalSites };
}
