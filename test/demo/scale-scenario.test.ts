/**
 * The benchmark scenario generator writes a complete scenario folder of the requested size
 * (here a small one, so the test stays quick), deterministically for a given seed.
 */
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gunzipSync } from 'node:zlib';
import { afterAll, describe, expect, test } from 'vitest';
import { makeScaleScenario } from '../../bench/scale-scenario.ts';

const dirs: string[] = [];
afterAll(async () => {
  for (const dir of dirs) await rm(dir, { recursive: true, force: true });
});

async function fresh(): Promise<string> {
  const dir = await mkdtemp(join(tmpdir(), 'wrackline-scale-test-'));
  dirs.push(dir);
  return dir;
}

describe('makeScaleScenario', () => {
  test('writes the requested segments, years and exact number of positions', async () => {
    const dir = await fresh();
    const summary = await makeScaleScenario(dir, { segments: 40, years: 3, positions: 12_345, seed: 5 });
    const segments = JSON.parse(await readFile(join(dir, 'segments.geojson'), 'utf8')) as { features: { properties: { id: string } }[] };
    expect(segments.features).toHaveLength(40);
    const lines = gunzipSync(await readFile(join(dir, 'drift/positions.csv.gz')))
      .toString('utf8')
      .trim()
      .split('\n');
    expect(lines).toHaveLength(12_345 + 1);
    expect(summary.rows.positions).toBe(12_345);
    const beach = (await readFile(join(dir, 'tables/beach-litter.csv'), 'utf8')).trim().split('\n').slice(1);
    const years = new Set(beach.map((line) => line.split(',')[2]?.slice(0, 4)));
    // 3 years ending 2026-autumn: December 2023 to November 2026.
    for (const year of years) expect(['2023', '2024', '2025', '2026']).toContain(year);
    expect(years.has('2026')).toBe(true);
    const datapackage = JSON.parse(await readFile(join(dir, 'datapackage.json'), 'utf8')) as { resources: { path: string }[] };
    expect(datapackage.resources.map((r) => r.path)).toContain('drift/positions.csv.gz');
    expect(datapackage.resources.map((r) => r.path)).not.toContain('drift/trajectories.nc');
  });

  test('the same seed gives the same tables', async () => {
    const a = await fresh();
    const b = await fresh();
    await makeScaleScenario(a, { segments: 12, years: 2, positions: 1000, seed: 9 });
    await makeScaleScenario(b, { segments: 12, years: 2, positions: 1000, seed: 9 });
    for (const file of ['tables/beach-litter.csv', 'tables/water-microplastics.csv', 'segments.geojson']) {
      expect((await readFile(join(a, file))).equals(await readFile(join(b, file))), file).toBe(true);
    }
  });
});
