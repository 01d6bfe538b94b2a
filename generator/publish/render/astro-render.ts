/**
 * Step: render (the pages).
 * Renders a model folder into HTML by running `astro build` as a child process.
 *
 * The Astro project is this package's own root (where astro.config.mjs lives), found from this
 * file's location, so `wrackline build` works from any working folder: paths given by the user
 * are made absolute first, then Astro runs with `--root` set to the package root (and a scratch
 * working folder of its own, see runAstro).
 * The child gets WRACKLINE_MODEL (the model folder), ASTRO_TELEMETRY_DISABLED=1 and TZ=UTC (no
 * date on a page may depend on the machine's zone), and writes to `--outDir`.
 */
import { spawn } from 'node:child_process';
import { existsSync, readFileSync, statSync } from 'node:fs';
import { mkdir, readFile, readdir, rm, writeFile } from 'node:fs/promises';
import { createRequire } from 'node:module';
import { availableParallelism } from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { modelSeasons, ownerOf } from './page-reuse.ts';
import { moveFiles } from '../move-files.ts';
import { errorCode } from '../publish-error.ts';
import { compareCodeUnits, listFiles } from '../tree-hash.ts';

/** The folder holding this package's package.json (three levels above generator/publish/render/). */
export const packageRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..', '..');

/**
 * Absolute path of a package's command-line script, read from its package.json "bin". The
 * package.json is found through Node's own search path for `packageName` (it may not be an
 * exported subpath of the package).
 */
export function resolvePackageBin(packageName: string, binName: string, fromDir: string = packageRoot): string {
  const require = createRequire(path.join(fromDir, 'package.json'));
  const candidates = (require.resolve.paths(packageName) ?? []).map((folder) => path.join(folder, packageName, 'package.json'));
  const manifestPath = candidates.find((candidate) => existsSync(candidate));
  if (!manifestPath) throw new Error(`package ${packageName} is not installed (looked from ${fromDir})`);
  const manifest = JSON.parse(readFileSync(manifestPath, 'utf8')) as { bin?: string | { [name: string]: string } };
  const relative = typeof manifest.bin === 'string' ? manifest.bin : manifest.bin?.[binName];
  if (!relative) throw new Error(`package ${packageName} has no command ${binName}`);
  return path.join(path.dirname(manifestPath), relative);
}

interface ChildResult {
  code: number | null;
  signal: NodeJS.Signals | null;
  /** The last lines the child printed (stdout and stderr), for error messages. */
  tail: string[];
}

/** Runs `node script args…`, feeding each output line to `onLine`. */
export function runNodeScript(
  script: string,
  args: readonly string[],
  options: { cwd: string; env: NodeJS.ProcessEnv; onLine?: (line: string) => void; keepLines?: number; execArgv?: readonly string[] },
): Promise<ChildResult> {
  const keep = options.keepLines ?? 60;
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [...(options.execArgv ?? []), script, ...args], { cwd: options.cwd, env: options.env, stdio: ['ignore', 'pipe', 'pipe'] });
    const tail: string[] = [];
    const pending = { stdout: '', stderr: '' };
    const take = (which: 'stdout' | 'stderr', chunk: Buffer): void => {
      pending[which] += chunk.toString('utf8');
      const lines = pending[which].split(/\r?\n/);
      pending[which] = lines.pop() ?? '';
      for (const line of lines) {
        tail.push(line);
        if (tail.length > keep) tail.shift();
        options.onLine?.(line);
      }
    };
    child.stdout.on('data', (chunk: Buffer) => take('stdout', chunk));
    child.stderr.on('data', (chunk: Buffer) => take('stderr', chunk));
    child.on('error', reject);
    child.on('close', (code, signal) => {
      for (const rest of [pending.stdout, pending.stderr]) if (rest) tail.push(rest);
      resolve({ code, signal, tail });
    });
  });
}

/** Strips terminal colour codes from a line of child output. */
function plainText(line: string): string {
  // biome-ignore lint/suspicious/noControlCharactersInRegex: strips the terminal colour codes (ESC [ … m) of Astro's output
  return line.replace(/\x1b\[[0-9;]*[A-Za-z]/g, '');
}

export interface RenderOptions {
  modelDir: string;
  outDir: string;
  /** Astro project root; defaults to this package's root. */
  siteRoot?: string;
  /** Called with the number of pages written so far. */
  onPage?: (pagesDone: number) => void;
  /** JSON list of "season/segment" bulletins whose own pages to render (WRACKLINE_RENDER_ONLY). */
  only?: string;
  /** How many Astro processes share the bulletins; default: see `renderProcesses`. */
  processes?: number;
}

/** Below this many bulletins one Astro process is quicker than two (each pays a start-up of a few seconds). */
const bulletinsPerExtraProcess = 400;

/**
 * Heap limit of each Astro process (MiB). Astro's own garbage collection is lazy: left alone,
 * one process rendering 2,000 bulletins grew to 1.9 GB although far less was live. The limit
 * makes it collect sooner, so two processes together stay well under the memory budget.
 */
const astroHeapMiB = 900;

/**
 * The heap limit for a model whose largest bulletin file has the given size: room beside the
 * usual limit to parse that bulletin (its text and its objects; five times its size is an
 * allowance, not a measurement). A bulletin of a series with hundreds of thousands of samples is
 * hundreds of megabytes; the site keeps no such bulletin once read (site/lib/model.ts).
 */
export function astroHeapFor(largestBulletinBytes: number): number {
  return astroHeapMiB + Math.ceil((5 * largestBulletinBytes) / (1024 * 1024));
}

/** Size in bytes of the largest bulletin file of a model folder (0 when none); one look per folder. */
const largestSizes = new Map<string, Promise<number>>();
function largestBulletinBytes(modelDir: string): Promise<number> {
  let found = largestSizes.get(modelDir);
  if (!found) {
    found = modelBulletinIds(modelDir).then((ids) => {
      let largest = 0;
      for (const id of ids) largest = Math.max(largest, statSync(path.join(modelDir, 'bulletins', `${id}.json`)).size);
      return largest;
    });
    largestSizes.set(modelDir, found);
  }
  return found;
}

/** One Astro process per core, at most two, and only when there are enough bulletins to share. */
export function renderProcesses(bulletins: number, cores: number = availableParallelism()): number {
  return Math.max(1, Math.min(2, cores, Math.floor(bulletins / bulletinsPerExtraProcess)));
}

/** "season/segment" ids of every bulletin in a model folder written by writeModel, sorted. */
export async function modelBulletinIds(modelDir: string): Promise<string[]> {
  const ids: string[] = [];
  const seasons = await readdir(path.join(modelDir, 'bulletins')).catch(() => [] as string[]);
  for (const season of seasons.sort(compareCodeUnits)) {
    const names = await readdir(path.join(modelDir, 'bulletins', season)).catch(() => [] as string[]);
    for (const name of names.filter((n) => n.endsWith('.json')).sort(compareCodeUnits)) ids.push(`${season}/${name.slice(0, -'.json'.length)}`);
  }
  return ids;
}

/** Deals bulletins to `parts` lists in turn, so each gets a like share of every season. */
export function dealBulletins(ids: readonly string[], parts: number): string[][] {
  const lists: string[][] = Array.from({ length: parts }, () => []);
  ids.forEach((id, i) => lists[i % parts]?.push(id));
  return lists;
}

interface AstroRun {
  siteRoot: string;
  modelDir: string;
  outDir: string;
  only: string | undefined;
  /** Called with the site path of each page Astro reports written ("/seasons/…/index.html"). */
  onPage: (page: string) => void;
}

/**
 * One `astro build`. It runs in a scratch folder of its own under the project's `.astro/`:
 * Astro keeps its intermediate server build in `<working folder>/.astro/` when the output
 * folder lies outside the working folder, so each process needs its own working folder to
 * run beside another (and that folder must lie inside the project, where the packages resolve).
 */
async function runAstro(run: AstroRun, scratch: string): Promise<number> {
  const astro = resolvePackageBin('astro', 'astro', run.siteRoot);
  let pages = 0;
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    WRACKLINE_MODEL: path.resolve(run.modelDir),
    ASTRO_TELEMETRY_DISABLED: '1',
    TZ: 'UTC',
    FORCE_COLOR: '0',
  };
  delete env['WRACKLINE_RENDER_ONLY'];
  if (run.only !== undefined) env['WRACKLINE_RENDER_ONLY'] = path.resolve(run.only);
  await mkdir(scratch, { recursive: true });
  try {
    const result = await runNodeScript(astro, ['build', '--root', run.siteRoot, '--outDir', path.resolve(run.outDir)], {
      cwd: scratch,
      env,
      execArgv: [`--max-old-space-size=${astroHeapFor(await largestBulletinBytes(run.modelDir))}`],
      onLine: (line) => {
        // Astro lists each page it writes as "12:00:01   ├─ /path/index.html (+3ms)" (or └─).
        const page = /[├└]─\s+(\/\S*)/.exec(plainText(line));
        if (page?.[1]) {
          pages += 1;
          run.onPage(page[1]);
        }
      },
    });
    if (result.code !== 0) {
      const why = result.signal ? `was stopped by ${result.signal}` : `exited with code ${result.code}`;
      throw new Error(`astro build ${why}. Its last output:\n${result.tail.map((line) => `  | ${plainText(line)}`).join('\n')}`);
    }
  } finally {
    await rm(scratch, { recursive: true, force: true, maxRetries: 3 });
  }
  return pages;
}

/** A page of the site as Astro writes it: an HTML page or the feed. */
function isPage(file: string): boolean {
  return file.endsWith('.html') || file.endsWith('.xml');
}

/**
 * The pages in a folder Astro wrote. Counted from the files, not from Astro's log (which feeds
 * only the progress line): the count printed at the end must not depend on how a log was read.
 */
async function pageFiles(outDir: string): Promise<number> {
  return (await listFiles(outDir)).filter(isPage).length;
}

/** Removes scratch folders (`.astro/render-<pid>-…`) left by builds that were killed. */
async function removeStaleScratch(siteRoot: string): Promise<void> {
  const folder = path.join(siteRoot, '.astro');
  for (const entry of await readdir(folder).catch(() => [] as string[])) {
    const pid = Number(/^render-(\d+)-/.exec(entry)?.[1]);
    if (!Number.isInteger(pid) || pid === process.pid) continue;
    let alive = true;
    try {
      process.kill(pid, 0);
    } catch (error) {
      alive = errorCode(error) === 'EPERM';
    }
    if (!alive) await rm(path.join(folder, entry), { recursive: true, force: true, maxRetries: 3 });
  }
}

/**
 * Renders the model with Astro. With many bulletins, two Astro processes run side by side,
 * each rendering the pages of half the bulletins (pages listing every bulletin are rendered by
 * both; the first one's are kept); their files are then gathered in `outDir`.
 */
export async function renderWithAstro(options: RenderOptions): Promise<{ pages: number }> {
  const siteRoot = options.siteRoot ?? packageRoot;
  if (!existsSync(path.join(siteRoot, 'astro.config.mjs'))) {
    throw new Error(`no astro.config.mjs in ${siteRoot}: the site project is missing`);
  }
  const ids = options.only === undefined ? await modelBulletinIds(options.modelDir) : (JSON.parse(await readFile(options.only, 'utf8')) as string[]);
  const processes = options.processes ?? renderProcesses(ids.length);
  let pages = 0;
  const count = (): void => {
    pages += 1;
    options.onPage?.(pages);
  };
  await removeStaleScratch(siteRoot);
  const scratchOf = (i: number): string => path.join(siteRoot, '.astro', `render-${process.pid}-${Date.now().toString(36)}-${i}`);
  if (processes <= 1) {
    await runAstro({ siteRoot, modelDir: options.modelDir, outDir: options.outDir, only: options.only, onPage: count }, scratchOf(0));
    return { pages: await pageFiles(options.outDir) };
  }
  const current = modelSeasons(options.modelDir).find((s) => s.current)?.id ?? '';
  const shardRoot = `${path.resolve(options.outDir)}.shards`;
  await rm(shardRoot, { recursive: true, force: true });
  await mkdir(shardRoot, { recursive: true });
  try {
    const lists = dealBulletins(ids, processes);
    const runs: AstroRun[] = [];
    for (const [i, list] of lists.entries()) {
      const only = path.join(shardRoot, `only-${i}.json`);
      await writeFile(only, `${JSON.stringify(list)}\n`);
      const own = new Set(list);
      // Pages listing every bulletin are rendered by each process alike: count them once.
      const onPage =
        i === 0
          ? count
          : (page: string): void => {
              const owner = ownerOf(page.replace(/^\/+/, ''), current);
              if (owner !== null && own.has(owner)) count();
            };
      runs.push({ siteRoot, modelDir: options.modelDir, outDir: i === 0 ? options.outDir : path.join(shardRoot, `site-${i}`), only, onPage });
    }
    const outcomes = await Promise.allSettled(runs.map((run, i) => runAstro(run, scratchOf(i))));
    const failed = outcomes.find((outcome): outcome is PromiseRejectedResult => outcome.status === 'rejected');
    if (failed) throw failed.reason;
    // Pages listing every bulletin: those of the first process are kept.
    for (const [i, run] of runs.entries()) {
      if (i === 0) continue;
      const own = new Set(lists[i]);
      await moveFiles(run.outDir, options.outDir, (file) => {
        const owner = ownerOf(file, current);
        return owner !== null && own.has(owner);
      });
    }
    return { pages: await pageFiles(options.outDir) };
  } finally {
    await rm(shardRoot, { recursive: true, force: true, maxRetries: 3 });
  }
}
