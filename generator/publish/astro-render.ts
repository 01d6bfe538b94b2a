/**
 * Renders a model folder into HTML by running `astro build` as a child process.
 *
 * The Astro project is this package's own root (where astro.config.mjs lives), found from this
 * file's location, so `wrackline build` works from any working folder: paths given by the user
 * are made absolute first, then Astro runs with the package root as its working folder.
 * The child gets WRACKLINE_MODEL (the model folder), ASTRO_TELEMETRY_DISABLED=1 and TZ=UTC (no
 * date on a page may depend on the machine's zone), and writes to `--outDir`.
 */
import { spawn } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

/** The folder holding this package's package.json (two levels above generator/publish/). */
export const packageRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');

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

export interface ChildResult {
  code: number | null;
  signal: NodeJS.Signals | null;
  /** The last lines the child printed (stdout and stderr), for error messages. */
  tail: string[];
}

/** Runs `node script args…`, feeding each output line to `onLine`. */
export function runNodeScript(
  script: string,
  args: readonly string[],
  options: { cwd: string; env: NodeJS.ProcessEnv; onLine?: (line: string) => void; keepLines?: number },
): Promise<ChildResult> {
  const keep = options.keepLines ?? 60;
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [script, ...args], { cwd: options.cwd, env: options.env, stdio: ['ignore', 'pipe', 'pipe'] });
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
export function plainText(line: string): string {
  // eslint-disable-next-line no-control-regex
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
}

export async function renderWithAstro(options: RenderOptions): Promise<{ pages: number }> {
  const siteRoot = options.siteRoot ?? packageRoot;
  if (!existsSync(path.join(siteRoot, 'astro.config.mjs'))) {
    throw new Error(`no astro.config.mjs in ${siteRoot}: the site project is missing`);
  }
  const astro = resolvePackageBin('astro', 'astro', siteRoot);
  let pages = 0;
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    WRACKLINE_MODEL: path.resolve(options.modelDir),
    ASTRO_TELEMETRY_DISABLED: '1',
    TZ: 'UTC',
    FORCE_COLOR: '0',
  };
  delete env['WRACKLINE_RENDER_ONLY'];
  if (options.only !== undefined) env['WRACKLINE_RENDER_ONLY'] = path.resolve(options.only);
  const result = await runNodeScript(astro, ['build', '--outDir', path.resolve(options.outDir)], {
    cwd: siteRoot,
    env,
    onLine: (line) => {
      // Astro lists each page it writes as "12:00:01   ├─ /path/index.html (+3ms)" (or └─).
      if (/[├└]─\s+\/\S*/.test(plainText(line))) {
        pages += 1;
        options.onPage?.(pages);
      }
    },
  });
  if (result.code !== 0) {
    const why = result.signal ? `was stopped by ${result.signal}` : `exited with code ${result.code}`;
    throw new Error(`astro build ${why}. Its last output:\n${result.tail.map((line) => `  | ${plainText(line)}`).join('\n')}`);
  }
  return { pages };
}

/** Builds a pagefind search index into `<siteDir>/pagefind/`. */
export async function indexWithPagefind(siteDir: string): Promise<void> {
  const pagefind = resolvePackageBin('pagefind', 'pagefind');
  const result = await runNodeScript(pagefind, ['--site', path.resolve(siteDir)], { cwd: packageRoot, env: { ...process.env } });
  if (result.code !== 0) {
    throw new Error(`pagefind exited with code ${result.code}. Its last output:\n${result.tail.map((line) => `  | ${line}`).join('\n')}`);
  }
}
