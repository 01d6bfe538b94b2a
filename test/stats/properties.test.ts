/**
 * Property tests: the fast algorithms equal the all-pairs oracles (test/stats/oracles.ts) on random
 * series with ties in time and value, gaps (missing values) and censoring.
 */
import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { kendallScore } from '../../generator/stats/kendall-score.ts';
import { mannKendall } from '../../generator/stats/mann-kendall.ts';
import { sensSlope } from '../../generator/stats/sens-slope.ts';
import { countSlopePairs, selectPairwiseSlopes, sortCountingInversions } from '../../generator/stats/slope-selection.ts';
import { prepareSeries } from '../../generator/stats/series-input.ts';
import type { SeriesPoint } from '../../generator/stats/types.ts';
import { kendallScoreOracle, slopeAtRankOracle, sortedSlopesOracle } from './oracles.ts';

/** Random series: integer-ish times with repeats and gaps, values from a small set (many ties) or continuous. */
const seriesArbitrary = fc
  .record({
    points: fc.array(
      fc.record({
        gap: fc.integer({ min: 0, max: 3 }), // 0 = same time as the previous point
        // measurement-like numbers with 6 decimals (slopes closer than ~1e-12 of the range are outside the selection's scope)
        value: fc.oneof(
          fc.integer({ min: -3, max: 3 }),
          fc.double({ min: -100, max: 100, noNaN: true }).map((v) => Math.round(v * 1e6) / 1e6),
        ),
        missing: fc.boolean(),
        censored: fc.integer({ min: 0, max: 5 }),
      }),
      { minLength: 0, maxLength: 60 },
    ),
    fractionalTimes: fc.boolean(),
  })
  .map(({ points, fractionalTimes }) => {
    let time = 2000;
    return points.map((p): SeriesPoint => {
      time += fractionalTimes ? p.gap / 7 : p.gap;
      const point: SeriesPoint = { t: time, value: p.missing && p.gap === 2 ? null : p.value };
      if (p.censored === 0) point.censored = true;
      return point;
    });
  });

describe('fast algorithms equal the all-pairs oracles', () => {
  test("Knight's S (with the censoring rule) equals Σ sgn over all pairs", () => {
    fc.assert(
      fc.property(seriesArbitrary, (points) => {
        const s = prepareSeries(points);
        expect(kendallScore(s.t, s.y, s.censored).S).toBe(kendallScoreOracle(s.t, s.y, s.censored));
      }),
      { numRuns: 400 },
    );
  });

  test('slope selection (never listing all slopes) returns the k-th smallest slope for any k', () => {
    fc.assert(
      fc.property(seriesArbitrary, fc.integer({ min: 1, max: 1_000_000 }), fc.integer({ min: 0, max: 2 ** 31 }), (points, k, seed) => {
        const s = prepareSeries(points);
        const total = countSlopePairs(s.t);
        if (total === 0) return;
        const oracle = sortedSlopesOracle(s.t, s.y);
        const ranks = [1 + (k % total), 1, total, Math.ceil(total / 2)];
        const selected = selectPairwiseSlopes(s.t, s.y, ranks, { directLimit: 0, listLimit: 8, sampleSize: 16, seed });
        // + 0 turns −0 into 0: the two are the same slope
        ranks.forEach((rank, i) => expect((selected[i] as number) + 0).toBe((oracle[rank - 1] as number) + 0));
      }),
      { numRuns: 300 },
    );
  });

  test("Sen's slope and interpolated limits equal the oracle's order statistics", () => {
    fc.assert(
      fc.property(seriesArbitrary, (points) => {
        const s = prepareSeries(points.filter((p) => !p.censored));
        const oracle = sortedSlopesOracle(s.t, s.y);
        const r = sensSlope(s.t, s.y, { directLimit: 0 });
        if (oracle.length === 0) {
          expect(r.slope).toBeNull();
          return;
        }
        expect((r.slope as number) + 0).toBe((slopeAtRankOracle(oracle, (oracle.length + 1) / 2) as number) + 0);
        const mk = mannKendall(s.t, s.y);
        const c = 1.959963984540054 * Math.sqrt(mk.varS);
        const lower = slopeAtRankOracle(oracle, (oracle.length - c) / 2);
        const upper = slopeAtRankOracle(oracle, (oracle.length + c) / 2 + 1);
        if (lower === null) expect(r.lower).toBeNull();
        else expect(r.lower).toBeCloseTo(lower, 9);
        if (upper === null) expect(r.upper).toBeNull();
        else expect(r.upper).toBeCloseTo(upper, 9);
      }),
      { numRuns: 300 },
    );
  });

  test('slope selection on a longer series with heavy ties (many equal slopes) stays exact', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: 0, max: 2 }), { minLength: 200, maxLength: 400 }), fc.integer(), (values, seed) => {
        const t = Float64Array.from(values, (_, i) => Math.floor(i / 2));
        const y = Float64Array.from(values);
        const total = countSlopePairs(t);
        const oracle = sortedSlopesOracle(t, y);
        const ranks = [1, Math.floor(total / 3), Math.ceil(total / 2), total];
        const selected = selectPairwiseSlopes(t, y, ranks, { directLimit: 0, listLimit: 500, sampleSize: 200, seed });
        // + 0 turns −0 into 0: the two are the same slope
        ranks.forEach((rank, i) => expect((selected[i] as number) + 0).toBe((oracle[rank - 1] as number) + 0));
      }),
      { numRuns: 20 },
    );
  });
});

describe('sorting with an inversion count', () => {
  test('sortCountingInversions: stable order by key and the all-pairs inversion count, from any start order', () => {
    fc.assert(
      fc.property(fc.array(fc.integer({ min: -20, max: 20 }), { minLength: 0, maxLength: 300 }), fc.integer(), (values, seed) => {
        const keys = Float64Array.from(values);
        const n = keys.length;
        // a start order: a seeded shuffle
        const start = Uint32Array.from({ length: n }, (_, i) => i);
        let state = seed >>> 0;
        for (let i = n - 1; i > 0; i--) {
          state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
          const j = state % (i + 1);
          [start[i], start[j]] = [start[j] as number, start[i] as number];
        }
        let expected = 0;
        for (let a = 0; a < n; a++) for (let b = a + 1; b < n; b++) if ((keys[start[a] as number] as number) > (keys[start[b] as number] as number)) expected++;
        const result = sortCountingInversions(keys, start);
        expect(result.inversions).toBe(expected);
        const positionInStart = new Map(Array.from(start, (index, position) => [index, position]));
        for (let r = 1; r < n; r++) {
          const a = result.order[r - 1] as number;
          const b = result.order[r] as number;
          expect((keys[a] as number) < (keys[b] as number) || (keys[a] === keys[b] && (positionInStart.get(a) as number) < (positionInStart.get(b) as number))).toBe(true);
        }
      }),
      { numRuns: 200 },
    );
  });
});
