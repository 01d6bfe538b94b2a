/**
 * From records to the series a trend test reads: one value per segment, indicator and season.
 *
 * - Several samples in one season are combined into their median (one value per season and year,
 *   as the Seasonal Kendall test expects; Hirsch, Slack & Smith 1982). The median is marked
 *   censored when the middle value(s) were below detection.
 * - For counts summed per season (wildlife reports, modelled arrivals) the season value is the
 *   total; a season inside the monitored period with no report counts 0. The monitored period
 *   runs from the first to the last season with any record of that indicator in the scenario.
 * - Only records dated up to the end of the season being published are used, so a past bulletin
 *   never changes when new data arrive.
 */
import type { Record as ScenarioRecord } from '../scenario/types.ts';
import type { SeasonDefinition } from '../scenario/settings.ts';
import type { SeriesPoint } from '../stats/types.ts';
import type { SeasonRef } from './types.ts';
import { parseSeasonId, previousSeasonId, seasonMidYear, seasonRef } from './seasons.ts';

export interface SeasonValue {
  season: string; // "2026-autumn"
  seasonName: string; // "autumn"
  t: number; // decimal year of the middle of the season
  value: number | null;
  censored: boolean;
  samples: number;
}

/** Median of numbers; null for none. */
export function median(values: readonly number[]): number | null {
  if (values.length === 0) return null;
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  if (sorted.length % 2 === 1) return sorted[middle] ?? null;
  return ((sorted[middle - 1] ?? 0) + (sorted[middle] ?? 0)) / 2;
}

/** Median of samples that may be censored; censored when a middle sample is censored. */
export function censoredMedian(samples: readonly { value: number; censored: boolean }[]): { value: number; censored: boolean } | null {
  if (samples.length === 0) return null;
  const sorted = [...samples].sort((a, b) => a.value - b.value || Number(b.censored) - Number(a.censored));
  const middle = Math.floor(sorted.length / 2);
  const picks = sorted.length % 2 === 1 ? [sorted[middle]] : [sorted[middle - 1], sorted[middle]];
  const known = picks.filter((p): p is { value: number; censored: boolean } => p !== undefined);
  const value = known.reduce((sum, p) => sum + p.value, 0) / known.length;
  return { value, censored: known.some((p) => p.censored) };
}

/** Season ids from `first` to `last` inclusive, oldest first. */
export function seasonsBetween(first: string, last: string, definitions: readonly SeasonDefinition[]): string[] {
  const out: string[] = [];
  let current: string | null = last;
  const firstRef = seasonRef(first, definitions);
  if (!firstRef) return out;
  for (let guard = 0; current !== null && guard < 4000; guard += 1) {
    out.push(current);
    if (current === first) break;
    const ref = seasonRef(current, definitions);
    if (!ref || ref.start <= firstRef.start) break;
    current = previousSeasonId(current, definitions);
  }
  return out.reverse();
}

function refOrThrow(id: string, definitions: readonly SeasonDefinition[]): SeasonRef {
  const ref = seasonRef(id, definitions);
  if (!ref) throw new Error(`seasonal series: season ${id} matches no season definition`);
  return ref;
}

/**
 * Season values of one segment and one indicator up to the end of `untilSeason`.
 * `records` are that segment's records of that indicator; `monitored` is the first and last season
 * with data of the indicator anywhere (used for counts only).
 */
export function seasonValues(
  records: readonly ScenarioRecord[],
  options: {
    aggregation: 'per-sample' | 'season-total';
    untilSeason: SeasonRef;
    definitions: readonly SeasonDefinition[];
    monitored: { first: string; last: string } | null;
  },
): SeasonValue[] {
  const kept = records.filter((r) => r.date <= options.untilSeason.end && r.value !== null);
  const bySeason = new Map<string, ScenarioRecord[]>();
  for (const record of kept) {
    const list = bySeason.get(record.season) ?? [];
    list.push(record);
    bySeason.set(record.season, list);
  }
  let seasons = [...bySeason.keys()];
  if (options.aggregation === 'season-total' && options.monitored) {
    const lastMonitored = options.monitored.last < options.untilSeason.id ? options.monitored.last : options.untilSeason.id;
    const lastRef = seasonRef(lastMonitored, options.definitions);
    const end = lastRef && lastRef.end <= options.untilSeason.end ? lastMonitored : options.untilSeason.id;
    const firstRef = seasonRef(options.monitored.first, options.definitions);
    if (firstRef && firstRef.start <= options.untilSeason.end) {
      seasons = [...new Set([...seasons, ...seasonsBetween(options.monitored.first, end, options.definitions)])];
    }
  }
  const values: SeasonValue[] = [];
  for (const season of seasons) {
    const ref = refOrThrow(season, options.definitions);
    if (ref.start > options.untilSeason.end) continue;
    const list = bySeason.get(season) ?? [];
    const parsed = parseSeasonId(season);
    const seasonName = list[0]?.seasonName ?? parsed?.name ?? season;
    if (options.aggregation === 'season-total') {
      const total = list.reduce((sum, r) => sum + (r.value ?? 0), 0);
      values.push({ season, seasonName, t: seasonMidYear(ref), value: total, censored: false, samples: list.length });
    } else {
      const m = censoredMedian(list.map((r) => ({ value: r.value ?? 0, censored: r.censored })));
      values.push({ season, seasonName, t: seasonMidYear(ref), value: m?.value ?? null, censored: m?.censored ?? false, samples: list.length });
    }
  }
  return values.sort((a, b) => a.t - b.t);
}

/** The series points handed to the trend engine; the cycle is the season's year (winter 2026 = 2026). */
export function toSeriesPoints(values: readonly SeasonValue[]): SeriesPoint[] {
  return values.map((v) => {
    const year = parseSeasonId(v.season)?.year;
    return year === undefined
      ? { t: v.t, value: v.value, censored: v.censored, season: v.seasonName }
      : { t: v.t, value: v.value, censored: v.censored, season: v.seasonName, cycle: year };
  });
}
