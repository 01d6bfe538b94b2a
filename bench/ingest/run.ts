/**
 * Ingest benchmark: creates a synthetic scenario in a temporary folder — 2,000 coastline segments
 * and 10 million particle positions — and runs the drift assignment over it (positions streamed,
 * nearest segment through the spatial index, arrivals per segment and season, DBSCAN zones). Then
 * writes a large positions CSV (1 GB by default) and streams it through the positions reader to
 * show that memory stays bounded. Each measured step runs in its own child process, so its peak
 * memory (maximum resident set size) is its own.
 *
 *   npx tsx bench/ingest/run.ts [--positions 10000000] [--segments 2000] [--big-gb 1] [--keep]
 *
 * Targets: assignment under 30 s and under 1 GB peak memory on 2 cores. The data are synthetic
 * (a wiggly invented coastline and random particles); nothing here is a real place.
 */
import { spawnSync } from 'node:child_process';
import { createWriteStream, mkdtempSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import { createSeededRandom } from '../../generator/random/seeded-random.ts';

const { values } = parseArgs({
  options: {
    positions: { type: 'string', default: '10000000' },
    segments: { type: 'string', default: '2000' },
    'big-gb': { type: 'string', default: '1' },
    keep: { type: 'boolean', default: false },
  },
});
const positionCount = Number(values.positions);
const segmentCount = Number(values.segments);
const bigBytes = Number(values['big-gb']) * 1024 ** 3;

const dir = mkdtempSync(join(tmpdir(), 'wrackline-bench-'));
const stepScript = fileURLToPath(new URL('./step.ts', import.meta.url));

/** Coast runs north from 20° N at about 0° E with a wiggle; each segment is ~2 km, 8 vertices. */
function coastPoint(km: number): [number, number] {
  const lat = 20 + km / 111.195;
  const lon = 0.05 * Math.sin(km / 7) + 0.02 * Math.sin(km / 1.3);
  return [lon, lat];
}

function writeSegments(): number {
  const features = [];
  const kmPerSegment = 2;
  for (let s = 0; s < segmentCount; s++) {
    const coordinates = Array.from({ length: 8 }, (_, j) => coastPoint(s * kmPerSegment + (j * kmPerSegment) / 7).map((v) => Number(v.toFixed(6))));
    features.push({ type: 'Feature', properties: { id: `seg-${s}`, name: `Segment ${s}`, kind: 'beach', shellfish: 'none' }, geometry: { type: 'LineString', coordinates } });
  }
  writeFileSync(join(dir, 'segments.geojson'), JSON.stringify({ type: 'FeatureCollection', features }));
  return segmentCount * kmPerSegment;
}

/**
 * Positions: particles × days. A third of the particles drift along the coast (0–5 km offshore),
 * the rest drift offshore (0.1°–3° west); daily steps from 2025-12-01 (winter and spring).
 */
async function writePositions(path: string, count: number, seed: number): Promise<void> {
  const days = 100;
  const particles = Math.ceil(count / days);
  const seeded = createSeededRandom(seed);
  const random = (): number => seeded.uniform();
  const startMs = Date.UTC(2025, 11, 1);
  const dayText = Array.from({ length: days }, (_, d) => new Date(startMs + d * 86_400_000).toISOString().replace('.000Z', 'Z'));
  const coastKm = segmentCount * 2;
  const state = Array.from({ length: particles }, (_, p) => {
    const near = p % 3 === 0;
    const km = random() * coastKm;
    const [lon, lat] = coastPoint(km);
    return { lon: near ? lon - (random() * 5) / 80 : -0.1 - random() * 2.9, lat };
  });
  const out = createWriteStream(path, { highWaterMark: 1 << 22 });
  const write = (text: string): Promise<void> | null => (out.write(text) ? null : new Promise<void>((resolve) => out.once('drain', () => resolve())));
  await write('particle,time,lon,lat,status\n');
  let written = 0;
  for (let d = 0; d < days && written < count; d++) {
    let chunk = '';
    for (let p = 0; p < particles && written < count; p++) {
      const s = state[p] as { lon: number; lat: number };
      s.lon += (random() - 0.5) * 0.02;
      s.lat += (random() - 0.5) * 0.02;
      chunk += `${p},${dayText[d]},${s.lon.toFixed(5)},${s.lat.toFixed(5)},drifting\n`;
      written++;
      if (chunk.length > 4_000_000) {
        const wait = write(chunk);
        chunk = '';
        if (wait !== null) await wait;
      }
    }
    const wait = write(chunk);
    if (wait !== null) await wait;
  }
  await new Promise<void>((resolve) => out.end(() => resolve()));
}

interface StepResult {
  wallSeconds: number;
  cpuSeconds: number;
  peakMegabytes: number;
  output: string;
}

function runStep(args: string[]): StepResult {
  const started = performance.now();
  const child = spawnSync(process.execPath, ['--import', 'tsx', stepScript, ...args], { encoding: 'utf8', maxBuffer: 1 << 24 });
  const wallSeconds = (performance.now() - started) / 1000;
  if (child.status !== 0) throw new Error(`bench step failed: ${child.stderr}`);
  const report = JSON.parse(child.stdout.trim().split('\n').pop() ?? '{}') as { peakMegabytes: number; cpuSeconds: number; output: string };
  return { wallSeconds, cpuSeconds: report.cpuSeconds, peakMegabytes: report.peakMegabytes, output: report.output };
}

function mb(bytes: number): string {
  return `${(bytes / 1024 ** 2).toFixed(0)} MB`;
}

// Remove the temporary folder however the run ends (unless --keep).
process.on('exit', () => {
  if (!values.keep) rmSync(dir, { recursive: true, force: true });
});

const t0 = performance.now();
const coastKm = writeSegments();
await writePositions(join(dir, 'positions.csv'), positionCount, 7);
const created = (performance.now() - t0) / 1000;
console.log(
  `created ${segmentCount.toLocaleString('en-GB')} segments (${coastKm} km of coast) and ${positionCount.toLocaleString('en-GB')} positions (${mb(statSync(join(dir, 'positions.csv')).size)} CSV) in ${created.toFixed(1)} s  [${dir}]`,
);

const assign = runStep(['assign', dir]);
console.log(`assignment: ${assign.output}`);
console.log(
  `  wall time ${assign.wallSeconds.toFixed(1)} s (target < 30 s; includes starting the child process), CPU time ${assign.cpuSeconds.toFixed(1)} s, peak memory ${assign.peakMegabytes.toFixed(0)} MB (target < 1024 MB)`,
);
console.log(
  `  load average while measuring: ${loadavg()
    .map((v) => v.toFixed(1))
    .join(' ')} on ${cpus().length} cores`,
);

if (bigBytes > 0) {
  const bigPath = join(dir, 'big-positions.csv');
  const bytesPerRow = 48;
  const t1 = performance.now();
  await writePositions(bigPath, Math.ceil(bigBytes / bytesPerRow), 11);
  const size = statSync(bigPath).size;
  console.log(`created a ${mb(size)} positions CSV in ${((performance.now() - t1) / 1000).toFixed(1)} s`);
  const big = runStep(['read', bigPath]);
  console.log(`streamed read: ${big.output}`);
  console.log(`  wall time ${big.wallSeconds.toFixed(1)} s, CPU time ${big.cpuSeconds.toFixed(1)} s, peak memory ${big.peakMegabytes.toFixed(0)} MB for a ${mb(size)} file`);
}
