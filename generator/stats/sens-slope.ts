/**
 * Sen's slope (Theil 1950, "A rank-invariant method of linear and polynomial regression analysis",
 * Proc. K. Ned. Akad. Wet. 53; Sen 1968, "Estimates of the regression coefficient based on
 * Kendall's tau", J. Am. Stat. Assoc. 63(324):1379–1389): the median of the N′ pairwise slopes
 * (y_j − y_i)/(t_j − t_i) over the real time gaps, pairs with equal time skipped (Sen 1968 eq. 2.4;
 * EnvStats `kendallTrendTest` eqs. 13–15).
 *
 * Confidence interval (Gilbert 1987, Statistical Methods for Environmental Pollution Monitoring,
 * §16.5.1, pp. 218–219, eqs. 16.7–16.8): C = z(1−α/2)·√Var(S), M1 = (N′ − C)/2, M2 = (N′ + C)/2;
 * the limits are the M1-th and (M2 + 1)-th ordered slopes, interpolated linearly between
 * neighbours when not whole numbers (as EnvStats does), and null when a rank falls outside 1..N′.
 * Gilbert advises n ≥ 10 unless there are many ties.
 *
 * Intercept (Conover 1980, Practical Nonparametric Statistics, 2nd ed., §5.5): median(y) − slope ·
 * median(t).
 *
 * Speed: for N′ up to 50,000 (n ≲ 300) all slopes are listed and sorted; above, the median and both limits
 * come from randomized slope selection (slope-selection.ts), O(n log n) expected, memory O(n).
 *
 * @example
 *   sensSlope(Float64Array.of(1, 2, 3, 4), Float64Array.of(1, 3, 2, 5)).slope; // => 1
 */
import { kendallScore } from './kendall-score.ts';
import { kendallVariance } from './kendall-variance.ts';
import { normalQuantile } from './normal-distribution.ts';
import { assertFiniteArrays } from './series-input.ts';
import { countSlopePairs, selectPairwiseSlopes } from './slope-selection.ts';
import type { SenResult } from './types.ts';

export interface SensSlopeOptions {
  /** confidence level of the interval; defaults to 0.95 */
  confidence?: number;
  /** Var(S) for the interval; defaults to the tie-corrected Var(S) of these values */
  varS?: number;
  /** seed of the slope selection for long series; defaults to 1 (results do not depend on it) */
  seed?: number;
  /** list all slopes while N′ is at most this; defaults to 50,000 */
  directLimit?: number;
}

export interface SensSlopeDetail extends SenResult {
  /** N′, the number of pairwise slopes */
  nSlopes: number;
}

/** Median of a numeric array (copy sorted). */
export function median(values: ArrayLike<number>): number {
  const sorted = Float64Array.from(values).sort();
  const n = sorted.length;
  if (n === 0) return Number.NaN;
  const mid = n >> 1;
  return n % 2 === 1 ? (sorted[mid] as number) : ((sorted[mid - 1] as number) + (sorted[mid] as number)) / 2;
}

/** Check a confidence level. @throws when not in (0, 1) */
export function checkConfidence(confidence: number): void {
  if (!(confidence > 0 && confidence < 1)) throw new Error(`invalid confidence; not in (0, 1): ${confidence}`);
}

/**
 * The ranks needed for a median and an interpolated interval, and a reader of them.
 * `slopeAt(rank)` takes a fractional 1-based rank and interpolates; null outside 1..N′.
 */
export function intervalRanks(nSlopes: number, varS: number, confidence: number): { lowerRank: number; upperRank: number } {
  const c = normalQuantile(1 - (1 - confidence) / 2) * Math.sqrt(varS);
  return { lowerRank: (nSlopes - c) / 2, upperRank: (nSlopes + c) / 2 + 1 };
}

/**
 * Sen's slope, its Gilbert interval and Conover's intercept for a series sorted by time.
 * @throws when the arrays differ in length or hold NaN or ±Infinity, or the confidence is not in (0, 1)
 */
export function sensSlope(t: Float64Array, y: Float64Array, options: SensSlopeOptions = {}): SensSlopeDetail {
  assertFiniteArrays('sensSlope', t, y);
  const confidence = options.confidence ?? 0.95;
  checkConfidence(confidence);
  const nSlopes = countSlopePairs(t);
  if (nSlopes === 0) {
    return { slope: null, lower: null, upper: null, intercept: null, confidence, nSlopes, notEstimable: 'fewer than two distinct times' };
  }
  let varS = options.varS;
  if (varS === undefined) {
    const score = kendallScore(t, y);
    varS = kendallVariance(t.length, score.valueTies, score.timeTies);
  }
  const middle = (nSlopes + 1) / 2;
  const { lowerRank, upperRank } = intervalRanks(nSlopes, varS, confidence);
  const wanted = new Set<number>([Math.floor(middle), Math.ceil(middle)]);
  const lowerUsable = lowerRank >= 1 && lowerRank <= nSlopes;
  const upperUsable = upperRank >= 1 && upperRank <= nSlopes;
  if (lowerUsable) {
    wanted.add(Math.floor(lowerRank));
    wanted.add(Math.ceil(lowerRank));
  }
  if (upperUsable) {
    wanted.add(Math.floor(upperRank));
    wanted.add(Math.ceil(upperRank));
  }
  const ranks = [...wanted].sort((a, b) => a - b);
  const selectOptions: { seed?: number; directLimit?: number } = {};
  if (options.seed !== undefined) selectOptions.seed = options.seed;
  if (options.directLimit !== undefined) selectOptions.directLimit = options.directLimit;
  const values = selectPairwiseSlopes(t, y, ranks, selectOptions);
  const byRank = new Map<number, number>();
  ranks.forEach((rank, i) => byRank.set(rank, values[i] as number));
  const at = (rank: number): number => {
    const low = byRank.get(Math.floor(rank)) as number;
    const high = byRank.get(Math.ceil(rank)) as number;
    const fraction = rank - Math.floor(rank);
    return fraction === 0 ? low : low + fraction * (high - low);
  };
  const slope = at(middle);
  const lower = lowerUsable ? at(lowerRank) : null;
  const upper = upperUsable ? at(upperRank) : null;
  const intercept = median(y) - slope * median(t);
  return { slope, lower, upper, intercept, confidence, nSlopes, notEstimable: null };
}
