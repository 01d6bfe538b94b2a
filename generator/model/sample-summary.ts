/**
 * Season summaries of a series' samples, for the chart and the data table of a bulletin page when
 * the series has more samples than a page can draw or list one by one (a national table can hold
 * hundreds of thousands of surveys of one stretch of coast). Each season gives its number of
 * samples, their median, lowest and highest value and how many were below the lab's detection
 * limit (counted at the limit, as the chart draws them). The trend itself never uses these: it is
 * computed on the samples as before. Every sample stays in the bulletin's observations download.
 */
import { median } from 'd3-array';
import { censoredMedian } from './series.ts';
import type { Observation, SeasonId, SeasonSampleSummary } from './types.ts';

/** Above this many samples, a page shows season summaries instead of each sample. */
export const mostSamplesDrawn = 400;

/** One summary per season that has a sample with a value, oldest first; null when few enough samples to draw. */
export function seasonSampleSummaries(observations: readonly Observation[], limit = mostSamplesDrawn): SeasonSampleSummary[] | null {
  if (observations.length <= limit) return null;
  const bySeason = new Map<SeasonId, { t: number[]; samples: { value: number; censored: boolean }[]; below: number }>();
  for (const o of observations) {
    if (o.value === null) continue;
    let group = bySeason.get(o.season);
    if (!group) {
      group = { t: [], samples: [], below: 0 };
      bySeason.set(o.season, group);
    }
    group.t.push(o.t);
    group.samples.push({ value: o.value, censored: o.censored });
    if (o.censored) group.below++;
  }
  const out: SeasonSampleSummary[] = [];
  for (const [season, group] of bySeason) {
    let lowest = Number.POSITIVE_INFINITY;
    let highest = Number.NEGATIVE_INFINITY;
    for (const { value } of group.samples) {
      if (value < lowest) lowest = value;
      if (value > highest) highest = value;
    }
    out.push({
      season,
      t: median(group.t) as number,
      samples: group.samples.length,
      // the same median as the season's value in the trend (censored samples at their limit)
      median: (censoredMedian(group.samples) as { value: number }).value,
      lowest,
      highest,
      belowDetection: group.below,
    });
  }
  return out.sort((a, b) => a.t - b.t);
}
