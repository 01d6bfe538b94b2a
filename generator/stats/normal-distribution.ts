/**
 * Standard normal distribution: cumulative probability, upper tail and quantile, to about full
 * double precision, for the p-values and confidence ranks of the trend tests.
 *
 * - Lower part (|x| < 3): the Taylor series Φ(x) = ½ + φ(x)·Σ x^(2k+1)/(1·3·5·…·(2k+1))
 *   (Abramowitz & Stegun 1964, Handbook of Mathematical Functions, eq. 26.2.11).
 * - Tails (|x| ≥ 3): the continued fraction Q(x) = φ(x)/(x + 1/(x + 2/(x + 3/(x + …))))
 *   (Abramowitz & Stegun 1964, eq. 26.2.14), evaluated by the modified Lentz method
 *   (Press et al. 2007, Numerical Recipes 3rd ed., §5.2).
 * - Quantile: Acklam's rational approximation (P. J. Acklam 2003, relative error 1.15e-9; from
 *   memory, checked against SciPy in the tests) refined by one Halley step on the accurate CDF.
 *
 * @example
 *   normalUpperTail(1.959963984540054); // => 0.025
 *   normalQuantile(0.975);              // => 1.959963984540054
 */

const INV_SQRT_2PI = 0.3989422804014327;

/** Density φ(x) of the standard normal distribution. */
export function normalDensity(x: number): number {
  return INV_SQRT_2PI * Math.exp(-0.5 * x * x);
}

/** Q(x) = P(Z > x) for x ≥ 3 by the continued fraction of A&S 26.2.14 (Lentz). */
function upperTailContinuedFraction(x: number): number {
  const tiny = 1e-300;
  // f = x + 1/(x + 2/(x + 3/(x + …)))
  let f = x;
  let c = x;
  let d = 0;
  for (let k = 1; k < 500; k++) {
    d = x + k * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = x + k / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const delta = c * d;
    f *= delta;
    if (Math.abs(delta - 1) < 1e-16) break;
  }
  return normalDensity(x) / f;
}

/** Φ(x) − ½ for |x| < 3 by the series of A&S 26.2.11. */
function centralSeries(x: number): number {
  let term = x;
  let sum = x;
  const x2 = x * x;
  for (let k = 1; k < 200; k++) {
    term *= x2 / (2 * k + 1);
    sum += term;
    if (Math.abs(term) < 1e-17 * Math.abs(sum)) break;
  }
  return normalDensity(x) * sum;
}

/** P(Z > x), the upper tail, accurate in the far tail (no 1 − Φ cancellation). */
export function normalUpperTail(x: number): number {
  if (Number.isNaN(x)) return Number.NaN;
  if (x === Number.POSITIVE_INFINITY) return 0;
  if (x === Number.NEGATIVE_INFINITY) return 1;
  if (x >= 3) return upperTailContinuedFraction(x);
  if (x <= -3) return 1 - upperTailContinuedFraction(-x);
  return 0.5 - centralSeries(x);
}

/** Φ(x) = P(Z ≤ x). */
export function normalCdf(x: number): number {
  return normalUpperTail(-x);
}

const A = [-3.969683028665376e1, 2.209460984245205e2, -2.759285104469687e2, 1.38357751867269e2, -3.066479806614716e1, 2.506628277459239];
const B = [-5.447609879822406e1, 1.615858368580409e2, -1.556989798598866e2, 6.680131188771972e1, -1.328068155288572e1];
const C = [-7.784894002430293e-3, -3.223964580411365e-1, -2.400758277161838, -2.549732539343734, 4.374664141464968, 2.938163982698783];
const D = [7.784695709041462e-3, 3.224671290700398e-1, 2.445134137142996, 3.754408661907416];

function acklam(p: number): number {
  const [a0, a1, a2, a3, a4, a5] = A as [number, number, number, number, number, number];
  const [b0, b1, b2, b3, b4] = B as [number, number, number, number, number];
  const [c0, c1, c2, c3, c4, c5] = C as [number, number, number, number, number, number];
  const [d0, d1, d2, d3] = D as [number, number, number, number];
  const low = 0.02425;
  if (p < low) {
    const q = Math.sqrt(-2 * Math.log(p));
    return (((((c0 * q + c1) * q + c2) * q + c3) * q + c4) * q + c5) / ((((d0 * q + d1) * q + d2) * q + d3) * q + 1);
  }
  if (p > 1 - low) {
    const q = Math.sqrt(-2 * Math.log(1 - p));
    return -(((((c0 * q + c1) * q + c2) * q + c3) * q + c4) * q + c5) / ((((d0 * q + d1) * q + d2) * q + d3) * q + 1);
  }
  const q = p - 0.5;
  const r = q * q;
  return ((((((a0 * r + a1) * r + a2) * r + a3) * r + a4) * r + a5) * q) / (((((b0 * r + b1) * r + b2) * r + b3) * r + b4) * r + 1);
}

/**
 * The quantile z with Φ(z) = p.
 * @throws when p is not in (0, 1)
 */
export function normalQuantile(p: number): number {
  if (!(p > 0 && p < 1)) throw new Error(`normalQuantile requires p in (0, 1); got ${p}`);
  let x = acklam(p);
  // Halley refinement on the accurate CDF (Acklam's note).
  for (let step = 0; step < 2; step++) {
    const e = p < 0.5 ? normalCdf(x) - p : p - 1 + normalUpperTail(x);
    const sign = p < 0.5 ? 1 : -1;
    const u = (sign * e) / normalDensity(x);
    const correction = u / (1 + (x * u) / 2);
    x -= correction;
  }
  return x;
}
