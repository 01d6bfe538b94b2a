/**
 * The trend engine: nonparametric trend tests and slopes for monitoring series. The only barrel of
 * generator/stats; one method per module.
 */

// Whole analysis of one series
export { analyzeTrend, BOOTSTRAP_MAX_VALUES, type AnalyzeTrendOptions } from './analyze-trend.ts';

// Mann–Kendall test
export { mannKendall, continuityCorrectedZ, twoSidedP, type MannKendallDetail } from './mann-kendall.ts';
export { kendallScore, knightScore, countInversions, type KendallScore } from './kendall-score.ts';
export { kendallVariance } from './kendall-variance.ts';
export { kendallExactTwoSidedP, inversionCounts } from './kendall-exact-distribution.ts';

// Sen's slope
export { sensSlope, median, intervalRanks, type SensSlopeOptions, type SensSlopeDetail } from './sens-slope.ts';
export { selectPairwiseSlopes, countSlopePairs, listAllSlopes, type SlopeSelectionOptions } from './slope-selection.ts';

// Seasonal and regional tests
export { seasonalKendall, seasonCovariance, type SeasonGroup, type SeasonalKendallDetail } from './seasonal-kendall.ts';
export { regionalKendall, type RegionalSite } from './regional-kendall.ts';

// Serial correlation
export { hamedRaoCorrection, hamedRaoFactor, yueWangFactor, averageRanks } from './serial-correction.ts';

// Values below a detection limit
export { censoredSlopeRule, type CensoredSlopeDecision } from './censored-slope-rule.ts';

// Many segments at once
export { benjaminiHochberg, benjaminiHochbergDecision, type BenjaminiHochbergDecision } from './benjamini-hochberg.ts';

// Uncertainty band
export { trendBand, theilSenLine, probabilityUpFromCounts, type TrendBandOptions, type TrendBandResult } from './trend-band.ts';

// Minimum-data rules
export { minimumDataShortfall, type MinimumDataOptions, type Shortfall } from './minimum-data.ts';

// Input and distributions
export { prepareSeries, type PreparedSeries } from './series-input.ts';
export { normalCdf, normalUpperTail, normalQuantile, normalDensity } from './normal-distribution.ts';
export { chiSquareUpperTail } from './chi-square-distribution.ts';

export type * from './types.ts';
