/**
 * Minimum-data rules: when a series is too thin for a trend claim, say so in plain words.
 * Each rule has an id (stable, for code) and a reason (for readers).
 *
 * | rule                | default       | reason printed                                   | source |
 * |---------------------|---------------|--------------------------------------------------|--------|
 * | `no-values`         | n = 0         | "no values"                                      | — |
 * | `few-values`        | n < 8         | "fewer than 8 values"                            | common practice; USEPA 2009 Unified Guidance (EPA 530/R-09-007) §17.3.2 asks for at least 8–10 values for the Mann–Kendall test (from memory) |
 * | `short-span`        | span < 5      | "values span less than 5 years"                  | common practice (time in years) |
 * | `mostly-censored`   | > 50% "<x"    | "most values are below the detection limit"      | common practice; Helsel 2012 (Statistics for Censored Environmental Data, 2nd ed.) warns that trend tests lose power fast above ~50% censoring (from memory) |
 * | `no-change`         | all equal     | "all values are the same"                        | Var(S) = 0: the test is undefined |
 * | `few-seasons`       | seasonal test | "fewer than 2 seasons have 2 or more values"     | Hirsch, Slack & Smith 1982 need ≥ 2 values per season to form S_g |
 */
import type { PreparedSeries } from './series-input.ts';

export interface MinimumDataOptions {
  /** fewest values; defaults to 8 */
  minValues?: number;
  /** shortest span of time, in the unit of `t` (years for dates); defaults to 5; 0 turns it off */
  minYears?: number;
  /** largest share of censored values; defaults to 0.5 */
  maxCensoredShare?: number;
  /** check the seasonal rule too; defaults to false */
  seasonal?: boolean;
}

export interface Shortfall {
  rule: string;
  reason: string;
}

/** The first minimum-data rule the series breaks, or null. */
export function minimumDataShortfall(series: PreparedSeries, options: MinimumDataOptions = {}): Shortfall | null {
  const minValues = options.minValues ?? 8;
  const minYears = options.minYears ?? 5;
  const maxCensoredShare = options.maxCensoredShare ?? 0.5;
  const n = series.t.length;
  if (n === 0) return { rule: 'no-values', reason: 'no values' };
  if (n < minValues) return { rule: 'few-values', reason: `fewer than ${minValues} values` };
  const span = (series.t[n - 1] as number) - (series.t[0] as number);
  if (minYears > 0 && span < minYears) return { rule: 'short-span', reason: `values span less than ${minYears} years` };
  if (series.nCensored / n > maxCensoredShare) return { rule: 'mostly-censored', reason: 'most values are below the detection limit' };
  let allSame = true;
  for (let i = 1; i < n; i++) {
    if (series.y[i] !== series.y[0] || series.censored[i] !== series.censored[0]) {
      allSame = false;
      break;
    }
  }
  if (allSame || series.nCensored === n) return { rule: 'no-change', reason: 'all values are the same' };
  if (options.seasonal) {
    const counts = new Map<string, number>();
    for (const season of series.season) counts.set(season, (counts.get(season) ?? 0) + 1);
    let usable = 0;
    for (const count of counts.values()) if (count >= 2) usable++;
    if (usable < 2) return { rule: 'few-seasons', reason: 'fewer than 2 seasons have 2 or more values' };
  }
  return null;
}
