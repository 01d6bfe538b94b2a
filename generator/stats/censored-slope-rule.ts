/**
 * When values below a detection limit ("<x") leave Sen's slope meaningless, and which values the
 * slope uses otherwise. No substitution: a censored value is never replaced by x, x/2 or 0
 * (Helsel 2012, Statistics for Censored Environmental Data Using Minitab and R, 2nd ed., Wiley,
 * ch. 1 and 6 on why substitution misleads).
 *
 * Our rule (a simplification: Helsel 2012 ch. 11 recommends the Akritas–Theil–Sen line for
 * censored data, which is not implemented here):
 * 1. nothing censored: every value is used;
 * 2. more than half censored: not estimable, "most values are below the detection limit";
 * 3. the highest detection limit is at or above the median of the measured values: not
 *    estimable, "detection limits are as high as the typical measured value" (the unknown values
 *    could then fall anywhere in the middle of the data);
 * 4. otherwise the slope uses the measured (uncensored) values only: the censored ones lie below
 *    the lower half of the data, where dropping them moves the median slope little.
 * The Mann–Kendall S always uses every value (ambiguous pairs as ties; kendall-score.ts).
 */
import type { PreparedSeries } from './series-input.ts';
import { median } from './sens-slope.ts';

export type CensoredSlopeDecision = { estimable: true; t: Float64Array; y: Float64Array; droppedCensored: number } | { estimable: false; reason: string };

export function censoredSlopeRule(series: PreparedSeries): CensoredSlopeDecision {
  const n = series.t.length;
  if (series.nCensored === 0) return { estimable: true, t: series.t, y: series.y, droppedCensored: 0 };
  if (series.nCensored / n > 0.5) return { estimable: false, reason: 'most values are below the detection limit' };
  const t: number[] = [];
  const y: number[] = [];
  let highestLimit = -Infinity;
  for (let i = 0; i < n; i++) {
    if (series.censored[i]) highestLimit = Math.max(highestLimit, series.y[i] as number);
    else {
      t.push(series.t[i] as number);
      y.push(series.y[i] as number);
    }
  }
  if (highestLimit >= median(y)) return { estimable: false, reason: 'detection limits are as high as the typical measured value' };
  return { estimable: true, t: Float64Array.from(t), y: Float64Array.from(y), droppedCensored: series.nCensored };
}
