/**
 * Turns the drift-model resources of a scenario into per-segment, per-season arrivals and
 * offshore accumulation zones.
 *
 * Sources, in order of preference for the figures (the others are still read and checked):
 * 1. `drift-positions` CSV (plain or gzip), streamed;
 * 2. `drift-trajectories` CF NetCDF (NetCDF-3 or NetCDF-4), used when no positions CSV is listed,
 *    since both usually hold the same model run;
 * 3. `drift-arrivals`, a table aggregated upstream (for instance by the drift job in
 *    generator/drift/scaleout/); used when neither of the above is listed. With it, a
 *    `drift-end-positions` table (the last position in each season of every particle still
 *    drifting) gives the accumulation zones; without one there are no zones.
 * Arrivals per km = arrivals / segment length (km). Each segment's nearest zone is the zone of the
 * same season whose centroid is closest to the segment line.
 */
import type { ScenarioSettings } from '../scenario/settings.ts';
import type { DriftArrivals, LoadedScenario, Segment } from '../scenario/types.ts';
import type { AccumulationZone } from '../model/types.ts';
import { InputValidationError, PositionsOutsideSeasons } from '../errors.ts';
import type { IssueLog } from '../read/issue-log.ts';
import type { ResourceEntry } from '../read/package-descriptor.ts';
import { accumulationZones } from './accumulation-zones.ts';
import { readArrivalsTable } from './arrivals-table.ts';
import { readEndPositionsTable } from './end-positions-table.ts';
import { SegmentIndex } from './segment-index.ts';
import { DriftTally } from './drift-tally.ts';
import { readTrajectoryFile } from './trajectory-file.ts';
import { readPositionsCsv } from './positions-csv.ts';
import { DriftPeriodGuard } from './drift-period.ts';
import { seasonRange } from '../read/season-calendar.ts';

export interface DriftInput {
  resources: readonly { resource: ResourceEntry; absolutePath: string }[];
  segments: readonly Segment[];
  settings: ScenarioSettings;
  segmentsFile: string;
  log: IssueLog;
  onProgress?: (phase: string, done: number, total?: number) => void;
}

type DriftResult = NonNullable<LoadedScenario['drift']>;

/** Each segment's nearest zone of the season: the zone whose centroid is closest to the segment line. */
function nearestZone(index: SegmentIndex, segment: number, zones: readonly AccumulationZone[]): { id: string; distanceKm: number } | null {
  let nearest: { id: string; distanceKm: number } | null = null;
  for (const zone of zones) {
    const km = index.distanceToSegmentKm(zone.lon, zone.lat, segment);
    if (!nearest || km < nearest.distanceKm) nearest = { id: zone.id, distanceKm: km };
  }
  return nearest;
}

/** Arrivals and zones from a filled tally. */
export function summariseTally(tally: DriftTally, segments: readonly Segment[], settings: ScenarioSettings): DriftResult {
  const arrivals: DriftArrivals[] = [];
  const zones: { season: string; zones: AccumulationZone[] }[] = [];
  for (const season of tally.seasonIds()) {
    const end = tally.endOfSeason(season);
    const seasonZones = accumulationZones(end.lon, end.lat, settings.drift.zoneDistanceKm, settings.drift.zoneMinParticles);
    zones.push({ season, zones: seasonZones });
    const counts = tally.arrivalsOf(season);
    segments.forEach((segment, s) => {
      const count = counts?.[s] ?? 0;
      arrivals.push({
        segmentId: segment.id,
        season,
        arrivals: count,
        arrivalsPerKm: segment.lengthKm > 0 ? count / segment.lengthKm : 0,
        nearestZone: nearestZone(tally.index, s, seasonZones),
      });
    });
  }
  return { arrivals, zones };
}

/**
 * Streams the drift positions through one tally: the positions CSV files, or the trajectory files
 * when no CSV is listed (trajectory files are always read and checked). Null when neither is listed.
 */
export async function tallyDriftFiles(input: DriftInput): Promise<DriftTally | null> {
  const { log, segments, settings } = input;
  const positions = input.resources.filter((r) => r.resource.role === 'drift-positions');
  const trajectories = input.resources.filter((r) => r.resource.role === 'drift-trajectories');
  if (positions.length + trajectories.length === 0) return null;
  const mainTally = new DriftTally(segments, settings.seasons, settings.drift.arrivalDistanceKm);
  const period = new DriftPeriodGuard(settings, segments);
  const useTrajectories = positions.length === 0;
  // Positions in months no season covers are counted, not listed one by one (files are huge).
  const reportOutside = (file: string, before: number): void => {
    const count = mainTally.outsideSeasons - before;
    if (count > 0) {
      log.add(PositionsOutsideSeasons, PositionsOutsideSeasons.message(file, count), {
        file,
        row: null,
        column: 'time',
        value: String(count),
        expected: 'times inside the seasons of scenario.json',
        severity: 'warning',
        excluded: true,
      });
    }
  };
  for (const { resource, absolutePath } of positions) {
    const before = mainTally.outsideSeasons;
    input.onProgress?.(`reading ${resource.path}`, 0);
    await readPositionsCsv({
      absolutePath,
      file: resource.path,
      compression: resource.compression,
      delimiter: resource.dialect.delimiter,
      log,
      onProgress: (done, total) => input.onProgress?.(`reading ${resource.path}`, done, total),
      onPosition: (particle, timeMs, lon, lat, ashore) => period.admit(timeMs, lon, lat) && mainTally.add(particle, timeMs, lon, lat, ashore),
    });
    reportOutside(resource.path, before);
    period.report(resource.path, log);
  }
  for (const [fileNumber, { resource, absolutePath }] of trajectories.entries()) {
    input.onProgress?.(`reading ${resource.path}`, 0);
    // Trajectory files are always checked; their positions count only when no CSV is listed.
    const tally = useTrajectories ? mainTally : null;
    const before = mainTally.outsideSeasons;
    try {
      // Trajectory numbers restart in every file: an offset per file keeps particles distinct.
      const offset = fileNumber * 100_000_000;
      await readTrajectoryFile(
        absolutePath,
        resource.path,
        log,
        (p) => period.admit(p.timeMs, p.lon, p.lat) && (tally ? tally.add(p.particle + offset, p.timeMs, p.lon, p.lat, p.ashore) : true),
      );
      reportOutside(resource.path, before);
      period.report(resource.path, log);
    } catch (error) {
      if (!(error instanceof InputValidationError)) throw error;
      log.push(error.issue);
      log.countsFor(resource.path);
    }
  }
  return mainTally;
}

export async function readDrift(input: DriftInput): Promise<DriftResult | null> {
  const { log, segments, settings } = input;
  const tables = input.resources.filter((r) => r.resource.role === 'drift-arrivals');
  const endTables = input.resources.filter((r) => r.resource.role === 'drift-end-positions');
  const mainTally = await tallyDriftFiles(input);
  if (mainTally === null && tables.length === 0) return null;
  if (mainTally !== null) {
    input.onProgress?.('drift zones', 0);
    const result = summariseTally(mainTally, segments, settings);
    // Both raw positions and an aggregated table: the table is checked but the positions are used.
    for (const { resource, absolutePath } of tables) {
      await readArrivalsTable(resource, absolutePath, settings.seasons, new Set(segments.map((s) => s.id)), input.segmentsFile, log);
    }
    for (const { resource, absolutePath } of endTables) await readEndPositionsTable(resource, absolutePath, settings.seasons, log);
    return result;
  }
  const lengths = new Map(segments.map((s) => [s.id, s.lengthKm]));
  const arrivals: DriftArrivals[] = [];
  for (const { resource, absolutePath } of tables) {
    const rows = await readArrivalsTable(resource, absolutePath, settings.seasons, new Set(lengths.keys()), input.segmentsFile, log);
    for (const row of rows) {
      const km = lengths.get(row.segmentId) ?? 0;
      arrivals.push({ segmentId: row.segmentId, season: row.season, arrivals: row.arrivals, arrivalsPerKm: km > 0 ? row.arrivals / km : 0, nearestZone: null });
    }
  }
  const seasons = [...new Set(arrivals.map((a) => a.season))].sort((a, b) =>
    (seasonRange(a, settings.seasons)?.start ?? a).localeCompare(seasonRange(b, settings.seasons)?.start ?? b),
  );
  if (endTables.length === 0) return { arrivals, zones: seasons.map((season) => ({ season, zones: [] })) };
  // End-of-season positions aggregated upstream: zones and each segment's nearest zone as above.
  const ends = new Map<string, { lon: number[]; lat: number[] }>();
  for (const { resource, absolutePath } of endTables) {
    for (const [season, positions] of await readEndPositionsTable(resource, absolutePath, settings.seasons, log)) {
      const all = ends.get(season);
      if (all) {
        // one at a time: spreading a long array into push overflows the call stack
        for (let i = 0; i < positions.lon.length; i++) {
          all.lon.push(positions.lon[i]!);
          all.lat.push(positions.lat[i]!);
        }
      } else ends.set(season, positions);
    }
  }
  const index = new SegmentIndex(segments);
  const position = new Map(segments.map((segment, s) => [segment.id, s]));
  const zones = seasons.map((season) => {
    const end = ends.get(season);
    return { season, zones: end ? accumulationZones(Float64Array.from(end.lon), Float64Array.from(end.lat), settings.drift.zoneDistanceKm, settings.drift.zoneMinParticles) : [] };
  });
  const zonesOf = new Map(zones.map((z) => [z.season, z.zones]));
  for (const arrival of arrivals) arrival.nearestZone = nearestZone(index, position.get(arrival.segmentId) ?? -1, zonesOf.get(arrival.season) ?? []);
  return { arrivals, zones };
}
