/**
 * Large-table bench: a beach-litter table of 5 million rows (about 230 MB of CSV) in the small
 * invented test scenario (test/fixtures/inputs/base), then
 *   1. `wrackline check` (read and validate only), and
 *   2. `wrackline build --no-cache` (read, statistics, pages),
 * each as its own process. Prints wall time and the peak memory of the command's process tree
 * (the sum of VmRSS of the process and its children, sampled every 100 ms).
 *
 *   npx tsx bench/ingest/beach-litter-table.ts [--rows 5000000] [--skip-check] [--skip-build] [--keep]
 *
 * The rows are synthetic: three invented segments, dates spread over 2020–2026, seeded counts.
 */
import { spawn } from 'node:child_process';
import { cpSync, createWriteStream, mkdtempSync, readFileSync, rmSync, statSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import { createSeededRandom } from '../../generator/random/seeded-random.ts';

const { values } = parseArgs({
  options: {
    rows: { type: 'string', default: '5000000' },
    'skip-check': { type: 'boolean', default: false },
    'skip-build': { type: 'boolean', default: false },
    keep: { type: 'boolean', default: false },
  },
});
const rows = Number(values.rows);
const root = path.resolve(fileURLToPath(new URL('../..', import.meta.url)));
const work = mkdtempSync(path.join(tmpdir(), 'wrackline-bench-table-'));
const scenario = path.join(work, 'scenario');
cpSync(path.join(root, 'test', 'fixtures', 'inputs', 'base'), scenario, { recursive: true });

function treeRssKiB(pid: number): number {
  let total = 0;
  const stack = [pid];
  while (stack.length > 0) {
    const current = stack.pop() as number;
    try {
      const match = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${current}/status`, 'utf8'));
      if (match) total += Number(match[1]);
      for (const task of readFileSync(`/proc/${current}/task/${current}/children`, 'utf8').trim().split(/\s+/)) if (task) stack.push(Number(task));
    } catch {
      // ended between two reads
    }
  }
  return total;
}

async function writeTable(file: string): Promise<void> {
  const random = createSeededRandom(20_261_205);
  const segments = ['north-beach', 'harbour-mouth', 'seal-island'];
  const start = Date.UTC(2020, 0, 1);
  const span = Date.UTC(2026, 10, 30) - start;
  const out = createWriteStream(file);
  out.write('survey_id,segment_id,date,surveyed_length_m,items,plastic_items,area_m2\n');
  let buffer = '';
  for (let i = 0; i < rows; i++) {
    const date = new Date(start + Math.floor(random.uniform() * span)).toISOString().slice(0, 10);
    const items = random.integer(0, 199);
    buffer += `BL-${i},${segments[i % 3]},${date},100,${items},${Math.floor(items * 0.7)},\n`;
    if (buffer.length > 1 << 20) {
      if (!out.write(buffer)) await new Promise<void>((resolve) => out.once('drain', () => resolve()));
      buffer = '';
    }
  }
  out.write(buffer);
  await new Promise((resolve) => out.end(resolve));
}

function run(args: string[]): Promise<{ code: number | null; seconds: number; peakMiB: number; tail: string }> {
  const started = performance.now();
  const child = spawn(process.execPath, [path.join(root, 'bin', 'wrackline.mjs'), ...args], {
    cwd: root,
    env: { ...process.env, CI: 'true', ASTRO_TELEMETRY_DISABLED: '1' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let peak = 0;
  const sampler = setInterval(() => {
    if (child.pid) peak = Math.max(peak, treeRssKiB(child.pid));
  }, 100);
  let output = '';
  child.stdout.on('data', (c: Buffer) => (output += c.toString()));
  child.stderr.on('data', (c: Buffer) => (output += c.toString()));
  return new Promise((resolve) =>
    child.on('close', (code) => {
      clearInterval(sampler);
      resolve({
        code,
        seconds: (performance.now() - started) / 1000,
        peakMiB: peak / 1024,
        tail: output
          .split('\n')
          .filter((line) => !/^\s+at /.test(line))
          .slice(-20)
          .join('\n'),
      });
    }),
  );
}

const table = path.join(scenario, 'tables', 'beach-litter.csv');
let t0 = performance.now();
await writeTable(table);
console.log(
  `machine: ${cpus().length} cores, load ${loadavg()
    .map((l) => l.toFixed(1))
    .join(' ')}`,
);
console.log(`table: ${rows.toLocaleString('en-GB')} rows, ${(statSync(table).size / 1024 / 1024).toFixed(0)} MB, written in ${((performance.now() - t0) / 1000).toFixed(1)} s`);
t0 = performance.now();
if (!values['skip-check']) {
  const check = await run(['check', '--scenario', scenario]);
  console.log(`check: exit ${check.code}, ${check.seconds.toFixed(1)} s, peak ${check.peakMiB.toFixed(0)} MiB`);
  if (check.code !== 0) console.log(check.tail);
}
if (!values['skip-build']) {
  const build = await run(['build', '--scenario', scenario, '--out', path.join(work, 'site'), '--no-cache']);
  console.log(`build: exit ${build.code}, ${build.seconds.toFixed(1)} s, peak ${build.peakMiB.toFixed(0)} MiB (process tree)`);
  if (build.code !== 0) console.log(build.tail);
}
if (!values.keep) rmSync(work, { recursive: true, force: true });
else console.log(`kept ${work}`);
