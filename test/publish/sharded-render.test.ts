// Rendering with two Astro processes side by side (each taking half the bulletins) gives the
// same files, byte for byte, as one process rendering everything: the demo model, rendered both
// ways. Also checks that the page count is not inflated by the pages both processes render.
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, expect, test } from 'vitest';
import { buildModel } from '../../generator/model/build-model.ts';
import { writeModel } from '../../generator/model/write-model.ts';
import { packageRoot, renderWithAstro } from '../../generator/publish/render/astro-render.ts';
import { loadScenario } from '../../generator/read/load-scenario.ts';
import { snapshot } from './helpers/tree.ts';

let dir: string;
beforeAll(async () => {
  dir = await mkdtemp(path.join(tmpdir(), 'wrackline-shards-'));
  const scenario = await loadScenario(path.join(packageRoot, 'content', 'demo'));
  await writeModel(path.join(dir, 'model'), buildModel(scenario));
}, 120_000);
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

test('two render processes give the files of one', async () => {
  const modelDir = path.join(dir, 'model');
  const one = await renderWithAstro({ modelDir, outDir: path.join(dir, 'one'), processes: 1 });
  const two = await renderWithAstro({ modelDir, outDir: path.join(dir, 'two'), processes: 2 });
  expect(two.pages).toBe(one.pages);
  const a = await snapshot(path.join(dir, 'one'));
  const b = await snapshot(path.join(dir, 'two'));
  expect(Object.keys(b).length).toBe(Object.keys(a).length);
  expect(b).toEqual(a);
  // nothing of the second process is left beside the output
  await expect(rm(`${path.join(dir, 'two')}.shards`, { recursive: false })).rejects.toThrow();
}, 240_000);
