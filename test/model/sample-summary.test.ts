// Season summaries for series with more samples than a page can draw (generator/model/sample-summary.ts).
// Reference medians from simple-statistics (Tom MacWright, simple-statistics 7: `median`), a
// general-purpose library independent of the project's own median.
import { median as referenceMedian } from 'simple-statistics';
import { describe, expect, it } from 'vitest';
import { mostSamplesDrawn, seasonSampleSummaries } from '../../generator/model/sample-summary.ts';
import type { Observation } from '../../generator/model/types.ts';

function observations(count: number, seasons: readonly string[]): Observation[] {
  return Array.from({ length: count }, (_, i) => {
    const season = seasons[i % seasons.length] as string;
    const year = Number(season.slice(0, 4));
    return { date: `${year}-06-01`, t: year + 0.4 + (i % 7) / 1000, season, value: (i * 37) % 101, censored: i % 50 === 0 };
  });
}

describe('season summaries of many samples', () => {
  it('leaves a series of up to 400 samples to be drawn one by one', () => {
    expect(seasonSampleSummaries(observations(mostSamplesDrawn, ['2024-summer']))).toBeNull();
  });

  it('summarises a series of 401 samples per season, with the median a reference library gives', () => {
    const list = observations(mostSamplesDrawn + 1, ['2023-summer', '2024-summer', '2025-summer']);
    const summaries = seasonSampleSummaries(list);
    expect(summaries?.map((s) => s.season)).toEqual(['2023-summer', '2024-summer', '2025-summer']);
    for (const summary of summaries ?? []) {
      const values = list.filter((o) => o.season === summary.season).map((o) => o.value as number);
      expect(summary.samples).toBe(values.length);
      expect(summary.median).toBe(referenceMedian(values));
      expect(summary.lowest).toBe(Math.min(...values));
      expect(summary.highest).toBe(Math.max(...values));
      expect(summary.belowDetection).toBe(list.filter((o) => o.season === summary.season && o.censored).length);
    }
  });

  it('summarises a million samples without overflowing the call stack', () => {
    // a 1,000,000-row beach-litter table crashed the chart with "Maximum call stack size exceeded"
    const summaries = seasonSampleSummaries(observations(1_000_000, ['2025-winter', '2025-spring']));
    expect(summaries?.reduce((n, s) => n + s.samples, 0)).toBe(1_000_000);
  });
});
