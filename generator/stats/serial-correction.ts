/**
 * Variance correction of the Mann–Kendall test for serially correlated data (Hamed & Rao 1998,
 * "A modified Mann–Kendall trend test for autocorrelated data", J. Hydrol. 204:182–196, eq. 18):
 *
 *   Var*(S) = Var(S) · n/n*,   n/n* = 1 + 2/[n(n−1)(n−2)] · Σ_{k=1}^{n−1} (n−k)(n−k−1)(n−k−2) ρ_s(k)
 *
 * ρ_s(k) is the lag-k autocorrelation of the ranks of the series after removing Sen's slope
 * (y − b·t), counted only where significant: |ρ_s(k)| > z(1−α/2)/√n (Hamed & Rao 1998, §3; as in
 * R `modifiedmk::mmkh` and pyMannKendall). Lags are positions in time order, so the correction
 * assumes roughly even spacing. Autocorrelation estimate: Σ_{i=1}^{n−k}(R_i − R̄)(R_{i+k} − R̄) /
 * Σ(R_i − R̄)². For speed, lags beyond min(2,000, max(10, 5·10⁷/n)) are not used (common practice:
 * Rao et al. 2003 use only the first three). Reported beside the plain test, never instead of it:
 * the bulletins' claims use the plain test (or the Seasonal Kendall test) with the false-discovery
 * check across places, and the methods page says so.
 *
 * Two rules of our own make the figure stable:
 * - Ties under a stated tolerance. Detrended values closer than
 *     δ = 2·|b|/365.25 + 10⁻⁹·(max|y| + |b|·max|t|)
 *   are ranked as ties (groups formed in sorted order, each value within δ of the previous one).
 *   The first term is the trend over two days: a date is known to a day, and the same series given
 *   as whole years or as ISO dates (leap years shift a date by a day) must rank the same. The second
 *   term is floating-point rounding of y − b·t. Without it, an exactly linear series gets ranks
 *   decided by rounding noise and a factor anywhere from about 0.3 to 1.3.
 * - A factor below 1 is bounded at 1. Eq. 18 gives n/n* < 1 for negative rank autocorrelation,
 *   which would make the corrected test more confident than the plain one. On the short seasonal
 *   records here (tens of values) a lag autocorrelation has a standard error of about 1/√n, so a
 *   negative estimate is mostly noise; Hamed & Rao justify the correction for positive dependence
 *   (the variance inflation of their §3). The correction may only widen the variance.
 *   `hamedRaoFactor` itself stays eq. 18 unbounded.
 *
 * Also the effective-sample-size factor of Yue & Wang (2004, Water Resour. Manage. 18(3):201–218):
 * n/n* = 1 + 2 Σ_k (1 − k/n) ρ_k.
 *
 * @example
 *   hamedRaoFactor(20, []); // => 1 (no significant lag)
 */
import { continuityCorrectedZ, twoSidedP } from './mann-kendall.ts';
import { normalQuantile } from './normal-distribution.ts';
import type { SerialCorrectionResult } from './types.ts';

/** n/n* of Hamed & Rao (1998) eq. 18 from the significant rank autocorrelations (lag → ρ). */
export function hamedRaoFactor(n: number, significant: ReadonlyArray<{ lag: number; rho: number }>): number {
  if (n < 3) return 1;
  let sum = 0;
  for (const { lag, rho } of significant) sum += (n - lag) * (n - lag - 1) * (n - lag - 2) * rho;
  return 1 + (2 / (n * (n - 1) * (n - 2))) * sum;
}

/** n/n* of Yue & Wang (2004) from autocorrelations ρ_1, ρ_2, … (index 0 is lag 1). */
export function yueWangFactor(n: number, rho: readonly number[]): number {
  let sum = 0;
  rho.forEach((value, index) => {
    const lag = index + 1;
    sum += (1 - lag / n) * value;
  });
  return 1 + 2 * sum;
}

/**
 * Average ranks (1-based; ties get the mean of their ranks). With a tolerance, values within it of
 * the previous value in sorted order belong to the same tie group.
 */
export function averageRanks(values: ArrayLike<number>, tolerance = 0): Float64Array {
  const n = values.length;
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => (values[a] as number) - (values[b] as number));
  const ranks = new Float64Array(n);
  let i = 0;
  while (i < n) {
    let j = i;
    while (j + 1 < n && (values[order[j + 1] as number] as number) - (values[order[j] as number] as number) <= tolerance) j++;
    const rank = (i + j) / 2 + 1;
    for (let k = i; k <= j; k++) ranks[order[k] as number] = rank;
    i = j + 1;
  }
  return ranks;
}

/** δ of the header: the trend over two days plus floating-point rounding of y − b·t. */
export function tieTolerance(slope: number, scale: number): number {
  return (2 * Math.abs(slope)) / 365.25 + 1e-9 * scale;
}

export interface HamedRaoInput {
  S: number;
  varS: number;
  slope: number;
  /** significance level of the lags; defaults to 0.05 */
  alpha?: number;
  /** largest lag used; defaults to min(n − 1, 2000, max(10, 5·10⁷/n)) */
  maxLag?: number;
}

/**
 * Hamed & Rao (1998) corrected test for a series sorted by time.
 * @throws when times and values differ in length
 */
export function hamedRaoCorrection(t: Float64Array, y: Float64Array, input: HamedRaoInput): SerialCorrectionResult & { significantLags: number[] } {
  const n = t.length;
  if (n !== y.length) throw new Error(`hamedRaoCorrection requires times and values of equal length; got ${n} and ${y.length}`);
  const detrended = new Float64Array(n);
  let scale = 0;
  for (let i = 0; i < n; i++) {
    detrended[i] = (y[i] as number) - input.slope * (t[i] as number);
    scale = Math.max(scale, Math.abs(y[i] as number) + Math.abs(input.slope * (t[i] as number)));
  }
  const ranks = averageRanks(detrended, tieTolerance(input.slope, scale));
  let mean = 0;
  for (let i = 0; i < n; i++) mean += ranks[i] as number;
  mean /= n || 1;
  let denominator = 0;
  for (let i = 0; i < n; i++) denominator += ((ranks[i] as number) - mean) ** 2;
  const limit = n > 0 ? normalQuantile(1 - (input.alpha ?? 0.05) / 2) / Math.sqrt(n) : Infinity;
  const maxLag = Math.min(n - 1, input.maxLag ?? Math.min(2000, Math.max(10, Math.floor(5e7 / Math.max(1, n)))));
  const significant: { lag: number; rho: number }[] = [];
  if (denominator > 0) {
    for (let lag = 1; lag <= maxLag; lag++) {
      let sum = 0;
      for (let i = 0; i + lag < n; i++) sum += ((ranks[i] as number) - mean) * ((ranks[i + lag] as number) - mean);
      const rho = sum / denominator;
      if (Math.abs(rho) > limit) significant.push({ lag, rho });
    }
  }
  // bounded at 1: the correction may only widen the variance (see the header)
  const factor = Math.max(1, hamedRaoFactor(n, significant));
  const varS = input.varS * factor;
  const z = varS > 0 ? continuityCorrectedZ(input.S, varS) : null;
  return { method: 'hamed-rao-1998', factor, varS, z, p: twoSidedP(z), significantLags: significant.map((s) => s.lag) };
}
