/**
 * What compares the segments of one season with each other: per indicator the
 * Benjamini–Hochberg q-values across the segments with a p-value (Benjamini & Hochberg 1995,
 * step-up procedure), the claimed direction, the region percentile and the count of segments
 * tested; per segment the modelled drift with its percentile and the level from the rule table.
 * A segment with no survey value in the last four seasons gets no level ('not-set') unless other
 * evidence (the drift model) meets a rule; absence of evidence is never the lowest level.
 *
 * It reads only a small summary of each series (`SeriesSummary`), so a build that reuses the
 * summaries of unchanged series from an earlier build (generator/publish/cache/model-memo.ts) gets
 * exactly the values of a build that evaluated every series afresh: both run this same code.
 */
import { lowerFirst } from '../bulletin/indicator-words.ts';
import { formatNumber, formatPlain } from '../bulletin/numbers.ts';
import { noRecentSurveyNote, type LastSurvey } from '../bulletin/phrase-level.ts';
import { getIndicator, indicatorIds } from '../indicators/index.ts';
import { levelDefinition } from '../risk/levels.ts';
import { seasonRef } from './seasons.ts';
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
  /** the latest season with a value (its median), for saying what the last survey found */
  lastValue?: { season: string; value: number; censored: boolean } | null;
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
    lastValue: lastSeasonValue(evaluation),
  };
}

function lastSeasonValue(evaluation: IndicatorEvaluation): SeriesSummary['lastValue'] {
  for (let i = evaluation.values.length - 1; i >= 0; i -= 1) {
    const v = evaluation.values[i];
    if (v && v.value !== null) return { season: v.season, value: v.value, censored: v.censored };
  }
  return null;
}

/**
 * A level needs recent evidence. Where no series but the drift model has a value in the last four
 * seasons (the assessment window), absence of surveys is never read as the lowest level: with no
 * rule met the level is 'not-set', and where a rule of other evidence (the drift model) still sets
 * a level, the level keeps it with a note saying so. The note names what the last survey found.
 */
export function levelWithoutRecentSurvey(
  level: LevelResult,
  entries: readonly { indicator: IndicatorId; summary: SeriesSummary }[],
  settings: ScenarioSettings,
  rules: readonly RiskRule[] = [],
): LevelResult {
  // Surveys and samples; the drift model is not a survey, and a season with no animal reported
  // counts 0 reports, which is no survey either.
  const surveys = entries.filter((e) => e.indicator !== 'drift-arrivals' && e.indicator !== 'wildlife-reports');
  if (surveys.some((e) => e.summary.assessmentValue !== null)) return level;
  let last: { indicator: IndicatorId; value: NonNullable<SeriesSummary['lastValue']>; start: string } | null = null;
  for (const e of surveys) {
    const value = e.summary.lastValue;
    if (!value) continue;
    const start = seasonRef(value.season, settings.seasons)?.start ?? '';
    if (last === null || start > last.start) last = { indicator: e.indicator, value, start };
  }
  const lastSurvey: LastSurvey | null = last
    ? {
        seasonLabel: lowerFirst(seasonRef(last.value.season, settings.seasons)?.label ?? last.value.season),
        valueText: last.indicator === 'wildlife-reports' ? formatNumber(last.value.value, 0) : formatPlain(last.value.value),
        censored: last.value.censored,
        unit: getIndicator(last.indicator).unit,
      }
    : null;
  const top = level.hits[0];
  if (top) {
    const rule = rules.find((r) => r.id === top.ruleId);
    return { ...level, note: noRecentSurveyNote(lastSurvey, rule?.indicator === 'wildlife-reports' ? 'wildlife-reports' : 'drift-model') };
  }
  const none = levelDefinition('not-set');
  return { id: none.id, rank: none.rank, label: none.label, hits: [], note: noRecentSurveyNote(lastSurvey, null) };
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
    const level = levelWithoutRecentSurvey(
      assessLevel(rules, inputs),
      entries.map((e) => ({ indicator: e.verdict.indicator, summary: e.summary })),
      settings,
      rules,
    );
    segments.set(segmentId, { segmentId, indicators: entries.map((e) => e.verdict), drift, level, levelInputs: inputs });
  }
  return { segments, regionalSites };
}
