/**
 * The direction a bulletin may claim for one indicator at one segment.
 * Rising or falling only when the Benjamini–Hochberg q-value (Benjamini & Hochberg 1995) across the
 * region's segments is below the false-discovery rate; the sign comes from the Kendall score S
 * (Seasonal Kendall S′ when the seasonal test ran). Otherwise the direction is uncertain.
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

export function decideDirection(trend: TrendResult | null, qValue: number | null, falseDiscoveryRate: number): Direction {
  if (!trend || trend.n === 0 || trend.insufficient) return 'too-little-data';
  if (qValue === null || !(qValue < falseDiscoveryRate)) return 'no-clear-direction';
  const score = trendScore(trend);
  if (score === null || score === 0) return 'no-clear-direction';
  return score > 0 ? 'rising' : 'falling';
}
