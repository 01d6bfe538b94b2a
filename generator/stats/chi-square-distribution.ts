/**
 * Upper tail of the chi-square distribution, P(X ≥ x) for df degrees of freedom, as the regularized
 * upper incomplete gamma function Q(df/2, x/2): series for x < a + 1, continued fraction above
 * (Press et al. 2007, Numerical Recipes 3rd ed., §6.2, eqs. 6.2.5 and 6.2.7), with the Lanczos
 * log-gamma (Lanczos 1964, SIAM J. Numer. Anal. B 1:86–96; g = 7, n = 9 coefficients, common practice).
 *
 * @example
 *   chiSquareUpperTail(3.841458820694124, 1); // => 0.05
 */

const LANCZOS = [
  0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059, 12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6,
  1.5056327351493116e-7,
];

/** ln Γ(z) for z > 0. */
export function logGamma(z: number): number {
  if (z < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * z)) - logGamma(1 - z);
  const x = z - 1;
  let a = LANCZOS[0] as number;
  const t = x + 7.5;
  for (let i = 1; i < 9; i++) a += (LANCZOS[i] as number) / (x + i);
  return 0.5 * Math.log(2 * Math.PI) + (x + 0.5) * Math.log(t) - t + Math.log(a);
}

function lowerSeries(a: number, x: number): number {
  let sum = 1 / a;
  let term = sum;
  for (let n = 1; n < 10000; n++) {
    term *= x / (a + n);
    sum += term;
    if (Math.abs(term) < Math.abs(sum) * 1e-16) break;
  }
  return sum * Math.exp(-x + a * Math.log(x) - logGamma(a));
}

function upperContinuedFraction(a: number, x: number): number {
  const tiny = 1e-300;
  let b = x + 1 - a;
  let c = 1 / tiny;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < 10000; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < tiny) d = tiny;
    c = b + an / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < 1e-16) break;
  }
  return Math.exp(-x + a * Math.log(x) - logGamma(a)) * h;
}

/** Regularized upper incomplete gamma Q(a, x). */
export function regularizedUpperGamma(a: number, x: number): number {
  if (x <= 0) return 1;
  if (x < a + 1) return 1 - lowerSeries(a, x);
  return upperContinuedFraction(a, x);
}

/**
 * P(X ≥ x) for a chi-square variable with df degrees of freedom.
 * @throws when df is not positive
 */
export function chiSquareUpperTail(x: number, df: number): number {
  if (!(df > 0)) throw new Error(`chiSquareUpperTail requires df > 0; got ${df}`);
  return regularizedUpperGamma(df / 2, x / 2);
}
