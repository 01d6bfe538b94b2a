/**
 * Seasonal Kendall test and seasonal Sen slope (Hirsch, Slack & Smith 1982, "Techniques of trend
 * analysis for monthly water quality data", Water Resour. Res. 18(1):107–121).
 *
 * - Per season g: Mann–Kendall S_g and tie-corrected Var(S_g) (mann-kendall.ts). S′ = Σ S_g,
 *   Var(S′) = Σ Var(S_g) for independent seasons (Hirsch et al. 1982 eqs. 3–4); z with the
 *   continuity correction and a two-sided p.
 * - Slope: median of all within-season pairwise slopes (Hirsch et al. 1982 p. 117); interval by
 *   Gilbert (1987, pp. 227–228) with N′ = number of within-season slopes and Var(S′), the ranks
 *   interpolated as in sens-slope.ts.
 * - Serially dependent seasons (computed in season-covariance.ts, which may leave it out for very
 *   many seasons over many cycles; `covarianceSkipped` then says so):
 *   Var(S′) = Σ Var(S_g) + 2 Σ_{g<h} σ_gh (Hirsch & Slack 1984,
 *   "A nonparametric trend test for seasonal data with serial dependence", Water Resour. Res.
 *   20(6):727–732, eq. 7; Dietz & Killeen 1981, J. Am. Stat. Assoc. 76:169–174), with
 *   σ_gh = [K_gh + 4 Σ_i R_ig R_ih − n(n_g + 1)(n_h + 1)]/3,
 *   K_gh = Σ_{i<j} sgn[(Y_jg − Y_ig)(Y_jh − Y_ih)], R_ig = [n_g + 1 + Σ_k sgn(Y_ig − Y_kg)]/2,
 *   a missing value adds 0 to K and takes the mid rank (n_g + 1)/2. The cycles (years) i are
 *   `cycle` of each point when given, else ⌊t⌋; several values of one season in one cycle are
 *   replaced by their median for this correction only. Hirsch & Slack report the correction
 *   unreliable for short records (e.g. 5 years of monthly data).
 * - Heterogeneity of seasonal trends (van Belle & Hughes 1984, "Nonparametric tests for trend in
 *   water quality", Water Resour. Res. 20(1):127–136): χ² = Σ Z_g² − p·Z̄², Z_g = S_g/√Var(S_g)
 *   (no continuity correction), df = p − 1, over the p seasons with Var(S_g) > 0.
 * - tau: S′ / Σ_g √[(n0_g − n1_g)(n0_g − n2_g)] (tau-b pooled over seasons); tauA = S′/Σ n0_g, the
 *   form EnvStats prints.
 *
 * Censored values follow the rule of kendall-score.ts for S; slopes use the uncensored values
 * (censored-slope-rule.ts). Within-season slopes are listed (memory
 * O(N′)); this suits seasonal records (tens of values per season), not millions.
 */
import { chiSquareUpperTail } from './chi-square-distribution.ts';
import { continuityCorrectedZ, mannKendall, twoSidedP } from './mann-kendall.ts';
import { checkConfidence, intervalRanks } from './sens-slope.ts';
import { totalSeasonCovariance, type CycleCell } from './season-covariance.ts';
import { listAllSlopes } from './slope-selection.ts';
import type { SeasonalKendallResult } from './types.ts';

export { seasonCovariance, type CycleCell } from './season-covariance.ts';

/** One season's values, sorted by time. */
export interface SeasonGroup {
  season: string;
  t: Float64Array;
  y: Float64Array;
  censored?: Uint8Array;
  /** cycle (e.g. year) of each value, for the covariance correction; defaults to ⌊t⌋ */
  cycle?: Float64Array;
}

export interface SeasonalKendallOptions {
  /** confidence level of the slope interval; defaults to 0.95 */
  confidence?: number;
  /** most products the covariance correction may take (season-covariance.ts); beyond it the correction is left out */
  covarianceWorkLimit?: number;
}

export interface SeasonalKendallDetail extends SeasonalKendallResult {
  tauA: number | null;
  zCovariance: number | null;
  nSlopes: number;
  /** present only when the covariance correction was left out, saying why */
  covarianceSkipped?: string;
}

/** Within-season slopes between uncensored values (the censoring rule of censored-slope-rule.ts). */
function uncensoredSlopes(g: SeasonGroup): Float64Array {
  if (!g.censored || !g.censored.includes(1)) return listAllSlopes(g.t, g.y);
  const t: number[] = [];
  const y: number[] = [];
  for (let i = 0; i < g.t.length; i++) {
    if (g.censored[i]) continue;
    t.push(g.t[i] as number);
    y.push(g.y[i] as number);
  }
  return listAllSlopes(t, y);
}

function cycleTable(groups: readonly SeasonGroup[]): { cycles: number[]; cells: (CycleCell | null)[][] } {
  const cycleSet = new Set<number>();
  const perGroup: Map<number, { values: number[]; censored: boolean[] }>[] = groups.map((g) => {
    const map = new Map<number, { values: number[]; censored: boolean[] }>();
    for (let i = 0; i < g.t.length; i++) {
      const cycle = g.cycle ? (g.cycle[i] as number) : Math.floor(g.t[i] as number);
      cycleSet.add(cycle);
      let entry = map.get(cycle);
      if (!entry) map.set(cycle, (entry = { values: [], censored: [] }));
      entry.values.push(g.y[i] as number);
      entry.censored.push(g.censored ? g.censored[i] === 1 : false);
    }
    return map;
  });
  const cycles = [...cycleSet].sort((a, b) => a - b);
  const cells = perGroup.map((map) =>
    cycles.map((cycle) => {
      const entry = map.get(cycle);
      if (!entry) return null;
      const order = entry.values.map((_value, i) => i).sort((a, b) => (entry.values[a] as number) - (entry.values[b] as number));
      const mid = order[(order.length - 1) >> 1] as number;
      // median (lower median for an even count, so the value stays an observed one with its flag)
      return { value: entry.values[mid] as number, censored: entry.censored[mid] as boolean };
    }),
  );
  return { cycles, cells };
}

/**
 * Seasonal Kendall test on groups of one season each.
 * @throws when a group holds NaN or ±Infinity, or the confidence is not in (0, 1)
 */
export function seasonalKendall(groups: readonly SeasonGroup[], options: SeasonalKendallOptions = {}): SeasonalKendallDetail {
  const confidence = options.confidence ?? 0.95;
  checkConfidence(confidence);
  let S = 0;
  let varS = 0;
  let tauDenominator = 0;
  let pairs = 0;
  const seasons: SeasonalKendallResult['seasons'] = [];
  const zs: number[] = [];
  const slopeLists: Float64Array[] = [];
  for (const g of groups) {
    const mk = mannKendall(g.t, g.y, g.censored);
    S += mk.S;
    varS += mk.varS;
    seasons.push({ season: g.season, n: mk.n, S: mk.S, varS: mk.varS });
    if (mk.varS > 0) zs.push(mk.S / Math.sqrt(mk.varS));
    const n0 = (mk.n * (mk.n - 1)) / 2;
    pairs += n0;
    let timePairs = 0;
    for (const u of mk.timeTies) timePairs += (u * (u - 1)) / 2;
    let valuePairs = 0;
    for (const u of mk.valueTies) valuePairs += (u * (u - 1)) / 2;
    tauDenominator += Math.sqrt((n0 - timePairs) * (n0 - valuePairs));
    slopeLists.push(uncensoredSlopes(g));
  }
  const z = continuityCorrectedZ(S, varS);
  // slopes: pooled within-season slopes
  let nSlopes = 0;
  for (const list of slopeLists) nSlopes += list.length;
  const slopes = new Float64Array(nSlopes);
  let offset = 0;
  for (const list of slopeLists) {
    slopes.set(list, offset);
    offset += list.length;
  }
  slopes.sort();
  const at = (rank: number): number => {
    const low = slopes[Math.floor(rank) - 1] as number;
    const high = slopes[Math.ceil(rank) - 1] as number;
    return low + (rank - Math.floor(rank)) * (high - low);
  };
  let slope: number | null = null;
  let lower: number | null = null;
  let upper: number | null = null;
  if (nSlopes > 0) {
    slope = at((nSlopes + 1) / 2);
    const { lowerRank, upperRank } = intervalRanks(nSlopes, varS, confidence);
    lower = lowerRank >= 1 && lowerRank <= nSlopes ? at(lowerRank) : null;
    upper = upperRank >= 1 && upperRank <= nSlopes ? at(upperRank) : null;
  }
  // Hirsch & Slack (1984) covariance correction
  let varSCovariance: number | null = null;
  let covarianceSkipped: string | null = null;
  if (groups.length > 0) {
    const { cells } = cycleTable(groups);
    const covariance = totalSeasonCovariance(cells, options.covarianceWorkLimit);
    if (covariance === null) covarianceSkipped = `the covariance correction was not computed: ${groups.length} groups over ${cells[0]?.length ?? 0} cycles exceed the work limit`;
    else varSCovariance = varS + 2 * covariance;
  }
  const zCovariance = varSCovariance === null ? null : continuityCorrectedZ(S, varSCovariance);
  // van Belle & Hughes (1984) heterogeneity
  let heterogeneity: SeasonalKendallResult['heterogeneity'] = null;
  if (zs.length >= 2) {
    let sum = 0;
    let sumSquares = 0;
    for (const value of zs) {
      sum += value;
      sumSquares += value * value;
    }
    const mean = sum / zs.length;
    const chi2 = Math.max(0, sumSquares - zs.length * mean * mean);
    const df = zs.length - 1;
    heterogeneity = { chi2, df, p: chiSquareUpperTail(chi2, df) };
  }
  const result: SeasonalKendallDetail = {
    S,
    varS,
    z,
    p: twoSidedP(z),
    tau: tauDenominator > 0 ? S / tauDenominator : null,
    tauA: pairs > 0 ? S / pairs : null,
    slope,
    lower,
    upper,
    varSCovariance,
    pCovariance: twoSidedP(zCovariance),
    zCovariance,
    heterogeneity,
    seasons,
    nSlopes,
  };
  if (covarianceSkipped !== null) result.covarianceSkipped = covarianceSkipped;
  return result;
}
