/** Reads the committed demo tables for the demo tests (plain CSV parsing with csv-parse). */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parse } from 'csv-parse/sync';

export const DEMO_DIR = fileURLToPath(new URL('../../content/demo/', import.meta.url));

export type Row = Record<string, string>;

export function readTable(name: string): Row[] {
  return parse(readFileSync(join(DEMO_DIR, 'tables', `${name}.csv`), 'utf8'), { columns: true }) as Row[];
}

export const SEASON_OF_MONTH = ['winter', 'winter', 'spring', 'spring', 'spring', 'summer', 'summer', 'summer', 'autumn', 'autumn', 'autumn', 'winter'] as const;

export function seasonName(date: string): string {
  return SEASON_OF_MONTH[Number(date.slice(5, 7)) - 1] ?? 'unknown';
}

/** Values of one segment in date order: beach litter normalised to items/100 m; "<x" read as x. */
export function series(rows: readonly Row[], segmentId: string, column: string): { date: string; value: number; censored: boolean }[] {
  return rows
    .filter((row) => row['segment_id'] === segmentId)
    .map((row) => {
      const cell = row[column] ?? '';
      const censored = cell.startsWith('<');
      let value = Number(censored ? cell.slice(1) : cell);
      if (column === 'items') value = (value * 100) / Number(row['surveyed_length_m']);
      return { date: row['date'] ?? '', value, censored };
    })
    .sort((a, b) => a.date.localeCompare(b.date));
}

export function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? (sorted[mid] as number) : ((sorted[mid - 1] as number) + (sorted[mid] as number)) / 2;
}
