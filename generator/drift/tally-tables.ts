/**
 * A filled drift tally as the two tables an upstream aggregation hands to the build (the
 * `drift-arrivals` and `drift-end-positions` resources): arrivals for every segment in every
 * season with positions (seasons oldest first, segments in file order), and the end-of-season
 * positions of drifting particles per season. Used to check the drift job in
 * generator/drift/scaleout/ against this reader.
 */
import type { DriftTally } from './drift-tally.ts';

export interface TallyTables {
  arrivals: { segmentId: string; season: string; arrivals: number }[];
  endPositions: { season: string; lon: number; lat: number }[];
}

export function tallyTables(tally: DriftTally): TallyTables {
  const arrivals: TallyTables['arrivals'] = [];
  const endPositions: TallyTables['endPositions'] = [];
  for (const season of tally.seasonIds()) {
    const counts = tally.arrivalsOf(season);
    tally.segments.forEach((segment, s) => arrivals.push({ segmentId: segment.id, season, arrivals: counts?.[s] ?? 0 }));
    const end = tally.endOfSeason(season);
    for (let i = 0; i < end.lon.length; i++) endPositions.push({ season, lon: end.lon[i] ?? 0, lat: end.lat[i] ?? 0 });
  }
  return { arrivals, endPositions };
}
