// Atomic publishing: a failed build — invalid data, an exception, a safety refusal, or the
// process killed mid-build — leaves the published site byte-identical; a good build replaces
// it in one step. The output is a link to a release folder (see generator/publish/swap/release-swap.ts).
import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { lstat, mkdir, mkdtemp, readFile, readdir, readlink, rm, symlink, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, test } from 'vitest';
import { runBuild } from '../../generator/cli/build.ts';
import { createProgress } from '../../generator/progress/progress.ts';
import { openPublishSession, placeFor } from '../../generator/publish/swap/release-swap.ts';
import { fakeSteps } from './helpers/fake-site.ts';
import type { FakeStepOptions } from './helpers/fake-site.ts';
import { snapshot } from './helpers/tree.ts';

const root = path.resolve(import.meta.dirname, '..', '..');
let work: string;
let out: string;

beforeEach(async () => {
  work = await mkdtemp(path.join(tmpdir(), 'wrackline-publish-'));
  out = path.join(work, 'site');
});
afterEach(async () => {
  await rm(work, { recursive: true, force: true });
});

async function build(options: FakeStepOptions = {}, extra: string[] = []): Promise<{ code: number; errors: string }> {
  const errors: string[] = [];
  const code = await runBuild(['--out', out, '--no-cache', ...extra], {
    steps: fakeSteps(options),
    progress: createProgress({ quiet: true }),
    stdout: () => {},
    stderr: (text) => errors.push(text),
  });
  return { code, errors: errors.join('\n') };
}

async function workFolders(): Promise<string[]> {
  const state = placeFor(out).state;
  if (!existsSync(state)) return [];
  return (await readdir(state)).filter((name) => name.startsWith('work-') || name.startsWith('link-'));
}

describe('atomic publishing', () => {
  test('a good build publishes a link to a complete release with a manifest', async () => {
    expect((await build()).code).toBe(0);
    expect((await lstat(out)).isSymbolicLink()).toBe(true);
    expect(await readlink(out)).toMatch(/^site\.wrackline\/releases\/r-[0-9a-f]{20}$/);
    const files = await snapshot(out);
    expect(Object.keys(files)).toEqual(expect.arrayContaining(['index.html', 'manifest.json', 'archive-ledger.json', 'seasons/2026-autumn/north-bay/index.html']));
    const manifest = JSON.parse(await readFile(path.join(out, 'manifest.json'), 'utf8')) as { files: { file: string; sha256: string }[] };
    for (const entry of manifest.files) expect(files[entry.file]).toBe(entry.sha256);
    expect(await workFolders()).toEqual([]);
  });

  test('invalid data exits 1 with a readable summary and touches nothing', async () => {
    const result = await build({ invalid: true });
    expect(result.code).toBe(1);
    expect(result.errors).toContain('tables/beach-litter.csv, row 3, column items: value "-4"; items must not be negative');
    expect(existsSync(out)).toBe(false);
    expect(existsSync(placeFor(out).state)).toBe(false);

    expect((await build()).code).toBe(0);
    const before = await snapshot(out);
    expect((await build({ invalid: true, values: { '2026-autumn/north-bay': 5 } })).code).toBe(1);
    expect(await snapshot(out)).toEqual(before);
  });

  test('an exception half way through rendering leaves the published site byte-identical', async () => {
    expect((await build()).code).toBe(0);
    const before = await snapshot(out);
    const linkBefore = await readlink(out);
    const result = await build({ failWhileRendering: true, values: { '2026-autumn/north-bay': 7 } });
    expect(result.code).toBe(1);
    expect(result.errors).toContain('renderer failed half way');
    expect(await readlink(out)).toBe(linkBefore);
    expect(await snapshot(out)).toEqual(before);
    expect(await workFolders()).toEqual([]);
  });

  test('pages with inline script are refused and nothing is published', async () => {
    expect((await build()).code).toBe(0);
    const before = await snapshot(out);
    const result = await build({ extraHead: '<script>window.x = 1</script>', values: { '2026-autumn/north-bay': 3 } });
    expect(result.code).toBe(1);
    expect(result.errors).toContain('index.html: has an inline <script>');
    expect(await snapshot(out)).toEqual(before);
  });

  test('a changed build swaps in at once; the previous release is kept, older ones retired and deleted by the next build', async () => {
    expect((await build()).code).toBe(0);
    const first = await readlink(out);
    expect((await build({ values: { '2026-autumn/north-bay': 2 } })).code).toBe(0);
    const second = await readlink(out);
    expect(second).not.toBe(first);
    expect(await readFile(path.join(out, 'seasons/2026-autumn/north-bay/index.html'), 'utf8')).toContain('Value 2');
    expect((await build({ values: { '2026-autumn/north-bay': 3 } })).code).toBe(0);
    const releases = await readdir(placeFor(out).releases);
    expect(releases.sort()).toEqual([path.basename(second), path.basename(await readlink(out))].sort());
    // The oldest left releases/ at once and waits beside it; the next build deletes it.
    const retiredFirst = `retired-${path.basename(first)}`;
    expect((await readdir(placeFor(out).state)).filter((entry) => entry.startsWith('retired-'))).toEqual([retiredFirst]);
    expect((await build({ values: { '2026-autumn/north-bay': 4 } })).code).toBe(0);
    expect((await readdir(placeFor(out).state)).filter((entry) => entry.startsWith('retired-'))).toEqual([`retired-${path.basename(second)}`]);
  });

  test('the same content again is recognised and the release is left as it is', async () => {
    expect((await build()).code).toBe(0);
    const link = await readlink(out);
    const before = await snapshot(out);
    expect((await build()).code).toBe(0);
    expect(await readlink(out)).toBe(link);
    expect(await snapshot(out)).toEqual(before);
  });

  test('a folder published before the link layout is taken over; a foreign folder is refused', async () => {
    expect((await build()).code).toBe(0);
    // Make `out` a plain folder holding the published files, as a copy of an older layout.
    const copy = path.join(work, 'copy');
    const { cp } = await import('node:fs/promises');
    await cp(await (await import('node:fs/promises')).realpath(out), copy, { recursive: true });
    await rm(out);
    await rm(placeFor(out).state, { recursive: true });
    await cp(copy, out, { recursive: true });
    expect((await build({ values: { '2026-autumn/north-bay': 4 } })).code).toBe(0);
    expect((await lstat(out)).isSymbolicLink()).toBe(true);

    const foreign = path.join(work, 'foreign');
    await mkdir(foreign);
    await writeFile(path.join(foreign, 'notes.txt'), 'keep me');
    const errors: string[] = [];
    const code = await runBuild(['--out', foreign, '--no-cache'], {
      steps: fakeSteps(),
      progress: createProgress({ quiet: true }),
      stderr: (text) => errors.push(text),
    });
    expect(code).toBe(2);
    expect(errors.join('\n')).toContain('refusing to replace');
    expect(await readFile(path.join(foreign, 'notes.txt'), 'utf8')).toBe('keep me');
  });

  test('a link lost by a run stopped during the takeover is restored by the next run', async () => {
    expect((await build()).code).toBe(0);
    const link = await readlink(out);
    const before = await snapshot(out);
    await rm(out); // as if stopped after moving the old folder away and before linking
    const session = await openPublishSession(out);
    await session.close();
    expect(await readlink(out)).toBe(link);
    expect(await snapshot(out)).toEqual(before);
  });

  test('a live build holding the lock stops a second one; a dead holder is taken over', async () => {
    expect((await build()).code).toBe(0);
    const lock = path.join(placeFor(out).state, 'lock');
    await writeFile(lock, `${process.ppid}\n`); // a process that is certainly alive
    const refused = await build({ values: { '2026-autumn/north-bay': 8 } });
    expect(refused.code).toBe(2);
    expect(refused.errors).toContain(`process ${process.ppid}`);
    await writeFile(lock, '2147483646\n'); // no such process
    await mkdir(path.join(placeFor(out).state, 'work-2147483646-1-site'));
    expect((await build({ values: { '2026-autumn/north-bay': 8 } })).code).toBe(0);
    expect(await workFolders()).toEqual([]);
  });

  test('a build killed with SIGKILL mid-render leaves the site byte-identical; the next run cleans up', async () => {
    expect((await build()).code).toBe(0);
    const before = await snapshot(out);
    const linkBefore = await readlink(out);
    const child = spawn(process.execPath, ['--import', 'tsx', path.join(root, 'test/publish/helpers/build-until-killed.ts'), out], {
      cwd: root,
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let stderrText = '';
    child.stderr.on('data', (chunk: Buffer) => (stderrText += chunk.toString()));
    await new Promise<void>((resolve, reject) => {
      child.stdout.on('data', (chunk: Buffer) => {
        if (chunk.toString().includes('rendering')) resolve();
      });
      child.on('exit', (code) => reject(new Error(`child ended early with ${code}: ${stderrText}`)));
    });
    const left = await workFolders();
    expect(left.length).toBeGreaterThan(0); // the killed run's half-written tree is there
    const exited = new Promise((resolve) => child.on('exit', (_code, signal) => resolve(signal)));
    child.kill('SIGKILL');
    expect(await exited).toBe('SIGKILL');
    expect(await readlink(out)).toBe(linkBefore);
    expect(await snapshot(out)).toEqual(before);

    expect((await build({ values: { '2026-autumn/north-bay': 6 } })).code).toBe(0);
    expect(await workFolders()).toEqual([]);
    expect(await readFile(path.join(out, 'seasons/2026-autumn/north-bay/index.html'), 'utf8')).toContain('Value 6');
  });
});

test('stray links in the state folder do not count as published releases', async () => {
  await mkdir(work, { recursive: true });
  await symlink('/', path.join(work, 'site'));
  const errors: string[] = [];
  const code = await runBuild(['--out', out, '--no-cache'], {
    steps: fakeSteps(),
    progress: createProgress({ quiet: true }),
    stderr: (text) => errors.push(text),
  });
  expect(code).toBe(2);
  expect(errors.join('\n')).toContain('is a link to /');
});
