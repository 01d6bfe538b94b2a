/**
 * Trend-engine benchmark: `npx tsx bench/trend/run.ts` (add `--quick` to stop at n = 100,000 and
 * skip SciPy's theilslopes at 20,000, which takes about a minute and ~10 GB).
 *
 * Prints, for n = 10³…10⁶, the time of Mann–Kendall and of Sen's slope with its interval and the
 * peak memory of each run, each size in its own child process; in the same run, SciPy's
 * `theilslopes` and `kendalltau` (Debian's /usr/bin/python3, when it has SciPy) on the same data,
 * timed as whole processes; and a 1,000-resample bootstrap band for n = 500.
 * Targets: n = 10⁶ under 5 s; ≥ 50× faster than SciPy's theilslopes at n = 20,000 (whole
 * processes); the band under 1 s. Figures depend on the machine and its load: they are printed,
 * never asserted.
 */
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { createSeededRandom } from '../../generator/random/seeded-random.ts';

const here = dirname(fileURLToPath(import.meta.url));
const quick = process.argv.includes('--quick');
const python = '/usr/bin/python3';
const folder = mkdtempSync(join(tmpdir(), 'wrackline-bench-'));

function hasScipy(): boolean {
  if (!existsSync(python)) return false;
  const probe = spawnSync(python, ['-c', 'import scipy; print(scipy.__version__)'], { encoding: 'utf8' });
  return probe.status === 0;
}

/** Daily values over n days: a slow rise, a season and noise (seeded). */
function writeSeries(n: number): string {
  const random = createSeededRandom(20261202 + n);
  const data = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    const t = 2000 + i / 365.25;
    data[i] = t;
    data[n + i] = 0.02 * (t - 2000) + 0.5 * Math.sin(2 * Math.PI * t) + random.normal();
  }
  const path = join(folder, `series-${n}.bin`);
  writeFileSync(path, Buffer.from(data.buffer));
  return path;
}

function timed(command: string, args: string[]): { wallMs: number; json: Record<string, number> | null; error: string | null } {
  const start = performance.now();
  const run = spawnSync(command, args, { encoding: 'utf8', maxBuffer: 1 << 24 });
  const wallMs = performance.now() - start;
  if (run.status !== 0) return { wallMs, json: null, error: (run.stderr || `exit ${run.status}`).trim().split('\n').slice(-1)[0] ?? 'failed' };
  const line = run.stdout.trim().split('\n').pop() ?? '';
  return { wallMs, json: JSON.parse(line) as Record<string, number>, error: null };
}

const fmt = (ms: number) => (ms >= 1000 ? `${(ms / 1000).toFixed(2)} s` : `${ms.toFixed(1)} ms`);
const node = process.execPath;
// The engine child is bundled to one plain JavaScript file first (esbuild, already installed with
// tsx and astro), so a whole-process time is node start-up plus the work, like SciPy's
// byte-compiled modules; without esbuild it falls back to running the TypeScript through tsx.
let engineEntry: string[] = ['--import', 'tsx', join(here, 'engine-child.ts')];
try {
  const esbuild = await import('esbuild');
  const bundle = join(folder, 'engine-child.mjs');
  esbuild.buildSync({ entryPoints: [join(here, 'engine-child.ts')], bundle: true, platform: 'node', format: 'esm', target: 'node20', outfile: bundle, logLevel: 'silent' });
  engineEntry = [bundle];
} catch (error) {
  console.log(`(esbuild unavailable, running the engine through tsx: ${error instanceof Error ? error.message : String(error)})`);
}
const engine = (args: string[]) => timed(node, [...engineEntry, ...args]);
const scipy = (mode: string, file: string) => timed(python, [join(here, 'scipy-child.py'), mode, file]);

console.log(
  `Wrackline trend bench — Node ${process.version}, ${cpus().length} cores, load average ${loadavg()
    .map((l) => l.toFixed(2))
    .join(' ')}`,
);
console.log("(wall-clock times rise with the machine's load; CPU time of the work is shown beside them)");
const withScipy = hasScipy();
if (!withScipy) console.log(`SciPy not found at ${python}: SciPy columns skipped`);
else console.log(`SciPy ${execFileSync(python, ['-c', 'import scipy; print(scipy.__version__)'], { encoding: 'utf8' }).trim()} at ${python}`);

const sizes = quick ? [1_000, 10_000, 20_000, 100_000] : [1_000, 10_000, 20_000, 100_000, 1_000_000];
console.log('\nWrackline (each size in its own process; MK = Mann–Kendall, Sen = slope + 95% interval)');
console.log('n          MK          Sen         MK+Sen      (CPU time)   whole process  peak RSS');
const ourWall = new Map<number, number>();
const files = new Map<number, string>();
for (const n of sizes) {
  const file = writeSeries(n);
  files.set(n, file);
  const r = engine(['trend', file]);
  if (!r.json) {
    console.log(`${String(n).padEnd(10)} failed: ${r.error}`);
    continue;
  }
  ourWall.set(n, r.wallMs);
  console.log(
    `${String(n).padEnd(10)} ${fmt(r.json['mkMs'] as number).padEnd(11)} ${fmt(r.json['senMs'] as number).padEnd(11)} ${fmt(r.json['totalMs'] as number).padEnd(11)} ${fmt(r.json['cpuMs'] as number).padEnd(12)} ${fmt(r.wallMs).padEnd(14)} ${(r.json['peakRssMB'] as number).toFixed(0)} MB`,
  );
}

if (withScipy) {
  console.log('\nSciPy (whole processes, same data)');
  console.log('n          function      compute      (CPU time)   whole process  peak RSS    ours (whole)  speed-up');
  for (const n of sizes) {
    const file = files.get(n) as string;
    const runs: string[] = ['kendalltau'];
    if (n <= 20_000 && !(quick && n === 20_000)) runs.unshift('theilslopes');
    for (const mode of runs) {
      const r = scipy(mode, file);
      if (!r.json) {
        console.log(`${String(n).padEnd(10)} ${mode.padEnd(13)} failed: ${r.error}`);
        continue;
      }
      const ours = ourWall.get(n);
      const ratio = mode === 'theilslopes' && ours ? `${(r.wallMs / ours).toFixed(1)}×` : '';
      console.log(
        `${String(n).padEnd(10)} ${mode.padEnd(13)} ${fmt(r.json['computeMs'] as number).padEnd(12)} ${fmt(r.json['cpuMs'] as number).padEnd(12)} ${fmt(r.wallMs).padEnd(14)} ${(r.json['peakRssMB'] as number).toFixed(0).padStart(6)} MB   ${(ours ? fmt(ours) : '').padEnd(13)} ${ratio}`,
      );
    }
  }
}

console.log('\nBootstrap band (moving-block, Theil–Sen refits)');
const band = engine(['band', '500', '1000']);
if (band.json)
  console.log(
    `n = 500, 1,000 resamples: ${fmt(band.json['ms'] as number)} (CPU time ${fmt(band.json['cpuMs'] as number)}; whole process ${fmt(band.wallMs)}, peak RSS ${(band.json['peakRssMB'] as number).toFixed(0)} MB, block length ${band.json['blockLength']})`,
  );
else console.log(`band failed: ${band.error}`);

console.log(
  `\nload average at the end: ${loadavg()
    .map((l) => l.toFixed(2))
    .join(' ')}`,
);
rmSync(folder, { recursive: true, force: true });
