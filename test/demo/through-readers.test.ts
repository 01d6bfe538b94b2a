/**
 * The demo goes through the project's real readers and model builder (when those modules are
 * present) and exercises every direction word, the too-little-data path, seasons that disagree,
 * values below detection and the three deliberate bad rows.
 */
import { existsSync } from 'node:fs';
import { describe, expect, test } from 'vitest';
import type { LoadedScenario } from '../../generator/scenario/types.ts';
import type { Bulletin } from '../../generator/model/types.ts';
import { DEMO_DIR } from './demo-tables.ts';

const loaderUrl = new URL('../../generator/read/load-scenario.ts', import.meta.url);
const builderUrl = new URL('../../generator/model/build-model.ts', import.meta.url);
const haveLoader = existsSync(loaderUrl);
const haveBuilder = haveLoader && existsSync(builderUrl);

let loaded: LoadedScenario | null = null;
async function load(): Promise<LoadedScenario> {
  if (!loaded) {
    const module = (await import(loaderUrl.href)) as { loadScenario: (dir: string) => Promise<LoadedScenario> };
    loaded = await module.loadScenario(DEMO_DIR);
  }
  return loaded;
}

describe('demo through the real readers', () => {
  test.skipIf(!haveLoader)(
    'reads 30 segments, all four indicators, drift arrivals, and leaves out exactly the three bad rows',
    async () => {
      const scenario = await load();
      expect(scenario.segments).toHaveLength(30);
      const indicators = new Set(scenario.records.map((record) => record.indicator));
      for (const id of ['beach-litter', 'water-microplastics', 'shellfish-tissue', 'wildlife-reports']) expect(indicators.has(id as never), id).toBe(true);
      expect(scenario.records.some((record) => record.censored)).toBe(true);
      // Exactly the three deliberate bad rows are left out, each named by file, column and value.
      const excluded = scenario.report.issues.filter((issue) => issue.excluded);
      expect(excluded, JSON.stringify(scenario.report.issues, null, 1)).toHaveLength(3);
      expect(excluded.some((issue) => issue.file.endsWith('beach-litter.csv') && issue.column === 'items' && issue.value === '-4')).toBe(true);
      expect(excluded.some((issue) => issue.file.endsWith('water-microplastics.csv') && issue.column === 'segment_id' && issue.value === 'north-spit')).toBe(true);
      expect(excluded.some((issue) => issue.file.endsWith('shellfish-tissue.csv') && issue.column === 'date' && issue.value === '2027-02-14')).toBe(true);
      for (const issue of excluded) expect(issue.row).toBeGreaterThan(1);
      expect(scenario.drift?.arrivals.length ?? 0).toBeGreaterThan(0);
    },
    120_000,
  );

  test.skipIf(!haveBuilder)(
    'builds bulletins showing every direction and the seasons-disagree path',
    async () => {
      const scenario = await load();
      const module = (await import(builderUrl.href)) as { buildModel: (s: LoadedScenario) => { bulletins: Bulletin[] } };
      const { bulletins } = module.buildModel(scenario);
      const current = bulletins.filter((bulletin) => bulletin.season.id === '2026-autumn');
      expect(current).toHaveLength(30);
      const directions = new Set(current.flatMap((bulletin) => bulletin.indicators.map((indicator) => indicator.direction)));
      for (const direction of ['rising', 'falling', 'no-clear-direction', 'too-little-data']) expect(directions.has(direction as never), direction).toBe(true);
      const byId = new Map(current.map((bulletin) => [bulletin.segment.id, bulletin]));
      const litterDirection = (id: string) => byId.get(id)?.indicators.find((indicator) => indicator.indicator === 'beach-litter')?.direction;
      expect(litterDirection('corrab-sands')).toBe('rising');
      expect(litterDirection('ostry-beach')).toBe('falling');
      expect(litterDirection('pellow-strand')).toBe('no-clear-direction');
      expect(litterDirection('lissow-beach')).toBe('too-little-data');
      expect(current.some((bulletin) => bulletin.indicators.some((indicator) => indicator.seasonsDisagree))).toBe(true);
      expect(new Set(current.map((bulletin) => bulletin.level.id)).size).toBeGreaterThanOrEqual(3);
    },
    300_000,
  );
});
