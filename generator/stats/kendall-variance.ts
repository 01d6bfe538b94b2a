/**
 * Variance of Kendall's score S under the null hypothesis of no trend, with ties in value and in
 * time (Kendall 1975, Rank Correlation Methods, 4th ed., eq. 4.4; EnvStats `kendallTrendTest`
 * eq. 9, citing Gilbert 1987, Statistical Methods for Environmental Pollution Monitoring, eq. 16.4):
 *
 *   Var(S) = [n(n−1)(2n+5) − Σt(t−1)(2t+5) − Σu(u−1)(2u+5)]/18
 *          + [Σt(t−1)(t−2)]·[Σu(u−1)(u−2)] / [9n(n−1)(n−2)]
 *          + [Σt(t−1)]·[Σu(u−1)] / [2n(n−1)]
 *
 * t = sizes of groups of equal value, u = sizes of groups of equal time. Without time ties it is
 * the usual [n(n−1)(2n+5) − Σt(t−1)(2t+5)]/18 (Gilbert 1987, eq. 16.4).
 *
 * @example
 *   kendallVariance(10, [], []);   // => 125
 *   kendallVariance(3, [2], []);   // => 2.6666666666666665
 */
export function kendallVariance(n: number, valueTies: readonly number[], timeTies: readonly number[]): number {
  if (n < 2) return 0;
  let valueTerm = 0;
  let valueTriple = 0;
  let valuePair = 0;
  for (const t of valueTies) {
    valueTerm += t * (t - 1) * (2 * t + 5);
    valueTriple += t * (t - 1) * (t - 2);
    valuePair += t * (t - 1);
  }
  let timeTerm = 0;
  let timeTriple = 0;
  let timePair = 0;
  for (const u of timeTies) {
    timeTerm += u * (u - 1) * (2 * u + 5);
    timeTriple += u * (u - 1) * (u - 2);
    timePair += u * (u - 1);
  }
  let variance = (n * (n - 1) * (2 * n + 5) - valueTerm - timeTerm) / 18;
  if (n > 2) variance += (valueTriple * timeTriple) / (9 * n * (n - 1) * (n - 2));
  variance += (valuePair * timePair) / (2 * n * (n - 1));
  return variance;
}
