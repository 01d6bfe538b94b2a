/**
 * The land resource reader (generator/read/read-land.ts) on real open geometry: Natural Earth
 * 1:10m land polygons (public domain, world-atlas 2.x land-10m.json), cut to Iceland's box
 * (63–67° N, 25–13° W), simplified with topojson-simplify to the vertex budget; and bad features
 * reported with file and row, never dropped silently.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { geoArea } from 'd3-geo';
import type { FeatureCollection, MultiPolygon, Polygon } from 'geojson';
import { feature } from 'topojson-client';
import type { Topology } from 'topojson-specification';
import { describe, expect, it } from 'vitest';
import { IssueLog } from '../../generator/read/issue-log.ts';
import { readLand } from '../../generator/read/read-land.ts';

const require = createRequire(import.meta.url);

function iceland(): Polygon[] {
  const world = JSON.parse(readFileSync(require.resolve('world-atlas/land-10m.json'), 'utf8')) as Topology;
  const land = feature(world, world.objects['land']!) as unknown as FeatureCollection<MultiPolygon>;
  return land.features
    .flatMap((f) => f.geometry.coordinates)
    .filter((p) => p[0]!.every(([lon, lat]) => lon! > -25 && lon! < -13 && lat! > 63 && lat! < 67))
    .map((coordinates) => ({ type: 'Polygon', coordinates }));
}

describe('readLand', () => {
  it('simplifies Natural Earth Iceland to the budget and keeps its area within 2 %', async () => {
    const polygons = iceland();
    expect(polygons.length).toBeGreaterThan(0);
    const dir = mkdtempSync(join(tmpdir(), 'wrackline-land-'));
    writeFileSync(join(dir, 'land.json'), JSON.stringify({ type: 'FeatureCollection', features: polygons.map((geometry) => ({ type: 'Feature', properties: {}, geometry })) }));
    const log = new IssueLog();
    const land = await readLand(join(dir, 'land.json'), 'land.json', log, 300);
    expect(log.issues).toEqual([]);
    expect(land).not.toBeNull();
    expect(land!.verticesRead).toBeGreaterThan(300);
    expect(land!.verticesKept).toBeLessThanOrEqual(330); // the budget, plus each ring's closing position
    // area on the sphere (d3-geo geoArea, steradians; rings as d3 wants them: the smaller side)
    const area = (coordinates: number[][][][]) =>
      coordinates.reduce((sum, p) => {
        const a = geoArea({ type: 'Polygon', coordinates: p });
        return sum + Math.min(a, 4 * Math.PI - a);
      }, 0);
    const before = area(polygons.map((p) => p.coordinates));
    const after = area(land!.geometry.coordinates);
    expect(Math.abs(after - before) / before).toBeLessThan(0.02);
    expect(land!.coarse.coordinates.reduce((n, p) => n + p[0]!.length, 0)).toBeLessThanOrEqual(330);
  });

  it('lists a line, an open ring and a swapped position by row, and keeps the good polygon', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'wrackline-land-'));
    const square = [
      [0, 0],
      [1, 0],
      [1, 1],
      [0, 1],
      [0, 0],
    ];
    writeFileSync(
      join(dir, 'land.geojson'),
      JSON.stringify({
        type: 'FeatureCollection',
        features: [
          { type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates: [square] } },
          {
            type: 'Feature',
            properties: {},
            geometry: {
              type: 'LineString',
              coordinates: [
                [0, 0],
                [1, 1],
              ],
            },
          },
          {
            type: 'Feature',
            properties: {},
            geometry: {
              type: 'Polygon',
              coordinates: [
                [
                  [0, 0],
                  [1, 0],
                  [1, 1],
                  [0, 1],
                ],
              ],
            },
          },
          {
            type: 'Feature',
            properties: {},
            geometry: {
              type: 'Polygon',
              coordinates: [
                [
                  [10, 95],
                  [11, 95],
                  [11, 96],
                  [10, 95],
                ],
              ],
            },
          },
        ],
      }),
    );
    const log = new IssueLog();
    const land = await readLand(join(dir, 'land.geojson'), 'land.geojson', log);
    expect(land!.geometry.coordinates).toHaveLength(1);
    expect(log.issues.map((i) => [i.row, i.excluded, i.message])).toEqual([
      [2, true, 'land.geojson row 2, column geometry: geometry type "LineString"; expected Polygon or MultiPolygon'],
      [3, true, 'land.geojson row 3, column geometry: a ring is not closed (its last position differs from its first)'],
      [4, true, 'land.geojson row 4, column geometry: position [10, 95] is not a valid longitude/latitude; expected longitude −180..180 and latitude −90..90'],
    ]);
    expect(log.report().files).toEqual([{ file: 'land.geojson', read: 4, kept: 1, excluded: 3 }]);
  });

  it('an unreadable file is one error naming the file', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'wrackline-land-'));
    writeFileSync(join(dir, 'land.geojson'), '{ not json');
    const log = new IssueLog();
    expect(await readLand(join(dir, 'land.geojson'), 'land.geojson', log)).toBeNull();
    expect(log.issues).toHaveLength(1);
    expect(log.issues[0]!.severity).toBe('error');
    expect(log.issues[0]!.message).toMatch(/^land\.geojson row 1, column \(all\): not a GeoJSON or TopoJSON file of land polygons/);
  });
});

// The land file goes through the same JSON bounds as the segments file (json-input.ts): a key that
// names JavaScript's prototype machinery or nesting past the cap is refused with a named error, not
// parsed into an object or a stack overflow.
describe('land file with hostile JSON', () => {
  const write = (text: string): string => {
    const file = join(mkdtempSync(join(tmpdir(), 'wrackline-land-')), 'land.geojson');
    writeFileSync(file, text);
    return file;
  };
  it('refuses a __proto__ key', async () => {
    const log = new IssueLog();
    const land = await readLand(write('{"type":"FeatureCollection","__proto__":{"polluted":true},"features":[]}'), 'land.geojson', log);
    expect(land).toBeNull();
    expect(log.report().issues.map((i) => [i.code, i.column, i.severity])).toEqual([['KeyForbidden', '$.__proto__', 'error']]);
    expect(({} as { polluted?: boolean }).polluted).toBeUndefined();
  });
  it('refuses nesting deeper than the cap with a named error', async () => {
    const log = new IssueLog();
    const deep = `{"type":"FeatureCollection","features":[${'['.repeat(100_000)}${']'.repeat(100_000)}]}`;
    const land = await readLand(write(deep), 'land.geojson', log);
    expect(land).toBeNull();
    expect(log.report().issues.map((i) => [i.code, i.file, i.severity])).toEqual([['JsonTooDeep', 'land.geojson', 'error']]);
  });
});
