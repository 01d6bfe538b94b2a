/**
 * Small file-tree helpers of a rebuild: placing staged files (whole folders the site lacks move in
 * one rename, a file the render wrote itself is kept), deleting trees on a worker thread, and the
 * code fingerprint of the model memo (it follows the imports of the model code, nothing else).
 */
import { cp, mkdir, mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, expect, test } from 'vitest';
import { placeStaged } from '../../generator/publish/render/page-reuse.ts';
import { removeInWorker } from '../../generator/publish/swap/remove-in-worker.ts';
import { modelFingerprint } from '../../generator/publish/cache/model-memo.ts';
import { listFiles } from '../../generator/publish/tree-hash.ts';
import { packageRoot } from './helpers/cli-build.ts';

let dir: string;
beforeEach(async () => {
  dir = await mkdtemp(path.join(tmpdir(), 'wrackline-staging-'));
});
afterEach(async () => {
  await rm(dir, { recursive: true, force: true });
});

async function put(root: string, file: string, text: string): Promise<void> {
  await mkdir(path.dirname(path.join(root, file)), { recursive: true });
  await writeFile(path.join(root, file), text);
}

test('staged files are placed: missing folders whole, single files where the folder exists, rendered files kept', async () => {
  const stage = path.join(dir, 'stage');
  const site = path.join(dir, 'site');
  const staged = [
    'seasons/2026-autumn/north-bay/index.html',
    'seasons/2026-autumn/north-bay/bulletin.json',
    'seasons/2026-autumn/south-reef/index.html',
    'segments/north-bay/index.html',
    'embed/north-bay/beach-litter/index.html',
  ];
  for (const file of staged) await put(stage, file, `staged ${file}`);
  // The render wrote the season page and south-reef's page itself (a route not in the plan).
  await put(site, 'seasons/2026-autumn/index.html', 'rendered season');
  await put(site, 'seasons/2026-autumn/south-reef/index.html', 'rendered south-reef');
  const placed = placeStaged(
    stage,
    site,
    staged.map((file) => ({ file, sha256: '-', bytes: 0 })),
  );
  expect(placed.map((entry) => entry.file)).toEqual(staged.filter((file) => file !== 'seasons/2026-autumn/south-reef/index.html'));
  expect(await readFile(path.join(site, 'seasons/2026-autumn/south-reef/index.html'), 'utf8')).toBe('rendered south-reef');
  for (const entry of placed) expect(await readFile(path.join(site, entry.file), 'utf8')).toBe(`staged ${entry.file}`);
  expect((await listFiles(site)).sort()).toEqual([...staged, 'seasons/2026-autumn/index.html'].sort());
});

test('trees are deleted on a worker thread; a missing folder is no error', async () => {
  await put(dir, 'a/b/c.txt', 'x');
  await put(dir, 'd/e.txt', 'y');
  await removeInWorker([path.join(dir, 'a'), path.join(dir, 'd'), path.join(dir, 'never-there')]);
  expect(existsSync(path.join(dir, 'a'))).toBe(false);
  expect(existsSync(path.join(dir, 'd'))).toBe(false);
  await removeInWorker([]);
});

test('the model fingerprint changes with the code the model imports, not with other code', async () => {
  const root = path.join(dir, 'project');
  await cp(path.join(packageRoot, 'generator'), path.join(root, 'generator'), { recursive: true });
  for (const file of ['package.json', 'package-lock.json']) await cp(path.join(packageRoot, file), path.join(root, file));
  const base = await modelFingerprint(root, '1.0.0');
  expect(await modelFingerprint(root, '1.0.0')).toBe(base);
  expect(await modelFingerprint(root, '1.0.1')).not.toBe(base);
  // the page renderer and the command line do not make the model
  await writeFile(path.join(root, 'generator', 'publish', 'render', 'astro-render.ts'), '// changed\n', { flag: 'a' });
  await writeFile(path.join(root, 'generator', 'cli', 'main.ts'), '// changed\n', { flag: 'a' });
  expect(await modelFingerprint(root, '1.0.0')).toBe(base);
  // a sentence of the bulletins does
  await writeFile(path.join(root, 'generator', 'bulletin', 'phrase-level.ts'), '// changed\n', { flag: 'a' });
  const worded = await modelFingerprint(root, '1.0.0');
  expect(worded).not.toBe(base);
  // and so does the statistics code (loaded by worker threads, taken whole)
  await writeFile(path.join(root, 'generator', 'stats', 'trend-pool.ts'), '// changed\n', { flag: 'a' });
  expect(await modelFingerprint(root, '1.0.0')).not.toBe(worded);
});
