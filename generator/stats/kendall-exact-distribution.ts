/**
 * Exact null distribution of Kendall's S for n values without ties: S = n(n−1)/2 − 2·I where I is
 * the number of inversions of a uniformly random permutation, so P(I = k) = I_n(k)/n! with the
 * Mahonian numbers I_n(k) = Σ_{j=0}^{min(k, n−1)} I_{n−1}(k − j) (Kendall 1975, Rank Correlation
 * Methods, 4th ed., §4.3, the recurrence behind the tables of S; Gilbert 1987, Statistical Methods
 * for Environmental Pollution Monitoring, §16.4.1, exact test for n ≤ 10; table number from memory).
 *
 * @example
 *   kendallExactTwoSidedP(4, 6); // => 1/12 (only the two monotone orders of 4 reach |S| = 6)
 */

/** Counts of permutations of n items by number of inversions (length n(n−1)/2 + 1). */
export function inversionCounts(n: number): Float64Array {
  let counts = Float64Array.of(1);
  for (let m = 2; m <= n; m++) {
    const next = new Float64Array(counts.length + m - 1);
    for (let k = 0; k < next.length; k++) {
      let sum = 0;
      for (let j = 0; j < m; j++) {
        const index = k - j;
        if (index >= 0 && index < counts.length) sum += counts[index] as number;
      }
      next[k] = sum;
    }
    counts = next;
  }
  return counts;
}

/**
 * P(|S| ≥ |score|) under no trend, for n values without ties.
 * @throws when n is not an integer in 2..20 (the sum is exact in doubles up to there)
 */
export function kendallExactTwoSidedP(n: number, score: number): number {
  if (!Number.isInteger(n) || n < 2 || n > 20) throw new Error(`kendallExactTwoSidedP requires an integer n in 2..20; got ${n}`);
  const counts = inversionCounts(n);
  const pairs = (n * (n - 1)) / 2;
  let total = 0;
  let extreme = 0;
  for (let k = 0; k < counts.length; k++) {
    const c = counts[k] as number;
    total += c;
    if (Math.abs(pairs - 2 * k) >= Math.abs(score)) extreme += c;
  }
  return Math.min(1, extreme / total);
}
