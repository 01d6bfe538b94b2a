// The region percentile of many values against one list (sorted once, binary search) must equal
// the direct count: 100·(below + (equal − 1)/2)/(n − 1) over the known values (the mid-rank
// percentile, common practice), 50 for a list of one, null for an unknown value.
import fc from 'fast-check';
import { expect, test } from 'vitest';
import { percentileRanker, regionPercentile } from '../../generator/risk/assess-level.ts';

function direct(value: number | null, values: readonly (number | null)[]): number | null {
  if (value === null) return null;
  const known = values.filter((v): v is number => v !== null && Number.isFinite(v));
  if (known.length <= 1) return 50;
  const below = known.filter((v) => v < value).length;
  const equalOthers = Math.max(0, known.filter((v) => v === value).length - 1);
  return (100 * (below + equalOthers / 2)) / (known.length - 1);
}

const list = fc.array(fc.oneof(fc.integer({ min: -5, max: 5 }).map(Number), fc.constant(null), fc.double({ min: -10, max: 10, noNaN: true })), { maxLength: 40 });

test('percentileRanker equals the direct count', () => {
  fc.assert(
    fc.property(list, fc.oneof(fc.integer({ min: -6, max: 6 }).map(Number), fc.constant(null)), (values, extra) => {
      const rank = percentileRanker(values);
      for (const value of [...values, extra]) expect(rank(value)).toBe(direct(value, values));
      expect(regionPercentile(extra, values)).toBe(direct(extra, values));
    }),
    { numRuns: 1000 },
  );
});

test('worked cases', () => {
  // 4 known values 1, 2, 2, 3: a 2 has one below and one equal other → (1 + 0.5)/3 = 50 %.
  expect(percentileRanker([1, 2, null, 2, 3])(2)).toBe(50);
  expect(percentileRanker([1, 2, 2, 3])(3)).toBe(100);
  expect(percentileRanker([7])(7)).toBe(50);
  expect(percentileRanker([1, 2])(null)).toBeNull();
});
