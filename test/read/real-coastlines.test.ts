// Coastlines as the real world has them: closed island rings, island groups, polygons with holes,
// national data with 10^5+ vertices, a coast across the 180° meridian, digitising flaws and
// swapped coordinates. Each case seen with real files is one test, named after the case.
//
// Real geometry: Natural Earth 1:50m admin-0 countries (public domain), as redistributed in the
// world-atlas package (countries-50m.json, TopoJSON, Natural Earth version 4.1.0).
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { join } from 'node:path';
import { feature as topologyFeature } from 'topojson-client';
import type { Topology } from 'topojson-specification';
import { describe, expect, test } from 'vitest';
import { loadScenario } from '../../generator/read/load-scenario.ts';
import { findSelfCrossing, unwrapLongitudes } from '../../generator/read/line-crossings.ts';
import { assertInDelta } from '../asserts.ts';
import { baseScenario, beachHeader, expectIssue, scenarioCopy } from './fixture-scenario.ts';

type Position = [number, number];
const segmentsFile = 'segments.geojson';
const require = createRequire(import.meta.url);

function feature(id: string, geometry: unknown, extra: Record<string, unknown> = {}): unknown {
  return { type: 'Feature', properties: { id, name: `Name of ${id}`, kind: 'island-shore', shellfish: 'none', ...extra }, geometry };
}

function withFeatures(...features: unknown[]): string {
  const base = JSON.parse(readFileSync(join(baseScenario, segmentsFile), 'utf8')) as { features: unknown[] };
  return JSON.stringify({ type: 'FeatureCollection', features: [...base.features, ...features] });
}

/** Outer rings of a country's polygons in Natural Earth 1:50m (world-atlas countries-50m.json). */
function naturalEarthRings(country: string): Position[][] {
  const topology = JSON.parse(readFileSync(require.resolve('world-atlas/countries-50m.json'), 'utf8')) as Topology;
  const collection = topologyFeature(topology, 'countries') as unknown as { features: { properties: { name: string }; geometry: { type: string; coordinates: unknown } }[] };
  const found = collection.features.find((f) => f.properties.name === country);
  if (!found) throw new Error(`${country} not in Natural Earth`);
  const polygons = (found.geometry.type === 'Polygon' ? [found.geometry.coordinates] : found.geometry.coordinates) as Position[][][];
  return polygons.map((polygon) => polygon[0] ?? []);
}

/** Great-circle length of a line in km: haversine sum, mean Earth radius 6371.0088 km (IUGG). */
function haversineKm(line: readonly Position[]): number {
  const rad = Math.PI / 180;
  let sum = 0;
  for (let i = 1; i < line.length; i++) {
    const [lon1, lat1] = line[i - 1] as Position;
    const [lon2, lat2] = line[i] as Position;
    const h = Math.sin(((lat2 - lat1) * rad) / 2) ** 2 + Math.cos(lat1 * rad) * Math.cos(lat2 * rad) * Math.sin(((lon2 - lon1) * rad) / 2) ** 2;
    sum += 2 * Math.asin(Math.min(1, Math.sqrt(h)));
  }
  return sum * 6371.0088;
}

async function loadSegments(...features: unknown[]) {
  return loadScenario(scenarioCopy({ files: { [segmentsFile]: withFeatures(...features) } }));
}

describe('real coastlines', () => {
  test('closed LineString island shore is valid, not "the line crosses itself"', async () => {
    // Fiji's largest ring in Natural Earth 1:50m lies wholly east of 180°; its closed outline is the
    // whole shore of an island, which OGC Simple Features and RFC 7946 allow as a closed line.
    const ring = naturalEarthRings('Fiji')
      .filter((r) => r.every(([lon]) => lon > 0))
      .sort((a, b) => b.length - a.length)[0] as Position[];
    expect(ring[0]).toEqual(ring[ring.length - 1]);
    const scenario = await loadSegments(feature('fiji-main-shore', { type: 'LineString', coordinates: ring }));
    expect(scenario.report.issues.filter((i) => i.file === segmentsFile)).toEqual([]);
    const segment = scenario.segments.find((s) => s.id === 'fiji-main-shore');
    expect(segment).toBeDefined();
    // Haversine and d3-geo's great-circle length agree to rounding (same sphere, same radius).
    assertInDelta(segment?.lengthKm ?? 0, haversineKm(ring), 1e-6 * haversineKm(ring));
  });

  test('self-crossing segment is a warning naming the segment and the point; the segment is kept', async () => {
    // A figure of eight: edges (0,50)–(0.1,50.1) and (0.1,50)–(0,50.1) cross at (0.05, 50.05).
    const eight = {
      type: 'LineString',
      coordinates: [
        [0, 50],
        [0.1, 50.1],
        [0.1, 50],
        [0, 50.1],
      ],
    };
    const scenario = await loadSegments(feature('digitised-cove', eight));
    const issue = expectIssue(scenario.report.issues, { code: 'GeometrySelfIntersects', file: segmentsFile, row: 4, column: 'geometry', severity: 'warning', excluded: false });
    expect(issue.message).toContain('"digitised-cove"');
    expect(issue.value).toBe('[0.05, 50.05]');
    expect(issue.message).toContain('positions 1 and 3');
    expect(scenario.report.ok).toBe(true);
    expect(scenario.segments.map((s) => s.id)).toContain('digitised-cove');
  });

  test('self-crossing closed ring points at the crossing, not at the closing point', async () => {
    // A closed bow tie: first = last = (0, 50); the only crossing is at (0.05, 50.05).
    const bowTie = {
      type: 'LineString',
      coordinates: [
        [0, 50],
        [0.1, 50.1],
        [0.1, 50],
        [0, 50.1],
        [0, 50],
      ],
    };
    const scenario = await loadSegments(feature('bow-tie-islet', bowTie));
    const issue = expectIssue(scenario.report.issues, { code: 'GeometrySelfIntersects', file: segmentsFile, row: 4 });
    expect(issue.value).toBe('[0.05, 50.05]');
  });

  test('segment left out: its rows get one summary line, not one "is not a segment id" each', async () => {
    const rows = Array.from({ length: 30 }, (_, i) => `PC-${i + 1},point-cove,2026-0${(i % 5) + 3}-${String((i % 27) + 1).padStart(2, '0')},100,5,,`);
    const dir = scenarioCopy({
      files: {
        [segmentsFile]: withFeatures(feature('point-cove', { type: 'Point', coordinates: [0.4, 50] })),
        'tables/beach-litter.csv': `${beachHeader}\nBL-1,north-beach,2025-10-02,85,37,15,100\n${rows.join('\n')}\n`,
      },
    });
    const scenario = await loadScenario(dir);
    expectIssue(scenario.report.issues, { code: 'GeometryInvalid', file: segmentsFile, row: 4, severity: 'error' });
    expect(scenario.report.issues.filter((i) => i.code === 'UnknownSegment')).toEqual([]);
    const summary = expectIssue(scenario.report.issues, { code: 'SegmentLeftOut', file: 'tables/beach-litter.csv', row: 3, column: 'segment_id' });
    expect(summary.message).toContain('30 row(s) for segment "point-cove" not used: the segment was left out, see its error above');
    const counts = scenario.report.files.find((f) => f.file === 'tables/beach-litter.csv');
    expect(counts).toEqual({ file: 'tables/beach-litter.csv', read: 31, kept: 1, excluded: 30 });
  });

  test('longitude and latitude swapped: "did you swap longitude and latitude?"', async () => {
    // A line near 50.7° N, 120.5° E written [lat, lon].
    const swapped = {
      type: 'LineString',
      coordinates: [
        [50.72, 120.5],
        [50.73, 120.52],
      ],
    };
    const scenario = await loadSegments(feature('swapped-shore', swapped));
    const issue = expectIssue(scenario.report.issues, { code: 'CoordinateOutOfRange', file: segmentsFile, row: 4, severity: 'error' });
    expect(issue.hint).toContain('Did you swap longitude and latitude?');
  });

  test('island group as a MultiLineString and an island with a lagoon as a Polygon with a hole', async () => {
    const group = {
      type: 'MultiLineString',
      coordinates: [
        [
          [1, 50],
          [1.02, 50],
          [1.02, 50.02],
          [1, 50.02],
          [1, 50],
        ],
        [
          [1.05, 50],
          [1.06, 50.01],
          [1.05, 50],
        ],
      ],
    };
    const holed = {
      type: 'Polygon',
      coordinates: [
        [
          [2, 50],
          [2.1, 50],
          [2.1, 50.1],
          [2, 50.1],
          [2, 50],
        ],
        [
          [2.03, 50.03],
          [2.03, 50.06],
          [2.06, 50.06],
          [2.06, 50.03],
          [2.03, 50.03],
        ],
      ],
    };
    const scenario = await loadSegments(feature('skerries', group), feature('lagoon-isle', holed));
    expect(scenario.report.issues.filter((i) => i.file === segmentsFile)).toEqual([]);
    const isle = scenario.segments.find((s) => s.id === 'lagoon-isle');
    // The perimeter counts the outer shore and the lagoon shore.
    const outer: Position[] = [
      [2, 50],
      [2.1, 50],
      [2.1, 50.1],
      [2, 50.1],
      [2, 50],
    ];
    const inner: Position[] = [
      [2.03, 50.03],
      [2.03, 50.06],
      [2.06, 50.06],
      [2.06, 50.03],
      [2.03, 50.03],
    ];
    assertInDelta(isle?.lengthKm ?? 0, haversineKm(outer) + haversineKm(inner), 1e-6);
    expect(scenario.segments.map((s) => s.id)).toEqual(expect.arrayContaining(['skerries', 'lagoon-isle']));
  });

  test('segment of 200,000 vertices (national 1:10 000 data) is read and checked', async () => {
    // A meandering coast running north: 200,000 positions that never cross.
    const coordinates: Position[] = [];
    for (let i = 0; i < 200_000; i++) coordinates.push([3 + 0.002 * Math.sin(i / 7), 40 + i * 0.00005]);
    const scenario = await loadSegments(feature('long-national-coast', { type: 'LineString', coordinates }, { kind: 'beach' }));
    expect(scenario.report.issues.filter((i) => i.file === segmentsFile)).toEqual([]);
    expect(scenario.segments.find((s) => s.id === 'long-national-coast')?.lengthKm).toBeGreaterThan(1000);
  }, 60_000);

  test('a real coast crossing the 180° meridian (Chukotka) and an island ring across it (Fiji)', async () => {
    // Russia's mainland ring in Natural Earth 1:50m runs across 180°; its positions east of 175° E
    // and west of 175° W form the Chukotka coast on both sides of the meridian.
    const mainland = naturalEarthRings('Russia').sort((a, b) => b.length - a.length)[0] as Position[];
    let run: Position[] = [];
    let best: Position[] = [];
    for (const p of mainland) {
      if (Math.abs(p[0]) >= 175) run.push(p);
      else {
        if (run.length > best.length && run.some(([lon]) => lon > 0) && run.some(([lon]) => lon < 0)) best = run;
        run = [];
      }
    }
    expect(best.length).toBeGreaterThan(10);
    // Fiji: a small island ring with positions at both −180 and 180 in Natural Earth.
    const fijiAcross = naturalEarthRings('Fiji').find((r) => r.some(([lon]) => lon < 0) && r.some(([lon]) => lon > 0)) as Position[];
    const scenario = await loadSegments(
      feature('chukotka-coast', { type: 'LineString', coordinates: best }, { kind: 'rocky-shore' }),
      feature('fiji-date-line-isle', { type: 'LineString', coordinates: fijiAcross }),
    );
    expect(scenario.report.issues.filter((i) => i.file === segmentsFile && i.code === 'GeometrySelfIntersects')).toEqual([]);
    const coast = scenario.segments.find((s) => s.id === 'chukotka-coast');
    // RFC 7946 section 5.2: a box across the meridian has west > east.
    expect((coast?.bbox[0] ?? 0) > (coast?.bbox[2] ?? 0)).toBe(true);
    // Length on the sphere, not around the world: the haversine sum of the same positions.
    assertInDelta(coast?.lengthKm ?? 0, haversineKm(best), 1e-6 * haversineKm(best));
    expect(scenario.segments.map((s) => s.id)).toContain('fiji-date-line-isle');
  });
});

describe('line crossings (planar, common practice)', () => {
  test('the unwrapped longitudes step the short way across 180°', () => {
    expect(
      unwrapLongitudes([
        [179.9, 0],
        [-179.9, 0.1],
        [-179.8, 0.2],
      ]),
    ).toEqual([
      [179.9, 0],
      [180.1, 0.1],
      [180.2, 0.2],
    ]);
  });

  test('a line touching itself at a vertex is found; a repeated position is not a crossing', () => {
    expect(
      findSelfCrossing([
        [0, 0],
        [1, 0],
        [1, 0],
        [1, 1],
      ]),
    ).toBeNull();
    expect(
      findSelfCrossing([
        [0, 0],
        [2, 0],
        [2, 1],
        [1, 1],
        [1, 0],
        [1, -1],
      ])?.at,
    ).toEqual([1, 0]);
  });
});
