/**
 * The direction a bulletin may claim for one indicator at one segment.
 * Rising or falling only when the Benjamini–Hochberg q-value (Benjamini & Hochberg 1995) across the
 * region's segments is below the false-discovery rate; the sign comes from the Kendall score S
 * (Seasonal Kendall S′ when the seasonal test ran). Otherwise the direction is uncertain.
 *
 * One more condition, our own: the slope estimate (the Seasonal Kendall slope when the seasonal
 * test ran, else Sen's slope) must not be zero or point the other way. With many tied values (a
 * count that is 0 in most seasons) the Kendall test can pass while the slope is exactly 0; a
 * bulletin would then say "going up" beside "about 0 more a year", so no direction is claimed.
 */
import type { Direction } from './types.ts';
import type { TrendResult } from '../stats/types.ts';

/** The p-value that enters the false-discovery check: Seasonal Kendall when it ran, else Mann–Kendall. */
export function trendPValue(trend: TrendResult | null): number | null {
  if (!trend || trend.insufficient) return null;
  const seasonal = trend.seasonalKendall;
  if (seasonal) return seasonal.p;
  return trend.mannKendall?.p ?? null;
}

export function trendScore(trend: TrendResult | null): number | null {
  if (!trend) return null;
  if (trend.seasonalKendall) return trend.seasonalKendall.S;
  return trend.mannKendall?.S ?? null;
}

/** The slope a bulletin prints: Seasonal Kendall slope when it ran, else Sen's slope; null when none. */
export function trendSlope(trend: TrendResult | null): number | null {
  if (!trend || trend.sen?.notEstimable) return null;
  if (trend.seasonalKendall && trend.seasonalKendall.slope !== null) return trend.seasonalKendall.slope;
  return trend.sen?.slope ?? null;
}

/**
 * The direction a series may claim if its q-value passes: depends on the trend alone, so it can
 * be worked out once per series and kept (decideDirection = this, then the q-value check).
 */
export function directionIfClear(trend: TrendResult | null): Direction {
  if (!trend || trend.n === 0 || trend.insufficient) return 'too-little-data';
  const score = trendScore(trend);
  if (score === null || score === 0) return 'no-clear-direction';
  const slope = trendSlope(trend);
  if (slope !== null && (slope === 0 || Math.sign(slope) !== Math.sign(score))) return 'no-clear-direction';
  return score > 0 ? 'rising' : 'falling';
}

/** The claimed direction from `directionIfClear` and the series' q-value. */
export function directionWithQ(ifClear: Direction, qValue: number | null, falseDiscoveryRate: number): Direction {
  if (ifClear === 'too-little-data') return ifClear;
  if (qValue === null || !(qValue < falseDiscoveryRate)) return 'no-clear-direction';
  return ifClear;
}

export function decideDirection(trend: TrendResult | null, qValue: number | null, falseDiscoveryRate: number): Direction {
  return directionWithQ(directionIfClear(trend), qValue, falseDiscoveryRate);
}
