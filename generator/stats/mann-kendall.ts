/**
 * Mann–Kendall test for a monotonic trend (Mann 1945, "Nonparametric tests against trend",
 * Econometrica 13(3):245–259; Kendall 1975, Rank Correlation Methods, 4th ed.; Gilbert 1987,
 * Statistical Methods for Environmental Pollution Monitoring, ch. 16).
 *
 * - S by Knight's O(n log n) count (see kendall-score.ts), ties in time and value allowed.
 * - Var(S) with the tie correction (Gilbert 1987 eq. 16.4; Kendall 1975 eq. 4.4 for time ties).
 * - z with the continuity correction: (S − 1)/√Var if S > 0, 0 if S = 0, (S + 1)/√Var if S < 0
 *   (Gilbert 1987 eq. 16.5).
 * - p: two-sided, normal approximation, 2·P(Z > |z|).
 * - tau: Kendall's tau-b = S/√[(n0 − n1)(n0 − n2)] (Kendall 1975 eq. 3.6; n1, n2 pairs tied in time
 *   and in value). tauA = S/n0 is given too, the form EnvStats reports (Gilbert 1987 eq. 16.2 uses n0).
 * - pExact: exact two-sided p from the null distribution of S when 2 ≤ n ≤ 10 with no ties and
 *   nothing censored (Kendall 1975 §4.3; Gilbert 1987 §16.4.1), otherwise null.
 *
 * Assumes independent values (see serial-correction.ts for the Hamed & Rao 1998 correction).
 * Values below a detection limit: an ambiguous order counts as a tie (Helsel 2012, ch. 11); in
 * Var(S) the censored values of each detection limit form one tie group (exact for one limit with
 * all uncensored values at or above it; an approximation otherwise).
 *
 * @example
 *   mannKendall(Float64Array.of(1, 2, 3, 4, 5, 6, 7, 8, 9, 10), Float64Array.of(1, 2, 3, 4, 5, 6, 7, 8, 9, 10));
 *   // => { S: 45, varS: 125, z: 3.935…, p: 8.30e-5, tau: 1, pExact: 5.5e-7, … }
 */
import { kendallExactTwoSidedP } from './kendall-exact-distribution.ts';
import { kendallScore } from './kendall-score.ts';
import { kendallVariance } from './kendall-variance.ts';
import { normalUpperTail } from './normal-distribution.ts';
import { assertFiniteArrays } from './series-input.ts';
import type { MannKendallResult } from './types.ts';

/** Continuity-corrected z (Gilbert 1987 eq. 16.5); null when the variance is 0. */
export function continuityCorrectedZ(score: number, variance: number): number | null {
  if (!(variance > 0)) return null;
  if (score > 0) return (score - 1) / Math.sqrt(variance);
  if (score < 0) return (score + 1) / Math.sqrt(variance);
  return 0;
}

/** Two-sided p from a standard normal z; null when z is null. */
export function twoSidedP(z: number | null): number | null {
  if (z === null) return null;
  return Math.min(1, 2 * normalUpperTail(Math.abs(z)));
}

function pairsIn(sizes: readonly number[]): number {
  let sum = 0;
  for (const size of sizes) sum += (size * (size - 1)) / 2;
  return sum;
}

export interface MannKendallDetail extends MannKendallResult {
  n: number;
  tauA: number | null;
  timeTies: number[];
  valueTies: number[];
}

/**
 * Mann–Kendall test on a series sorted by time.
 * @param t times, ascending
 * @param y values (detection limit for censored ones)
 * @param censored 1 where the value is "<y"
 * @throws when the arrays differ in length, hold NaN or ±Infinity, or times are not ascending
 */
export function mannKendall(t: Float64Array, y: Float64Array, censored?: Uint8Array): MannKendallDetail {
  assertFiniteArrays('mannKendall', t, y);
  const n = t.length;
  const { S, timeTies, valueTies } = kendallScore(t, y, censored);
  const varS = kendallVariance(n, valueTies, timeTies);
  const z = continuityCorrectedZ(S, varS);
  const pairs = (n * (n - 1)) / 2;
  const denominator = Math.sqrt((pairs - pairsIn(timeTies)) * (pairs - pairsIn(valueTies)));
  const tau = denominator > 0 ? S / denominator : null;
  const tauA = pairs > 0 ? S / pairs : null;
  let anyCensored = false;
  if (censored) for (let i = 0; i < n; i++) if (censored[i]) anyCensored = true;
  const exactAllowed = n >= 2 && n <= 10 && timeTies.length === 0 && valueTies.length === 0 && !anyCensored;
  const pExact = exactAllowed ? kendallExactTwoSidedP(n, S) : null;
  return { S, varS, z, p: twoSidedP(z), tau, pExact, n, tauA, timeTies, valueTies };
}
