// The one cache of the build (generator/publish/cache/result-cache.ts): one format, keyed by
// input digest under a code fingerprint; only what a build kept is written; files beside a value
// are used only while they keep their recorded SHA-256; anything unusable counts as empty.
import { createHash } from 'node:crypto';
import { mkdtemp, readFile, readdir, rm, stat, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, expect, test } from 'vitest';
import { cacheFormat, codeFingerprint, isCacheKey, openShelf, shelfFile } from '../../generator/publish/cache/result-cache.ts';
import { packageRoot } from '../../generator/publish/render/astro-render.ts';

let dir: string;
beforeEach(async () => {
  dir = await mkdtemp(path.join(tmpdir(), 'wrackline-result-cache-'));
});
afterEach(async () => {
  await rm(dir, { recursive: true, force: true });
});

const keyOf = (text: string): string => createHash('sha256').update(text).digest('hex');
const a = keyOf('a');
const b = keyOf('b');

test('a saved value is found again under the same fingerprint, in the one format', async () => {
  const first = await openShelf<{ n: number }>(dir, 'numbers', 'code-1');
  expect(first.get(a)).toBeUndefined();
  first.keep(a, { n: 1 });
  expect(first.get(a)).toEqual({ n: 1 });
  await first.save();
  const onDisk = JSON.parse(await readFile(shelfFile(dir, 'numbers'), 'utf8'));
  expect(onDisk).toEqual({ format: cacheFormat, shelf: 'numbers', fingerprint: 'code-1', entries: { [a]: { n: 1 } }, files: {} });
  const second = await openShelf<{ n: number }>(dir, 'numbers', 'code-1');
  expect(second.get(a)).toEqual({ n: 1 });
  const otherCode = await openShelf<{ n: number }>(dir, 'numbers', 'code-2');
  expect(otherCode.get(a)).toBeUndefined();
});

test('only what the latest build kept is written; an unchanged shelf is not rewritten', async () => {
  const first = await openShelf<number>(dir, 'numbers', 'code-1');
  first.keep(a, 1);
  first.keep(b, 2);
  await first.save();
  const second = await openShelf<number>(dir, 'numbers', 'code-1');
  second.keep(b, second.get(b) as number);
  await second.save();
  const third = await openShelf<number>(dir, 'numbers', 'code-1');
  expect(third.get(a)).toBeUndefined();
  expect(third.get(b)).toBe(2);
  const before = (await stat(shelfFile(dir, 'numbers'))).mtimeMs;
  third.keep(b, third.get(b) as number);
  await writeFile(path.join(dir, 'marker'), 'x');
  await third.save();
  expect((await stat(shelfFile(dir, 'numbers'))).mtimeMs).toBe(before);
});

test('a key that is not a SHA-256 is refused; a bad shelf name too', async () => {
  const shelf = await openShelf<number>(dir, 'numbers', 'code-1');
  expect(isCacheKey(a)).toBe(true);
  expect(isCacheKey('../escape')).toBe(false);
  expect(shelf.get('../escape')).toBeUndefined();
  expect(() => shelf.keep('../escape', 1)).toThrow('"../escape" is not a cache key');
  await expect(openShelf(dir, '../out', 'code-1')).rejects.toThrow('is not a shelf name');
});

test('files beside a value: used while their hash matches, removed when no longer kept', async () => {
  const first = await openShelf<string>(dir, 'pages', 'code-1');
  first.keepFile(a, Buffer.from('page a'), 'listing a');
  first.keepFile(b, Buffer.from('page b'), 'listing b');
  await first.save();
  expect((await readdir(path.join(dir, 'pages'))).sort()).toEqual([a, b].sort());

  await writeFile(path.join(dir, 'pages', b), 'changed by hand');
  const second = await openShelf<string>(dir, 'pages', 'code-1');
  expect(second.file(a)).toEqual({ bytes: Buffer.from('page a'), sha256: keyOf('page a') });
  expect(second.file(b)).toBeUndefined();
  second.keepFile(a, Buffer.from('page a'), 'listing a');
  await second.save();
  expect(await readdir(path.join(dir, 'pages'))).toEqual([a]);
});

test('a damaged or foreign shelf file counts as empty', async () => {
  await writeFile(shelfFile(dir, 'numbers'), '{ not json');
  expect((await openShelf<number>(dir, 'numbers', 'code-1')).get(a)).toBeUndefined();
  await writeFile(shelfFile(dir, 'numbers'), JSON.stringify({ fingerprint: 'code-1', entries: { [a]: 1 } }));
  expect((await openShelf<number>(dir, 'numbers', 'code-1')).get(a)).toBeUndefined();
  await writeFile(shelfFile(dir, 'numbers'), JSON.stringify({ format: cacheFormat, shelf: 'other', fingerprint: 'code-1', entries: { [a]: 1 }, files: {} }));
  expect((await openShelf<number>(dir, 'numbers', 'code-1')).get(a)).toBeUndefined();
});

test('the code fingerprint follows the version and the files, whole or through imports', async () => {
  const parts = { whole: ['generator/random'], withImports: ['generator/model/stable-json.ts'] };
  const base = await codeFingerprint(packageRoot, '1.0.0', parts);
  expect(base).toMatch(/^[0-9a-f]{64}$/);
  expect(await codeFingerprint(packageRoot, '1.0.0', parts)).toBe(base);
  expect(await codeFingerprint(packageRoot, '1.0.1', parts)).not.toBe(base);
  expect(await codeFingerprint(packageRoot, '1.0.0', { whole: ['generator/random'] })).not.toBe(base);
});
