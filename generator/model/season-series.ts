/**
 * One season's series, one by one: what a segment's own records (and modelled drift) say about an
 * indicator up to the end of the season — the season values, the trend from the trend engine, the
 * season and assessment medians — before anything is compared across segments
 * (judge-season.ts does that). A series' evaluation depends only on its own records, the
 * scenario settings and the first and last season the indicator was monitored anywhere, which is
 * what lets a build reuse it when none of these changed (model-memo in generator/publish).
 */
import { getIndicator, indicatorIds } from '../indicators/index.ts';
import type { ScenarioSettings } from '../scenario/settings.ts';
import type { DriftArrivals, LoadedScenario, Record as ScenarioRecord, Segment } from '../scenario/types.ts';
import type { TrendOptions, TrendResult } from '../stats/types.ts';
import { trendPValue } from './direction.ts';
import type { IndicatorEvaluation, TrendEngine, TrendOutcome, TrendRequest } from './evaluation-types.ts';
import { derivedSeed } from './seed.ts';
import { parseSeasonId, previousSeasonId, seasonMidYear, seasonOfDate, seasonRef } from './seasons.ts';
import { censoredMedian, median, seasonValues, toSeriesPoints, type SeasonValue } from './series.ts';
import type { IndicatorId, SeasonRef } from './types.ts';
import { max, min } from 'd3-array';

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

export interface PendingTrend {
  request: TrendRequest;
  shortfall: ReturnType<typeof minimumDataShortfall>;
}

/** What to ask the engine for one series; null when it holds no value. */
export function trendRequest(values: readonly SeasonValue[], settings: ScenarioSettings, seed: number): PendingTrend | null {
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
export function finishTrend(values: readonly SeasonValue[], pending: PendingTrend, outcome: TrendOutcome): TrendResult {
  const { shortfall } = pending;
  if ('error' in outcome) return emptyTrend(values, shortfall ?? { rule: 'engine', reason: outcome.error });
  const result = outcome.result;
  return shortfall ? { ...result, insufficient: result.insufficient ?? shortfall } : result;
}

export function runTrend(engine: TrendEngine, values: readonly SeasonValue[], settings: ScenarioSettings, seed: number): TrendResult | null {
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

/** First and last season an indicator was monitored anywhere in the region. */
export interface MonitoredSpan {
  first: string;
  last: string;
  firstStart: string;
  lastStart: string;
}

/** What every series of one season shares: the season, its segments and the records by series. */
export interface SeasonContext {
  settings: ScenarioSettings;
  seasonId: string;
  season: SeasonRef;
  assessment: Set<string>;
  /** sorted by id */
  segments: Segment[];
  /** records by `${indicator}\u0000${segmentId}`, in file order */
  byKey: Map<string, ScenarioRecord[]>;
  monitored: Map<IndicatorId, MonitoredSpan>;
  /** modelled arrivals per segment, every season */
  driftBySegment: Map<string, DriftArrivals[]>;
}

export function seriesKey(indicator: IndicatorId, segmentId: string): string {
  return `${indicator}\u0000${segmentId}`;
}

interface RecordIndex {
  byKey: Map<string, ScenarioRecord[]>;
  monitored: Map<IndicatorId, MonitoredSpan>;
}

/**
 * The records by series and each indicator's monitored span, worked out once per list of records
 * and season definitions (every season of a build reads the same index; nothing changes it). A
 * list that grew or shrank, or other season definitions, are indexed again.
 */
const indexes = new WeakMap<readonly ScenarioRecord[], { length: number; seasons: unknown; index: RecordIndex }>();
function recordIndex(scenario: LoadedScenario): RecordIndex {
  const known = indexes.get(scenario.records);
  if (known && known.length === scenario.records.length && known.seasons === scenario.settings.seasons) return known.index;
  const byKey = new Map<string, ScenarioRecord[]>();
  const monitored = new Map<IndicatorId, MonitoredSpan>();
  for (const record of scenario.records) {
    const key = seriesKey(record.indicator, record.segmentId);
    const list = byKey.get(key);
    if (list) list.push(record);
    else byKey.set(key, [record]);
    const ref = seasonRef(record.season, scenario.settings.seasons);
    if (!ref) continue;
    const m = monitored.get(record.indicator);
    if (!m) monitored.set(record.indicator, { first: record.season, last: record.season, firstStart: ref.start, lastStart: ref.start });
    else {
      if (ref.start < m.firstStart) Object.assign(m, { first: record.season, firstStart: ref.start });
      if (ref.start > m.lastStart) Object.assign(m, { last: record.season, lastStart: ref.start });
    }
  }
  const index = { byKey, monitored };
  indexes.set(scenario.records, { length: scenario.records.length, seasons: scenario.settings.seasons, index });
  return index;
}

export function seasonContext(scenario: LoadedScenario, seasonId: string): SeasonContext {
  const settings = scenario.settings;
  const season = seasonRef(seasonId, settings.seasons);
  if (!season) throw new Error(`evaluateSeason: season ${seasonId} matches no season definition`);
  const assessment = new Set(assessmentSeasons(seasonId, settings));
  const segments = [...scenario.segments].sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));

  const index = recordIndex(scenario);
  const byKey = index.byKey;
  // Copies: monitoringStart below changes them for this season only.
  const monitored = new Map([...index.monitored].map(([indicator, span]) => [indicator, { ...span }]));

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
  return { settings, seasonId, season, assessment, segments, byKey, monitored, driftBySegment };
}

/** The records of one series that count for this season (dated up to its end, with a value). */
export function seriesRecords(context: SeasonContext, indicator: IndicatorId, segmentId: string): ScenarioRecord[] {
  const end = context.season.end;
  return (context.byKey.get(seriesKey(indicator, segmentId)) ?? []).filter((r) => r.date <= end && r.value !== null);
}

export interface SeasonSeries {
  records: ScenarioRecord[];
  values: SeasonValue[];
}

export function seasonSeries(context: SeasonContext, indicator: IndicatorId, segmentId: string): SeasonSeries {
  const { settings, season } = context;
  const records = seriesRecords(context, indicator, segmentId);
  const values =
    indicator === 'drift-arrivals' && records.length === 0
      ? driftValues(context.driftBySegment.get(segmentId) ?? [], season, settings)
      : seasonValues(records, {
          aggregation: getIndicator(indicator).aggregation,
          untilSeason: season,
          definitions: settings.seasons,
          monitored: context.monitored.get(indicator) ?? null,
        });
  return { records, values };
}

/**
 * The evaluation of one series from its records, values and trend; null when the series is left
 * out (no values, or modelled arrivals whose series cannot yet carry a trend). The fields that
 * compare segments (q-value, direction, region percentile, segments tested) are left at their
 * empty values: judge-season.ts fills them in.
 */
export function seriesEvaluation(context: SeasonContext, indicator: IndicatorId, series: SeasonSeries, trend: TrendResult | null): IndicatorEvaluation | null {
  const { settings, seasonId, assessment } = context;
  const { records, values } = series;
  if (values.length === 0) return null;
  // Modelled arrivals are listed as an indicator only once their series can carry a trend; until
  // then the season's figures live in the drift part of the bulletin alone.
  if (indicator === 'drift-arrivals' && (!trend || trend.insufficient)) return null;
  const definition = getIndicator(indicator);
  const inSeason = records.filter((r) => r.season === seasonId);
  const inAssessment = records.filter((r) => assessment.has(r.season));
  const bySeason = definition.aggregation === 'season-total' || records.length === 0;
  const seasonMedian = bySeason ? null : censoredMedian(inSeason.map((r) => ({ value: r.value ?? 0, censored: r.censored })));
  const seasonValue = bySeason ? (values.find((v) => v.season === seasonId)?.value ?? null) : (seasonMedian?.value ?? null);
  // A median is "below detection" when a middle sample was reported below the lab's detection limit.
  const seasonValueCensored = bySeason ? (values.find((v) => v.season === seasonId)?.censored ?? false) : (seasonMedian?.censored ?? false);
  const assessmentMedian = bySeason ? null : censoredMedian(inAssessment.map((r) => ({ value: r.value ?? 0, censored: r.censored })));
  const assessmentValue = bySeason
    ? median(values.filter((v) => assessment.has(v.season) && v.value !== null).map((v) => v.value ?? 0))
    : median(inAssessment.map((r) => r.value ?? 0));
  const assessmentValueCensored = assessmentMedian?.censored ?? false;
  const cci = median(inAssessment.map((r) => r.extra['cleanCoastIndex']).filter((x): x is number => typeof x === 'number' && Number.isFinite(x)));
  const years = values.filter((v) => v.value !== null).map((v) => parseSeasonId(v.season)?.year ?? Math.floor(v.t));
  return {
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
    seasonValueCensored,
    assessmentValue,
    assessmentValueCensored,
    cleanCoastIndex: cci,
    regionPercentile: null,
    segmentsTested: 0,
    sampleCount: definition.aggregation === 'season-total' || records.length === 0 ? values.length : records.length,
    yearSpan: years.length > 0 ? { first: min(years) as number, last: max(years) as number } : null,
  };
}

/** A series of the season, named by indicator and segment. */
export interface SeriesId {
  indicator: IndicatorId;
  segmentId: string;
}

/**
 * Evaluates the given series of one season (default: every indicator at every segment, indicator
 * by indicator). An engine that takes many series at once gets them in one batch (same results,
 * same order as one by one). Keyed by seriesKey; a series that is left out maps to null.
 */
export function evaluateSeries(
  context: SeasonContext,
  engine: TrendEngine,
  which: readonly SeriesId[] = indicatorIds.flatMap((indicator) => context.segments.map((s) => ({ indicator, segmentId: s.id }))),
): Map<string, { series: SeasonSeries; evaluation: IndicatorEvaluation | null }> {
  const { settings, seasonId } = context;
  const found = which.map((id) => ({ ...id, series: seasonSeries(context, id.indicator, id.segmentId) }));
  const trends = new Map<string, TrendResult | null>();
  const seedOf = (id: SeriesId): number => derivedSeed(settings.trend.seed, id.segmentId, id.indicator, seasonId);
  if (engine.analyzeMany) {
    const asked: { key: string; values: SeasonValue[]; pending: PendingTrend }[] = [];
    for (const item of found) {
      if (item.series.values.length === 0) continue;
      const pending = trendRequest(item.series.values, settings, seedOf(item));
      if (pending) asked.push({ key: seriesKey(item.indicator, item.segmentId), values: item.series.values, pending });
    }
    const outcomes = engine.analyzeMany(asked.map((a) => a.pending.request));
    asked.forEach((a, i) => trends.set(a.key, finishTrend(a.values, a.pending, outcomes[i] ?? { error: 'no result from the trend engine' })));
  }
  const out = new Map<string, { series: SeasonSeries; evaluation: IndicatorEvaluation | null }>();
  for (const item of found) {
    const key = seriesKey(item.indicator, item.segmentId);
    const { values } = item.series;
    const trend = values.length === 0 ? null : engine.analyzeMany ? (trends.get(key) ?? null) : runTrend(engine, values, settings, seedOf(item));
    out.set(key, { series: item.series, evaluation: seriesEvaluation(context, item.indicator, item.series, trend) });
  }
  return out;
}
