// The parts of rendering that do not need Astro: sharing bulletins between render processes,
// the search-index glob, the data downloads written from the model, the page safety check on
// worker threads, and remembered season references.
import { mkdir, mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, expect, test } from 'vitest';
import { dealBulletins, renderProcesses } from '../../generator/publish/render/astro-render.ts';
import { siteProblems, siteProblemsInParallel } from '../../generator/publish/check/html-safety.ts';
import { writeDownloads } from '../../generator/publish/render/write-downloads.ts';
import { observationsCsv, resultsCsv } from '../../generator/model/download-tables.ts';
import { writeModel } from '../../generator/model/write-model.ts';
import { seasonRef } from '../../generator/model/seasons.ts';
import { assembleModel } from '../../generator/model/assemble-model.ts';
import { fixtureScenario, testEngine } from '../model/fixture.ts';

let dir: string;
beforeEach(async () => {
  dir = await mkdtemp(path.join(tmpdir(), 'wrackline-render-parts-'));
});
afterEach(async () => {
  await rm(dir, { recursive: true, force: true });
});

test('bulletins are dealt in turn; a second process only for enough bulletins and cores', () => {
  expect(dealBulletins(['a/1', 'a/2', 'a/3', 'b/1', 'b/2'], 2)).toEqual([
    ['a/1', 'a/3', 'b/2'],
    ['a/2', 'b/1'],
  ]);
  expect(renderProcesses(60, 2)).toBe(1);
  expect(renderProcesses(4000, 2)).toBe(2);
  expect(renderProcesses(4000, 1)).toBe(1);
  expect(renderProcesses(4000, 8)).toBe(2);
});

test('downloads: bulletin.json is the model file byte for byte, the CSVs are the tables of the model', async () => {
  const set = assembleModel(fixtureScenario(), testEngine);
  const modelDir = path.join(dir, 'model');
  await writeModel(modelDir, set);
  const bulletin = set.bulletins[0];
  expect(bulletin).toBeDefined();
  if (!bulletin) return;
  const id = `${bulletin.season.id}/${bulletin.segment.id}`;
  const files = await writeDownloads(modelDir, path.join(dir, 'site'), [id]);
  expect(files).toBe(3);
  const folder = path.join(dir, 'site', 'seasons', bulletin.season.id, bulletin.segment.id);
  expect(await readFile(path.join(folder, 'bulletin.json'), 'utf8')).toBe(
    await readFile(path.join(modelDir, 'bulletins', bulletin.season.id, `${bulletin.segment.id}.json`), 'utf8'),
  );
  const parsed = JSON.parse(await readFile(path.join(folder, 'bulletin.json'), 'utf8')) as typeof bulletin;
  expect(await readFile(path.join(folder, 'observations.csv'), 'utf8')).toBe(observationsCsv(parsed));
  expect(await readFile(path.join(folder, 'results.csv'), 'utf8')).toBe(resultsCsv(parsed));
  await expect(writeDownloads(modelDir, path.join(dir, 'site'), ['../x/y'])).rejects.toThrow();
});

test('page safety on worker threads finds the same problems in the same order', async () => {
  const policy = `<meta http-equiv="Content-Security-Policy" content="default-src 'self'; script-src 'self'">`;
  const pages: { [file: string]: string } = {
    'a.html': `<html><head>${policy}</head><body><p>fine</p></body></html>`,
    'b.html': `<html><head></head><body><img src=x onerror="alert(1)"></body></html>`,
    'c/index.html': `<html><head>${policy}</head><body><a href="javascript:alert(1)">x</a><script>alert(2)</script></body></html>`,
    'd.html': `<html><head>${policy}</head><body>&lt;script&gt;alert(3)&lt;/script&gt;</body></html>`,
  };
  for (const [file, text] of Object.entries(pages)) {
    await mkdir(path.dirname(path.join(dir, file)), { recursive: true });
    await writeFile(path.join(dir, file), text);
  }
  const files = Object.keys(pages).sort();
  const alone = await siteProblems(dir, files);
  expect(alone.map((p) => p.page)).toEqual(['b.html', 'b.html', 'c/index.html', 'c/index.html']);
  expect(await siteProblemsInParallel(dir, files, 2, 1)).toEqual(alone);
});

test('a remembered season reference cannot be changed by a caller', () => {
  const definitions = [{ id: 'autumn', label: 'Autumn', months: [9, 10, 11] }];
  const first = seasonRef('2026-autumn', definitions);
  expect(first).toEqual({ id: '2026-autumn', label: 'Autumn 2026', start: '2026-09-01', end: '2026-11-30' });
  if (first) first.end = 'changed';
  expect(seasonRef('2026-autumn', definitions)?.end).toBe('2026-11-30');
});
