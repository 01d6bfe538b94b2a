/**
 * A small, independent Mann–Kendall test used only to check the demo's shapes, so the demo tests
 * do not lean on the code they feed. S = Σ_{i<j} sgn(x_j − x_i); Var(S) = n(n−1)(2n+5)/18 minus the
 * tie term Σ t(t−1)(2t+5)/18; Z with continuity correction (Mann 1945; Kendall 1975; as written in
 * Gilbert 1987, ch. 16, and EnvStats kendallTrendTest eqs. 2, 8, 10, 11). Two-sided p from the normal.
 */

export function mannKendallSimple(values: readonly number[]): { n: number; S: number; varS: number; z: number; p: number } {
  const n = values.length;
  let S = 0;
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) S += Math.sign((values[j] as number) - (values[i] as number));
  }
  const counts = new Map<number, number>();
  for (const v of values) counts.set(v, (counts.get(v) ?? 0) + 1);
  let tieTerm = 0;
  for (const t of counts.values()) tieTerm += t * (t - 1) * (2 * t + 5);
  const varS = (n * (n - 1) * (2 * n + 5) - tieTerm) / 18;
  const z = varS > 0 ? (S > 0 ? (S - 1) / Math.sqrt(varS) : S < 0 ? (S + 1) / Math.sqrt(varS) : 0) : 0;
  return { n, S, varS, z, p: 2 * (1 - normalCdf(Math.abs(z))) };
}

/** Standard normal CDF via the Abramowitz & Stegun 1964 formula 7.1.26 for erf (error < 1.5e-7). */
export function normalCdf(x: number): number {
  const t = 1 / (1 + 0.3275911 * Math.abs(x / Math.SQRT2));
  const poly = t * (0.254829592 + t * (-0.284496736 + t * (1.421413741 + t * (-1.453152027 + t * 1.061405429))));
  const erf = 1 - poly * Math.exp(-(x * x) / 2);
  return x >= 0 ? 0.5 * (1 + erf) : 0.5 * (1 - erf);
}
