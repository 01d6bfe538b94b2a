/**
 * Reads a drift-arrivals table aggregated upstream (columns segment_id, season, arrivals): one row
 * per segment and season with the number of modelled particles arriving there.
 */
import { DriftSeasonUnknown, UnknownSegment } from '../errors.ts';
import { driftArrivals } from '../indicators/drift-arrivals.ts';
import { readCsvTable } from '../read/csv-table.ts';
import { buildRules } from '../read/indicator-table.ts';
import type { IssueLog } from '../read/issue-log.ts';
import type { ResourceEntry, TableSchema } from '../read/package-descriptor.ts';
import { seasonRange } from '../read/season-calendar.ts';
import type { SeasonDefinition } from '../scenario/settings.ts';

export interface ArrivalRow {
  segmentId: string;
  season: string;
  arrivals: number;
}

const defaultSchema: TableSchema = {
  fields: [
    { name: 'segment_id', type: 'string' },
    { name: 'season', type: 'string' },
    { name: 'arrivals', type: 'number' },
  ],
  missingValues: [''],
  primaryKey: ['segment_id', 'season'],
  foreignKeys: [],
};

export async function readArrivalsTable(
  resource: ResourceEntry,
  absolutePath: string,
  seasons: readonly SeasonDefinition[],
  segmentIds: ReadonlySet<string>,
  segmentsFile: string,
  log: IssueLog,
): Promise<ArrivalRow[]> {
  const schema = resource.schema ?? defaultSchema;
  const file = resource.path;
  const rows: ArrivalRow[] = [];
  await readCsvTable({
    absolutePath,
    file,
    dialect: resource.dialect,
    compression: resource.compression,
    rules: buildRules(schema, driftArrivals),
    missingValues: schema.missingValues,
    essentialColumns: ['segment_id', 'season', 'arrivals'],
    primaryKey: schema.primaryKey ?? ['segment_id', 'season'],
    log,
    onRow: (row) => {
      const segmentId = String(row.values['segment_id'] ?? '');
      const season = String(row.values['season'] ?? '');
      let keep = true;
      if (!segmentIds.has(segmentId)) {
        log.add(UnknownSegment, UnknownSegment.message(file, row.line, 'segment_id', segmentId, segmentsFile), {
          file,
          row: row.line,
          column: 'segment_id',
          value: segmentId,
          expected: `a segment id from ${segmentsFile}`,
          severity: 'warning',
          excluded: true,
        });
        keep = false;
      }
      if (!knownDriftSeason(season, seasons, log, file, row.line)) keep = false;
      if (!keep) return 'excluded';
      rows.push({ segmentId, season, arrivals: Number(row.values['arrivals']) });
      return 'kept';
    },
  });
  return rows;
}

/** Whether a drift table's season id names a season of the settings; logs DriftSeasonUnknown (the row left out) when not. */
export function knownDriftSeason(season: string, seasons: readonly SeasonDefinition[], log: IssueLog, file: string, line: number): boolean {
  if (seasonRange(season, seasons) !== null) return true;
  log.add(DriftSeasonUnknown, DriftSeasonUnknown.message(file, line, 'season', season), {
    file,
    row: line,
    column: 'season',
    value: season,
    expected: 'YYYY-<season id>',
    severity: 'warning',
    excluded: true,
  });
  return false;
}
