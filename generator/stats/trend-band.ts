/**
 * Uncertainty band of a Theil–Sen trend line and the probability that the trend is upward, from a
 * seeded moving-block bootstrap of the residuals (Künsch 1989, "The jackknife and the bootstrap
 * for general stationary observations", Ann. Stat. 17(3):1217–1241).
 *
 * 1. Fit slope b (median pairwise slope) and intercept a = median(y) − b·median(t) (Sen 1968;
 *    Conover 1980). Residuals e_i = y_i − a − b·t_i in time order.
 * 2. Block length L = ⌈n^(1/3)⌉ (rule: the optimal block length grows like n^(1/3) for variance
 *    estimation, Hall, Horowitz & Jing 1995, Biometrika 82(3):561–574; the constant 1 is our choice).
 *    Each resample joins blocks e_s … e_{s+L−1} with starts s drawn uniformly from 0..n−L until n
 *    residuals, giving y*_i = a + b·t_i + e*_i at the same times; a*, b* are refitted.
 * 3. Band: at each distinct time, the (1−c)/2 and (1+c)/2 quantiles of a* + b*·t (R's type 7
 *    linear interpolation, common practice).
 * 4. probabilityUp = (nPositive + 0.5)/(nBoot + 1), nPositive = resamples with b* > 0
 *    (Hirsch, Archfield & De Cicco 2015, "A bootstrap method for estimating uncertainty of water
 *    quality trends", Environ. Model. Softw. 73:148–166; as in the authors' EGRETci code).
 *
 * Deterministic: the same input, seed and resample count give the same band. Each refit finds
 * the median slope exactly in one O(N′) pass without storing all N′ slopes (see medianSlope);
 * refits multiply by stored inverse time gaps (up to 4 million pairs), which can differ from a
 * division in the last bit.
 *
 * @example
 *   trendBand(t, y, { resamples: 500, seed: 7 }).probabilityUp; // e.g. 0.97 for a clear rise
 */
import { createSeededRandom } from '../random/seeded-random.ts';
import { checkConfidence } from './sens-slope.ts';
import { countSlopePairs, quickselect } from './slope-selection.ts';
import type { TrendBand } from './types.ts';

export interface TrendBandOptions {
  resamples: number;
  seed: number;
  /** band coverage; defaults to 0.95 */
  confidence?: number;
  /** block length; defaults to ⌈n^(1/3)⌉ */
  blockLength?: number;
}

/**
 * Probability of an upward trend from bootstrap counts: (nPositive + 0.5)/(nBoot + 1)
 * (Hirsch, Archfield & De Cicco 2015; EGRETci `wBT`).
 * @throws when the counts are not whole numbers with 0 ≤ nPositive ≤ nBoot
 */
export function probabilityUpFromCounts(nPositive: number, nBoot: number): number {
  if (!Number.isInteger(nPositive) || !Number.isInteger(nBoot) || nPositive < 0 || nPositive > nBoot) {
    throw new Error(`probabilityUpFromCounts requires whole counts with 0 ≤ nPositive ≤ nBoot; got ${nPositive} of ${nBoot}`);
  }
  return (nPositive + 0.5) / (nBoot + 1);
}

/** Median of the first `count` numbers of `buffer` (reordered in place). */
function medianInPlace(buffer: Float64Array, count: number): number {
  const mid = count >> 1;
  const upper = quickselect(buffer, mid, 0, count);
  if (count % 2 === 1) return upper;
  let lower = -Infinity;
  for (let i = 0; i < mid; i++) if ((buffer[i] as number) > lower) lower = buffer[i] as number;
  return (lower + upper) / 2;
}

/**
 * Median pairwise slope by bracketing: a sorted sample of 1,024 random pairs gives a window around
 * the median rank (±2.5 binomial standard deviations); one pass over all pairs counts the slopes
 * below the window and keeps those inside it (about 8% of them), and the median is selected
 * there. Falls back to listing every slope when the window misses (rare). Exact either way.
 */
/**
 * Median slope of a series with no two equal times when it lies in [lo, hi]: one pass counts the
 * slopes below lo and keeps those inside, and the median is selected among those; null when it
 * lies outside (the caller then lists every slope). Exact: the same number as selecting among all.
 */
function medianSlopeInWindow(y: Float64Array, inverseGaps: Float64Array, scratch: Float64Array, lo: number, hi: number): number | null {
  const n = y.length;
  const pairs = inverseGaps.length;
  const lowRank = Math.floor((pairs + 1) / 2);
  const highRank = Math.ceil((pairs + 1) / 2);
  let below = 0;
  let count = 0;
  let k = 0;
  for (let i = 0; i < n; i++) {
    const yi = y[i] as number;
    for (let j = i + 1; j < n; j++, k++) {
      // branch-free: the slope is always written and kept only when inside the window
      const slope = ((y[j] as number) - yi) * (inverseGaps[k] as number);
      below += slope < lo ? 1 : 0;
      scratch[count] = slope;
      count += slope >= lo && slope <= hi ? 1 : 0;
    }
  }
  if (!(below < lowRank && below + count >= highRank)) return null;
  const low = quickselect(scratch, lowRank - below - 1, 0, count);
  if (highRank === lowRank) return low;
  let next = Infinity;
  for (let i = lowRank - below; i < count; i++) if ((scratch[i] as number) < next) next = scratch[i] as number;
  return (low + next) / 2;
}

/** A range expected to hold the median slope (a guess: a wrong one only costs time). */
export interface SlopeWindow {
  lo: number;
  hi: number;
}

function medianSlope(t: Float64Array, y: Float64Array, scratch: Float64Array, uniform: () => number, inverseGaps: Float64Array | null, window: SlopeWindow | null = null): number {
  const n = t.length;
  const pairs = countSlopePairs(t);
  const middle = (pairs + 1) / 2;
  const lowRank = Math.floor(middle);
  const highRank = Math.ceil(middle);
  const sampleSize = 1024;
  if (pairs > 4 * sampleSize) {
    const sample = new Float64Array(sampleSize);
    for (let k = 0; k < sampleSize; ) {
      const a = Math.floor(uniform() * n);
      const b = Math.floor(uniform() * n);
      if (t[a] === t[b]) continue;
      sample[k++] = ((y[b] as number) - (y[a] as number)) / ((t[b] as number) - (t[a] as number));
    }
    sample.sort();
    const spread = 2.5 * Math.sqrt(sampleSize / 4) + 2;
    const at = (middle / pairs) * sampleSize;
    const lo = sample[Math.max(0, Math.floor(at - spread))] as number;
    const hi = sample[Math.min(sampleSize - 1, Math.ceil(at + spread))] as number;
    let below = 0;
    let count = 0;
    let overflow = false;
    let pair = 0;
    if (inverseGaps && pairs === (n * (n - 1)) / 2) {
      // no two equal times: a tight loop over every pair
      for (let i = 0; i < n && !overflow; i++) {
        const yi = y[i] as number;
        for (let j = i + 1; j < n; j++, pair++) {
          const slope = ((y[j] as number) - yi) * (inverseGaps[pair] as number);
          if (slope < lo) below++;
          else if (slope <= hi) {
            if (count === scratch.length) {
              overflow = true;
              break;
            }
            scratch[count++] = slope;
          }
        }
      }
    } else {
      for (let i = 0; i < n && !overflow; i++) {
        const ti = t[i] as number;
        const yi = y[i] as number;
        for (let j = i + 1; j < n; j++) {
          let slope: number;
          if (inverseGaps) {
            if (t[j] === ti) continue;
            slope = ((y[j] as number) - yi) * (inverseGaps[pair++] as number);
          } else {
            const dt = (t[j] as number) - ti;
            if (dt === 0) continue;
            slope = ((y[j] as number) - yi) / dt;
          }
          if (slope < lo) below++;
          else if (slope <= hi) {
            if (count === scratch.length) {
              overflow = true;
              break;
            }
            scratch[count++] = slope;
          }
        }
      }
    }
    if (!overflow && below < lowRank && below + count >= highRank) {
      const low = quickselect(scratch, lowRank - below - 1, 0, count);
      if (highRank === lowRank) return low;
      let next = Infinity;
      for (let i = lowRank - below; i < count; i++) if ((scratch[i] as number) < next) next = scratch[i] as number;
      return (low + next) / 2;
    }
  }
  // list every slope (small series, or the window missed)
  const all = pairs <= scratch.length ? scratch : new Float64Array(pairs);
  if (inverseGaps && pairs === (n * (n - 1)) / 2) {
    if (window && pairs <= scratch.length) {
      const found = medianSlopeInWindow(y, inverseGaps, scratch, window.lo, window.hi);
      if (found !== null) return found;
    }
    // no two equal times (the usual case): no test per pair
    let k = 0;
    for (let i = 0; i < n; i++) {
      const yi = y[i] as number;
      for (let j = i + 1; j < n; j++, k++) all[k] = ((y[j] as number) - yi) * (inverseGaps[k] as number);
    }
    return medianInPlace(all, pairs);
  }
  let count = 0;
  for (let i = 0; i < n; i++) {
    const ti = t[i] as number;
    const yi = y[i] as number;
    for (let j = i + 1; j < n; j++) {
      if (inverseGaps) {
        if (t[j] !== ti) {
          all[count] = ((y[j] as number) - yi) * (inverseGaps[count] as number);
          count++;
        }
      } else {
        const dt = (t[j] as number) - ti;
        if (dt !== 0) all[count++] = ((y[j] as number) - yi) / dt;
      }
    }
  }
  return medianInPlace(all, count);
}

/** 1/(t_j − t_i) for the pairs i < j with different times, in loop order (null when too many). */
function inverseTimeGaps(t: Float64Array): Float64Array | null {
  const pairs = countSlopePairs(t);
  if (pairs > 4_000_000) return null;
  const inverse = new Float64Array(pairs);
  let k = 0;
  for (let i = 0; i < t.length; i++) {
    for (let j = i + 1; j < t.length; j++) {
      const dt = (t[j] as number) - (t[i] as number);
      if (dt !== 0) inverse[k++] = 1 / dt;
    }
  }
  return inverse;
}

/** Theil–Sen slope and Conover intercept; `scratch` holds at least n numbers. */
export function theilSenLine(
  t: Float64Array,
  y: Float64Array,
  scratch: Float64Array,
  medianT: number,
  uniform: () => number,
  inverseGaps: Float64Array | null = null,
  window: SlopeWindow | null = null,
): { slope: number; intercept: number } {
  const n = t.length;
  const slope = medianSlope(t, y, scratch, uniform, inverseGaps, window);
  for (let i = 0; i < n; i++) scratch[i] = y[i] as number;
  const intercept = medianInPlace(scratch, n) - slope * medianT;
  return { slope, intercept };
}

/**
 * Type-7 quantile of `values` (reordered in place): the two order statistics it interpolates are
 * selected, not sorted for, which gives the same number as sorting first.
 */
function quantileSelected(values: Float64Array, probability: number): number {
  const n = values.length;
  const position = (n - 1) * probability;
  const low = Math.floor(position);
  const lowValue = quickselect(values, low, 0, n);
  let highValue = lowValue;
  if (low + 1 < n) {
    // the next order statistic is the smallest value right of `low` after the selection
    highValue = Infinity;
    for (let i = low + 1; i < n; i++) if ((values[i] as number) < highValue) highValue = values[i] as number;
  }
  return lowValue + (position - low) * (highValue - lowValue);
}

export interface TrendBandResult {
  band: TrendBand;
  probabilityUp: number;
  nPositive: number;
}

/**
 * Bootstrap band and probability of an upward trend for a series sorted by time.
 * Returns null when there are fewer than 3 values or fewer than 2 distinct times.
 * @throws when resamples is not a positive integer or the confidence is not in (0, 1)
 */
export function trendBand(t: Float64Array, y: Float64Array, options: TrendBandOptions): TrendBandResult | null {
  const { resamples, seed } = options;
  if (!Number.isInteger(resamples) || resamples < 1) throw new Error(`invalid resamples; not a positive integer: ${resamples}`);
  const confidence = options.confidence ?? 0.95;
  checkConfidence(confidence);
  const n = t.length;
  if (n < 3 || t[0] === t[n - 1]) return null;
  const pairCount = countSlopePairs(t);
  const scratch = new Float64Array(Math.max(n, pairCount <= 4 * 1024 ? pairCount : Math.ceil(pairCount / 4)));
  const medianT = (() => {
    const sorted = Float64Array.from(t).sort();
    const mid = n >> 1;
    return n % 2 === 1 ? (sorted[mid] as number) : ((sorted[mid - 1] as number) + (sorted[mid] as number)) / 2;
  })();
  const random = createSeededRandom(seed);
  const fit = theilSenLine(t, y, scratch, medianT, random.uniform);
  const residuals = new Float64Array(n);
  for (let i = 0; i < n; i++) residuals[i] = (y[i] as number) - fit.intercept - fit.slope * (t[i] as number);
  const blockLength = Math.min(n, Math.max(1, options.blockLength ?? Math.ceil(Math.cbrt(n))));
  // refits multiply by stored 1/(t_j − t_i) instead of dividing (the first fit divides, as Sen's slope does)
  const inverseGaps = inverseTimeGaps(t);
  const slopes = new Float64Array(resamples);
  const intercepts = new Float64Array(resamples);
  const resampled = new Float64Array(n);
  let nPositive = 0;
  const windowAfter = 24;
  let window: SlopeWindow | null = null;
  let seenLow = Infinity;
  let seenHigh = -Infinity;
  for (let r = 0; r < resamples; r++) {
    let filled = 0;
    while (filled < n) {
      const start = random.integer(0, n - blockLength);
      for (let k = 0; k < blockLength && filled < n; k++, filled++) {
        resampled[filled] = fit.intercept + fit.slope * (t[filled] as number) + (residuals[start + k] as number);
      }
    }
    const line = theilSenLine(t, resampled, scratch, medianT, random.uniform, inverseGaps, window);
    // After a few refits, guess where the next median slopes lie: the range of those seen so far,
    // widened by half on each side. A guess only saves time; a miss falls back to every slope.
    if (r < windowAfter) {
      seenLow = Math.min(seenLow, line.slope);
      seenHigh = Math.max(seenHigh, line.slope);
      if (r === windowAfter - 1) {
        const margin = (seenHigh - seenLow) / 2;
        window = { lo: seenLow - margin, hi: seenHigh + margin };
      }
    }
    slopes[r] = line.slope;
    intercepts[r] = line.intercept;
    if (line.slope > 0) nPositive++;
  }
  // distinct times
  const times: number[] = [];
  for (let i = 0; i < n; i++) if (i === 0 || t[i] !== t[i - 1]) times.push(t[i] as number);
  const lower: number[] = [];
  const upper: number[] = [];
  const fitted: number[] = [];
  const values = new Float64Array(resamples);
  const tail = (1 - confidence) / 2;
  for (const time of times) {
    for (let r = 0; r < resamples; r++) values[r] = (intercepts[r] as number) + (slopes[r] as number) * time;
    lower.push(quantileSelected(values, tail));
    upper.push(quantileSelected(values, 1 - tail));
    fitted.push(fit.intercept + fit.slope * time);
  }
  return {
    band: { t: times, fit: fitted, lower, upper, resamples, blockLength, seed },
    probabilityUp: probabilityUpFromCounts(nPositive, resamples),
    nPositive,
  };
}
