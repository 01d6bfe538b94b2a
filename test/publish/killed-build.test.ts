// With the real pipeline (reader, model, Astro): a build killed with SIGKILL while Astro is
// writing pages leaves the published site byte-identical, even though the orphaned Astro process
// may keep writing into its work folder; the next build cleans up and publishes.
import { spawn } from 'node:child_process';
import type { ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import { mkdtemp, readdir, readlink, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, expect, test } from 'vitest';
import { placeFor } from '../../generator/publish/swap/release-swap.ts';
import { packageRoot } from './helpers/cli-build.ts';
import { snapshot } from './helpers/tree.ts';

let work: string;
let lockHolder: ChildProcess | null = null;

/**
 * Holds the shared Astro lock for the whole test (other builds wait), when flock exists. The
 * holder waits for the end of its standard input, so it lets go when the test closes the pipe or
 * when the test process dies (the pipe closes with it).
 */
async function holdAstroLock(): Promise<void> {
  if (!existsSync('/usr/bin/flock')) return;
  const holder = spawn('/usr/bin/flock', ['/tmp/astro.lock', '-c', 'echo locked; cat > /dev/null'], { stdio: ['pipe', 'pipe', 'ignore'] });
  lockHolder = holder;
  await new Promise<void>((resolve) => holder.stdout?.on('data', () => resolve()));
}

function build(out: string, onStderr?: (text: string) => void): ChildProcess {
  const env: NodeJS.ProcessEnv = { ...process.env };
  delete env['CI']; // progress lines tell the test when the pages phase starts
  const child = spawn(
    process.execPath,
    [path.join(packageRoot, 'bin', 'wrackline.mjs'), 'build', '--scenario', path.join(packageRoot, 'content', 'demo'), '--out', out, '--no-cache'],
    {
      cwd: packageRoot,
      env,
      stdio: ['ignore', 'ignore', 'pipe'],
    },
  );
  child.stderr?.on('data', (chunk: Buffer) => onStderr?.(chunk.toString()));
  return child;
}

function exitOf(child: ChildProcess): Promise<{ code: number | null; signal: NodeJS.Signals | null }> {
  return new Promise((resolve) => child.on('exit', (code, signal) => resolve({ code, signal })));
}

beforeAll(async () => {
  work = await mkdtemp(path.join(tmpdir(), 'wrackline-killed-'));
  await holdAstroLock();
}, 900_000);
afterAll(async () => {
  if (lockHolder) {
    const ended = new Promise((resolve) => lockHolder?.on('exit', resolve));
    lockHolder.stdin?.end();
    await ended;
  }
  await rm(work, { recursive: true, force: true });
});

test('SIGKILL during astro build: the published site is untouched, the next run recovers', { timeout: 900_000 }, async () => {
  const out = path.join(work, 'site');
  expect((await exitOf(build(out))).code).toBe(0);
  const before = await snapshot(out);
  const link = await readlink(out);

  let log = '';
  let resolvePages: () => void = () => {};
  const pagesStarted = new Promise<void>((resolve) => (resolvePages = resolve));
  const victim = build(out, (text) => {
    log += text;
    if (/statistics .* in /.test(log)) resolvePages();
  });
  const victimExit = exitOf(victim);
  await Promise.race([pagesStarted, victimExit.then(() => Promise.reject(new Error(`build ended before pages: ${log}`)))]);
  await new Promise((resolve) => setTimeout(resolve, 1500)); // Astro is now writing pages
  victim.kill('SIGKILL');
  expect((await victimExit).signal).toBe('SIGKILL');

  expect(await readlink(out)).toBe(link);
  expect(await snapshot(out)).toEqual(before);
  const leftovers = (await readdir(placeFor(out).state)).filter((name) => name.startsWith('work-'));
  expect(leftovers.length).toBeGreaterThan(0);
  await new Promise((resolve) => setTimeout(resolve, 3000)); // an orphaned Astro may still be writing
  expect(await snapshot(out)).toEqual(before);

  const next = await exitOf(build(out));
  expect(next.code).toBe(0);
  expect(Object.keys(await snapshot(out))).toContain('manifest.json');
  expect((await readdir(placeFor(out).state)).filter((name) => name.startsWith('work-'))).toEqual([]);
});
