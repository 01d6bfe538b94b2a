/**
 * Invented drift scenarios for checking the Dask drift job (generator/drift/scaleout/) against the
 * built-in reader: a coast of a few short segments with
 * - two pairs of segments sharing a vertex, listed in both orders (positions whose nearest point is
 *   the shared vertex are exactly as near to both: the segment listed first must win);
 * - two parallel segments 0.02° apart, with positions 10⁻⁸° either side of the middle line (near
 *   ties, 2 mm apart);
 * - a straight segment with positions 10⁻⁶ km inside and outside the arrival distance;
 * - particles drifting across season boundaries (November→December, the year of winter changes;
 *   February→March), over several files (plain CSV and gzip CSV, the same particles continuing
 *   from file to file, equal times in two files, a time going backwards), with stranded positions;
 * - a few bad rows the readers must leave out and report, a gzip file cut short and a text file
 *   named as gzip.
 * All places and values are invented.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { earthRadiusKm } from '../../generator/drift/geodesy.ts';
import { writeNetcdf3 } from '../../generator/drift/netcdf3-writer.ts';
import { createSeededRandom } from '../../generator/random/seeded-random.ts';
import { contiguousSpec, incompleteSpec, indexedSpec, orthogonalSpec, writeNetcdf4, type Trajectory } from './cf-fixtures.ts';

const toRadians = Math.PI / 180;

/** Segments: [id, coordinates]; b/a and c/d share a vertex (b listed before a, c before d). */
const segmentLines: [string, [number, number][]][] = [
  [
    'fold-b',
    [
      [10.0, 40.1],
      [10.05, 40.15],
    ],
  ],
  [
    'fold-a',
    [
      [10.0, 40.0],
      [10.0, 40.1],
    ],
  ],
  [
    'bend-c',
    [
      [10.3, 40.0],
      [10.3, 40.1],
    ],
  ],
  [
    'bend-d',
    [
      [10.3, 40.1],
      [10.35, 40.15],
    ],
  ],
  [
    'twin-west',
    [
      [11.0, 40.0],
      [11.0, 40.1],
    ],
  ],
  [
    'twin-east',
    [
      [11.02, 40.0],
      [11.02, 40.1],
    ],
  ],
  [
    'edge-line',
    [
      [12.0, 40.0],
      [12.0, 40.1],
    ],
  ],
];

/** Longitude offset east of a meridian arc at which the great-circle distance is `km` (lat inside the arc). */
function offsetForKm(km: number, lat: number): number {
  return Math.asin(Math.sin(km / earthRadiusKm) / Math.cos(lat * toRadians)) / toRadians;
}

/** Points chosen to test the decision rules, each with a note of what it tests. */
export const decisionPoints: { lon: number; lat: number; note: string }[] = [
  // Beyond the end of fold-a and before the start of fold-b: nearest point of both is (10, 40.1).
  { lon: 9.98, lat: 40.105, note: 'exact tie fold-b/fold-a' },
  { lon: 9.985, lat: 40.103, note: 'exact tie fold-b/fold-a' },
  { lon: 10.28, lat: 40.105, note: 'exact tie bend-c/bend-d' },
  { lon: 10.285, lat: 40.103, note: 'exact tie bend-c/bend-d' },
  { lon: 11.01 - 1e-8, lat: 40.05, note: 'near tie, twin-west by 2 mm' },
  { lon: 11.01 + 1e-8, lat: 40.05, note: 'near tie, twin-east by 2 mm' },
  { lon: 12.0 + offsetForKm(2 - 1e-6, 40.05), lat: 40.05, note: 'inside the arrival distance by 1 mm' },
  { lon: 12.0 + offsetForKm(2 + 1e-6, 40.05), lat: 40.05, note: 'outside the arrival distance by 1 mm' },
  { lon: 12.0 - offsetForKm(2, 40.07), lat: 40.07, note: 'at the arrival distance' },
];

function segmentsGeojson(): string {
  return JSON.stringify({
    type: 'FeatureCollection',
    features: segmentLines.map(([id, coordinates]) => ({
      type: 'Feature',
      properties: { id, name: `Invented ${id}`, kind: 'beach', shellfish: 'none' },
      geometry: { type: 'LineString', coordinates },
    })),
  });
}

const settings = {
  invented: true,
  region: { id: 'job-check', name: 'Invented check coast' },
  publisher: { role: 'publisher', name: 'Invented publisher' },
  authorities: [{ role: 'public-health', name: 'Invented health office' }],
  publications: [{ season: '2026-spring', date: '2026-06-01' }],
  drift: { arrivalDistanceKm: 2, zoneDistanceKm: 4, zoneMinParticles: 3 },
};

function writeScenario(dir: string, drift: { name: string; role: string; path: string; compression?: string }[]): void {
  mkdirSync(join(dir, 'drift'), { recursive: true });
  writeFileSync(join(dir, 'scenario.json'), JSON.stringify(settings, null, 2));
  writeFileSync(join(dir, 'segments.geojson'), segmentsGeojson());
  const resources = [
    { name: 'settings', role: 'settings', path: 'scenario.json', format: 'json' },
    { name: 'segments', role: 'segments', path: 'segments.geojson', format: 'geojson' },
    ...drift.map((d) => ({ ...d, format: d.path.endsWith('.nc') ? 'netcdf' : 'csv' })),
  ];
  writeFileSync(join(dir, 'datapackage.json'), JSON.stringify({ name: 'job-check', resources }, null, 2));
}

const iso = (ms: number): string => new Date(ms).toISOString().replace('.000Z', 'Z');

/**
 * Positions CSV files: particles 0–8 sit on the decision points; particles 10–49 wander around the
 * coast. Times run hourly across 2025-11-30/12-01 and 2026-02-28/03-01.
 */
export function writeCsvScenario(dir: string): void {
  mkdirSync(join(dir, 'drift'), { recursive: true });
  const random = createSeededRandom(18);
  const rows1: string[] = ['particle,time,lon,lat,status'];
  const rows2: string[] = ['particle,time,lon,lat,status'];
  const starts = [Date.UTC(2025, 10, 30, 18), Date.UTC(2026, 1, 28, 18)];
  decisionPoints.forEach((p, k) => {
    for (const start of starts) {
      rows1.push(`${k},${iso(start)},${p.lon},${p.lat},drifting`);
      rows2.push(`${k},${iso(start + 10 * 3_600_000)},${p.lon},${p.lat},drifting`);
    }
  });
  const xs = segmentLines.flatMap(([, line]) => line.map((c) => c[0]));
  for (let particle = 10; particle < 50; particle++) {
    let lon = Math.min(...xs) - 0.05 + random.uniform() * (Math.max(...xs) - Math.min(...xs) + 0.1);
    let lat = 39.98 + random.uniform() * 0.2;
    for (const start of starts) {
      for (let h = 0; h < 12; h++) {
        lon += (random.uniform() - 0.5) * 0.01;
        lat += (random.uniform() - 0.5) * 0.01;
        const ashore = h === 11 && particle % 5 === 0;
        const row = `${particle},${iso(start + h * 3_600_000)},${lon.toFixed(6)},${lat.toFixed(6)},${ashore ? 'ashore' : 'drifting'}`;
        (h < 7 ? rows1 : rows2).push(row);
      }
    }
  }
  // The same particle and time in both files (the later file's position is the last one), a time
  // going backwards in the second file, and bad rows the readers leave out.
  rows1.push(`60,${iso(Date.UTC(2026, 1, 28, 23))},10.01,40.05,drifting`);
  rows2.push(`60,${iso(Date.UTC(2026, 1, 28, 23))},10.02,40.06,drifting`);
  rows2.push(`60,${iso(Date.UTC(2026, 1, 28, 22))},10.03,40.07,drifting`);
  rows1.push(`61,${iso(Date.UTC(2026, 1, 28, 20))},200.5,40.05,drifting`);
  rows1.push(`61,2026-02-30T00:00:00Z,10.0,40.05,drifting`);
  rows1.push(`61,${iso(Date.UTC(2026, 1, 28, 21))},10.0,-91,drifting`);
  rows1.push(`61,${iso(Date.UTC(2026, 1, 28, 22))},10.0,40.05,beached`);
  rows1.push(`61,${iso(Date.UTC(2026, 1, 28, 23))},10.0,40.05,drifting`);
  rows1.push(`61,${iso(Date.UTC(2026, 1, 28, 23))},10.1,40.05,drifting`);
  rows1.push(`,${iso(Date.UTC(2026, 1, 28, 23))},10.1,40.05,drifting`);
  rows1.push(`62,${iso(Date.UTC(2026, 1, 28, 23))},NaN,40.05,drifting`);
  rows1.push(`x7,${iso(Date.UTC(2026, 1, 28, 23))},10.1,40.05,drifting`);
  rows1.push(`63,${iso(Date.UTC(2026, 1, 28, 23))},10.1,40.05,drifting,extra`);
  writeFileSync(join(dir, 'drift', 'positions-1.csv'), `${rows1.join('\n')}\n`);
  writeFileSync(join(dir, 'drift', 'positions-2.csv.gz'), gzipSync(`${rows2.join('\n')}\n`));
  // A gzip file cut short (its positions up to the cut count, then the error names the row where
  // reading stopped) and a plain text file that claims to be gzip.
  const rows3: string[] = ['particle,time,lon,lat,status'];
  for (let particle = 70; particle < 80; particle++) {
    for (let h = 0; h < 30; h++)
      rows3.push(`${particle},${iso((starts[1] ?? 0) + h * 3_600_000)},${(10 + random.uniform() * 2).toFixed(6)},${(40 + random.uniform() * 0.15).toFixed(6)},drifting`);
  }
  const whole = gzipSync(`${rows3.join('\n')}\n`);
  writeFileSync(join(dir, 'drift', 'positions-3.csv.gz'), whole.subarray(0, Math.floor(whole.length * 0.6)));
  writeFileSync(join(dir, 'drift', 'positions-4.csv.gz'), `${rows3.slice(0, 5).join('\n')}\n`);
  writeScenario(dir, [
    { name: 'positions-1', role: 'drift-positions', path: 'drift/positions-1.csv' },
    { name: 'positions-2', role: 'drift-positions', path: 'drift/positions-2.csv.gz', compression: 'gz' },
    { name: 'positions-3', role: 'drift-positions', path: 'drift/positions-3.csv.gz', compression: 'gz' },
    { name: 'positions-4', role: 'drift-positions', path: 'drift/positions-4.csv.gz', compression: 'gz' },
  ]);
}

/** Trajectories around the coast across 2025-12-01 00:00 (hours since 2025-09-01: 2184). */
function trajectories(seed: number): Trajectory[] {
  const random = createSeededRandom(seed);
  const result: Trajectory[] = decisionPoints.map((p, k) => ({
    id: 500 + k,
    observations: [
      { hours: 2180, lon: p.lon, lat: p.lat },
      { hours: 2190, lon: p.lon, lat: p.lat },
    ],
  }));
  for (let t = 0; t < 12; t++) {
    let lon = 9.95 + random.uniform() * 2.1;
    let lat = 39.98 + random.uniform() * 0.2;
    const observations = [];
    const first = 2178 + Math.floor(random.uniform() * 4);
    for (let h = first; h < first + 10; h++) {
      lon += (random.uniform() - 0.5) * 0.01;
      lat += (random.uniform() - 0.5) * 0.01;
      observations.push({ hours: h, lon, lat });
    }
    result.push({ id: 600 + t, observations });
  }
  return result;
}

/** The time units of cf-fixtures, moved to 2025-09-01 so that the files cross into winter 2026. */
function moved<T extends { variables: readonly { attributes?: readonly { name: string; value: unknown }[] }[] }>(spec: T, units = 'hours since 2025-09-01 00:00:00'): T {
  const copy = structuredClone(spec);
  for (const variable of copy.variables) {
    for (const attribute of variable.attributes ?? []) {
      if (attribute.name === 'units' && typeof attribute.value === 'string' && attribute.value.includes('since')) {
        (attribute as { value: string }).value = units;
      }
    }
  }
  return copy;
}

/** CF trajectory files in all four layouts (NetCDF-3) and one NetCDF-4 file. */
export async function writeNetcdfScenario(dir: string): Promise<void> {
  mkdirSync(join(dir, 'drift'), { recursive: true });
  const specs = {
    'orthogonal.nc': orthogonalSpec(trajectories(1)),
    'incomplete.nc': incompleteSpec(trajectories(2)),
    'contiguous.nc': contiguousSpec(trajectories(3)),
    'indexed.nc': indexedSpec(trajectories(4)),
  };
  for (const [name, spec] of Object.entries(specs)) writeFileSync(join(dir, 'drift', name), writeNetcdf3(moved(spec)));
  await writeNetcdf4(join(dir, 'drift', 'contiguous-4.nc'), moved(contiguousSpec(trajectories(5))));
  writeScenario(
    dir,
    [...Object.keys(specs), 'contiguous-4.nc'].map((name) => ({ name: name.replace('.nc', ''), role: 'drift-trajectories', path: `drift/${name}` })),
  );
}

/** Bad trajectory files: cut short, wrong time units, positions outside the valid range. */
export function writeBadScenario(dir: string): void {
  mkdirSync(join(dir, 'drift'), { recursive: true });
  const good = writeNetcdf3(moved(contiguousSpec(trajectories(6))));
  writeFileSync(join(dir, 'drift', 'cut-short.nc'), good.subarray(0, Math.floor(good.length * 0.7)));
  const units = moved(contiguousSpec(trajectories(7)), 'fortnights since 2025-09-01');
  writeFileSync(join(dir, 'drift', 'wrong-units.nc'), writeNetcdf3(units));
  const outside = trajectories(8);
  const bad = outside[10]?.observations;
  if (bad?.[2]) bad[2].lat = 95.5;
  if (bad?.[4]) bad[4].lon = 400;
  writeFileSync(join(dir, 'drift', 'outside.nc'), writeNetcdf3(moved(indexedSpec(outside))));
  writeScenario(
    dir,
    ['cut-short.nc', 'wrong-units.nc', 'outside.nc'].map((name) => ({ name: name.replace('.nc', ''), role: 'drift-trajectories', path: `drift/${name}` })),
  );
}
