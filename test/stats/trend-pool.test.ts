/**
 * The worker pool must give exactly what one thread gives: the same results, byte for byte, in
 * request order, including the bootstrap band (seeded per request) and errors for bad input.
 * A small batch is forced through the pool (minBatch 0, tiny chunks) so both threads take part.
 */
import { describe, expect, test } from 'vitest';
import { createSeededRandom } from '../../generator/random/seeded-random.ts';
import type { SeriesPoint } from '../../generator/stats/types.ts';
import { analyzeInOrder, analyzeInPool, lastBatchShares, type TrendRequest } from '../../generator/stats/trend-pool.ts';

function invented(seed: number): SeriesPoint[] {
  const random = createSeededRandom(seed);
  const points: SeriesPoint[] = [];
  for (let k = 0; k < 36; k++) {
    if (random.uniform() < 0.1) continue;
    const value = Math.round((2 + 0.03 * k + random.uniform()) * 10) / 10;
    points.push({ t: 2015 + k / 4 + 0.125, value: value < 2.2 ? 2.2 : value, censored: value < 2.2, season: ['winter', 'spring', 'summer', 'autumn'][k % 4] as string });
  }
  return points;
}

describe('analyzeInPool', () => {
  const requests: TrendRequest[] = Array.from({ length: 60 }, (_, i) => ({
    points: invented(i + 1),
    options: { confidence: 0.95, seasonal: i % 2 === 0, bootstrap: i % 5 === 4 ? false : { resamples: 200, seed: 1000 + i } },
  }));
  // a request the engine refuses (a value that is not a finite number)
  requests.splice(17, 0, {
    points: [
      { t: 2020, value: Number.NaN },
      { t: 2021, value: 1 },
    ],
    options: { confidence: 0.95 },
  });

  test('gives byte-identical outcomes in request order, errors included', { timeout: 60_000 }, () => {
    const alone = analyzeInOrder(requests);
    const pooled = analyzeInPool(requests, { minBatch: 0, chunkSize: 3, workers: 1 });
    expect(pooled).toHaveLength(requests.length);
    expect(JSON.stringify(pooled)).toBe(JSON.stringify(alone));
    expect('error' in (pooled[17] as object)).toBe(true);
    expect(pooled.filter((o) => 'result' in o && o.result.band !== null).length).toBeGreaterThan(30);
    // the same batch computed by the worker alone (the calling thread only waits)
    const byWorker = analyzeInPool(requests, { minBatch: 0, chunkSize: 5, workers: 1, callerComputes: false });
    expect(lastBatchShares).toEqual({ caller: 0, workers: Math.ceil(requests.length / 5) });
    expect(JSON.stringify(byWorker)).toBe(JSON.stringify(alone));
  });

  test('a batch below the threshold stays on the calling thread', () => {
    const few = requests.slice(0, 4);
    expect(JSON.stringify(analyzeInPool(few, { minBatch: 10 }))).toBe(JSON.stringify(analyzeInOrder(few)));
  });
});
