/**
 * A large invented scenario for benchmarks, written on demand into a folder (never committed):
 * by default 2,000 coastline segments, ten years of seasonal surveys for the four indicators and
 * 5 million drift-model positions (gzip CSV), in the same folder format as the demo.
 *
 *   tsx bench/scale-scenario.ts [--out DIR] [--segments N] [--years N] [--positions N] [--seed N]
 *
 * Without --out it writes into a new temporary folder and prints its path, timings and sizes.
 * The coast is a long procedurally drawn shore in open Southern Ocean water (about 40° S to 58° S
 * at 120° W, far from any land); everything is invented.
 */
import { once } from 'node:events';
import { createWriteStream } from 'node:fs';
import { mkdir, mkdtemp, stat, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { createGzip } from 'node:zlib';
import { runSeason, type DriftSetup, type PositionRow } from '../content/demo/drift.ts';
import { makeTables, SEGMENT_RECIPES, TABLE_HEADERS, toCsv, type SegmentRecipe } from '../content/demo/monitoring.ts';
import { makeDatapackage, makeSettings } from '../content/demo/package-files.ts';
import { isoDate, isoDateTime, seasonRange } from '../content/demo/seasons.ts';

export interface ScaleOptions {
  /** Number of coastline segments; defaults to 2000. */
  segments?: number;
  /** Years of seasonal monitoring ending with 2026-autumn; defaults to 10. */
  years?: number;
  /** Drift-model positions written; defaults to 5,000,000. */
  positions?: number;
  /** Seed of every random draw; defaults to 1. */
  seed?: number;
}

export interface ScaleSummary {
  dir: string;
  segments: number;
  rows: { beachLitter: number; water: number; shellfish: number; wildlife: number; positions: number };
  files: { path: string; bytes: number }[];
}

const ORIGIN = { lon: -120, lat: -40 };
const SEGMENT_KM = 1;
const KINDS = ['beach', 'beach', 'rocky-shore', 'beach', 'bay', 'beach', 'harbour', 'beach', 'estuary', 'rocky-shore'] as const;

function toLonLat(x: number, y: number): [number, number] {
  const lat = ORIGIN.lat + y / 110.574;
  const lon = ORIGIN.lon + x / (111.32 * Math.cos((lat * Math.PI) / 180));
  return [lon, lat];
}

/** Mainland shore of the scale coast: land to the east of x = coastX(y); y runs south from 0. */
function coastX(y: number): number {
  const phase = ((y % 60) + 60) % 60;
  const bay = 4 * Math.exp(-(((phase - 30) / 3) ** 2));
  return 2.2 * Math.sin(y / 17) + 1.1 * Math.sin(y / 6.3 + 1) + 0.35 * Math.sin(y / 1.9 + 0.4) + bay;
}

function round5(value: number): number {
  return Math.round(value * 1e5) / 1e5;
}

function segmentId(index: number): string {
  return `seg-${String(index + 1).padStart(4, '0')}`;
}

function segmentsGeojson(count: number): string {
  const features = [];
  for (let i = 0; i < count; i++) {
    const coordinates: [number, number][] = [];
    for (let k = 0; k <= 4; k++) {
      const y = -(i + k / 4) * SEGMENT_KM;
      const [lon, lat] = toLonLat(coastX(y), y);
      coordinates.push([round5(lon), round5(lat)]);
    }
    const kind = KINDS[i % KINDS.length] ?? 'beach';
    features.push({
      type: 'Feature',
      properties: { id: segmentId(i), name: `Scale segment ${i + 1}`, kind, shellfish: kind === 'bay' ? 'farmed' : 'none', place: `Stretch ${Math.floor(i / 50) + 1}` },
      geometry: { type: 'LineString', coordinates },
    });
  }
  return `${JSON.stringify({ type: 'FeatureCollection', features })}\n`;
}

/** Invented land east of the shore, sampled every 500 m from 20 km north of the first segment to
 * 20 km south of the last (the reader simplifies it for drawing), closed 1,200 km inland. */
function landGeojson(count: number): string {
  const shore: [number, number][] = [];
  for (let y = 20; y >= -(count * SEGMENT_KM + 20); y -= 0.5) {
    const [lon, lat] = toLonLat(coastX(y), y);
    shore.push([round5(lon), round5(lat)]);
  }
  const inland = (y: number): [number, number] => {
    const [lon, lat] = toLonLat(1200, y);
    return [round5(lon), round5(lat)];
  };
  // north to south along the shore with land to the east (left of the way): anticlockwise
  const ring = [...shore, inland(-(count * SEGMENT_KM + 20)), inland(20), shore[0]!];
  return `${JSON.stringify({ type: 'FeatureCollection', features: [{ type: 'Feature', properties: { name: 'Scale coast mainland (invented)' }, geometry: { type: 'Polygon', coordinates: [ring] } }] })}\n`;
}

/** Reuse the demo's recipes in turn, so the scale scenario has every series shape too. */
function scaleRecipes(count: number): SegmentRecipe[] {
  const recipes: SegmentRecipe[] = [];
  for (let i = 0; i < count; i++) {
    const template = SEGMENT_RECIPES[i % SEGMENT_RECIPES.length] as SegmentRecipe;
    recipes.push({ ...template, segmentId: segmentId(i) });
  }
  return recipes;
}

async function writeGzipLines(path: string, produce: (write: (text: string) => Promise<void>) => Promise<void>): Promise<void> {
  const gzip = createGzip({ level: 6 });
  const file = createWriteStream(path);
  gzip.pipe(file);
  const write = async (text: string) => {
    if (!gzip.write(text)) await once(gzip, 'drain');
  };
  await produce(write);
  gzip.end();
  await once(file, 'finish');
}

export async function makeScaleScenario(dir: string, options: ScaleOptions = {}): Promise<ScaleSummary> {
  const segmentCount = options.segments ?? 2000;
  const years = options.years ?? 10;
  const positionTarget = options.positions ?? 5_000_000;
  const seed = options.seed ?? 1;
  if (!(segmentCount >= 1 && years >= 1 && positionTarget >= 0)) throw new Error(`invalid scale options: ${JSON.stringify(options)}`);
  const seasons = seasonRange(2026 - years + 1, years * 4);
  const firstSeason = seasons[0];
  if (!firstSeason) throw new Error('makeScaleScenario requires at least one season');

  await mkdir(join(dir, 'tables'), { recursive: true });
  await mkdir(join(dir, 'drift'), { recursive: true });
  const texts = new Map<string, string>();
  texts.set(
    'scenario.json',
    `${JSON.stringify(
      makeSettings({
        regionId: 'scale-coast',
        regionName: 'Scale test coast (invented)',
        regionDescription: `An invented ${segmentCount}-segment coast for benchmarks. Invented for demonstration: no such place exists.`,
        orgName: 'Scale Test',
        seed,
        monitoringStart: isoDate(firstSeason.startDay),
      }),
      null,
      2,
    )}\n`,
  );
  texts.set(
    'datapackage.json',
    `${JSON.stringify(
      makeDatapackage({
        name: 'scale-test-coast',
        title: 'Scale test scenario (invented)',
        description: `${segmentCount} segments, ${years} years, about ${positionTarget} drift positions, for benchmarks.`,
        created: '2026-12-01T00:00:00Z',
        drift: 'positions',
        land: true,
      }),
      null,
      2,
    )}\n`,
  );
  texts.set('segments.geojson', segmentsGeojson(segmentCount));
  texts.set('land.geojson', landGeojson(segmentCount));
  const tables = makeTables(seed, scaleRecipes(segmentCount), seasons);
  texts.set('tables/beach-litter.csv', toCsv(TABLE_HEADERS.beachLitter, tables.beachLitter));
  texts.set('tables/water-microplastics.csv', toCsv(TABLE_HEADERS.water, tables.water));
  texts.set('tables/shellfish-tissue.csv', toCsv(TABLE_HEADERS.shellfish, tables.shellfish));
  texts.set('tables/wildlife-reports.csv', toCsv(TABLE_HEADERS.wildlife, tables.wildlife));
  for (const [path, text] of texts) await writeFile(join(dir, path), text);

  // Drift: gyres every 100 km offshore, sources at every estuary and harbour.
  const coastLengthKm = segmentCount * SEGMENT_KM;
  const gyres = [];
  for (let y = -50; y > -coastLengthKm; y -= 100) gyres.push({ x: -55, y, radiusKm: 18, swirlKmPerDay: 8, inflowKmPerDay: 2.4 });
  const sources = [];
  for (let i = 0; i < segmentCount; i++) {
    const kind = KINDS[i % KINDS.length];
    if (kind === 'estuary' || kind === 'harbour') {
      const y = -(i + 0.5) * SEGMENT_KM;
      sources.push({ name: segmentId(i), x: coastX(y) - 0.8, y, share: 0, spreadKm: 0.4 });
    }
  }
  const share = 0.4 / Math.max(1, sources.length);
  for (const source of sources) source.share = share;
  const setup: DriftSetup = {
    coastX,
    landRange: [-coastLengthKm, 0],
    gyres,
    coastalCurrentKmPerDay: 9,
    coastalWidthKm: 7,
    wind: { winter: [3.2, -1.0], spring: [1.0, 1.5], summer: [-1.6, 0.6], autumn: [2.4, -1.6] },
    gyreSeasonFactor: { winter: 0.8, spring: 1.1, summer: 1.4, autumn: 1.0 },
    diffusionKm2PerDay: 0.8,
    bounds: { xMin: -120, xMax: 80, yMin: -coastLengthKm - 80, yMax: 80 },
    offshoreBox: { xMin: -88, xMax: -6, yMin: -coastLengthKm, yMax: 0 },
    sources,
    particlesPerSeason: 2000,
    maxDays: 40,
    releaseWindowDays: 50,
    toLonLat,
  };
  const driftSeasons = seasons.slice(-8);
  let positions = 0;
  await writeGzipLines(join(dir, 'drift/positions.csv.gz'), async (write) => {
    await write('particle,time,lon,lat,status\n');
    let particle = 0;
    for (let round = 0; positions < positionTarget; round++) {
      for (const season of driftSeasons) {
        if (positions >= positionTarget) break;
        let buffer = '';
        particle = runSeason(setup, season, particle, seed + round * 7919, (row: PositionRow) => {
          if (positions >= positionTarget) return;
          positions++;
          buffer += `${row.particle},${isoDateTime(row.day)},${row.lon},${row.lat},${row.ashore ? 'ashore' : 'drifting'}\n`;
        });
        await write(buffer);
      }
    }
  });

  const files = [];
  for (const path of [...texts.keys(), 'drift/positions.csv.gz']) files.push({ path, bytes: (await stat(join(dir, path))).size });
  return {
    dir,
    segments: segmentCount,
    rows: { beachLitter: tables.beachLitter.length, water: tables.water.length, shellfish: tables.shellfish.length, wildlife: tables.wildlife.length, positions },
    files,
  };
}

async function runFromCommandLine(argv: string[]): Promise<number> {
  const options: ScaleOptions = {};
  let dir: string | null = null;
  for (let i = 0; i < argv.length; i++) {
    const flag = argv[i];
    const value = argv[i + 1];
    if (value === undefined) {
      process.stderr.write(`scale-scenario: ${flag ?? ''} needs a value\n`);
      return 2;
    }
    i++;
    if (flag === '--out') dir = resolve(value);
    else if (flag === '--segments' || flag === '--years' || flag === '--positions' || flag === '--seed') {
      const number = Number(value);
      if (!Number.isInteger(number) || number < 0) {
        process.stderr.write(`scale-scenario: invalid ${flag}; not a whole number: ${value}\n`);
        return 2;
      }
      options[flag.slice(2) as keyof ScaleOptions] = number;
    } else {
      process.stderr.write(`scale-scenario: unknown option ${flag ?? ''}\n`);
      return 2;
    }
  }
  const target = dir ?? (await mkdtemp(join(tmpdir(), 'wrackline-scale-')));
  const started = performance.now();
  const summary = await makeScaleScenario(target, options);
  const seconds = (performance.now() - started) / 1000;
  for (const file of summary.files) process.stdout.write(`${file.path.padEnd(34)} ${file.bytes.toLocaleString('en-GB').padStart(14)} bytes\n`);
  const rows = summary.rows;
  process.stdout.write(
    `segments ${summary.segments}; rows: beach litter ${rows.beachLitter}, water ${rows.water}, shellfish ${rows.shellfish}, wildlife ${rows.wildlife}, positions ${rows.positions}\n`,
  );
  process.stdout.write(`written in ${seconds.toFixed(1)} s to ${summary.dir}\n`);
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
