/**
 * The demo's season calendar: the four meteorological seasons with the project's default ids
 * (winter of year Y = December of Y−1 to February of Y), ten years from 2017-winter to 2026-autumn.
 */

export const SEASON_NAMES = ['winter', 'spring', 'summer', 'autumn'] as const;
export type SeasonName = (typeof SEASON_NAMES)[number];

export interface DemoSeason {
  index: number; // 0 = first season of the record
  id: string; // "2026-autumn"
  name: SeasonName;
  year: number;
  /** Days since 1970-01-01 (UTC) of the first and last day. */
  startDay: number;
  endDay: number;
}

const MS_PER_DAY = 86_400_000;

export function dayNumber(year: number, month: number, day: number): number {
  return Date.UTC(year, month - 1, day) / MS_PER_DAY;
}

export function isoDate(dayNum: number): string {
  return new Date(dayNum * MS_PER_DAY).toISOString().slice(0, 10);
}

export function isoDateTime(dayNum: number): string {
  return new Date(Math.round(dayNum * MS_PER_DAY)).toISOString().replace('.000Z', 'Z');
}

/** Decimal year of a day number: year + (day of year − 1) / days in year. */
export function decimalYear(dayNum: number): number {
  const date = new Date(dayNum * MS_PER_DAY);
  const year = date.getUTCFullYear();
  const first = dayNumber(year, 1, 1);
  const next = dayNumber(year + 1, 1, 1);
  return year + (dayNum - first) / (next - first);
}

const START_MONTH: Record<SeasonName, number> = { winter: 12, spring: 3, summer: 6, autumn: 9 };

export function seasonOf(year: number, name: SeasonName, index = 0): DemoSeason {
  const startYear = name === 'winter' ? year - 1 : year;
  const startDay = dayNumber(startYear, START_MONTH[name], 1);
  const endMonth = START_MONTH[name] + 3;
  const endDay = dayNumber(startYear + Math.floor((endMonth - 1) / 12), ((endMonth - 1) % 12) + 1, 1) - 1;
  return { index, id: `${year}-${name}`, name, year, startDay, endDay };
}

/** Consecutive seasons from `firstYear`-winter, `count` of them. */
export function seasonRange(firstYear: number, count: number): DemoSeason[] {
  const seasons: DemoSeason[] = [];
  for (let index = 0; index < count; index++) {
    const name = SEASON_NAMES[index % 4] as SeasonName;
    seasons.push(seasonOf(firstYear + Math.floor(index / 4), name, index));
  }
  return seasons;
}

/** The demo record: 2017-winter (from 1 Dec 2016) to 2026-autumn (to 30 Nov 2026). */
export const DEMO_SEASONS = seasonRange(2017, 40);
