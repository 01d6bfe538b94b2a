/**
 * The whole trend analysis of one series, as a bulletin needs it: Mann–Kendall, Sen's slope with
 * its interval, optionally the Seasonal Kendall test, the Hamed & Rao (1998) serial correction,
 * a bootstrap band with the probability of an upward trend, and the minimum-data verdict.
 * Each part is described in its own module; this one only wires them and applies the rules:
 *
 * - Missing values (null) are dropped; NaN or ±Infinity throw (series-input.ts).
 * - `insufficient` names the first minimum-data rule broken (minimum-data.ts); the numbers are
 *   still given where they can be computed, so an analyst can see them, but a bulletin must not
 *   claim a trend when `insufficient` is set.
 * - Censored values: S uses all of them (ambiguous pairs as ties); the slope follows
 *   censored-slope-rule.ts; the serial correction and the band use only the values the slope uses.
 * - Fast path: up to 50,000 pairwise slopes (n ≲ 300) are listed directly; the bootstrap runs only
 *   for n ≤ 2,000.
 *
 * @example
 *   analyzeTrend(points, { confidence: 0.95, seasonal: true, bootstrap: { resamples: 500, seed: 7 } });
 */
import { censoredSlopeRule } from './censored-slope-rule.ts';
import { mannKendall } from './mann-kendall.ts';
import { minimumDataShortfall } from './minimum-data.ts';
import { seasonalKendall, type SeasonGroup } from './seasonal-kendall.ts';
import { checkConfidence, sensSlope } from './sens-slope.ts';
import { hamedRaoCorrection } from './serial-correction.ts';
import { prepareSeries, type PreparedSeries } from './series-input.ts';
import { trendBand } from './trend-band.ts';
import type { SenResult, SeriesPoint, TrendOptions, TrendResult } from './types.ts';

export interface AnalyzeTrendOptions extends TrendOptions {
  /** fewest values for a claim; defaults to 8 */
  minValues?: number;
  /** shortest span in the unit of t (years for dates); defaults to 5; 0 turns the rule off */
  minYears?: number;
}

/** Largest series the bootstrap band is computed for (O(n²) per resample). */
export const BOOTSTRAP_MAX_VALUES = 2000;

/** Split a prepared series by season; the cycle is the point's own or ⌊t⌋. */
function seasonGroups(series: PreparedSeries): SeasonGroup[] {
  const bySeason = new Map<string, { t: number[]; y: number[]; c: number[]; cycle: number[] }>();
  for (let i = 0; i < series.t.length; i++) {
    const name = series.season[i] as string;
    let group = bySeason.get(name);
    if (!group) bySeason.set(name, (group = { t: [], y: [], c: [], cycle: [] }));
    const t = series.t[i] as number;
    const cycle = series.cycle[i] as number;
    group.t.push(t);
    group.y.push(series.y[i] as number);
    group.c.push(series.censored[i] as number);
    group.cycle.push(Number.isFinite(cycle) ? cycle : Math.floor(t));
  }
  return [...bySeason.entries()].map(([season, g]) => ({
    season,
    t: Float64Array.from(g.t),
    y: Float64Array.from(g.y),
    censored: Uint8Array.from(g.c),
    cycle: Float64Array.from(g.cycle),
  }));
}

/**
 * Analyse one series.
 * @throws when a time or value is NaN or ±Infinity, or an option is out of range
 */
export function analyzeTrend(points: readonly SeriesPoint[], options: AnalyzeTrendOptions = {}): TrendResult {
  const confidence = options.confidence ?? 0.95;
  checkConfidence(confidence);
  const series = prepareSeries(points, 'analyzeTrend');
  const n = series.t.length;
  const minimum: { minValues?: number; minYears?: number; seasonal?: boolean } = { seasonal: options.seasonal === true };
  if (options.minValues !== undefined) minimum.minValues = options.minValues;
  if (options.minYears !== undefined) minimum.minYears = options.minYears;
  const insufficient = minimumDataShortfall(series, minimum);
  const result: TrendResult = {
    n,
    nCensored: series.nCensored,
    mannKendall: null,
    sen: null,
    serialCorrection: null,
    probabilityUp: null,
    band: null,
    insufficient,
  };
  if (options.seasonal) result.seasonalKendall = null;
  if (n < 2) return result;

  const mk = mannKendall(series.t, series.y, series.censored);
  const { n: _n, timeTies: _tt, valueTies: _vt, ...mkPublic } = mk;
  result.mannKendall = mkPublic;

  const decision = censoredSlopeRule(series);
  let slopeSeries: { t: Float64Array; y: Float64Array } | null = null;
  if (!decision.estimable) {
    result.sen = { slope: null, lower: null, upper: null, intercept: null, confidence, notEstimable: decision.reason };
  } else {
    const sen = sensSlope(decision.t, decision.y, decision.droppedCensored === 0 ? { confidence, varS: mk.varS } : { confidence });
    const { nSlopes: _ns, ...senPublic } = sen;
    result.sen = senPublic as SenResult;
    if (sen.slope !== null) slopeSeries = { t: decision.t, y: decision.y };
  }

  if (options.seasonal) {
    const seasonal = seasonalKendall(seasonGroups(series), { confidence });
    if (!decision.estimable) {
      seasonal.slope = null;
      seasonal.lower = null;
      seasonal.upper = null;
    }
    result.seasonalKendall = seasonal;
  }

  if (slopeSeries && n >= 3 && mk.varS > 0 && result.sen?.slope !== null && result.sen?.slope !== undefined) {
    const serial = hamedRaoCorrection(slopeSeries.t, slopeSeries.y, { S: mk.S, varS: mk.varS, slope: result.sen.slope });
    const { significantLags: _lags, ...serialPublic } = serial;
    result.serialCorrection = serialPublic;
  }

  if (options.bootstrap && slopeSeries && slopeSeries.t.length <= BOOTSTRAP_MAX_VALUES) {
    const banded = trendBand(slopeSeries.t, slopeSeries.y, { resamples: options.bootstrap.resamples, seed: options.bootstrap.seed, confidence });
    if (banded) {
      result.band = banded.band;
      result.probabilityUp = banded.probabilityUp;
    }
  }
  return result;
}
