/**
 * Everything the model knows about one season, before any sentence is written: per segment and
 * indicator the season values, the trend (trend engine), the Benjamini–Hochberg q-value across the
 * region's segments, the claimed direction, the assessment median, the region percentile, the
 * modelled drift and the level from the rule table.
 *
 * Two steps: each series on its own (season-series.ts), then the comparison across segments
 * (judge-season.ts), which also names the series of the Regional Kendall test.
 */
import type { RiskRule } from '../scenario/settings.ts';
import type { LoadedScenario } from '../scenario/types.ts';
import type { IndicatorEvaluation, RegionalResult, SeasonEvaluation, SegmentEvaluation, TrendEngine } from './evaluation-types.ts';
import { judgeSeason, summarizeSeries, type IndicatorVerdict, type SegmentVerdict } from './judge-season.ts';
import { evaluateSeries, seasonContext, seriesKey, type SeasonContext, type SeasonSeries } from './season-series.ts';
import { toSeriesPoints } from './series.ts';
import { areaRegionalSites, scenarioAreas } from './areas.ts';
import type { IndicatorId } from './types.ts';

export type {
  IndicatorEvaluation,
  RegionalResult,
  SeasonEvaluation,
  SegmentEvaluation,
  TrendEngine,
  TrendOutcome,
  TrendRequest,
} from './evaluation-types.ts';
export { assessmentSeasons, minimumDataShortfall, minimumValuesPerSeason, useSeasonalTest } from './season-series.ts';

/** A series' own evaluation with the values that compare it with the other segments filled in. */
export function withVerdict(evaluation: IndicatorEvaluation, verdict: IndicatorVerdict): IndicatorEvaluation {
  return {
    ...evaluation,
    qValue: verdict.qValue,
    direction: verdict.direction,
    regionPercentile: verdict.regionPercentile,
    segmentsTested: verdict.segmentsTested,
  };
}

/** A segment's evaluation from its verdict and its series' own evaluations. */
export function segmentEvaluation(verdict: SegmentVerdict, own: (indicator: IndicatorId) => IndicatorEvaluation | null): SegmentEvaluation {
  return {
    segmentId: verdict.segmentId,
    indicators: verdict.indicators.map((v) => {
      const evaluation = own(v.indicator);
      if (!evaluation) throw new Error(`evaluateSeason: no evaluation of ${v.indicator} at ${verdict.segmentId}`);
      return withVerdict(evaluation, v);
    }),
    drift: verdict.drift,
    level: verdict.level,
    levelInputs: verdict.levelInputs,
  };
}

/** The Regional Kendall test over the named segments' series (null when it cannot run or fails). */
export function regionalTrend(
  context: SeasonContext,
  engine: TrendEngine,
  indicator: IndicatorId,
  sites: readonly string[],
  seriesOf: (indicator: IndicatorId, segmentId: string) => SeasonSeries,
): RegionalResult | null {
  const series = sites.map((site) => ({ site, points: toSeriesPoints(seriesOf(indicator, site).values) }));
  try {
    return engine.regional(series, { confidence: context.settings.trend.confidence });
  } catch {
    return null;
  }
}

/** Evaluate one season for every segment of the scenario. */
export function evaluateSeason(scenario: LoadedScenario, seasonId: string, rules: readonly RiskRule[], engine: TrendEngine): SeasonEvaluation {
  const context = seasonContext(scenario, seasonId);
  const evaluated = evaluateSeries(context, engine);
  const entryOf = (indicator: IndicatorId, segmentId: string) => {
    const entry = evaluated.get(seriesKey(indicator, segmentId));
    if (!entry) throw new Error(`evaluateSeason: series ${indicator} at ${segmentId} was not evaluated`);
    return entry;
  };
  const segmentIds = context.segments.map((s) => s.id);
  const driftRows = scenario.drift?.arrivals.filter((a) => a.season === seasonId) ?? [];
  const verdict = judgeSeason(segmentIds, (indicator, segmentId) => summarizeSeries(entryOf(indicator, segmentId).evaluation), driftRows, context.settings, rules, engine);
  const regional = verdict.regionalSites.map(({ indicator, sites }) => ({
    indicator,
    result: regionalTrend(context, engine, indicator, sites, (i, s) => entryOf(i, s).series),
    segments: sites.length,
  }));
  const areas = scenarioAreas(scenario.segments);
  const areaRegional = areas
    ? areaRegionalSites(areas, verdict.regionalSites).map(({ area, indicator, sites }) => ({
        area,
        indicator: indicator as IndicatorId,
        result: regionalTrend(context, engine, indicator as IndicatorId, sites, (i, s) => entryOf(i, s).series),
        segments: sites.length,
      }))
    : undefined;
  const segments = new Map<string, SegmentEvaluation>();
  for (const id of segmentIds) {
    const own = verdict.segments.get(id);
    if (own)
      segments.set(
        id,
        segmentEvaluation(own, (indicator) => entryOf(indicator, id).evaluation),
      );
  }
  const zones = scenario.drift?.zones.find((z) => z.season === seasonId)?.zones ?? [];
  return { season: context.season, segments, regional, zones, ...(areaRegional ? { areaRegional } : {}) };
}
