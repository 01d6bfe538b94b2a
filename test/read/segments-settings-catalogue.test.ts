// Bad-input cases of the coastline segments file and the settings file, plus geodesic lengths.
// Segment "rows" are features counted from 1.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { topology } from 'topojson-server';
import { describe, expect, test } from 'vitest';
import { loadScenario } from '../../generator/read/load-scenario.ts';
import { assertInDelta } from '../asserts.ts';
import { baseScenario, expectIssue, scenarioCopy } from './fixture-scenario.ts';

const segmentsFile = 'segments.geojson';

function feature(id: string, geometry: unknown, extra: Record<string, unknown> = {}): unknown {
  return { type: 'Feature', properties: { id, name: `Name of ${id}`, kind: 'beach', shellfish: 'none', ...extra }, geometry };
}

function withFeatures(...features: unknown[]): string {
  const base = JSON.parse(readFileSync(join(baseScenario, segmentsFile), 'utf8')) as { features: unknown[] };
  return JSON.stringify({ type: 'FeatureCollection', features: [...base.features, ...features] });
}

async function loadSegments(text: string) {
  return loadScenario(scenarioCopy({ files: { [segmentsFile]: text } }));
}

describe('coastline segments: bad input catalogue', () => {
  test('coordinate out of range (latitude 95)', async () => {
    const scenario = await loadSegments(
      withFeatures(
        feature('bad-lat', {
          type: 'LineString',
          coordinates: [
            [0, 50],
            [0.1, 95],
          ],
        }),
      ),
    );
    const issue = expectIssue(scenario.report.issues, { code: 'CoordinateOutOfRange', file: segmentsFile, row: 4, column: 'geometry', severity: 'error', excluded: true });
    expect(issue.value).toBe('[0.1, 95]');
    expect(scenario.segments.map((s) => s.id)).toEqual(['north-beach', 'harbour-mouth', 'seal-island']);
  });

  test('empty geometry', async () => {
    const scenario = await loadSegments(withFeatures(feature('empty-line', { type: 'LineString', coordinates: [] })));
    expectIssue(scenario.report.issues, { code: 'GeometryInvalid', file: segmentsFile, row: 4, column: 'geometry', severity: 'error' });
  });

  test('missing geometry and a point geometry', async () => {
    const scenario = await loadSegments(withFeatures(feature('no-geometry', null), feature('a-point', { type: 'Point', coordinates: [0, 50] })));
    expectIssue(scenario.report.issues, { code: 'GeometryInvalid', file: segmentsFile, row: 4, column: 'geometry' });
    const point = expectIssue(scenario.report.issues, { code: 'GeometryInvalid', file: segmentsFile, row: 5, column: 'geometry' });
    expect(point.message).toContain('"Point"');
  });

  test('self-intersecting line (a figure of eight)', async () => {
    const eight = {
      type: 'LineString',
      coordinates: [
        [0, 50],
        [0.1, 50.1],
        [0.1, 50],
        [0, 50.1],
      ],
    };
    const scenario = await loadSegments(withFeatures(feature('figure-eight', eight)));
    // A digitising flaw is a warning: the segment is kept (see real-files.test.ts).
    expectIssue(scenario.report.issues, { code: 'GeometrySelfIntersects', file: segmentsFile, row: 4, column: 'geometry', severity: 'warning', excluded: false });
    expect(scenario.segments.map((s) => s.id)).toContain('figure-eight');
  });

  test('self-intersecting polygon ring (a bow tie)', async () => {
    const bowTie = {
      type: 'Polygon',
      coordinates: [
        [
          [0, 50],
          [0.1, 50.1],
          [0.1, 50],
          [0, 50.1],
          [0, 50],
        ],
      ],
    };
    const scenario = await loadSegments(withFeatures(feature('bow-tie', bowTie)));
    expectIssue(scenario.report.issues, { code: 'GeometrySelfIntersects', file: segmentsFile, row: 4, column: 'geometry' });
  });

  test('unclosed polygon ring', async () => {
    const open = {
      type: 'Polygon',
      coordinates: [
        [
          [0, 50],
          [0.1, 50],
          [0.1, 50.1],
          [0, 50.1],
        ],
      ],
    };
    const scenario = await loadSegments(withFeatures(feature('open-ring', open)));
    const issue = expectIssue(scenario.report.issues, { code: 'GeometryInvalid', file: segmentsFile, row: 4, column: 'geometry' });
    expect(issue.message).toContain('not closed');
  });

  test('a line of zero length', async () => {
    const scenario = await loadSegments(
      withFeatures(
        feature('one-spot', {
          type: 'LineString',
          coordinates: [
            [1, 50],
            [1, 50],
          ],
        }),
      ),
    );
    const issue = expectIssue(scenario.report.issues, { code: 'GeometryInvalid', file: segmentsFile, row: 4, column: 'geometry', severity: 'error' });
    expect(issue.message).toContain('zero length');
  });

  test('polygons are stored wound so that d3-geo sees the small area (RFC 7946 counter-clockwise input)', async () => {
    // d3-geo treats clockwise exterior rings as the inside, the opposite of RFC 7946: an RFC ring
    // read as-is would cover the rest of the globe (geoArea > 2π).
    const { geoArea } = await import('d3-geo');
    const scenario = await loadScenario(scenarioCopy());
    const island = scenario.segments.find((s) => s.id === 'seal-island');
    const area = geoArea(island?.geometry as GeoJSON.Geometry);
    expect(area).toBeLessThan(1e-6);
    expect(area).toBeGreaterThan(0);
    const clockwise = {
      type: 'Polygon',
      coordinates: [
        [
          [1, 50],
          [1, 50.02],
          [1.02, 50.02],
          [1.02, 50],
          [1, 50],
        ],
      ],
    };
    const both = await loadSegments(withFeatures(feature('clockwise-isle', clockwise)));
    expect(geoArea(both.segments.find((s) => s.id === 'clockwise-isle')?.geometry as GeoJSON.Geometry)).toBeLessThan(1e-6);
  });

  test('id that is not a URL-safe slug, and a duplicate id', async () => {
    const line = {
      type: 'LineString',
      coordinates: [
        [1, 50],
        [1.1, 50],
      ],
    };
    const scenario = await loadSegments(withFeatures(feature('Bad Id/..', line), feature('north-beach', line)));
    expectIssue(scenario.report.issues, { code: 'SegmentPropertyInvalid', file: segmentsFile, row: 4, column: 'id', severity: 'error' });
    const duplicate = expectIssue(scenario.report.issues, { code: 'SegmentIdDuplicate', file: segmentsFile, row: 5, column: 'id', severity: 'error' });
    expect(duplicate.message).toContain('feature 1');
  });

  test('unknown kind and shellfish words', async () => {
    const line = {
      type: 'LineString',
      coordinates: [
        [1, 50],
        [1.1, 50],
      ],
    };
    const scenario = await loadSegments(withFeatures(feature('odd-words', line, { kind: 'marina', shellfish: 'sometimes' })));
    expectIssue(scenario.report.issues, { code: 'SegmentPropertyInvalid', file: segmentsFile, row: 4, column: 'kind' });
    expectIssue(scenario.report.issues, { code: 'SegmentPropertyInvalid', file: segmentsFile, row: 4, column: 'shellfish' });
  });

  test('HTML or script text in a segment name is kept as text and pointed out', async () => {
    const name = 'Cove <img src=x onerror=alert(1)>';
    const line = {
      type: 'LineString',
      coordinates: [
        [1, 50],
        [1.1, 50],
      ],
    };
    const scenario = await loadSegments(withFeatures(feature('script-cove', line, { name })));
    expectIssue(scenario.report.issues, { code: 'MarkupInText', file: segmentsFile, row: 4, column: 'name', severity: 'warning', excluded: false });
    expect(scenario.segments.find((s) => s.id === 'script-cove')?.name).toBe(name);
  });

  test('a file that is not GeoJSON', async () => {
    const scenario = await loadSegments('{"type": "Point", "coordinates": [0, 0]}');
    expectIssue(scenario.report.issues, { code: 'SegmentsUnreadable', file: segmentsFile, row: 1, severity: 'error' });
  });

  test('TopoJSON is read like GeoJSON', async () => {
    const geojson = JSON.parse(readFileSync(join(baseScenario, segmentsFile), 'utf8')) as GeoJSON.FeatureCollection;
    const topo = topology({ segments: geojson });
    const scenario = await loadSegments(JSON.stringify(topo));
    expect(scenario.report.issues).toEqual([]);
    expect(scenario.segments.map((s) => s.id)).toEqual(['north-beach', 'harbour-mouth', 'seal-island']);
  });
});

describe('geodesic segment length', () => {
  test('one degree of latitude along a meridian is 111.195 km', async () => {
    // 2πR/360 with the mean Earth radius R = 6371.0088 km (IUGG, Moritz 1980) = 111.1951 km;
    // commonly quoted as "1° of latitude ≈ 111.2 km" (from memory; it varies 110.6–111.7 km on the ellipsoid).
    const meridian = {
      type: 'LineString',
      coordinates: [
        [0, 10],
        [0, 11],
      ],
    };
    const scenario = await loadSegments(withFeatures(feature('meridian', meridian)));
    assertInDelta(scenario.segments.find((s) => s.id === 'meridian')?.lengthKm, 111.1951, 1e-3);
  });

  test('one minute of latitude is close to one nautical mile (1.852 km)', async () => {
    // The international nautical mile, 1852 m, was defined as about one minute of latitude
    // (International Hydrographic Conference 1929; from memory). On the sphere: 1.85325 km.
    const minute = {
      type: 'LineString',
      coordinates: [
        [3, 45],
        [3, 45 + 1 / 60],
      ],
    };
    const scenario = await loadSegments(withFeatures(feature('one-minute', minute)));
    assertInDelta(scenario.segments.find((s) => s.id === 'one-minute')?.lengthKm, 1.852, 0.002);
  });

  test('a polygon segment is measured along its perimeter and has a bbox', async () => {
    const scenario = await loadScenario(scenarioCopy());
    const island = scenario.segments.find((s) => s.id === 'seal-island');
    // 0.02° square at 50° N: two sides of 0.02° latitude (2.2239 km each) and two of 0.02° longitude
    // (≈ 1.4295 km at 50.00° and 1.4286 km at 50.02°): ≈ 7.306 km (spherical, computed by hand).
    assertInDelta(island?.lengthKm, 7.306, 0.01);
    expect(island?.bbox).toEqual([0.3, 50.0, 0.32, 50.02]);
  });
});

describe('settings: bad input catalogue', () => {
  test('a wrong value is reported with the file and its JSON path', async () => {
    const settings = JSON.parse(readFileSync(join(baseScenario, 'scenario.json'), 'utf8')) as { drift: { arrivalDistanceKm: number } };
    settings.drift.arrivalDistanceKm = -1;
    const scenario = await loadScenario(scenarioCopy({ files: { 'scenario.json': JSON.stringify(settings) } }));
    const issue = expectIssue(scenario.report.issues, { code: 'SettingsInvalid', file: 'scenario.json', column: '$.drift.arrivalDistanceKm', severity: 'error' });
    expect(issue.message).toContain('scenario.json, at $.drift.arrivalDistanceKm');
    expect(issue.value).toBe('-1');
    // the other files are still checked
    expect(scenario.segments).toHaveLength(3);
  });

  test('a publication season that no season definition covers', async () => {
    const settings = JSON.parse(readFileSync(join(baseScenario, 'scenario.json'), 'utf8')) as { publications: { season: string; date: string }[] };
    settings.publications.push({ season: '2027-monsoon', date: '2027-03-01' });
    const scenario = await loadScenario(scenarioCopy({ files: { 'scenario.json': JSON.stringify(settings) } }));
    expectIssue(scenario.report.issues, { code: 'SettingsInvalid', file: 'scenario.json', column: '$.publications[2].season', severity: 'error' });
  });

  test('a misspelled setting is pointed out, not silently dropped', async () => {
    const settings = JSON.parse(readFileSync(join(baseScenario, 'scenario.json'), 'utf8')) as { drift: { [key: string]: number } };
    settings.drift['arrivalDistanceKM'] = 5;
    const scenario = await loadScenario(scenarioCopy({ files: { 'scenario.json': JSON.stringify(settings) } }));
    expectIssue(scenario.report.issues, { code: 'SettingUnknown', file: 'scenario.json', column: '$.drift.arrivalDistanceKM', severity: 'warning' });
    expect(scenario.settings.drift.arrivalDistanceKm).toBe(2);
  });

  test('settings may be written in YAML', async () => {
    const { stringify } = await import('yaml');
    const settings = JSON.parse(readFileSync(join(baseScenario, 'scenario.json'), 'utf8')) as unknown;
    const dir = scenarioCopy({
      files: { 'scenario.json': null, 'scenario.yaml': stringify(settings) },
      descriptor: (d) => {
        const r = d.resources.find((x) => x['role'] === 'settings');
        if (r) r['path'] = 'scenario.yaml';
      },
    });
    const scenario = await loadScenario(dir);
    expect(scenario.report.issues).toEqual([]);
    expect(scenario.settings.region.id).toBe('test-coast');
  });

  test('settings that are not JSON', async () => {
    const scenario = await loadScenario(scenarioCopy({ files: { 'scenario.json': '{ "region": ' } }));
    expectIssue(scenario.report.issues, { code: 'SettingsUnreadable', file: 'scenario.json', severity: 'error' });
  });
});
