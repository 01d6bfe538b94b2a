/**
 * The model's link to the trend engine in generator/stats: the trend of one series, the
 * Benjamini–Hochberg adjustment (Benjamini & Hochberg 1995) and the Regional Kendall test
 * (Helsel & Frans 2006). Large batches of series are spread over the cores (trend-pool.ts).
 */
import { analyzeTrend, benjaminiHochberg, regionalKendall } from '../stats/index.ts';
import { analyzeInPool } from '../stats/trend-pool.ts';
import type { RegionalResult, TrendEngine } from './evaluate-season.ts';

export const statsTrendEngine: TrendEngine = {
  analyze: (points, options) => analyzeTrend(points, options),
  // A season's series at once: on every core when there are many (trend-pool.ts), else one by one.
  analyzeMany: (requests) => analyzeInPool(requests),
  adjust: (pValues) => benjaminiHochberg([...pValues]),
  regional(series, options): RegionalResult | null {
    if (series.length === 0) return null;
    const result = regionalKendall(series, options);
    if (!result) return null;
    // Segments of one coast share weather and currents, so the cross-site covariance-corrected p
    // is used when it could be computed (Hirsch & Slack 1984 form; see regional-kendall.ts).
    // When it was left out (too many sites over too many years), the plain p is used and the
    // result says so.
    // The trends of the sites are tested for homogeneity (van Belle & Hughes 1984, the chi-square
    // of seasonal-kendall.ts with sites in place of seasons): where they differ, the regional
    // direction is not told as one (compose-region.ts).
    const regional: RegionalResult = { S: result.S, z: result.z, p: result.pCovariance ?? result.p, slope: result.slope, homogeneity: result.heterogeneity };
    if (result.pCovariance === null) regional.covarianceCorrected = false;
    return regional;
  },
};
