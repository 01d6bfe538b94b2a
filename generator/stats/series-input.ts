/**
 * Series input checks shared by the trend methods: drops missing values, rejects NaN and ±Infinity
 * with a message naming the point, and orders the points by time (stable, so equal times keep their
 * input order). Censored values ("<x") keep x as their value with a flag; they are never replaced
 * by a number below x.
 */
import type { SeriesPoint } from './types.ts';

/** A series as typed arrays, sorted by time. `censored[i]` is 1 when value i was reported as "<value". */
export interface PreparedSeries {
  t: Float64Array;
  y: Float64Array;
  censored: Uint8Array;
  nCensored: number;
  /** season label of each value (empty string when none was given) */
  season: string[];
  /** cycle of each value (NaN when none was given) */
  cycle: Float64Array;
}

/**
 * Check and order a series.
 * @throws when a time or a value is NaN or infinite
 */
export function prepareSeries(points: readonly SeriesPoint[], caller = 'trend'): PreparedSeries {
  const kept: { t: number; y: number; c: boolean; s: string; cycle: number; index: number }[] = [];
  for (let index = 0; index < points.length; index++) {
    const point = points[index] as SeriesPoint;
    if (!Number.isFinite(point.t)) {
      throw new Error(`${caller} requires finite times; point ${index} has time ${String(point.t)}`);
    }
    if (point.value === null || point.value === undefined) continue;
    if (!Number.isFinite(point.value)) {
      throw new Error(`${caller} requires finite values; point ${index} has value ${String(point.value)}`);
    }
    kept.push({ t: point.t, y: point.value, c: point.censored === true, s: point.season ?? '', cycle: point.cycle ?? Number.NaN, index });
  }
  kept.sort((a, b) => a.t - b.t || a.index - b.index);
  const n = kept.length;
  const t = new Float64Array(n);
  const y = new Float64Array(n);
  const censored = new Uint8Array(n);
  const season: string[] = new Array<string>(n);
  const cycle = new Float64Array(n);
  let nCensored = 0;
  for (let i = 0; i < n; i++) {
    const point = kept[i] as (typeof kept)[number];
    t[i] = point.t;
    y[i] = point.y;
    censored[i] = point.c ? 1 : 0;
    if (point.c) nCensored++;
    season[i] = point.s;
    cycle[i] = point.cycle;
  }
  return { t, y, censored, nCensored, season, cycle };
}

/**
 * Check that typed-array inputs are finite and of equal length.
 * @throws naming the caller, the array and the index of the first bad number
 */
export function assertFiniteArrays(caller: string, t: ArrayLike<number>, y: ArrayLike<number>): void {
  if (t.length !== y.length) throw new Error(`${caller} requires times and values of equal length; got ${t.length} and ${y.length}`);
  for (let i = 0; i < t.length; i++) {
    if (!Number.isFinite(t[i])) throw new Error(`${caller} requires finite times; index ${i} has ${String(t[i])}`);
    if (!Number.isFinite(y[i])) throw new Error(`${caller} requires finite values; index ${i} has ${String(y[i])}`);
  }
}
