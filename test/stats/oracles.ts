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

/** A cycle's value for the covariance oracle (null = missing). */
export interface CycleCellOracle {
  value: number;
  censored: boolean;
}

/**
 * Hirsch & Slack (1984, eq. 7; Dietz & Killeen 1981) covariance σ_gh of two seasons' S over common
 * cycles, computed pair by pair with both seasons' ranks recomputed each time: the form the engine
 * used before season-covariance.ts, kept verbatim as the oracle.
 */
export function seasonCovarianceOracle(a: readonly (CycleCellOracle | null)[], b: readonly (CycleCellOracle | null)[]): number {
  const n = a.length;
  let k = 0;
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const ai = a[i];
      const aj = a[j];
      const bi = b[i];
      const bj = b[j];
      if (!ai || !aj || !bi || !bj) continue;
      k += censoredSignOracle(ai.value, ai.censored, aj.value, aj.censored) * censoredSignOracle(bi.value, bi.censored, bj.value, bj.censored);
    }
  }
  const ranks = (cells: readonly (CycleCellOracle | null)[]): { r: number[]; count: number } => {
    const count = cells.filter((c) => c !== null).length;
    const r = cells.map((ci) => {
      if (!ci) return (count + 1) / 2;
      let sum = 0;
      for (const ck of cells) if (ck) sum += censoredSignOracle(ck.value, ck.censored, ci.value, ci.censored);
      return (count + 1 + sum) / 2;
    });
    return { r, count };
  };
  const ra = ranks(a);
  const rb = ranks(b);
  let cross = 0;
  for (let i = 0; i < n; i++) cross += (ra.r[i] as number) * (rb.r[i] as number);
  return (k + 4 * cross - n * (ra.count + 1) * (rb.count + 1)) / 3;
}

/** Σ_{g<h} σ_gh summed pair by pair in the order g = 0…, h = g+1… (the previous engine's loop). */
export function totalSeasonCovarianceOracle(cells: readonly (readonly (CycleCellOracle | null)[])[]): number {
  let covariance = 0;
  for (let g = 0; g < cells.length; g++) {
    for (let h = g + 1; h < cells.length; h++) covariance += seasonCovarianceOracle(cells[g] as (CycleCellOracle | null)[], cells[h] as (CycleCellOracle | null)[]);
  }
  return covariance;
}
