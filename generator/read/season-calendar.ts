/**
 * Which season a date belongs to, and the first and last day of a season, for the season
 * definitions of a scenario (four meteorological seasons by default: winter = December of the
 * previous year to February). A season whose months wrap past December (e.g. [12, 1, 2]) takes
 * the year of its last month: winter 2026 = December 2025 to February 2026.
 */
import type { SeasonDefinition } from '../scenario/settings.ts';

export interface SeasonPlace {
  /** "2026-autumn" */
  id: string;
  /** "autumn" */
  name: string;
  year: number;
}

/** Months of a season in calendar order starting from its first month, e.g. [12, 1, 2]. */
function monthsInOrder(season: SeasonDefinition): number[] {
  return season.months;
}

/** Offset (0 or −1) of a month's year from the season's year: December of a wrapping winter → −1. */
function yearOffset(season: SeasonDefinition, month: number): number {
  const months = monthsInOrder(season);
  const last = months[months.length - 1] ?? month;
  // Months after the season's last month in calendar terms belong to the previous calendar year.
  return month > last ? -1 : 0;
}

/** Parses YYYY-MM-DD into its parts, or null when it is not a real calendar date. */
export function parseIsoDate(text: string): { year: number; month: number; day: number } | null {
  const match = /^(\d{4})-(\d{2})-(\d{2})$/.exec(text);
  if (!match) return null;
  const year = Number(match[1]);
  const month = Number(match[2]);
  const day = Number(match[3]);
  if (month < 1 || month > 12 || day < 1) return null;
  const daysInMonth = new Date(Date.UTC(year, month, 0)).getUTCDate();
  if (day > daysInMonth) return null;
  return { year, month, day };
}

export function seasonOfMonth(year: number, month: number, seasons: readonly SeasonDefinition[]): SeasonPlace | null {
  for (const season of seasons) {
    if (!season.months.includes(month)) continue;
    const seasonYear = year - yearOffset(season, month);
    return { id: `${seasonYear}-${season.id}`, name: season.id, year: seasonYear };
  }
  return null;
}

/** Season of an ISO date, or null when no season covers its month. */
export function seasonOfDate(date: string, seasons: readonly SeasonDefinition[]): SeasonPlace | null {
  const parts = parseIsoDate(date.slice(0, 10));
  if (!parts) return null;
  return seasonOfMonth(parts.year, parts.month, seasons);
}

/** Season of an instant given in milliseconds since 1970 (UTC). */
export function seasonOfTime(milliseconds: number, seasons: readonly SeasonDefinition[]): SeasonPlace | null {
  const date = new Date(milliseconds);
  if (Number.isNaN(date.getTime())) return null;
  return seasonOfMonth(date.getUTCFullYear(), date.getUTCMonth() + 1, seasons);
}

function isoDay(year: number, month: number, day: number): string {
  const yyyy = String(year).padStart(4, '0');
  return `${yyyy}-${String(month).padStart(2, '0')}-${String(day).padStart(2, '0')}`;
}

/** First and last day of a season id like "2026-winter", or null when unknown. */
export function seasonRange(seasonId: string, seasons: readonly SeasonDefinition[]): { start: string; end: string } | null {
  const match = /^(\d{4})-([a-z0-9-]+)$/.exec(seasonId);
  if (!match) return null;
  const year = Number(match[1]);
  const season = seasons.find((s) => s.id === match[2]);
  if (!season) return null;
  const first = season.months[0];
  const last = season.months[season.months.length - 1];
  if (first === undefined || last === undefined) return null;
  const firstYear = year + yearOffset(season, first);
  const lastYear = year + yearOffset(season, last);
  const lastDay = new Date(Date.UTC(lastYear, last, 0)).getUTCDate();
  return { start: isoDay(firstYear, first, 1), end: isoDay(lastYear, last, lastDay) };
}

/** Decimal year of a date: year + (days since 1 January + 0.5) / days in the year. */
export function decimalYear(date: string): number {
  const parts = parseIsoDate(date.slice(0, 10));
  if (!parts) return Number.NaN;
  const start = Date.UTC(parts.year, 0, 1);
  const next = Date.UTC(parts.year + 1, 0, 1);
  const at = Date.UTC(parts.year, parts.month - 1, parts.day);
  return parts.year + ((at - start) / 86_400_000 + 0.5) / ((next - start) / 86_400_000);
}
