/**
 * Scale benchmark of the whole build: writes the scale scenario (bench/scale-scenario.ts; by
 * default 2,000 segments, 10 years, 4 indicators, 5 million drift positions), builds it end to
 * end with `wrackline build` as a separate process, then changes one segment's beach-litter data
 * and builds again with the warm trend-result cache and the first build's pages on line (pages
 * of bulletins whose inputs did not change are taken over: generator/publish/render/page-reuse.ts).
 * Prints wall time per phase (from the build's own progress lines), total wall time and the
 * peak memory of the build's process tree (the sum of VmRSS of the build and its children,
 * sampled every 100 ms from /proc).
 *
 *   tsx bench/site/run.ts [--segments N] [--years N] [--positions N] [--work DIR] [--keep] [--reuse]
 *
 * --work keeps everything in DIR; --reuse then skips writing the scenario when DIR/scenario
 * already holds one (its first beach-litter row was changed by the previous run: fine for timing).
 *
 * Targets (2 cores): full build under 120 s and 2 GB; rebuild after one segment changed under 15 s.
 * The script prints figures; it asserts nothing.
 */
import { spawn } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import { makeScaleScenario } from '../scale-scenario.ts';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');

interface Phase {
  phase: string;
  detail: string;
  seconds: number;
}

interface BuildFigures {
  code: number | null;
  wallSeconds: number;
  peakTreeMiB: number;
  phases: Phase[];
  summary: string;
  stderrTail: string;
}

function parseSeconds(text: string): number {
  const minutes = /^(\d+) min (\d+) s$/.exec(text);
  if (minutes) return Number(minutes[1]) * 60 + Number(minutes[2]);
  if (text.endsWith(' ms')) return Number(text.slice(0, -3)) / 1000;
  return Number(text.slice(0, -2));
}

/** Sum of VmRSS (KiB) over a process and all its descendants, from /proc. */
function treeRssKiB(pid: number): number {
  let total = 0;
  const stack = [pid];
  while (stack.length > 0) {
    const current = stack.pop() as number;
    try {
      const status = readFileSync(`/proc/${current}/status`, 'utf8');
      const match = /VmRSS:\s+(\d+) kB/.exec(status);
      if (match) total += Number(match[1]);
      for (const task of readFileSync(`/proc/${current}/task/${current}/children`, 'utf8').trim().split(/\s+/)) {
        if (task) stack.push(Number(task));
      }
    } catch {
      // the process ended between two reads
    }
  }
  return total;
}

/**
 * Holds the shared Astro lock file (when `flock` exists) until the returned function is called:
 * two Astro builds of one project at once break each other, and the wait for the lock must not
 * count as build time.
 */
async function holdAstroLock(): Promise<() => void> {
  if (!existsSync('/usr/bin/flock')) return () => {};
  const holder = spawn('/usr/bin/flock', ['/tmp/astro.lock', 'sh', '-c', 'echo held; exec cat'], { stdio: ['pipe', 'pipe', 'inherit'] });
  await new Promise<void>((resolve, reject) => {
    holder.stdout.once('data', () => resolve());
    holder.once('error', reject);
  });
  return () => holder.stdin.end();
}

async function runBuild(args: string[]): Promise<BuildFigures> {
  const release = await holdAstroLock();
  try {
    return await runBuildLocked(args);
  } finally {
    release();
  }
}

function runBuildLocked(args: string[]): Promise<BuildFigures> {
  const env: NodeJS.ProcessEnv = { ...process.env, ASTRO_TELEMETRY_DISABLED: '1' };
  delete env['CI']; // progress lines are wanted: they carry the phase times
  const started = performance.now();
  const child = spawn(process.execPath, [path.join(root, 'bin', 'wrackline.mjs'), 'build', ...args], {
    cwd: root,
    env,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let peak = 0;
  const sampler = setInterval(() => {
    if (child.pid) peak = Math.max(peak, treeRssKiB(child.pid));
  }, 100);
  let stderr = '';
  let stdout = '';
  child.stderr.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
  child.stdout.on('data', (chunk: Buffer) => (stdout += chunk.toString()));
  return new Promise((resolve) => {
    child.on('close', (code) => {
      clearInterval(sampler);
      const phases: Phase[] = [];
      let summary = '';
      for (const line of `${stderr}\n${stdout}`.split('\n')) {
        const match = /^ {2}(\S+(?: \S+)?)\s+(?:(.*?) in )?(\d[\d.]* m?s|\d+ min \d+ s)$/.exec(line);
        if (match?.[1] && match[3]) phases.push({ phase: match[1], detail: match[2] ?? '', seconds: parseSeconds(match[3]) });
        const noted = line.includes('trend cache:') || /^ {2}pages: /.test(line);
        if (line.startsWith('Published') || noted) summary = `${summary}${summary ? '\n  ' : ''}${line.trim()}`;
      }
      resolve({
        code,
        wallSeconds: (performance.now() - started) / 1000,
        peakTreeMiB: peak / 1024,
        phases,
        summary,
        stderrTail: stderr.split('\n').slice(-30).join('\n'),
      });
    });
  });
}

function report(title: string, figures: BuildFigures, targetSeconds: number): void {
  console.log(`\n${title}`);
  if (figures.code !== 0) {
    console.log(`  build failed with exit code ${figures.code}:\n${figures.stderrTail}`);
    return;
  }
  for (const phase of figures.phases) {
    console.log(`  ${phase.phase.padEnd(12)} ${phase.seconds.toFixed(1).padStart(7)} s  ${phase.detail}`);
  }
  console.log(
    `  ${'total wall'.padEnd(12)} ${figures.wallSeconds.toFixed(1).padStart(7)} s  (target < ${targetSeconds} s: ${figures.wallSeconds < targetSeconds ? 'met' : 'NOT met'})`,
  );
  console.log(
    `  ${'peak memory'.padEnd(12)} ${figures.peakTreeMiB.toFixed(0).padStart(7)} MiB of the build's process tree (target < 2048 MiB: ${figures.peakTreeMiB < 2048 ? 'met' : 'NOT met'})`,
  );
  if (figures.summary) console.log(`  ${figures.summary}`);
}

/**
 * Adds 7 items to one beach-litter survey of the season being published (autumn 2026): one
 * segment's data changed. A change dated in an earlier, already published season would be
 * refused by the archive check, as it should be.
 */
async function changeOneSegment(scenario: string): Promise<string> {
  const file = path.join(scenario, 'tables', 'beach-litter.csv');
  const lines = (await readFile(file, 'utf8')).split('\n');
  const header = (lines[0] ?? '').split(',');
  const items = header.indexOf('items');
  const segment = header.indexOf('segment_id');
  const date = header.indexOf('date');
  if (items < 0 || segment < 0 || date < 0) throw new Error('unexpected beach-litter table');
  const index = lines.findIndex((line, at) => at > 0 && (line.split(',')[date] ?? '') >= '2026-09-01');
  const row = lines[index]?.split(',');
  if (!row) throw new Error('no beach-litter survey in autumn 2026');
  row[items] = String(Number(row[items]) + 7);
  lines[index] = row.join(',');
  await writeFile(file, lines.join('\n'));
  return `${row[segment] ?? '?'}, survey of ${row[date] ?? '?'}`;
}

const { values } = parseArgs({
  options: {
    segments: { type: 'string' },
    years: { type: 'string' },
    positions: { type: 'string' },
    work: { type: 'string' },
    keep: { type: 'boolean' },
    reuse: { type: 'boolean' },
  },
});
const work = values.work ? path.resolve(values.work) : await mkdtemp(path.join(tmpdir(), 'wrackline-bench-site-'));
const scenario = path.join(work, 'scenario');
const out = path.join(work, 'site');
const cache = path.join(work, 'cache');
const options = {
  ...(values.segments ? { segments: Number(values.segments) } : {}),
  ...(values.years ? { years: Number(values.years) } : {}),
  ...(values.positions ? { positions: Number(values.positions) } : {}),
};

console.log(`wrackline site benchmark — ${new Date().toISOString()} — node ${process.version}, work folder ${work}`);
const started = performance.now();
if (values.reuse && existsSync(path.join(scenario, 'datapackage.json'))) {
  console.log(`reusing the scenario in ${scenario}`);
  await rm(out, { recursive: true, force: true });
  await rm(`${out}.wrackline`, { recursive: true, force: true });
  await rm(cache, { recursive: true, force: true });
} else {
  const made = await makeScaleScenario(scenario, options);
  console.log(
    `scenario written in ${((performance.now() - started) / 1000).toFixed(1)} s: ${made.segments} segments, ` +
      `${Object.entries(made.rows)
        .map(([name, count]) => `${name} ${count.toLocaleString('en-GB')}`)
        .join(', ')}`,
  );
}

const full = await runBuild(['--scenario', scenario, '--out', out, '--cache', cache]);
report('full build (cold cache)', full, 120);

const changed = await changeOneSegment(scenario);
const again = await runBuild(['--scenario', scenario, '--out', out, '--cache', cache]);
report(`rebuild after one segment's data changed (${changed}; warm cache)`, again, 15);

if (!values.keep && !values.work) await rm(work, { recursive: true, force: true });
