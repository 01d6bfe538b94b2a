/**
 * Everything the model knows about one season, before any sentence is written: per segment and
 * indicator the season values, the trend (trend engine), the Benjamini–Hochberg q-value across the
 * region's segments, the claimed direction, the assessment median, the region percentile, the
 * modelled drift and the level from the rule table.
 */
import { getIndicator, indicatorIds } from '../indicators/index.ts';
import { assessLevel, percentileRanker, type LevelInputs } from '../risk/assess-level.ts';
import type { RiskRule, ScenarioSettings } from '../scenario/settings.ts';
import type { DriftArrivals, LoadedScenario, Record as ScenarioRecord } from '../scenario/types.ts';
import type { SeriesPoint, TrendOptions, TrendResult } from '../stats/types.ts';
import { decideDirection, trendPValue } from './direction.ts';
import { derivedSeed } from './seed.ts';
import { parseSeasonId, previousSeasonId, seasonMidYear, seasonOfDate, seasonRef } from './seasons.ts';
import { censoredMedian, median, seasonValues, toSeriesPoints, type SeasonValue } from './series.ts';
import type { AccumulationZone, Direction, DriftBulletin, IndicatorId, LevelResult, Observation, SeasonRef } from './types.ts';

/** The statistics the model needs; the real one is in trend-engine.ts, tests may pass their own. */
export interface TrendEngine {
  analyze(points: SeriesPoint[], options: TrendOptions & { minValues?: number; minYears?: number }): TrendResult;
  /** Benjamini–Hochberg adjusted p-values, same order as the input. */
  adjust(pValues: readonly number[]): number[];
  /** Regional Kendall over several segments' series (sites as blocks); null when it cannot run. */
  regional(series: { site: string; points: SeriesPoint[] }[], options: { confidence: number }): RegionalResult | null;
  /**
   * Optional: every series of a season at once (same results as `analyze` one by one, in request
   * order; an error is returned, not thrown), so an engine can spread them over several cores.
   */
  analyzeMany?(requests: readonly TrendRequest[]): TrendOutcome[];
}

export interface TrendRequest {
  points: SeriesPoint[];
  options: TrendOptions & { minValues?: number; minYears?: number };
}

/** The result of one request, or the message of the error it raised. */
export type TrendOutcome = { result: TrendResult } | { error: string };

export interface RegionalResult {
  S: number | null;
  z: number | null;
  p: number | null;
  slope: number | null;
  /** false when p is the plain test's because the cross-site covariance correction could not be computed */
  covarianceCorrected?: boolean;
}

export interface IndicatorEvaluation {
  indicator: IndicatorId;
  values: SeasonValue[];
  observations: Observation[];
  trend: TrendResult | null;
  pValue: number | null;
  qValue: number | null;
  direction: Direction;
  probabilityUp: number | null;
  seasonValue: number | null;
  assessmentValue: number | null;
  cleanCoastIndex: number | null;
  regionPercentile: number | null;
  segmentsTested: number;
  sampleCount: number;
  yearSpan: { first: number; last: number } | null;
}

export interface SegmentEvaluation {
  segmentId: string;
  indicators: IndicatorEvaluation[];
  drift: DriftBulletin | null;
  level: LevelResult;
  /** The measures the level was assessed on (to explain a level change). */
  levelInputs: LevelInputs;
}

export interface SeasonEvaluation {
  season: SeasonRef;
  segments: Map<string, SegmentEvaluation>;
  regional: { indicator: IndicatorId; result: RegionalResult | null; segments: number }[];
  zones: AccumulationZone[];
}

/** The last four seasons ending with `season`, oldest first (the assessment period). */
export function assessmentSeasons(season: string, settings: ScenarioSettings): string[] {
  const out = [season];
  let current: string | null = season;
  while (out.length < 4 && current !== null) {
    current = previousSeasonId(current, settings.seasons);
    if (current) out.unshift(current);
  }
  return out;
}

function noteOf(record: ScenarioRecord): string | undefined {
  const species = record.extra['species'];
  if (typeof species === 'string' && species.length > 0) return species;
  const mesh = record.extra['meshUm'] ?? record.extra['mesh_um'];
  if (typeof mesh === 'number') return `mesh ${mesh} µm`;
  return undefined;
}

/** Seasons counted as "enough data" for the Seasonal Kendall test: at least 3 values in a season. */
export const minimumValuesPerSeason = 3;

/** Seasonal Kendall when two or more seasons each have at least three values. */
export function useSeasonalTest(values: readonly SeasonValue[]): boolean {
  const counts = new Map<string, number>();
  for (const v of values) if (v.value !== null) counts.set(v.seasonName, (counts.get(v.seasonName) ?? 0) + 1);
  return [...counts.values()].filter((n) => n >= minimumValuesPerSeason).length >= 2;
}

/** The scenario's minimum-data rule (settings.trend.minValues, minYears); null when met. */
export function minimumDataShortfall(values: readonly SeasonValue[], settings: ScenarioSettings): { rule: string; reason: string } | null {
  const known = values.filter((v) => v.value !== null);
  const years = new Set(known.map((v) => parseSeasonId(v.season)?.year ?? Math.floor(v.t)));
  if (known.length < settings.trend.minValues) {
    return {
      rule: 'min-values',
      reason: `only ${known.length} ${known.length === 1 ? 'season has' : 'seasons have'} samples, and we need at least ${settings.trend.minValues}`,
    };
  }
  if (years.size < settings.trend.minYears) {
    return { rule: 'min-years', reason: `the samples cover only ${years.size} years, and we need at least ${settings.trend.minYears}` };
  }
  return null;
}

function emptyTrend(values: readonly SeasonValue[], insufficient: { rule: string; reason: string }): TrendResult {
  const known = values.filter((v) => v.value !== null);
  return {
    n: known.length,
    nCensored: known.filter((v) => v.censored).length,
    mannKendall: null,
    sen: null,
    seasonalKendall: null,
    probabilityUp: null,
    band: null,
    insufficient,
  };
}

interface PendingTrend {
  request: TrendRequest;
  shortfall: ReturnType<typeof minimumDataShortfall>;
}

/** What to ask the engine for one series; null when it holds no value. */
function trendRequest(values: readonly SeasonValue[], settings: ScenarioSettings, seed: number): PendingTrend | null {
  if (values.every((v) => v.value === null)) return null;
  const shortfall = minimumDataShortfall(values, settings);
  const seasonal = useSeasonalTest(values);
  const options: TrendOptions & { minValues?: number; minYears?: number } = {
    confidence: settings.trend.confidence,
    minValues: settings.trend.minValues,
    minYears: settings.trend.minYears,
    seasonal,
    bootstrap: shortfall || settings.trend.bootstrapResamples === 0 ? false : { resamples: settings.trend.bootstrapResamples, seed },
  };
  return { request: { points: toSeriesPoints(values), options }, shortfall };
}

/** The trend of one series from the engine's outcome. */
function finishTrend(values: readonly SeasonValue[], pending: PendingTrend, outcome: TrendOutcome): TrendResult {
  const { shortfall } = pending;
  if ('error' in outcome) return emptyTrend(values, shortfall ?? { rule: 'engine', reason: outcome.error });
  const result = outcome.result;
  return shortfall ? { ...result, insufficient: result.insufficient ?? shortfall } : result;
}

function runTrend(
  engine: TrendEngine,
  values: readonly SeasonValue[],
  settings: ScenarioSettings,
  seed: number,
): TrendResult | null {
  const pending = trendRequest(values, settings, seed);
  if (!pending) return null;
  let outcome: TrendOutcome;
  try {
    outcome = { result: engine.analyze(pending.request.points, pending.request.options) };
  } catch (error) {
    outcome = { error: error instanceof Error ? error.message : String(error) };
  }
  return finishTrend(values, pending, outcome);
}

function driftValues(rows: readonly DriftArrivals[], until: SeasonRef, settings: ScenarioSettings): SeasonValue[] {
  const out: SeasonValue[] = [];
  for (const row of rows) {
    const ref = seasonRef(row.season, settings.seasons);
    if (!ref || ref.end > until.end) continue;
    out.push({ season: row.season, seasonName: parseSeasonId(row.season)?.name ?? row.season, t: seasonMidYear(ref), value: row.arrivalsPerKm, censored: false, samples: 1 });
  }
  return out.sort((a, b) => a.t - b.t);
}

/** Evaluate one season for every segment of the scenario. */
export function evaluateSeason(scenario: LoadedScenario, seasonId: string, rules: readonly RiskRule[], engine: TrendEngine): SeasonEvaluation {
  const settings = scenario.settings;
  const season = seasonRef(seasonId, settings.seasons);
  if (!season) throw new Error(`evaluateSeason: season ${seasonId} matches no season definition`);
  const assessment = new Set(assessmentSeasons(seasonId, settings));
  const segments = [...scenario.segments].sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));

  const byKey = new Map<string, ScenarioRecord[]>();
  const monitored = new Map<IndicatorId, { first: string; last: string; firstStart: string; lastStart: string }>();
  for (const record of scenario.records) {
    const key = `${record.indicator}\u0000${record.segmentId}`;
    const list = byKey.get(key) ?? [];
    list.push(record);
    byKey.set(key, list);
    const ref = seasonRef(record.season, settings.seasons);
    if (!ref) continue;
    const m = monitored.get(record.indicator);
    if (!m) monitored.set(record.indicator, { first: record.season, last: record.season, firstStart: ref.start, lastStart: ref.start });
    else {
      if (ref.start < m.firstStart) Object.assign(m, { first: record.season, firstStart: ref.start });
      if (ref.start > m.lastStart) Object.assign(m, { last: record.season, lastStart: ref.start });
    }
  }

  // When the scenario says when monitoring began, every season from then to this one is monitored.
  const startSeason = settings.monitoringStart ? seasonOfDate(settings.monitoringStart, settings.seasons) : null;
  const startRef = startSeason ? seasonRef(startSeason, settings.seasons) : null;
  if (startSeason && startRef) {
    for (const m of monitored.values()) Object.assign(m, { first: startSeason, firstStart: startRef.start, last: seasonId, lastStart: season.start });
  }

  // Modelled arrivals per segment (every season), indexed once.
  const driftBySegment = new Map<string, DriftArrivals[]>();
  for (const row of scenario.drift?.arrivals ?? []) {
    const list = driftBySegment.get(row.segmentId);
    if (list) list.push(row);
    else driftBySegment.set(row.segmentId, [row]);
  }

  const perSegment = new Map<string, IndicatorEvaluation[]>(segments.map((s) => [s.id, []]));
  const regional: SeasonEvaluation['regional'] = [];

  const seriesOf = (indicator: IndicatorId, segmentId: string): { records: ScenarioRecord[]; values: SeasonValue[] } => {
    const records = (byKey.get(`${indicator}\u0000${segmentId}`) ?? []).filter((r) => r.date <= season.end && r.value !== null);
    const values =
      indicator === 'drift-arrivals' && records.length === 0
        ? driftValues(driftBySegment.get(segmentId) ?? [], season, settings)
        : seasonValues(records, {
            aggregation: getIndicator(indicator).aggregation,
            untilSeason: season,
            definitions: settings.seasons,
            monitored: monitored.get(indicator) ?? null,
          });
    return { records, values };
  };

  // An engine that takes many series at once gets the whole season in one batch (same results,
  // same order as one by one).
  const seasonSeries = new Map<string, { records: ScenarioRecord[]; values: SeasonValue[] }>();
  let batched: Map<string, TrendResult> | null = null;
  if (engine.analyzeMany) {
    const keys: string[] = [];
    const pendings: PendingTrend[] = [];
    for (const indicator of indicatorIds) {
      for (const segment of segments) {
        const key = `${indicator}\u0000${segment.id}`;
        const found = seriesOf(indicator, segment.id);
        seasonSeries.set(key, found);
        if (found.values.length === 0) continue;
        const pending = trendRequest(found.values, settings, derivedSeed(settings.trend.seed, segment.id, indicator, seasonId));
        if (!pending) continue;
        keys.push(key);
        pendings.push(pending);
      }
    }
    const outcomes = engine.analyzeMany(pendings.map((p) => p.request));
    batched = new Map();
    keys.forEach((key, i) => {
      const values = seasonSeries.get(key)?.values ?? [];
      batched?.set(key, finishTrend(values, pendings[i] as PendingTrend, outcomes[i] ?? { error: 'no result from the trend engine' }));
    });
  }

  for (const indicator of indicatorIds) {
    const definition = getIndicator(indicator);
    const evaluations: { segmentId: string; evaluation: IndicatorEvaluation }[] = [];
    for (const segment of segments) {
      const key = `${indicator}\u0000${segment.id}`;
      const { records, values } = seasonSeries.get(key) ?? seriesOf(indicator, segment.id);
      if (values.length === 0) continue;
      const trend = batched ? (batched.get(key) ?? null) : runTrend(engine, values, settings, derivedSeed(settings.trend.seed, segment.id, indicator, seasonId));
      // Modelled arrivals are listed as an indicator only once their series can carry a trend; until
      // then the season's figures live in the drift part of the bulletin alone.
      if (indicator === 'drift-arrivals' && (!trend || trend.insufficient)) continue;
      const inSeason = records.filter((r) => r.season === seasonId);
      const inAssessment = records.filter((r) => assessment.has(r.season));
      const seasonValue =
        definition.aggregation === 'season-total' || records.length === 0
          ? (values.find((v) => v.season === seasonId)?.value ?? null)
          : (censoredMedian(inSeason.map((r) => ({ value: r.value ?? 0, censored: r.censored })))?.value ?? null);
      const assessmentValue =
        definition.aggregation === 'season-total' || records.length === 0
          ? median(values.filter((v) => assessment.has(v.season) && v.value !== null).map((v) => v.value ?? 0))
          : median(inAssessment.map((r) => r.value ?? 0));
      const cci = median(
        inAssessment.map((r) => r.extra['cleanCoastIndex']).filter((x): x is number => typeof x === 'number' && Number.isFinite(x)),
      );
      const years = values.filter((v) => v.value !== null).map((v) => parseSeasonId(v.season)?.year ?? Math.floor(v.t));
      evaluations.push({
        segmentId: segment.id,
        evaluation: {
          indicator,
          values,
          observations:
            records.length > 0
              ? records.map((r) => {
                  const note = noteOf(r);
                  return { date: r.date, t: r.t, season: r.season, value: r.value, censored: r.censored, ...(note ? { note } : {}) };
                })
              : values.map((v) => ({ date: seasonRef(v.season, settings.seasons)?.end ?? '', t: v.t, season: v.season, value: v.value, censored: false })),
          trend,
          pValue: trendPValue(trend),
          qValue: null,
          direction: 'too-little-data',
          // A chance of a rise means nothing where the data cannot carry a trend.
          probabilityUp: trend && !trend.insufficient ? (trend.probabilityUp ?? null) : null,
          seasonValue,
          assessmentValue,
          cleanCoastIndex: cci,
          regionPercentile: null,
          segmentsTested: 0,
          sampleCount: definition.aggregation === 'season-total' || records.length === 0 ? values.length : records.length,
          yearSpan: years.length > 0 ? { first: Math.min(...years), last: Math.max(...years) } : null,
        },
      });
    }
    // Benjamini–Hochberg across the region's segments with a p-value, this indicator, this season.
    const tested = evaluations.filter((e) => e.evaluation.pValue !== null);
    const adjusted = tested.length > 0 ? engine.adjust(tested.map((e) => e.evaluation.pValue ?? 1)) : [];
    tested.forEach((e, i) => {
      e.evaluation.qValue = adjusted[i] ?? null;
    });
    const percentileBasis = evaluations.map((e) =>
      indicator === 'drift-arrivals' ? (e.evaluation.seasonValue ?? null) : e.evaluation.assessmentValue,
    );
    const percentileOf = percentileRanker(percentileBasis);
    for (const e of evaluations) {
      e.evaluation.segmentsTested = tested.length;
      e.evaluation.direction = decideDirection(e.evaluation.trend, e.evaluation.qValue, settings.trend.falseDiscoveryRate);
      const own = indicator === 'drift-arrivals' ? e.evaluation.seasonValue : e.evaluation.assessmentValue;
      e.evaluation.regionPercentile = percentileOf(own);
      perSegment.get(e.segmentId)?.push(e.evaluation);
    }
    if (evaluations.length > 0) {
      const series = evaluations
        .filter((e) => e.evaluation.values.some((v) => v.value !== null))
        .map((e) => ({ site: e.segmentId, points: toSeriesPoints(e.evaluation.values) }));
      let result: RegionalResult | null = null;
      try {
        result = engine.regional(series, { confidence: settings.trend.confidence });
      } catch {
        result = null;
      }
      regional.push({ indicator, result, segments: series.length });
    }
  }

  const zones = scenario.drift?.zones.find((z) => z.season === seasonId)?.zones ?? [];
  const driftSeasonRows = scenario.drift?.arrivals.filter((a) => a.season === seasonId) ?? [];
  // The first row of each segment this season (as a search through the rows would find it).
  const driftRowOf = new Map<string, DriftArrivals>();
  for (const row of driftSeasonRows) if (!driftRowOf.has(row.segmentId)) driftRowOf.set(row.segmentId, row);
  const driftPercentileOf = percentileRanker(segments.map((s) => driftRowOf.get(s.id)?.arrivalsPerKm ?? 0));
  const out = new Map<string, SegmentEvaluation>();
  for (const segment of segments) {
    const indicators = perSegment.get(segment.id) ?? [];
    let drift: DriftBulletin | null = null;
    if (driftSeasonRows.length > 0) {
      const row = driftRowOf.get(segment.id);
      const own = row?.arrivalsPerKm ?? 0;
      drift = {
        arrivals: row?.arrivals ?? 0,
        arrivalsPerKm: own,
        regionPercentile: driftPercentileOf(own) ?? 50,
        nearestZone: row?.nearestZone ?? null,
      };
      const driftIndicator = indicators.find((i) => i.indicator === 'drift-arrivals');
      if (driftIndicator) driftIndicator.regionPercentile = drift.regionPercentile;
    }
    const inputs: LevelInputs = {};
    for (const evaluation of indicators) {
      inputs[evaluation.indicator] = {
        assessmentMedian: evaluation.assessmentValue,
        cleanCoastIndex: evaluation.cleanCoastIndex,
        regionPercentile: evaluation.regionPercentile,
        probabilityUp: evaluation.probabilityUp,
        direction: evaluation.direction,
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
    out.set(segment.id, { segmentId: segment.id, indicators, drift, level: assessLevel(rules, inputs), levelInputs: inputs });
  }
  return { season, segments: out, regional, zones };
}
