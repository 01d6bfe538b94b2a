/**
 * Reads a drift-end-positions table written upstream (by the drift job in
 * generator/drift/scaleout/): columns season, lon, lat, one row per particle still drifting at
 * the end of a season (its last position in the season), rows of a season in the order the
 * particles first appeared in it. The accumulation zones are found from these positions exactly
 * as from positions read here.
 */
import { knownDriftSeason } from './arrivals-table.ts';
import { readCsvTable } from '../read/csv-table.ts';
import { buildRules } from '../read/indicator-table.ts';
import type { IssueLog } from '../read/issue-log.ts';
import type { ResourceEntry, TableSchema } from '../read/package-descriptor.ts';
import type { SeasonDefinition } from '../scenario/settings.ts';

const defaultSchema: TableSchema = {
  fields: [
    { name: 'season', type: 'string', constraints: { required: true } },
    { name: 'lon', type: 'number', constraints: { required: true, minimum: -180, maximum: 180 } },
    { name: 'lat', type: 'number', constraints: { required: true, minimum: -90, maximum: 90 } },
  ],
  missingValues: [''],
  foreignKeys: [],
};

/** End-of-season positions per season, in file order. */
export async function readEndPositionsTable(
  resource: ResourceEntry,
  absolutePath: string,
  seasons: readonly SeasonDefinition[],
  log: IssueLog,
): Promise<Map<string, { lon: number[]; lat: number[] }>> {
  const schema = resource.schema ?? defaultSchema;
  const file = resource.path;
  const bySeason = new Map<string, { lon: number[]; lat: number[] }>();
  await readCsvTable({
    absolutePath,
    file,
    dialect: resource.dialect,
    compression: resource.compression,
    rules: buildRules(schema, null),
    missingValues: schema.missingValues,
    essentialColumns: ['season', 'lon', 'lat'],
    primaryKey: [],
    log,
    onRow: (row) => {
      const season = String(row.values['season'] ?? '');
      if (!knownDriftSeason(season, seasons, log, file, row.line)) return 'excluded';
      let positions = bySeason.get(season);
      if (!positions) {
        positions = { lon: [], lat: [] };
        bySeason.set(season, positions);
      }
      positions.lon.push(Number(row.values['lon']));
      positions.lat.push(Number(row.values['lat']));
      return 'kept';
    },
  });
  return bySeason;
}
