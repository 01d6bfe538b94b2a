/**
 * All-pairs oracles of the trend engine, for tests only: the plain O(n²) definitions that the fast
 * algorithms must reproduce exactly.
 */

/** Sign of y_b − y_a under the censoring rule: "<a" is below b only when b ≥ a; other censored pairs are ties. */
export function censoredSignOracle(ya: number, ca: boolean, yb: number, cb: boolean): number {
  if (!ca && !cb) return Math.sign(yb - ya);
  if (ca && cb) return 0;
  if (ca) return yb >= ya ? 1 : 0;
  return ya >= yb ? -1 : 0;
}

/** S = Σ_{i<j} sgn(t_j − t_i)·sgn(y_j − y_i), ambiguous censored pairs counted as ties (Mann 1945; Helsel 2012). */
export function kendallScoreOracle(t: ArrayLike<number>, y: ArrayLike<number>, censored?: ArrayLike<number>): number {
  let S = 0;
  for (let i = 0; i < t.length; i++) {
    for (let j = 0; j < t.length; j++) {
      if (!((t[j] as number) > (t[i] as number))) continue;
      S += censoredSignOracle(y[i] as number, censored?.[i] === 1, y[j] as number, censored?.[j] === 1);
    }
  }
  return S;
}

/** All N′ slopes sorted (pairs of equal time skipped). */
export function sortedSlopesOracle(t: ArrayLike<number>, y: ArrayLike<number>): number[] {
  const slopes: number[] = [];
  for (let i = 0; i < t.length; i++) {
    for (let j = 0; j < t.length; j++) {
      if ((t[j] as number) > (t[i] as number)) slopes.push(((y[j] as number) - (y[i] as number)) / ((t[j] as number) - (t[i] as number)));
    }
  }
  return slopes.sort((a, b) => a - b);
}

/** Interpolated order statistic at a 1-based fractional rank (Gilbert 1987 §16.5, EnvStats convention). */
export function slopeAtRankOracle(sorted: readonly number[], rank: number): number | null {
  if (rank < 1 || rank > sorted.length) return null;
  const low = sorted[Math.floor(rank) - 1] as number;
  const high = sorted[Math.ceil(rank) - 1] as number;
  return low + (rank - Math.floor(rank)) * (high - low);
}
