/**
 * Writes the invented demo scenario: `npm run demo:make` (or `tsx content/demo/make-demo.ts
 * [--out DIR]`). Seeded and deterministic: no clock, no Math.random; running it again writes the
 * same bytes (gzip with a zero modification time and fixed options).
 *
 * Everything written here is invented for demonstration: the coast, places, agencies, contacts
 * and every value.
 */
import { mkdir, writeFile } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { gzipSync } from 'node:zlib';
import { writeNetcdf3 } from '../../generator/drift/netcdf3-writer.ts';
import {
  coastX,
  landFeatureCollection,
  COAST_NORTH_Y,
  COAST_SOUTH_Y,
  ISLAND,
  islandPoint,
  onIsland,
  SEGMENT_PLANS,
  segmentsFeatureCollection,
  segmentLonLatLine,
  toLonLat,
  segmentLocalLine,
  localLength,
} from './coast.ts';
import { runSeason, type DriftSetup, type PositionRow } from './drift.ts';
import { makeTables, toCsv, TABLE_HEADERS, SEGMENT_RECIPES, BAD_ROWS } from './monitoring.ts';
import { makeDatapackage, makeSettings } from './package-files.ts';
import { DEMO_SEASONS, isoDate, isoDateTime } from './seasons.ts';

export const DEMO_SEED = 20261201;
export const REGION = { id: 'tessavar-coast', name: 'Tessavar Coast', org: 'Tessavar' };

/** Seasons with a drift-model run: the last eight (2025-winter to 2026-autumn). */
export const DRIFT_SEASONS = DEMO_SEASONS.slice(32);
/** Particles of the last season written to the NetCDF trajectory file. */
export const NETCDF_PARTICLES = 150;

export const DEMO_DRIFT_SETUP: DriftSetup = {
  coastX,
  landRange: [COAST_SOUTH_Y, COAST_NORTH_Y],
  island: {
    contains: onIsland,
    shorePoint: (x, y) => {
      const angle = Math.atan2(y - ISLAND.centreY, x - ISLAND.centreX);
      const [sx, sy] = islandPoint(angle);
      // 50 m seaward of the shore line.
      return [sx + 0.05 * Math.cos(angle), sy + 0.05 * Math.sin(angle)];
    },
  },
  gyres: [
    { x: -58, y: 22, radiusKm: 18, swirlKmPerDay: 9, inflowKmPerDay: 2.6 },
    { x: -46, y: -38, radiusKm: 14, swirlKmPerDay: 7, inflowKmPerDay: 2.2 },
  ],
  coastalCurrentKmPerDay: 9,
  coastalWidthKm: 7,
  // Onshore (east) windage in winter and autumn, offshore in summer: arrivals differ by season.
  wind: { winter: [3.2, -1.0], spring: [1.0, 1.5], summer: [-1.6, 0.6], autumn: [2.4, -1.6] },
  gyreSeasonFactor: { winter: 0.8, spring: 1.1, summer: 1.4, autumn: 1.0 },
  diffusionKm2PerDay: 0.8,
  bounds: { xMin: -120, xMax: 80, yMin: -140, yMax: 130 },
  offshoreBox: { xMin: -88, xMax: -6, yMin: -66, yMax: 58 },
  sources: [
    { name: 'Aldwen river mouth', x: coastX(-5) - 0.8, y: -5, share: 0.25, spreadKm: 0.4 },
    { name: 'Quarrow Harbour entrance', x: coastX(13) - 1.2, y: 13, share: 0.15, spreadKm: 0.4 },
    { name: 'Ithmere Bay creek', x: coastX(30) - 0.8, y: 30, share: 0.05, spreadKm: 0.3 },
  ],
  particlesPerSeason: 1800,
  maxDays: 40,
  releaseWindowDays: 50,
  toLonLat,
};

function positionLine(row: PositionRow): string {
  return `${row.particle},${isoDateTime(row.day)},${row.lon},${row.lat},${row.ashore ? 'ashore' : 'drifting'}\n`;
}

/** Deterministic gzip: fixed level and memory level; Node writes a zero mtime in the header. */
export function gzipFixed(data: string | Uint8Array): Uint8Array {
  return gzipSync(typeof data === 'string' ? Buffer.from(data, 'utf8') : data, { level: 9, memLevel: 9 });
}

interface DriftOutput {
  csvGz: Uint8Array;
  netcdf: Uint8Array;
  rows: number;
  arrivalsBySeason: Map<string, number>;
  box: [number, number, number, number];
}

function makeDrift(seed: number): DriftOutput {
  const chunks: string[] = [];
  let buffer = 'particle,time,lon,lat,status\n';
  let rows = 0;
  let particle = 0;
  const arrivalsBySeason = new Map<string, number>();
  const lastSeason = DRIFT_SEASONS[DRIFT_SEASONS.length - 1];
  const kept: PositionRow[] = [];
  let keepFrom = -1;
  const box: [number, number, number, number] = [180, 90, -180, -90];
  for (const season of DRIFT_SEASONS) {
    if (season === lastSeason) keepFrom = particle;
    particle = runSeason(DEMO_DRIFT_SETUP, season, particle, seed, (row) => {
      buffer += positionLine(row);
      extend(box, row.lon, row.lat);
      rows++;
      if (buffer.length > 1 << 20) {
        chunks.push(buffer);
        buffer = '';
      }
      if (row.ashore) arrivalsBySeason.set(season.id, (arrivalsBySeason.get(season.id) ?? 0) + 1);
      if (keepFrom >= 0 && row.particle < keepFrom + NETCDF_PARTICLES) kept.push(row);
    });
  }
  chunks.push(buffer);
  const csvGz = gzipFixed(chunks.join(''));
  if (!lastSeason) throw new Error('makeDrift requires at least one season');
  return { csvGz, netcdf: trajectoriesNetcdf(kept, lastSeason.startDay, lastSeason.id, keepFrom), rows, arrivalsBySeason, box };
}

/** CF-1.8 trajectory file, contiguous ragged array representation (CF ch. 9, H.4.3). */
function trajectoriesNetcdf(rows: PositionRow[], epochDay: number, seasonId: string, firstParticle: number): Uint8Array {
  const ids: number[] = [];
  const sizes: number[] = [];
  for (const row of rows) {
    if (ids[ids.length - 1] !== row.particle) {
      ids.push(row.particle);
      sizes.push(0);
    }
    sizes[sizes.length - 1] = (sizes[sizes.length - 1] ?? 0) + 1;
  }
  const epoch = isoDate(epochDay);
  return writeNetcdf3({
    dimensions: [
      { name: 'trajectory', size: ids.length },
      { name: 'obs', size: rows.length },
    ],
    attributes: [
      { name: 'Conventions', value: 'CF-1.8' },
      { name: 'featureType', value: 'trajectory' },
      { name: 'title', value: `Invented toy drift-model trajectories, ${seasonId} (demonstration only)` },
      { name: 'institution', value: `${REGION.org} Coastal Observatory (invented)` },
      { name: 'source', value: 'Seeded toy drift model of the Wrackline demo: gyres, coastal current, windage, random walk' },
      { name: 'comment', value: `Invented data for demonstration only. Particles ${firstParticle} to ${firstParticle + ids.length - 1} of the positions file.` },
    ],
    variables: [
      {
        name: 'trajectory',
        type: 'int',
        dimensions: ['trajectory'],
        data: ids,
        attributes: [
          { name: 'cf_role', value: 'trajectory_id' },
          { name: 'long_name', value: 'particle number (as in positions.csv.gz)' },
        ],
      },
      {
        name: 'row_size',
        type: 'int',
        dimensions: ['trajectory'],
        data: sizes,
        attributes: [
          { name: 'long_name', value: 'number of positions of this particle' },
          { name: 'sample_dimension', value: 'obs' },
        ],
      },
      {
        name: 'time',
        type: 'double',
        dimensions: ['obs'],
        data: rows.map((row) => row.day - epochDay),
        attributes: [
          { name: 'standard_name', value: 'time' },
          { name: 'long_name', value: 'time of the position' },
          { name: 'units', value: `days since ${epoch} 00:00:00` },
          { name: 'calendar', value: 'standard' },
          { name: 'axis', value: 'T' },
        ],
      },
      {
        name: 'lon',
        type: 'float',
        dimensions: ['obs'],
        data: rows.map((row) => row.lon),
        attributes: [
          { name: 'standard_name', value: 'longitude' },
          { name: 'long_name', value: 'longitude' },
          { name: 'units', value: 'degrees_east' },
          { name: 'axis', value: 'X' },
        ],
      },
      {
        name: 'lat',
        type: 'float',
        dimensions: ['obs'],
        data: rows.map((row) => row.lat),
        attributes: [
          { name: 'standard_name', value: 'latitude' },
          { name: 'long_name', value: 'latitude' },
          { name: 'units', value: 'degrees_north' },
          { name: 'axis', value: 'Y' },
        ],
      },
      {
        name: 'ashore',
        type: 'byte',
        dimensions: ['obs'],
        data: rows.map((row) => (row.ashore ? 1 : 0)),
        attributes: [
          { name: 'long_name', value: 'particle has reached the shore' },
          { name: 'flag_values', value: [0, 1], type: 'byte' },
          { name: 'flag_meanings', value: 'drifting ashore' },
          { name: 'coordinates', value: 'time lat lon' },
        ],
      },
    ],
  });
}

function json(value: unknown): string {
  return `${JSON.stringify(value, null, 2)}\n`;
}

export interface DemoSummary {
  files: { path: string; bytes: number }[];
  positions: number;
  arrivalsBySeason: Map<string, number>;
}

/** Write the whole demo scenario folder into `outDir`. */
export async function makeDemo(outDir: string, seed = DEMO_SEED): Promise<DemoSummary> {
  const files = new Map<string, string | Uint8Array>();
  files.set(
    'scenario.json',
    json(
      makeSettings({
        regionId: REGION.id,
        regionName: REGION.name,
        regionDescription:
          'An invented stretch of coast with sandy beaches, three shellfish-farming bays, a harbour town, an estuary and an offshore island. Invented for demonstration: no such place exists.',
        orgName: REGION.org,
        seed: 17,
        monitoringStart: '2016-12-01',
      }),
    ),
  );
  files.set(
    'datapackage.json',
    json(
      makeDatapackage({
        name: 'demo-tessavar-coast',
        title: 'Tessavar Coast demonstration scenario (invented)',
        description:
          'Ten years (December 2016 to November 2026) of seasonal monitoring on thirty coastline segments of the invented Tessavar Coast, with a toy drift-model run for the last eight seasons.',
        created: '2026-12-01T00:00:00Z',
        drift: 'positions-and-trajectories',
        land: true,
      }),
    ),
  );
  files.set('segments.geojson', json(segmentsFeatureCollection()));
  files.set('land.geojson', json(landFeatureCollection()));
  const tables = makeTables(seed);
  files.set('tables/beach-litter.csv', toCsv(TABLE_HEADERS.beachLitter, tables.beachLitter));
  files.set('tables/water-microplastics.csv', toCsv(TABLE_HEADERS.water, tables.water));
  files.set('tables/shellfish-tissue.csv', toCsv(TABLE_HEADERS.shellfish, tables.shellfish));
  files.set('tables/wildlife-reports.csv', toCsv(TABLE_HEADERS.wildlife, tables.wildlife));
  const drift = makeDrift(seed);
  files.set('drift/positions.csv.gz', drift.csvGz);
  files.set('drift/trajectories.nc', drift.netcdf);
  files.set('README.md', readme(drift));

  await mkdir(join(outDir, 'tables'), { recursive: true });
  await mkdir(join(outDir, 'drift'), { recursive: true });
  const written: { path: string; bytes: number }[] = [];
  for (const [path, content] of files) {
    await writeFile(join(outDir, path), content);
    written.push({ path, bytes: typeof content === 'string' ? Buffer.byteLength(content) : content.byteLength });
  }
  return { files: written, positions: drift.rows, arrivalsBySeason: drift.arrivalsBySeason };
}

function box([west, south, east, north]: [number, number, number, number]): string {
  return `${(-north).toFixed(2)}° S and ${(-south).toFixed(2)}° S, ${(-east).toFixed(2)}° W and ${(-west).toFixed(2)}° W`;
}

function extend(bounds: [number, number, number, number], lon: number, lat: number): void {
  bounds[0] = Math.min(bounds[0], lon);
  bounds[1] = Math.min(bounds[1], lat);
  bounds[2] = Math.max(bounds[2], lon);
  bounds[3] = Math.max(bounds[3], lat);
}

function readme(drift: DriftOutput): string {
  const segmentBox: [number, number, number, number] = [180, 90, -180, -90];
  for (const plan of SEGMENT_PLANS) for (const [lon, lat] of segmentLonLatLine(plan)) extend(segmentBox, lon, lat);
  const planById = new Map(SEGMENT_PLANS.map((plan) => [plan.id, plan]));
  const segmentRows = SEGMENT_RECIPES.map((recipe) => {
    const plan = planById.get(recipe.segmentId);
    if (!plan) throw new Error(`makeDemo: recipe for unknown segment ${recipe.segmentId}`);
    const data = [recipe.beach && 'beach litter', recipe.water && 'water', recipe.shellfish && 'shellfish', recipe.wildlife && 'wildlife'].filter(Boolean).join(', ') || 'none';
    const km = localLength(segmentLocalLine(plan)).toFixed(1);
    return `| \`${plan.id}\` | ${plan.name} | ${plan.kind} | ${plan.shellfish} | ${km} | ${data} | ${recipe.shows.join('; ')} |`;
  });
  const arrivals = DRIFT_SEASONS.map((season) => `${season.id} ${drift.arrivalsBySeason.get(season.id) ?? 0}`).join(', ');
  return `# The Tessavar Coast demo scenario (invented)

**Everything in this folder is invented for demonstration.** The Tessavar Coast, its towns, the
${REGION.org} Coastal Observatory, the shellfish-sanitation board, the public-health office, the
debris line, the animal rescue, their contacts and every number are made up by a seeded script.
Contacts use \`example.org\` addresses and 555-style numbers so that none of them reaches anyone.
Do not use these data or these pages for any decision about a real shore or real shellfish.

Regenerate with \`npm run demo:make\` (\`tsx content/demo/make-demo.ts [--out DIR]\`). The script
is seeded (seed ${DEMO_SEED}); it reads no clock and calls no unseeded random source, so running it
again reproduces every file byte for byte (\`test/demo/reproducible.test.ts\` checks this).

## Where it is

The coast is drawn procedurally on a local plane around 37.5° S, 127.5° W. The segments lie
between ${box(segmentBox)}; the drift positions between ${box(drift.box)}. That is open South Pacific water, deep ocean far from any coast. The
nearest real land is the Pitcairn Islands group (Pitcairn, Henderson, Oeno and Ducie, about
24°–25° S and 125°–131° W), some 1,400 km to the north; Rapa Iti (about 27.6° S, 144.3° W) and
Easter Island (about 27.1° S, 109.4° W) are farther away. No island or reef lies inside the box.
These positions are given from memory, not checked against a gazetteer; re-check them before
relying on the claim. The coordinates belong to no real place.

The season names are the project's default meteorological seasons (winter = December to February),
kept as they are even though a real coast at this latitude would have its summer in December to
February: a deliberate simplification of an invented place.

## Files

| file | what |
|---|---|
| \`datapackage.json\` | Frictionless Data Package: every file, with Table Schemas (types, units, missing values, keys) |
| \`scenario.json\` | settings: region, invented contacts, published seasons (2026-summer on 2026-09-01, 2026-autumn on 2026-12-01), trend, drift and risk rules |
| \`segments.geojson\` | ${SEGMENT_PLANS.length} coastline segments as LineStrings (WGS84) |
| \`land.geojson\` | invented land polygons of the mainland and the island, drawn under the maps (WGS84) |
| \`tables/beach-litter.csv\` | seasonal beach-litter surveys, 2017-winter to 2026-autumn |
| \`tables/water-microplastics.csv\` | surface-water net tows |
| \`tables/shellfish-tissue.csv\` | shellfish tissue samples |
| \`tables/wildlife-reports.csv\` | entanglement and ingestion reports |
| \`drift/positions.csv.gz\` | ${drift.rows.toLocaleString('en-GB')} daily particle positions of a toy drift run, ${DRIFT_SEASONS[0]?.id} to ${DRIFT_SEASONS[DRIFT_SEASONS.length - 1]?.id} |
| \`drift/trajectories.nc\` | the first ${NETCDF_PARTICLES} particles of the last season as a CF-1.8 trajectory file (NetCDF-3 classic, contiguous ragged array) |

## Magnitudes and their sources

- Beach litter (items > 2.5 cm per 100 m): from about 4 to about 350, mostly tens to low hundreds.
  EU 2015–2016 baseline means were 150 items/100 m (EU), 233 (north-east Atlantic), 274
  (Mediterranean); the EU threshold value is 20 items/100 m (Van Loon et al. 2020, JRC).
- Shellfish tissue: mostly 0.05–1 particles per g wet weight, below 1 in most samples (Van
  Cauwenberghe & Janssen 2014, Environ. Pollut. 193; Danopoulos et al. 2020, Environ. Health
  Perspect. 128(12)). Detection limits 0.05 or 0.08 particles/g.
- Surface water: from below the 0.05 particles/m³ detection limit to about 20 particles/m³ (333 µm
  net); published net-tow values span roughly 10⁻³ to 10² per m³ (from memory, unverified).
- Wildlife reports and the drift model are invented without a published reference.

## Segments and the pattern each shows

| id | name | kind | shellfish | length km | data | pattern |
|---|---|---|---|---|---|---|
${segmentRows.join('\n')}

## Deliberate bad rows

Three rows are wrong on purpose so that the validation report has something to show. Each should
be listed and left out, never silently dropped:

1. \`${BAD_ROWS.negativeCount.table}\`: a survey on \`${BAD_ROWS.negativeCount.segmentId}\` with \`items\` = ${BAD_ROWS.negativeCount.items} (a negative count; expected an integer ≥ 0).
2. \`${BAD_ROWS.unknownSegment.table}\`: a sample dated ${BAD_ROWS.unknownSegment.date} on segment \`${BAD_ROWS.unknownSegment.segmentId}\`, which is not in \`segments.geojson\` (foreign key).
3. \`${BAD_ROWS.futureDate.table}\`: a sample on \`${BAD_ROWS.futureDate.segmentId}\` dated ${BAD_ROWS.futureDate.date}, after the end of the last published season (2026-11-30) and after its publication date.

## The drift model

A seeded toy: two offshore gyres with a weak inflow (the accumulation zones, about 60 km west of Pellow Strand
and about 45 km west of Druan Cliffs), a southward coastal current, windage that blows onshore in winter
and autumn and offshore in summer, and a random walk. Particles start at the Aldwen river mouth,
the Quarrow Harbour entrance, a creek in Ithmere Bay, and across the offshore waters; each is
followed for up to 40 days within its season. A particle reaching the mainland or the island is
written once more with status \`ashore\` and stops. Particles ashore per season: ${arrivals}.
`;
}

async function runFromCommandLine(argv: string[]): Promise<number> {
  let outDir = fileURLToPath(new URL('.', import.meta.url));
  for (let i = 0; i < argv.length; i++) {
    const arg = argv[i];
    if (arg === '--out' && argv[i + 1]) outDir = resolve(argv[++i] as string);
    else {
      process.stderr.write(`make-demo: unknown argument ${arg ?? ''}; usage: make-demo [--out DIR]\n`);
      return 2;
    }
  }
  const summary = await makeDemo(outDir);
  const total = summary.files.reduce((sum, file) => sum + file.bytes, 0);
  for (const file of summary.files) process.stdout.write(`${file.path.padEnd(34)} ${file.bytes.toLocaleString('en-GB').padStart(12)} bytes\n`);
  process.stdout.write(`total ${(total / 1e6).toFixed(2)} MB; ${summary.positions.toLocaleString('en-GB')} drift positions; written to ${outDir}\n`);
  return 0;
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  runFromCommandLine(process.argv.slice(2)).then(
    (code) => {
      process.exitCode = code;
    },
    (error: unknown) => {
      console.error(error);
      process.exitCode = 1;
    },
  );
}
