// The trend-result cache returns exactly what the engine computed, recomputes when the series,
// the options or the statistics fingerprint change, and survives a damaged cache file.
import { mkdtemp, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, expect, test } from 'vitest';
import type { TrendEngine } from '../../generator/model/evaluate-season.ts';
import { statsTrendEngine } from '../../generator/model/trend-engine.ts';
import type { SeriesPoint, TrendOptions } from '../../generator/stats/types.ts';
import { openTrendCache, statisticsFingerprint, trendShelf } from '../../generator/publish/cache/trend-results.ts';
import { shelfFile } from '../../generator/publish/cache/result-cache.ts';
import { packageRoot } from '../../generator/publish/render/astro-render.ts';

let dir: string;
beforeEach(async () => {
  dir = await mkdtemp(path.join(tmpdir(), 'wrackline-cache-'));
});
afterEach(async () => {
  await rm(dir, { recursive: true, force: true });
});

const series: SeriesPoint[] = Object.freeze([3, 5, 4, 7, 6, 9, 8, 11, 10, 12].map((value, index) => Object.freeze({ t: 2017 + index, value }))) as SeriesPoint[];
const options: TrendOptions = { confidence: 0.95, seasonal: false, bootstrap: { resamples: 50, seed: 3 } };

function counting(inner: TrendEngine): { engine: TrendEngine; calls: () => number } {
  let calls = 0;
  return {
    engine: { ...inner, analyze: (points, opts) => ((calls += 1), inner.analyze(points, opts)) },
    calls: () => calls,
  };
}

test('a warm cache gives the same result without computing', async () => {
  const first = counting(statsTrendEngine);
  const cold = await openTrendCache(dir, 'f1', first.engine);
  const computed = cold.engine.analyze([...series], options);
  await cold.save();
  expect(cold.stats()).toEqual({ hits: 0, misses: 1 });

  const second = counting(statsTrendEngine);
  const warm = await openTrendCache(dir, 'f1', second.engine);
  const reused = warm.engine.analyze([...series], options);
  expect(second.calls()).toBe(0);
  expect(JSON.stringify(reused)).toBe(JSON.stringify(computed));
  expect(warm.stats()).toEqual({ hits: 1, misses: 0 });
});

test('another series, other options or another fingerprint are computed afresh', async () => {
  const cold = await openTrendCache(dir, 'f1', statsTrendEngine);
  cold.engine.analyze([...series], options);
  await cold.save();
  const changedSeries = series.map((point, index) => (index === 0 ? { ...point, value: 4 } : point));
  const warm = await openTrendCache(dir, 'f1', statsTrendEngine);
  warm.engine.analyze(changedSeries, options);
  warm.engine.analyze([...series], { ...options, confidence: 0.9 });
  expect(warm.stats()).toEqual({ hits: 0, misses: 2 });
  const otherCode = await openTrendCache(dir, 'f2', statsTrendEngine);
  otherCode.engine.analyze([...series], options);
  expect(otherCode.stats()).toEqual({ hits: 0, misses: 1 });
});

test('a damaged cache file is ignored', async () => {
  await writeFile(shelfFile(dir, trendShelf), '{ not json');
  const cache = await openTrendCache(dir, 'f1', statsTrendEngine);
  expect(cache.engine.analyze([...series], options).n).toBe(10);
  await cache.save();
});

test('the fingerprint follows the statistics code and the version', async () => {
  const a = await statisticsFingerprint(packageRoot, '1.0.0');
  expect(a).toMatch(/^[0-9a-f]{64}$/);
  expect(await statisticsFingerprint(packageRoot, '1.0.0')).toBe(a);
  expect(await statisticsFingerprint(packageRoot, '1.0.1')).not.toBe(a);
});
