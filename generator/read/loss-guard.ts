/**
 * The loss guard: a publication must not lose most of a table without someone deciding so.
 *
 * After every monitoring table is read, two checks turn quiet losses into errors (a build then
 * stops and publishes nothing):
 * - a table that left out more than the allowed share of its rows (default 5 %);
 * - a segment whose every row in a table was left out (its series would read "not measured").
 * The error says how many rows were lost, why (grouped by cause) and how to accept the loss on
 * purpose: an entry in scenario.json `leftOutAllowed` naming the table and the share allowed.
 * Listing a table also accepts whole series of it lost; those stay in the report as warnings.
 */
import * as catalogue from '../errors.ts';
import { SeriesLoss, TableLoss } from '../errors.ts';
import type { ErrorData } from '../errors.ts';
import type { ScenarioSettings } from '../scenario/settings.ts';
import type { FileCounts, IssueLog } from './issue-log.ts';

/** Share of a table's rows that may be left out before a build stops, unless accepted. */
export const defaultAllowedShare = 0.05;

export interface SeriesRows {
  read: number;
  kept: number;
  leftOut: Set<number>;
}

export interface TableRows {
  file: string;
  /** Rows read and kept per segment that exists, and the rows of it left out. */
  series: ReadonlyMap<string, SeriesRows>;
}

const titles = new Map<string, string>(
  Object.values(catalogue)
    .filter((entry): entry is ErrorData => typeof entry === 'object' && entry !== null && 'name' in entry && 'title' in entry)
    .map((entry) => [entry.name, entry.title]),
);

/** "47 value of the wrong type, 1 unknown coastline segment": rows left out grouped by cause. */
export function causesOf(log: IssueLog, file: string, onlyRows: ReadonlySet<number> | null = null): string {
  const byCode = new Map<string, number>();
  const rowsSeen = new Set<number>();
  for (const item of log.issues) {
    if (item.file !== file || !item.excluded || item.severity !== 'warning') continue;
    if (onlyRows !== null && (item.row === null || !onlyRows.has(item.row))) continue;
    // One row may have several bad cells: count each row once, under its first cause.
    if (item.row !== null && item.code !== 'SegmentLeftOut') {
      if (rowsSeen.has(item.row)) continue;
      rowsSeen.add(item.row);
    }
    const code = item.code ?? 'other';
    const rows = item.code === 'SegmentLeftOut' ? Number(/: (\d+) row/.exec(item.message)?.[1] ?? 1) : 1;
    byCode.set(code, (byCode.get(code) ?? 0) + rows);
  }
  return [...byCode.entries()]
    .sort((a, b) => b[1] - a[1])
    .map(([code, n]) => `${n} ${(titles.get(code) ?? code).toLowerCase()}`)
    .join(', ');
}

function percent(share: number): string {
  return `${Math.round(share * 1000) / 10} %`;
}

/** Adds a TableLoss or SeriesLoss error for every loss nobody accepted. */
export function guardLosses(tables: readonly TableRows[], counts: readonly FileCounts[], settings: ScenarioSettings, settingsFile: string, log: IssueLog): void {
  for (const table of tables) {
    const count = counts.find((c) => c.file === table.file);
    if (!count || count.read === 0 || count.excluded === 0) continue;
    const accepted = settings.leftOutAllowed.find((entry) => entry.table === table.file);
    const allowed = accepted?.share ?? defaultAllowedShare;
    const share = count.excluded / count.read;
    // A table no row of which was kept is already an error (NoUsableRows) when nothing else is.
    if (share > allowed) {
      const acceptance = `to accept it on purpose, add to ${settingsFile}: "leftOutAllowed": [{ "table": "${table.file}", "share": ${Math.ceil(share * 100) / 100}, "reason": "…" }]`;
      log.add(
        TableLoss,
        TableLoss.message(table.file, count.excluded, count.read, causesOf(log, table.file), accepted ? `${percent(allowed)} accepted in ${settingsFile}` : `${percent(allowed)}`),
        {
          file: table.file,
          row: null,
          column: null,
          value: `${count.excluded} of ${count.read}`,
          expected: `at most ${percent(allowed)} of the rows left out`,
          severity: 'error',
          excluded: false,
          hint: `Fix the rows listed as warnings for ${table.file}; ${acceptance}`,
        },
      );
    }
    if (accepted) continue;
    for (const [segment, rows] of table.series) {
      if (rows.read === 0 || rows.kept > 0) continue;
      log.add(SeriesLoss, SeriesLoss.message(table.file, segment, rows.read, causesOf(log, table.file, rows.leftOut)), {
        file: table.file,
        row: null,
        column: null,
        value: segment,
        expected: 'at least one row kept for each segment that has rows',
        severity: 'error',
        excluded: false,
        hint: `Fix the rows of ${segment} listed as warnings; to accept the loss on purpose, list the table in ${settingsFile}: "leftOutAllowed": [{ "table": "${table.file}", "share": …, "reason": "…" }]`,
      });
    }
  }
}
