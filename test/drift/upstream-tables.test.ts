// The drift tables an upstream aggregation hands to the build (drift-arrivals and
// drift-end-positions) give the same drift figures as the positions they were made from, and the
// nearest-segment rule decides exact ties by the order of the segments file, whatever the R-tree's
// visiting order. Invented data (test/drift/drift-job-fixtures.ts).
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, test } from 'vitest';
import { readDrift } from '../../generator/drift/drift-model.ts';
import { SegmentIndex } from '../../generator/drift/segment-index.ts';
import { IssueLog } from '../../generator/read/issue-log.ts';
import { readPackageDescriptor } from '../../generator/read/package-descriptor.ts';
import { readSegments } from '../../generator/read/read-segments.ts';
import { readSettings } from '../../generator/read/read-settings.ts';
import type { Segment } from '../../generator/scenario/types.ts';
import { builtinTally } from './builtin-tally.ts';
import { writeCsvScenario } from './drift-job-fixtures.ts';

async function driftOf(dir: string, roles: readonly string[]) {
  const log = new IssueLog();
  const descriptor = await readPackageDescriptor(join(dir, 'datapackage.json'), 'datapackage.json', log);
  const settingsResource = descriptor.resources.find((r) => r.role === 'settings');
  const segmentsResource = descriptor.resources.find((r) => r.role === 'segments');
  if (!settingsResource || !segmentsResource) throw new Error('fixture without settings or segments');
  const settings = await readSettings(join(dir, settingsResource.path), settingsResource.path, log, settingsResource.format);
  if (!settings) throw new Error('fixture settings not readable');
  const segments = await readSegments(join(dir, segmentsResource.path), segmentsResource.path, log);
  const resources = descriptor.resources.filter((r) => roles.includes(r.role)).map((resource) => ({ resource, absolutePath: join(dir, resource.path) }));
  return { drift: await readDrift({ resources, segments, settings, segmentsFile: segmentsResource.path, log }), log };
}

describe('drift tables aggregated upstream', () => {
  const dir = mkdtempSync(join(tmpdir(), 'wrackline-upstream-'));
  afterAll(() => rmSync(dir, { recursive: true, force: true }));

  test('drift-arrivals with drift-end-positions give the arrivals and zones of the positions themselves', async () => {
    writeCsvScenario(dir);
    const tables = (await builtinTally(dir)).tables;
    writeFileSync(join(dir, 'drift', 'arrivals.csv'), `segment_id,season,arrivals\n${tables.arrivals.map((a) => `${a.segmentId},${a.season},${a.arrivals}`).join('\n')}\n`);
    writeFileSync(join(dir, 'drift', 'ends.csv'), `season,lon,lat\n${tables.endPositions.map((e) => `${e.season},${e.lon},${e.lat}`).join('\n')}\n`);
    const descriptorPath = join(dir, 'datapackage.json');
    const descriptor = JSON.parse(readFileSync(descriptorPath, 'utf8')) as { resources: object[] };
    descriptor.resources.push(
      { name: 'arrivals', role: 'drift-arrivals', path: 'drift/arrivals.csv', format: 'csv' },
      { name: 'ends', role: 'drift-end-positions', path: 'drift/ends.csv', format: 'csv' },
    );
    writeFileSync(descriptorPath, JSON.stringify(descriptor));
    const fromPositions = await driftOf(dir, ['drift-positions']);
    const fromTables = await driftOf(dir, ['drift-arrivals', 'drift-end-positions']);
    expect(fromTables.log.issues).toEqual([]);
    expect(fromPositions.drift?.zones.some((z) => z.zones.length > 0)).toBe(true);
    expect(fromTables.drift).toEqual(fromPositions.drift);
  });

  test('a bad end position is reported with file, row and column and left out', async () => {
    writeFileSync(join(dir, 'drift', 'ends.csv'), 'season,lon,lat\n2026-spring,10.1,40.05\n2026-spring,10.1,95\n2026-brumaire,10.1,40.05\n');
    const { log } = await driftOf(dir, ['drift-arrivals', 'drift-end-positions']);
    const messages = log.issues.map((i) => `${i.file} ${i.row} ${i.column}`);
    expect(messages).toEqual(['drift/ends.csv 3 lat', 'drift/ends.csv 4 season']);
  });
});

describe('nearest segment when two are exactly as near', () => {
  // Two segments sharing the vertex (10, 40.1); the point (9.98, 40.105) is beyond the end of one
  // and before the start of the other, so both distances are the distance to the shared vertex.
  const line = (id: string, coordinates: [number, number][]): Segment => ({ id, geometry: { type: 'LineString', coordinates } }) as unknown as Segment;
  const north = line('north', [
    [10.0, 40.0],
    [10.0, 40.1],
  ]);
  const slant = line('slant', [
    [10.0, 40.1],
    [10.05, 40.15],
  ]);

  test('the segment listed first wins, in either order', () => {
    expect(new SegmentIndex([north, slant], 2).nearestWithin(9.98, 40.105, 2)?.segment).toBe(0);
    expect(new SegmentIndex([slant, north], 2).nearestWithin(9.98, 40.105, 2)?.segment).toBe(0);
    const a = new SegmentIndex([north, slant]);
    expect(a.distanceToSegmentKm(9.98, 40.105, 0)).toBe(a.distanceToSegmentKm(9.98, 40.105, 1));
  });
});
