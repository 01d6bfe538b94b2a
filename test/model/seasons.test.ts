import { describe, expect, test } from 'vitest';
import { previousSeasonId, seasonOfDate, seasonRef } from '../../generator/model/seasons.ts';
import { censoredMedian, seasonValues, seasonsBetween } from '../../generator/model/series.ts';
import { defaultSeasons } from '../../generator/scenario/settings.ts';
import type { Record as ScenarioRecord } from '../../generator/scenario/types.ts';

// Meteorological seasons (common practice): winter = Dec–Feb, counted to the year of its February.
describe('season arithmetic', () => {
  test('winter of 2026 runs from 1 December 2025 to 28 February 2026', () => {
    expect(seasonRef('2026-winter', defaultSeasons)).toEqual({ id: '2026-winter', label: 'Winter 2026', start: '2025-12-01', end: '2026-02-28' });
  });
  test('autumn 2026 is September to November; leap-year February ends on the 29th', () => {
    expect(seasonRef('2026-autumn', defaultSeasons)).toMatchObject({ start: '2026-09-01', end: '2026-11-30' });
    expect(seasonRef('2024-winter', defaultSeasons)?.end).toBe('2024-02-29');
  });
  test("dates fall in the right season; December belongs to the next year's winter", () => {
    expect(seasonOfDate('2025-12-15', defaultSeasons)).toBe('2026-winter');
    expect(seasonOfDate('2026-01-15', defaultSeasons)).toBe('2026-winter');
    expect(seasonOfDate('2026-10-01', defaultSeasons)).toBe('2026-autumn');
  });
  test('the season before', () => {
    expect(previousSeasonId('2026-autumn', defaultSeasons)).toBe('2026-summer');
    expect(previousSeasonId('2026-spring', defaultSeasons)).toBe('2026-winter');
    expect(previousSeasonId('2026-winter', defaultSeasons)).toBe('2025-autumn');
  });
  test('seasons between two seasons, inclusive', () => {
    expect(seasonsBetween('2025-autumn', '2026-summer', defaultSeasons)).toEqual(['2025-autumn', '2026-winter', '2026-spring', '2026-summer']);
  });
});

function record(date: string, season: string, value: number, censored = false, indicator: ScenarioRecord['indicator'] = 'beach-litter'): ScenarioRecord {
  return {
    indicator,
    segmentId: 'a',
    date,
    t: 0,
    season,
    seasonName: season.slice(5),
    value,
    censored,
    extra: {},
    source: { file: 'x.csv', row: 2 },
  };
}

describe('season values', () => {
  test('several samples in a season become their median; data after the season end are left out', () => {
    const values = seasonValues(
      [record('2026-06-10', '2026-summer', 10), record('2026-07-10', '2026-summer', 30), record('2026-08-10', '2026-summer', 20), record('2026-09-10', '2026-autumn', 99)],
      { aggregation: 'per-sample', untilSeason: seasonRef('2026-summer', defaultSeasons)!, definitions: defaultSeasons, monitored: null },
    );
    expect(values.map((v) => [v.season, v.value, v.samples])).toEqual([['2026-summer', 20, 3]]);
  });
  test('counts are summed per season; a season without reports in the monitored period counts 0', () => {
    const values = seasonValues(
      [
        record('2026-01-10', '2026-winter', 2, false, 'wildlife-reports'),
        record('2026-02-10', '2026-winter', 1, false, 'wildlife-reports'),
        record('2026-07-10', '2026-summer', 4, false, 'wildlife-reports'),
      ],
      {
        aggregation: 'season-total',
        untilSeason: seasonRef('2026-autumn', defaultSeasons)!,
        definitions: defaultSeasons,
        monitored: { first: '2026-winter', last: '2026-autumn' },
      },
    );
    expect(values.map((v) => [v.season, v.value])).toEqual([
      ['2026-winter', 3],
      ['2026-spring', 0],
      ['2026-summer', 4],
      ['2026-autumn', 0],
    ]);
  });
  test('a median whose middle value is below detection is marked censored', () => {
    expect(
      censoredMedian([
        { value: 0.05, censored: true },
        { value: 0.05, censored: true },
        { value: 0.4, censored: false },
      ]),
    ).toEqual({ value: 0.05, censored: true });
    expect(
      censoredMedian([
        { value: 0.05, censored: true },
        { value: 0.3, censored: false },
        { value: 0.4, censored: false },
      ]),
    ).toEqual({ value: 0.3, censored: false });
  });
});
