/**
 * Covariance of the Kendall scores of two seasons (or two sites) observed over common cycles, and
 * its sum over all pairs of seasons: the correction term of the Seasonal Kendall variance for
 * serially dependent seasons (Hirsch & Slack 1984, "A nonparametric trend test for seasonal data
 * with serial dependence", Water Resour. Res. 20(6):727–732, eq. 7; after Dietz & Killeen 1981,
 * J. Am. Stat. Assoc. 76:169–174):
 *
 *   σ_gh = [K_gh + 4 Σ_i R_ig R_ih − n(n_g + 1)(n_h + 1)]/3,
 *   K_gh = Σ_{i<j} sgn[(Y_jg − Y_ig)(Y_jh − Y_ih)],   R_ig = [n_g + 1 + Σ_k sgn(Y_ig − Y_kg)]/2,
 *
 * over the n cycles i; a missing value adds 0 to K_gh and takes the mid rank (n_g + 1)/2. Signs
 * follow the censoring rule of kendall-score.ts (ambiguous orders are 0).
 *
 * Speed: everything that depends on one season alone is computed once per season — its doubled
 * ranks 2R_ig and the sign sgn(Y_jg − Y_ig) of every cycle pair i < j (0 when either is missing) —
 * so K_gh is a dot product of two sign vectors and Σ_i R_ig R_ih one of two rank vectors. For
 * p seasons over n cycles that is O(p·n²) once and O(p²·n²/2) small-integer products in all,
 * instead of recomputing both seasons' ranks (O(n²) each) for every one of the p(p−1)/2 pairs.
 * Every term of σ_gh is a whole number (K_gh, 4ΣRR and n(n_g+1)(n_h+1)) held exactly in doubles,
 * and the pairs are summed in the same order as the all-pairs form, so the sum is bit-identical to
 * it (test/stats/season-covariance.test.ts checks this against the all-pairs oracle).
 *
 * Limit: when p(p−1)/2 · (n(n−1)/2 + n) exceeds `workLimit` (default 4·10⁹ products, tens of
 * seconds on this project's machine), the correction is not computed and null is returned; the
 * caller must then report the uncorrected test and say so.
 */

export interface CycleCell {
  value: number;
  censored: boolean;
}

/** Sign of y_b − y_a with the censoring rule: ambiguous orders are 0. */
export function censoredSign(ya: number, ca: boolean, yb: number, cb: boolean): number {
  if (!ca && !cb) return Math.sign(yb - ya);
  if (ca && cb) return 0;
  if (ca) return yb >= ya ? 1 : 0; // "<ya" against yb
  return ya >= yb ? -1 : 0; // ya against "<yb"
}

/** One season's cycle pair signs and doubled ranks, computed once. */
export interface SeasonCycles {
  /** number of cycles (same for every season of one test) */
  n: number;
  /** cycles with a value */
  count: number;
  /** 2·R_i for each cycle (whole numbers) */
  ranks2: Float64Array;
  /** sgn(Y_j − Y_i) for each pair i < j in row order, 0 when either is missing */
  signs: Int8Array;
}

/** Pair signs and doubled ranks of one season over its cycles (null = no value in that cycle). */
export function prepareSeasonCycles(cells: readonly (CycleCell | null)[]): SeasonCycles {
  const n = cells.length;
  let count = 0;
  for (const cell of cells) if (cell) count++;
  const signs = new Int8Array((n * (n - 1)) / 2);
  const rankSums = new Float64Array(n);
  let p = 0;
  for (let i = 0; i < n; i++) {
    const ci = cells[i];
    for (let j = i + 1; j < n; j++, p++) {
      const cj = cells[j];
      if (!ci || !cj) continue;
      const sign = censoredSign(ci.value, ci.censored, cj.value, cj.censored);
      signs[p] = sign;
      // Σ_k sgn(Y_i − Y_k): pair (i, j) adds −sign to i and +sign to j
      rankSums[i] = (rankSums[i] as number) - sign;
      rankSums[j] = (rankSums[j] as number) + sign;
    }
  }
  const ranks2 = new Float64Array(n);
  for (let i = 0; i < n; i++) ranks2[i] = cells[i] ? count + 1 + (rankSums[i] as number) : count + 1;
  return { n, count, ranks2, signs };
}

/** σ_gh of two prepared seasons over the same cycles. */
export function preparedCovariance(a: SeasonCycles, b: SeasonCycles): number {
  const n = a.n;
  const sa = a.signs;
  const sb = b.signs;
  let k = 0;
  for (let p = 0; p < sa.length; p++) k += (sa[p] as number) * (sb[p] as number);
  let cross4 = 0;
  for (let i = 0; i < n; i++) cross4 += (a.ranks2[i] as number) * (b.ranks2[i] as number);
  return (k + cross4 - n * (a.count + 1) * (b.count + 1)) / 3;
}

/** σ_gh of two seasons over common cycles (null = missing in that cycle). */
export function seasonCovariance(a: readonly (CycleCell | null)[], b: readonly (CycleCell | null)[]): number {
  return preparedCovariance(prepareSeasonCycles(a), prepareSeasonCycles(b));
}

/** Default most products the covariance sum may take before it is left out. */
export const COVARIANCE_WORK_LIMIT = 4e9;

/**
 * Σ_{g<h} σ_gh over all pairs of seasons, or null when the work would exceed `workLimit`.
 * Sums in the order g = 0…, h = g+1… (the order of the all-pairs form).
 */
export function totalSeasonCovariance(cells: readonly (readonly (CycleCell | null)[])[], workLimit = COVARIANCE_WORK_LIMIT): number | null {
  const p = cells.length;
  if (p < 2) return 0;
  const n = (cells[0] as readonly (CycleCell | null)[]).length;
  const work = ((p * (p - 1)) / 2) * ((n * (n - 1)) / 2 + n);
  if (work > workLimit) return null;
  const pairsPerSeason = (n * (n - 1)) / 2;
  // one flat array of all seasons' signs and ranks, for a tight inner loop
  const signs = new Int8Array(p * pairsPerSeason);
  const ranks2 = new Float64Array(p * n);
  const counts1 = new Float64Array(p);
  for (let g = 0; g < p; g++) {
    const prepared = prepareSeasonCycles(cells[g] as readonly (CycleCell | null)[]);
    signs.set(prepared.signs, g * pairsPerSeason);
    ranks2.set(prepared.ranks2, g * n);
    counts1[g] = prepared.count + 1;
  }
  let covariance = 0;
  for (let g = 0; g < p; g++) {
    const og = g * pairsPerSeason;
    const rg = g * n;
    const countG = counts1[g] as number;
    for (let h = g + 1; h < p; h++) {
      const oh = h * pairsPerSeason;
      let k = 0;
      for (let q = 0; q < pairsPerSeason; q++) k += (signs[og + q] as number) * (signs[oh + q] as number);
      const rh = h * n;
      let cross4 = 0;
      for (let i = 0; i < n; i++) cross4 += (ranks2[rg + i] as number) * (ranks2[rh + i] as number);
      // whole numbers throughout, so the order of these additions does not change the value
      covariance += (k + cross4 - n * countG * (counts1[h] as number)) / 3;
    }
  }
  return covariance;
}
