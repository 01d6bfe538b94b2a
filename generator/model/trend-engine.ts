/**
 * The model's link to the trend engine in generator/stats: the trend of one series, the
 * Benjamini–Hochberg adjustment (Benjamini & Hochberg 1995) and the Regional Kendall test
 * (Helsel & Frans 2006).
 */
import { analyzeTrend, benjaminiHochberg, regionalKendall } from '../stats/index.ts';
import type { RegionalResult, TrendEngine } from './evaluate-season.ts';

export const statsTrendEngine: TrendEngine = {
  analyze: (points, options) => analyzeTrend(points, options),
  adjust: (pValues) => benjaminiHochberg([...pValues]),
  regional(series, options): RegionalResult | null {
    if (series.length === 0) return null;
    const result = regionalKendall(series, options);
    if (!result) return null;
    // Segments of one coast share weather and currents, so the cross-site covariance-corrected p
    // is used when it could be computed (Hirsch & Slack 1984 form; see regional-kendall.ts).
    return { S: result.S, z: result.z, p: result.pCovariance ?? result.p, slope: result.slope };
  },
};
