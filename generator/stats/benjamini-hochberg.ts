/**
 * Benjamini–Hochberg false-discovery-rate control (Benjamini & Hochberg 1995, "Controlling the
 * false discovery rate: a practical and powerful approach to multiple testing", J. R. Stat. Soc.
 * B 57(1):289–300): with p(1) ≤ … ≤ p(m), reject H(1)…H(k) for k = max{i : p(i) ≤ i·q/m}; the
 * adjusted p-values (q-values) are p̃(i) = min_{j ≥ i} min(1, m·p(j)/j) (the step-up form; SciPy
 * `false_discovery_control` docstring). Valid under independence or positive regression
 * dependence (Benjamini & Yekutieli 2001). O(m log m).
 *
 * @example
 *   benjaminiHochberg([0.01, 0.04, 0.03]); // => [0.03, 0.04, 0.04]
 */

/**
 * Adjusted p-values in the input order.
 * @throws when a p-value is not a number in [0, 1]
 */
export function benjaminiHochberg(pValues: readonly number[]): number[] {
  const m = pValues.length;
  pValues.forEach((p, i) => {
    if (!(p >= 0 && p <= 1)) throw new Error(`benjaminiHochberg requires p-values in [0, 1]; index ${i} has ${p}`);
  });
  const order = pValues.map((_, i) => i).sort((a, b) => (pValues[a] as number) - (pValues[b] as number) || a - b);
  const adjusted = new Array<number>(m);
  let running = 1;
  for (let rank = m; rank >= 1; rank--) {
    const index = order[rank - 1] as number;
    running = Math.min(running, ((pValues[index] as number) * m) / rank);
    adjusted[index] = Math.min(1, running);
  }
  return adjusted;
}

export interface BenjaminiHochbergDecision {
  /** number of hypotheses rejected */
  rejected: number;
  /** the largest p-value rejected, or null when none is */
  cutoff: number | null;
  /** rejected or not, in the input order */
  reject: boolean[];
}

/**
 * The step-up decision at false-discovery rate q.
 * @throws when q is not in (0, 1) or a p-value is not in [0, 1]
 */
export function benjaminiHochbergDecision(pValues: readonly number[], q = 0.05): BenjaminiHochbergDecision {
  if (!(q > 0 && q < 1)) throw new Error(`invalid false-discovery rate; not in (0, 1): ${q}`);
  const adjusted = benjaminiHochberg(pValues);
  const reject = adjusted.map((value) => value <= q);
  let cutoff: number | null = null;
  let rejected = 0;
  pValues.forEach((p, i) => {
    if (reject[i]) {
      rejected++;
      cutoff = cutoff === null ? p : Math.max(cutoff, p);
    }
  });
  return { rejected, cutoff, reject };
}
