// Drift figures remembered between builds: a second reading of the same drift inputs takes them
// over and gives exactly the scenario (figures, issues, record counts) of reading afresh; any
// change to a drift file reads again. The demo scenario's drift positions and their deliberate
// bad row are the inputs.
import { cp, mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { gunzipSync, gzipSync } from 'node:zlib';
import { afterEach, beforeEach, expect, test } from 'vitest';
import { loadScenario } from '../../generator/read/load-scenario.ts';
import { driftShelf, openDriftCache, readingFingerprint } from '../../generator/publish/cache/drift-figures.ts';
import { shelfFile } from '../../generator/publish/cache/result-cache.ts';
import { packageRoot } from '../../generator/publish/render/astro-render.ts';

const demo = path.join(packageRoot, 'content', 'demo');
let dir: string;
beforeEach(async () => {
  dir = await mkdtemp(path.join(tmpdir(), 'wrackline-drift-memo-'));
});
afterEach(async () => {
  await rm(dir, { recursive: true, force: true });
});

test('a remembered drift reading equals a fresh one, issues and counts included', async () => {
  const fingerprint = await readingFingerprint(packageRoot, 'test');
  const fresh = await loadScenario(demo);
  const first = await openDriftCache(path.join(dir, 'cache'), fingerprint);
  const filled = await loadScenario(demo, { driftMemo: first });
  expect(first.reused()).toBe(false);
  await first.save();
  const second = await openDriftCache(path.join(dir, 'cache'), fingerprint);
  const remembered = await loadScenario(demo, { driftMemo: second });
  expect(second.reused()).toBe(true);
  expect(fresh.drift).not.toBeNull();
  for (const loaded of [filled, remembered]) {
    expect(loaded.drift).toEqual(fresh.drift);
    expect(loaded.report).toEqual(fresh.report);
  }
});

test('another code fingerprint or a changed drift file reads the positions again', async () => {
  const scenario = path.join(dir, 'scenario');
  await cp(demo, scenario, { recursive: true });
  const cacheDir = path.join(dir, 'cache');
  const memo1 = await openDriftCache(cacheDir, 'code-1');
  await loadScenario(scenario, { driftMemo: memo1 });
  await memo1.save();
  const otherCode = await openDriftCache(cacheDir, 'code-2');
  await loadScenario(scenario, { driftMemo: otherCode });
  expect(otherCode.reused()).toBe(false);
  await otherCode.save();

  // Change the bytes of the positions file: the figures must be read again.
  const descriptor = JSON.parse(await readFile(path.join(scenario, 'datapackage.json'), 'utf8')) as { resources: { path: string; role?: string }[] };
  const positions = descriptor.resources.find((r) => r.path.includes('positions'));
  expect(positions).toBeDefined();
  const file = path.join(scenario, positions?.path ?? '');
  const gz = file.endsWith('.gz');
  const text = (gz ? gunzipSync(await readFile(file)) : await readFile(file)).toString('utf8');
  const lines = text.split('\n');
  lines[1] = `${lines[1]} `; // a trailing blank changes the bytes, not the value
  await writeFile(file, gz ? gzipSync(lines.join('\n')) : lines.join('\n'));
  const changed = await openDriftCache(cacheDir, 'code-2');
  await loadScenario(scenario, { driftMemo: changed });
  expect(changed.reused()).toBe(false);
  await changed.save();
  const again = await openDriftCache(cacheDir, 'code-2');
  await loadScenario(scenario, { driftMemo: again });
  expect(again.reused()).toBe(true);
});

test('nothing is written until the build says so', async () => {
  const cacheDir = path.join(dir, 'cache');
  const memo = await openDriftCache(cacheDir, 'code-1');
  await loadScenario(demo, { driftMemo: memo });
  await expect(readFile(shelfFile(cacheDir, driftShelf))).rejects.toThrow();
  await memo.save();
  expect((await readFile(shelfFile(cacheDir, driftShelf))).length).toBeGreaterThan(0);
});

test('a damaged memo file is ignored', async () => {
  const cacheDir = path.join(dir, 'cache');
  const memo = await openDriftCache(cacheDir, 'code-1');
  await loadScenario(demo, { driftMemo: memo });
  await memo.save();
  await writeFile(shelfFile(cacheDir, driftShelf), '{ not json');
  const after = await openDriftCache(cacheDir, 'code-1');
  const loaded = await loadScenario(demo, { driftMemo: after });
  expect(after.reused()).toBe(false);
  expect(loaded.drift).toEqual((await loadScenario(demo)).drift);
});

// Positions dated after the publication date are not used (drift-period.ts), so a scenario that
// publishes one more season must read its drift again: staging the demo's autumn over its summer
// once took the summer's drift figures, without any autumn position, from the cache.
test('a new publication date reads the drift again instead of taking over the last figures', async () => {
  const fingerprint = await readingFingerprint(packageRoot, 'test');
  const scenario = path.join(dir, 'scenario');
  await cp(demo, scenario, { recursive: true });
  const full = await readFile(path.join(scenario, 'scenario.json'), 'utf8');
  const settings = JSON.parse(full) as { publications: { season: string }[] };
  settings.publications = settings.publications.filter((p) => p.season !== '2026-autumn');
  await writeFile(path.join(scenario, 'scenario.json'), JSON.stringify(settings));
  const summerCache = await openDriftCache(path.join(dir, 'cache'), fingerprint);
  const summer = await loadScenario(scenario, { driftMemo: summerCache });
  await summerCache.save();
  await writeFile(path.join(scenario, 'scenario.json'), full);
  const autumnCache = await openDriftCache(path.join(dir, 'cache'), fingerprint);
  const autumn = await loadScenario(scenario, { driftMemo: autumnCache });
  expect(autumnCache.reused()).toBe(false);
  expect(autumn.drift).toEqual((await loadScenario(scenario)).drift);
  expect(autumn.drift).not.toEqual(summer.drift);
});
