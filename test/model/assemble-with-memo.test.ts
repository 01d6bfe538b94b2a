/**
 * The model memo must never change a result: after any change to the data or the settings, a
 * build that takes what it can from the memo of an earlier build gives the same model files,
 * byte for byte, as assembleModel without memo (the reference here), and it takes from the memo
 * only what did not change. Runs on the invented demo scenario (content/demo: every indicator,
 * modelled drift, Regional Kendall) with the real trend engine, through the memo on disk.
 */
import { mkdtemp, readFile, readdir, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { assembleModel } from '../../generator/model/assemble-model.ts';
import { assembleModelWithMemo, type MemoModelSet } from '../../generator/model/assemble-with-memo.ts';
import { decideDirection, directionIfClear, directionWithQ, trendScore, trendSlope } from '../../generator/model/direction.ts';
import { statsTrendEngine } from '../../generator/model/trend-engine.ts';
import { writeModel } from '../../generator/model/write-model.ts';
import { listFiles } from '../../generator/publish/tree-hash.ts';
import { bulletinShelf, openModelMemo, regionalShelf, summaryShelf } from '../../generator/publish/cache/model-memo.ts';
import { shelfFile } from '../../generator/publish/cache/result-cache.ts';
import { loadScenario } from '../../generator/read/load-scenario.ts';
import type { LoadedScenario } from '../../generator/scenario/types.ts';
import type { TrendResult } from '../../generator/stats/types.ts';

const demo = await loadScenario('content/demo');
let dir = '';
beforeAll(async () => {
  dir = await mkdtemp(path.join(tmpdir(), 'wrackline-memo-'));
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

function copy(scenario: LoadedScenario): LoadedScenario {
  return structuredClone(scenario);
}

let written = 0;
/** The files of a model folder written by writeModel, by path. */
async function folderFiles(set: Parameters<typeof writeModel>[1]): Promise<Map<string, string>> {
  written += 1;
  const folder = path.join(dir, `model-${written}`);
  await writeModel(folder, set);
  const files = new Map<string, string>();
  for (const file of (await listFiles(folder)).sort()) files.set(file, await readFile(path.join(folder, file), 'utf8'));
  await rm(folder, { recursive: true, force: true });
  return files;
}

/** The model files of the reference build (assembleModel, no memo), listings included. */
function referenceFiles(scenario: LoadedScenario): Promise<Map<string, string>> {
  return folderFiles(assembleModel(scenario, statsTrendEngine));
}

function memoFiles(set: MemoModelSet): Promise<Map<string, string>> {
  return folderFiles({ site: set.site, regions: set.regions, bulletins: [], written: set.bulletins });
}

async function buildWithMemo(scenario: LoadedScenario, cache: string): Promise<MemoModelSet> {
  const opened = await openModelMemo(cache, 'test-fingerprint');
  const set = assembleModelWithMemo(scenario, statsTrendEngine, opened.memo);
  await opened.save();
  return set;
}

function expectSameFiles(actual: Map<string, string>, expected: Map<string, string>): void {
  expect([...actual.keys()].sort()).toEqual([...expected.keys()].sort());
  for (const [name, text] of expected) expect(actual.get(name), name).toBe(text);
}

describe('assembleModelWithMemo', () => {
  let reference = new Map<string, string>();
  beforeAll(async () => {
    reference = await referenceFiles(demo);
    expect([...reference.keys()].some((file) => file.startsWith('listing/'))).toBe(true);
  });

  test('with an empty memo: the files of assembleModel, every bulletin composed', async () => {
    const cache = path.join(dir, 'empty');
    const set = await buildWithMemo(copy(demo), cache);
    expectSameFiles(await memoFiles(set), reference);
    expect(set.counts.bulletinsReused).toBe(0);
    expect(set.counts.bulletinsComposed).toBe(set.bulletins.length);
    expect((await readdir(path.join(cache, bulletinShelf))).length).toBe(set.bulletins.length);
  });

  test('unchanged data: everything from the memo, same files', async () => {
    const cache = path.join(dir, 'same');
    await buildWithMemo(copy(demo), cache);
    const again = await buildWithMemo(copy(demo), cache);
    expectSameFiles(await memoFiles(again), reference);
    expect(again.counts.seriesEvaluated).toBe(0);
    expect(again.counts.bulletinsComposed).toBe(0);
  });

  test('one survey changed: that segment is composed again, the files equal a build without memo', async () => {
    const cache = path.join(dir, 'one');
    await buildWithMemo(copy(demo), cache);
    const changed = copy(demo);
    const current = changed.settings.publications.at(-1)?.season;
    const record = changed.records.find((r) => r.indicator === 'beach-litter' && r.season === current && r.value !== null);
    if (!record || record.value === null) throw new Error('the demo has no beach-litter survey this season');
    record.value += 40;
    const set = await buildWithMemo(changed, cache);
    expectSameFiles(await memoFiles(set), await referenceFiles(changed));
    const composed = set.bulletins.filter((b) => !b.reused);
    expect(composed.some((b) => b.segmentId === record.segmentId && b.seasonId === current)).toBe(true);
    expect(set.counts.bulletinsReused).toBeGreaterThan(0);
  });

  test('a damaged memo file is not used: the bulletin is composed again', async () => {
    const cache = path.join(dir, 'damaged');
    await buildWithMemo(copy(demo), cache);
    const names = (await readdir(path.join(cache, bulletinShelf))).sort();
    await writeFile(path.join(cache, bulletinShelf, names[0] as string), '{"damaged": true}\n');
    const set = await buildWithMemo(copy(demo), cache);
    expectSameFiles(await memoFiles(set), reference);
    expect(set.counts.bulletinsComposed).toBe(1);
  });

  test('a memo of other code is not used', async () => {
    const cache = path.join(dir, 'code');
    await buildWithMemo(copy(demo), cache);
    const opened = await openModelMemo(cache, 'other-code');
    const set = assembleModelWithMemo(copy(demo), statsTrendEngine, opened.memo);
    expect(set.counts.bulletinsReused).toBe(0);
    expect(set.counts.seriesReused).toBe(0);
  });

  test('unreadable memo files count as empty', async () => {
    const cache = path.join(dir, 'unreadable');
    await buildWithMemo(copy(demo), cache);
    for (const shelf of [summaryShelf, regionalShelf, bulletinShelf]) await writeFile(shelfFile(cache, shelf), '{ not json');
    const set = await buildWithMemo(copy(demo), cache);
    expectSameFiles(await memoFiles(set), reference);
    expect(set.counts.bulletinsReused).toBe(0);
  });

  // Random changes of the kinds a season brings (a corrected value, a withdrawn sample, a new
  // drift run, a renamed segment, another false-discovery rate or minimum of values), one after
  // another through one memo: every build equals the build without memo.
  test('any sequence of changes: same files as without memo (fast-check)', { timeout: 240_000 }, async () => {
    const cache = path.join(dir, 'random');
    await buildWithMemo(copy(demo), cache);
    const change = fc.oneof(
      fc.record({ kind: fc.constant('value' as const), at: fc.nat(), factor: fc.double({ min: 0, max: 3, noNaN: true }) }),
      fc.record({ kind: fc.constant('remove' as const), at: fc.nat() }),
      fc.record({ kind: fc.constant('drift' as const), at: fc.nat(), factor: fc.double({ min: 0, max: 3, noNaN: true }) }),
      fc.record({ kind: fc.constant('rename' as const), at: fc.nat() }),
      fc.record({ kind: fc.constant('rate' as const), rate: fc.constantFrom(0.05, 0.1, 0.2) }),
      fc.record({ kind: fc.constant('min-values' as const), count: fc.constantFrom(4, 8, 12) }),
    );
    await fc.assert(
      fc.asyncProperty(fc.array(change, { minLength: 1, maxLength: 3 }), async (changes) => {
        const scenario = copy(demo);
        for (const c of changes) {
          if (c.kind === 'value' || c.kind === 'remove') {
            const index = c.at % scenario.records.length;
            const record = scenario.records[index];
            if (!record) continue;
            if (c.kind === 'remove') scenario.records.splice(index, 1);
            else if (record.value !== null) record.value = Math.round(record.value * c.factor * 100) / 100;
          } else if (c.kind === 'drift') {
            const rows = scenario.drift?.arrivals ?? [];
            const row = rows[c.at % Math.max(1, rows.length)];
            if (row) row.arrivalsPerKm = Math.round(row.arrivalsPerKm * c.factor * 10) / 10;
          } else if (c.kind === 'rename') {
            const segment = scenario.segments[c.at % scenario.segments.length];
            if (segment) segment.name = `${segment.name} East`;
          } else if (c.kind === 'rate') {
            scenario.settings.trend.falseDiscoveryRate = c.rate;
          } else {
            scenario.settings.trend.minValues = c.count;
          }
        }
        const set = await buildWithMemo(scenario, cache);
        expectSameFiles(await memoFiles(set), await referenceFiles(scenario));
      }),
      { numRuns: 8, seed: 20261202 },
    );
  });
});

// decideDirection was split in two so the part that needs the trend can be kept per series; the
// split must give the same answers as the rule written out in full (direction.ts header).
describe('directionIfClear and directionWithQ', () => {
  function written(trend: TrendResult | null, q: number | null, fdr: number): string {
    if (!trend || trend.n === 0 || trend.insufficient) return 'too-little-data';
    if (q === null || !(q < fdr)) return 'no-clear-direction';
    const score = trendScore(trend);
    if (score === null || score === 0) return 'no-clear-direction';
    const slope = trendSlope(trend);
    if (slope !== null && (slope === 0 || Math.sign(slope) !== Math.sign(score))) return 'no-clear-direction';
    return score > 0 ? 'rising' : 'falling';
  }
  test('equal to the rule in full for any trend, q-value and rate (fast-check)', () => {
    const small = fc.constantFrom(-2, -1, 0, 1, 2);
    const trend = fc.option(
      fc.record({
        n: fc.constantFrom(0, 5),
        insufficient: fc.option(fc.constant({ rule: 'min-values', reason: 'few' }), { nil: null }),
        S: small,
        slope: fc.option(small, { nil: null }),
        seasonal: fc.boolean(),
      }),
      { nil: null },
    );
    fc.assert(
      fc.property(trend, fc.option(fc.double({ min: 0, max: 1, noNaN: true }), { nil: null }), fc.constantFrom(0.05, 0.1), (t, q, fdr) => {
        const result: TrendResult | null =
          t === null
            ? null
            : ({
                n: t.n,
                nCensored: 0,
                mannKendall: { S: t.S, varS: 1, z: 0, p: 0.5, tau: 0 },
                sen: { slope: t.slope, lower: null, upper: null, intercept: null, confidence: 0.95 },
                seasonalKendall: t.seasonal ? { S: t.S, varS: 1, z: 0, p: 0.5, slope: t.slope } : null,
                probabilityUp: null,
                insufficient: t.insufficient,
              } as unknown as TrendResult);
        expect(directionWithQ(directionIfClear(result), q, fdr)).toBe(written(result, q, fdr));
        expect(decideDirection(result, q, fdr)).toBe(written(result, q, fdr));
      }),
      { numRuns: 2000 },
    );
  });
});
