/**
 * Regional Kendall test (Helsel & Frans 2006, "Regional Kendall test for trend", Environ. Sci.
 * Technol. 40(13):4066–4073; volume and pages from memory): the Seasonal Kendall test with sites in
 * place of seasons: S = Σ_sites S_k, Var(S) = Σ Var(S_k), z with the continuity correction; the
 * regional slope is the median of all within-site slopes. The cross-site covariance correction
 * (Hirsch & Slack 1984 form, sites sharing years) is reported as varSCovariance/pCovariance;
 * prefer it when sites are close enough to share weather. It is computed with each site's ranks
 * and cycle-pair signs prepared once (season-covariance.ts: about 0.3 s for 2,000 sites over ten
 * years here); beyond a work limit (sites² × years²) it is left out: varSCovariance and
 * pCovariance are then null and `covarianceSkipped` says why.
 *
 * Homogeneity of the trends across sites: `heterogeneity` is the van Belle & Hughes (1984) chi-square
 * ("Nonparametric tests for trend in water quality", Water Resour. Res. 20(1):127–136) with sites in
 * place of seasons: χ²_homog = Σ_k Z_k² − K·Z̄², Z_k = S_k/√Var(S_k) (no continuity correction),
 * df = K − 1 over the K sites with Var(S_k) > 0. A small p means the sites do not share one trend,
 * and USGS practice is then not to report one regional direction (see model/compose-region.ts).
 *
 * @example
 *   regionalKendall([{ site: 'a', points }, { site: 'b', points: others }], { confidence: 0.95 });
 */
import { seasonalKendall, type SeasonalKendallDetail, type SeasonGroup } from './seasonal-kendall.ts';
import { prepareSeries } from './series-input.ts';
import type { SeriesPoint } from './types.ts';

export interface RegionalSite {
  site: string;
  points: SeriesPoint[];
}

/**
 * Regional Kendall over sites; null when fewer than one site has 2 or more values.
 * @throws when a value or time is NaN or ±Infinity, or the confidence is not in (0, 1)
 */
export function regionalKendall(sites: readonly RegionalSite[], options: { confidence?: number } = {}): SeasonalKendallDetail | null {
  const groups: SeasonGroup[] = [];
  for (const { site, points } of sites) {
    const prepared = prepareSeries(points, 'regionalKendall');
    if (prepared.t.length < 2) continue;
    groups.push({ season: site, t: prepared.t, y: prepared.y, censored: prepared.censored });
  }
  if (groups.length === 0) return null;
  return seasonalKendall(groups, options.confidence === undefined ? {} : { confidence: options.confidence });
}
