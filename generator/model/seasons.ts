/**
 * Season arithmetic. A season id is "<year>-<name>", e.g. "2026-autumn". A season belongs to the
 * year of its last month, so with the default meteorological seasons the winter of 2026 runs from
 * 1 December 2025 to the end of February 2026.
 */
import type { SeasonRef } from './types.ts';
import type { SeasonDefinition } from '../scenario/settings.ts';

export interface ParsedSeasonId {
  year: number;
  name: string;
}

export function parseSeasonId(id: string): ParsedSeasonId | null {
  const match = /^(\d{4})-([a-z0-9-]+)$/.exec(id);
  if (!match || match[1] === undefined || match[2] === undefined) return null;
  return { year: Number(match[1]), name: match[2] };
}

function pad(value: number): string {
  return String(value).padStart(2, '0');
}

function daysInMonth(year: number, month: number): number {
  return new Date(Date.UTC(year, month, 0)).getUTCDate();
}

/** Year of each month of a season of `year`: months before a wrap (12 → 1) belong to year − 1. */
function monthYears(definition: SeasonDefinition, year: number): { year: number; month: number }[] {
  const months = definition.months;
  let wrapIndex = -1;
  for (let i = 1; i < months.length; i += 1) {
    if ((months[i] ?? 0) < (months[i - 1] ?? 0)) wrapIndex = i;
  }
  return months.map((month, i) => ({ year: wrapIndex !== -1 && i < wrapIndex ? year - 1 : year, month }));
}

// Season references are asked for again and again (once per record): remember them per list
// of definitions. A copy is handed out, so no caller can change a remembered one.
const remembered = new WeakMap<readonly SeasonDefinition[], Map<string, SeasonRef | null>>();

export function seasonRef(id: string, definitions: readonly SeasonDefinition[]): SeasonRef | null {
  let known = remembered.get(definitions);
  if (!known) {
    known = new Map();
    remembered.set(definitions, known);
  }
  let ref = known.get(id);
  if (ref === undefined) {
    ref = computeSeasonRef(id, definitions);
    known.set(id, ref);
  }
  return ref === null ? null : { ...ref };
}

function computeSeasonRef(id: string, definitions: readonly SeasonDefinition[]): SeasonRef | null {
  const parsed = parseSeasonId(id);
  if (!parsed) return null;
  const definition = definitions.find((d) => d.id === parsed.name);
  if (!definition) return null;
  const months = monthYears(definition, parsed.year);
  const first = months[0];
  const last = months[months.length - 1];
  if (!first || !last) return null;
  return {
    id,
    label: `${definition.label} ${parsed.year}`,
    start: `${first.year}-${pad(first.month)}-01`,
    end: `${last.year}-${pad(last.month)}-${pad(daysInMonth(last.year, last.month))}`,
  };
}

/** The season id a date (YYYY-MM-DD) falls in, or null when no season holds its month. */
export function seasonOfDate(date: string, definitions: readonly SeasonDefinition[]): string | null {
  const year = Number(date.slice(0, 4));
  const month = Number(date.slice(5, 7));
  for (const definition of definitions) {
    for (const candidateYear of [year, year + 1]) {
      const months = monthYears(definition, candidateYear);
      if (months.some((m) => m.year === year && m.month === month)) return `${candidateYear}-${definition.id}`;
    }
  }
  return null;
}

function isoDayBefore(date: string): string {
  const time = Date.UTC(Number(date.slice(0, 4)), Number(date.slice(5, 7)) - 1, Number(date.slice(8, 10))) - 86_400_000;
  return new Date(time).toISOString().slice(0, 10);
}

/** The season just before `id` in the calendar (not necessarily a published one). */
export function previousSeasonId(id: string, definitions: readonly SeasonDefinition[]): string | null {
  const ref = seasonRef(id, definitions);
  if (!ref) return null;
  return seasonOfDate(isoDayBefore(ref.start), definitions);
}

/** Decimal year of an ISO date: year + (day of year − 1 + 0.5) / days in year (the middle of the day). */
export function decimalYear(date: string): number {
  const year = Number(date.slice(0, 4));
  const start = Date.UTC(year, 0, 1);
  const day = (Date.UTC(year, Number(date.slice(5, 7)) - 1, Number(date.slice(8, 10))) - start) / 86_400_000;
  const length = (Date.UTC(year + 1, 0, 1) - start) / 86_400_000;
  return year + (day + 0.5) / length;
}

/** Decimal year of the middle of a season. */
export function seasonMidYear(ref: SeasonRef): number {
  return (decimalYear(ref.start) + decimalYear(ref.end)) / 2;
}
