// Drift-model results from particle positions: great-circle distances, DBSCAN zones, arrivals per
// segment and season, the positions CSV catalogue, and the pre-aggregated arrivals table.
import { gzipSync } from 'node:zlib';
import { describe, expect, test } from 'vitest';
import { convexHull } from '../../generator/drift/convex-hull.ts';
import { dbscan, noise } from '../../generator/drift/dbscan.ts';
import { haversineKm, pointToArcKm } from '../../generator/drift/geodesy.ts';
import { parseDateTime } from '../../generator/drift/positions-csv.ts';
import { loadScenario } from '../../generator/read/load-scenario.ts';
import { assertInDelta } from '../asserts.ts';
import { expectIssue, resourceNamed, scenarioCopy } from '../read/fixture-scenario.ts';

describe('great-circle distances', () => {
  test('one degree of longitude on the equator is 111.195 km (2πR/360, R = 6371.0088 km)', () => {
    assertInDelta(haversineKm(0, 0, 1, 0), 111.19508, 1e-4);
  });

  test('a point one degree north of the middle of an equatorial arc is 111.195 km from it', () => {
    assertInDelta(pointToArcKm(0.5, 1, 0, 0, 1, 0), 111.19508, 1e-4);
  });

  test('beyond the end of the arc the distance is to the nearer end', () => {
    assertInDelta(pointToArcKm(3, 0, 0, 0, 1, 0), 2 * 111.19508, 1e-3);
  });

  test('Paris to London is about 343.5 km', () => {
    // Great-circle distance Paris (48.8566 N, 2.3522 E) – London (51.5074 N, 0.1278 W) ≈ 343.5 km
    // on the mean-radius sphere (from memory, a common textbook example; the ellipsoid gives ≈ 343.9 km).
    assertInDelta(haversineKm(2.3522, 48.8566, -0.1278, 51.5074), 343.5, 0.6);
  });
});

describe('DBSCAN (Ester et al. 1996)', () => {
  test('a small example worked by hand from Definitions 1–5', () => {
    // Points on a line: 0 1 2 3 | 10 11 12 | 20, Eps = 1.5, MinPts = 3 (N_Eps includes the point).
    // Core points: 1 {0,1,2}, 2 {1,2,3}, 11 {10,11,12}. Border: 0, 3 (reached from 1, 2), 10, 12.
    // Noise: 20. Two clusters.
    const x = [0, 1, 2, 3, 10, 11, 12, 20];
    const neighbours = (i: number) => x.flatMap((v, j) => (Math.abs(v - (x[i] ?? 0)) <= 1.5 ? [j] : []));
    const labels = Array.from(dbscan(x.length, neighbours, 3));
    expect(labels).toEqual([0, 0, 0, 0, 1, 1, 1, noise]);
  });

  test('a border point first seen as noise joins the cluster that reaches it', () => {
    // Point 0 alone is not core (N = {0, 1}); it is visited first and marked noise, then claimed
    // as a border point when the cluster grows from point 1.
    const x = [0, 1, 1.2, 1.4];
    const neighbours = (i: number) => x.flatMap((v, j) => (Math.abs(v - (x[i] ?? 0)) <= 1 ? [j] : []));
    expect(Array.from(dbscan(x.length, neighbours, 4))).toEqual([0, 0, 0, 0]);
  });

  test('MinPts must be a positive whole number', () => {
    expect(() => dbscan(1, () => [0], 0)).toThrow(/invalid minPoints/);
  });
});

describe('convex hull (Andrew 1979)', () => {
  test('a square with an inside point', () => {
    expect(
      convexHull([
        [0, 0],
        [1, 0],
        [1, 1],
        [0, 1],
        [0.5, 0.5],
      ]),
    ).toEqual([
      [0, 0],
      [1, 0],
      [1, 1],
      [0, 1],
    ]);
  });
});

describe('arrivals per segment and season from the fixture positions', () => {
  test('distinct particles within 2 km, per km of coast, and one zone at the end of autumn', async () => {
    const scenario = await loadScenario(scenarioCopy());
    const drift = scenario.drift;
    expect(drift).not.toBeNull();
    const arrivals = (segment: string, season: string) => drift?.arrivals.find((a) => a.segmentId === segment && a.season === season);
    // Particles 1 (three positions, two near the beach: counted once) and 2 reach north-beach in autumn.
    expect(arrivals('north-beach', '2026-autumn')?.arrivals).toBe(2);
    const northBeach = scenario.segments.find((s) => s.id === 'north-beach');
    assertInDelta(arrivals('north-beach', '2026-autumn')?.arrivalsPerKm, 2 / (northBeach?.lengthKm ?? 1), 1e-12);
    // Particle 7 sits 0.55 km off harbour-mouth in summer.
    expect(arrivals('harbour-mouth', '2026-summer')?.arrivals).toBe(1);
    expect(arrivals('seal-island', '2026-autumn')?.arrivals).toBe(0);
    // Particles 3, 4, 5 end autumn within 4 km of each other: one zone of 3; particle 6 is noise,
    // particle 1 is ashore and not counted.
    const autumn = drift?.zones.find((z) => z.season === '2026-autumn')?.zones ?? [];
    expect(autumn.map((z) => [z.id, z.particles])).toEqual([['zone-1', 3]]);
    assertInDelta(autumn[0]?.lon, -0.5, 1e-9);
    assertInDelta(autumn[0]?.lat, 49.5, 1e-9);
    expect(arrivals('north-beach', '2026-autumn')?.nearestZone?.id).toBe('zone-1');
  });

  test('the same positions read from a gzip file give the same result', async () => {
    const { readFileSync } = await import('node:fs');
    const { baseScenario } = await import('../read/fixture-scenario.ts');
    const text = readFileSync(`${baseScenario}/drift/positions.csv`);
    const dir = scenarioCopy({
      files: { 'drift/positions.csv': null, 'drift/positions.csv.gz': gzipSync(text) },
      descriptor: (d) => {
        const r = resourceNamed(d, 'drift-positions');
        r['path'] = 'drift/positions.csv.gz';
        r['compression'] = 'gz';
      },
    });
    const scenario = await loadScenario(dir);
    expect(scenario.report.issues).toEqual([]);
    expect(scenario.drift?.arrivals.find((a) => a.segmentId === 'north-beach' && a.season === '2026-autumn')?.arrivals).toBe(2);
  });
});

describe('positions CSV: bad input catalogue', () => {
  const file = 'drift/positions.csv';
  const header = 'particle,time,lon,lat,status';

  async function loadPositions(text: string) {
    return loadScenario(scenarioCopy({ files: { [file]: text } }));
  }

  test('bad cells are reported by row and column and left out', async () => {
    const rows = [
      '1,2026-09-10T00:00:00Z,-0.2,95,drifting',
      '2,2026-09-31T00:00:00Z,-0.2,50,drifting',
      'x,2026-09-10T00:00:00Z,-0.2,50,drifting',
      '3,2026-09-10T00:00:00Z,NaN,50,drifting',
      '4,2026-09-10T00:00:00Z,-0.2,50,beached',
      '5,2026-09-10T00:00:00Z,-0.2,50,drifting',
      '5,2026-09-10T00:00:00Z,-0.2,50,drifting',
    ];
    const scenario = await loadPositions(`${header}\n${rows.join('\n')}\n`);
    const issues = scenario.report.issues;
    expectIssue(issues, { code: 'ValueWrongType', file, row: 2, column: 'lat', severity: 'warning', excluded: true });
    expectIssue(issues, { code: 'ValueWrongType', file, row: 3, column: 'time' });
    expectIssue(issues, { code: 'ValueWrongType', file, row: 4, column: 'particle' });
    expectIssue(issues, { code: 'ValueNotFinite', file, row: 5, column: 'lon' });
    expectIssue(issues, { code: 'ValueNotAllowed', file, row: 6, column: 'status' });
    expectIssue(issues, { code: 'DuplicateKey', file, row: 8, column: 'particle+time' });
    expect(scenario.report.files.find((f) => f.file === file)).toEqual({ file, read: 7, kept: 1, excluded: 6 });
  });

  test('a missing column stops the file', async () => {
    const scenario = await loadPositions('particle,time,lon\n1,2026-09-10T00:00:00Z,-0.2\n');
    expectIssue(scenario.report.issues, { code: 'HeaderMissingColumn', file, row: 1, column: 'lat', severity: 'error' });
  });

  test('a truncated last line', async () => {
    const scenario = await loadPositions(`${header}\n1,2026-09-10T00:00:00Z,-0.2,50,drifting\n2,2026-09-10T00:00:00Z,-0.`);
    expectIssue(scenario.report.issues, { code: 'RowTruncated', file, row: 3, excluded: true });
  });

  test('a truncated gzip stream', async () => {
    const gz = gzipSync(`${header}\n${'1,2026-09-10T00:00:00Z,-0.2,50,drifting\n'.repeat(2000)}`);
    const dir = scenarioCopy({
      files: { 'drift/positions.csv.gz': gz.subarray(0, gz.length - 20) },
      descriptor: (d) => {
        const r = resourceNamed(d, 'drift-positions');
        r['path'] = 'drift/positions.csv.gz';
        r['compression'] = 'gz';
      },
    });
    const scenario = await loadScenario(dir);
    expectIssue(scenario.report.issues, { code: 'CsvUnreadable', file: 'drift/positions.csv.gz', severity: 'error' });
  });

  test('ISO 8601 date-times with offsets', () => {
    expect(parseDateTime('2026-09-01T02:00:00+02:00')).toBe(Date.UTC(2026, 8, 1));
    expect(parseDateTime('2026-09-01')).toBe(Date.UTC(2026, 8, 1));
    expect(Number.isNaN(parseDateTime('2026-02-29T00:00:00Z'))).toBe(true);
  });
});

describe('positions outside every season', () => {
  test('are counted in one warning, not dropped silently', async () => {
    const { readFileSync } = await import('node:fs');
    const { baseScenario } = await import('../read/fixture-scenario.ts');
    const settings = JSON.parse(readFileSync(`${baseScenario}/scenario.json`, 'utf8')) as { [key: string]: unknown };
    // Seasons that leave out September: the fixture's five September positions fall in no season.
    settings['seasons'] = [
      { id: 'winter', label: 'Winter', months: [12, 1, 2] },
      { id: 'spring', label: 'Spring', months: [3, 4, 5] },
      { id: 'summer', label: 'Summer', months: [6, 7, 8] },
      { id: 'autumn', label: 'Autumn', months: [10, 11] },
    ];
    const dir = scenarioCopy({
      files: {
        'scenario.json': JSON.stringify(settings),
        'tables/beach-litter.csv': 'survey_id,segment_id,date,surveyed_length_m,items,plastic_items,area_m2\nBL-1,north-beach,2026-01-15,100,12,,\n',
        'tables/water-microplastics.csv': 'sample_id,segment_id,date,particles_per_m3,mesh_um\nWM-1,harbour-mouth,2026-03-10,0.42,333\n',
      },
    });
    const scenario = await loadScenario(dir);
    const issue = scenario.report.issues.find((i) => i.code === 'PositionsOutsideSeasons');
    expect(issue?.file).toBe('drift/positions.csv');
    expect(issue?.value).toBe('5');
    expect(issue?.message).toContain('drift/positions.csv row (several), column time: 5 position(s)');
    expect(scenario.report.files.find((f) => f.file === 'drift/positions.csv')).toEqual({ file: 'drift/positions.csv', read: 11, kept: 6, excluded: 5 });
  });
});

describe('pre-aggregated drift arrivals table', () => {
  test('read per segment and season, per km, with unknown segments and seasons left out', async () => {
    const text = 'segment_id,season,arrivals\nnorth-beach,2026-autumn,12\nharbour-mouth,2026-summer,3\nnowhere,2026-summer,3\nseal-island,2026-monsoon,1\n';
    const dir = scenarioCopy({
      files: { 'drift/arrivals.csv': text, 'drift/positions.csv': null },
      descriptor: (d) => {
        d.resources = d.resources.filter((r) => r['name'] !== 'drift-positions');
        d.resources.push({ name: 'drift-arrivals', role: 'drift-arrivals', path: 'drift/arrivals.csv', format: 'csv' });
      },
    });
    const scenario = await loadScenario(dir);
    expectIssue(scenario.report.issues, { code: 'UnknownSegment', file: 'drift/arrivals.csv', row: 4, column: 'segment_id', excluded: true });
    expectIssue(scenario.report.issues, { code: 'DriftSeasonUnknown', file: 'drift/arrivals.csv', row: 5, column: 'season', excluded: true });
    const northBeach = scenario.segments.find((s) => s.id === 'north-beach');
    const row = scenario.drift?.arrivals.find((a) => a.segmentId === 'north-beach');
    expect(row?.arrivals).toBe(12);
    assertInDelta(row?.arrivalsPerKm, 12 / (northBeach?.lengthKm ?? 1), 1e-12);
    expect(scenario.drift?.zones.map((z) => z.season)).toEqual(['2026-summer', '2026-autumn']);
  });
});

describe('segment index', () => {
  test('nearest segment within reach agrees with a brute-force search over every edge', async () => {
    const fc = (await import('fast-check')).default;
    const { SegmentIndex } = await import('../../generator/drift/segment-index.ts');
    const scenario = await loadScenario(scenarioCopy());
    const segments = scenario.segments;
    const index = new SegmentIndex(segments, 2);
    const edges = segments.flatMap((segment, s) => {
      const g = segment.geometry;
      const lines = g.type === 'LineString' ? [g.coordinates] : g.type === 'MultiLineString' || g.type === 'Polygon' ? g.coordinates : [];
      return lines.flatMap((line) => line.slice(1).map((b, i) => ({ s, a: line[i] as number[], b })));
    });
    fc.assert(
      fc.property(
        fc.double({ min: -0.1, max: 0.45, noNaN: true }),
        fc.double({ min: 49.85, max: 50.15, noNaN: true }),
        fc.double({ min: 0.2, max: 4, noNaN: true }),
        (lon, lat, km) => {
          let best = Infinity;
          let bestSegment = -1;
          for (const e of edges) {
            const d = pointToArcKm(lon, lat, e.a[0] ?? 0, e.a[1] ?? 0, e.b[0] ?? 0, e.b[1] ?? 0);
            if (d < best) {
              best = d;
              bestSegment = e.s;
            }
          }
          const found = new SegmentIndex(segments, km).nearestWithin(lon, lat, km);
          if (best <= km) {
            expect(found?.segment).toBe(bestSegment);
            assertInDelta(found?.distanceKm, best, 1e-9);
          } else {
            expect(found).toBeNull();
          }
          assertInDelta(index.distanceToSegmentKm(lon, lat, bestSegment), best, 1e-9);
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe('particle table', () => {
  test('stores values for small and large ids and reports NaN for unknown ones', async () => {
    const { ParticleTable } = await import('../../generator/drift/particle-table.ts');
    const table = new ParticleTable();
    table.set(0, 5);
    table.set(5000, 7);
    table.set(2 ** 40, 9);
    expect([table.get(0), table.get(5000), table.get(2 ** 40)]).toEqual([5, 7, 9]);
    expect(table.get(1)).toBeNaN();
    expect(table.get(2 ** 41)).toBeNaN();
  });
});
