/**
 * The per-season precomputed covariance sum (season-covariance.ts) against the all-pairs form of
 * Hirsch & Slack (1984, eq. 7; Dietz & Killeen 1981) kept in oracles.ts: bit-identical on random
 * data with missing cycles, ties and values below a detection limit.
 */
import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { seasonCovariance, totalSeasonCovariance, type CycleCell } from '../../generator/stats/season-covariance.ts';
import { seasonalKendall } from '../../generator/stats/seasonal-kendall.ts';
import { kendallVariance } from '../../generator/stats/kendall-variance.ts';
import { seasonCovarianceOracle, totalSeasonCovarianceOracle } from './oracles.ts';

// small integer values make ties common; about one cell in five missing, one in six censored
const cell: fc.Arbitrary<CycleCell | null> = fc.oneof(
  { weight: 1, arbitrary: fc.constant(null) },
  { weight: 4, arbitrary: fc.record({ value: fc.integer({ min: 0, max: 6 }).map((v) => v / 2), censored: fc.integer({ min: 0, max: 5 }).map((v) => v === 0) }) },
);
const table = fc.integer({ min: 0, max: 14 }).chain((cycles) => fc.array(fc.array(cell, { minLength: cycles, maxLength: cycles }), { minLength: 0, maxLength: 12 }));

describe('totalSeasonCovariance (Hirsch & Slack 1984 eq. 7)', () => {
  test('equals the all-pairs oracle exactly on random tables with gaps, ties and censoring', () => {
    fc.assert(
      fc.property(table, (cells) => {
        expect(totalSeasonCovariance(cells)).toBe(totalSeasonCovarianceOracle(cells));
      }),
      { numRuns: 400 },
    );
  });

  test('one pair equals the oracle exactly', () => {
    fc.assert(
      fc.property(
        table.filter((t) => t.length >= 2),
        (cells) => {
          expect(seasonCovariance(cells[0] as CycleCell[], cells[1] as CycleCell[])).toBe(seasonCovarianceOracle(cells[0] as CycleCell[], cells[1] as CycleCell[]));
        },
      ),
      { numRuns: 300 },
    );
  });

  test('a season with itself gives the Mann–Kendall variance n(n−1)(2n+5)/18 (Dietz & Killeen 1981)', () => {
    const cells: CycleCell[] = [3, 1, 4, 1.5, 9, 2.6].map((value) => ({ value, censored: false }));
    expect(seasonCovariance(cells, cells)).toBeCloseTo(kendallVariance(6, [], []), 12);
  });

  test('beyond the work limit the correction is left out, and the Seasonal Kendall result says so', () => {
    const cells: CycleCell[][] = [0, 1, 2].map((g) => [1, 2, 3, 4].map((v) => ({ value: v * (g + 1), censored: false })));
    expect(totalSeasonCovariance(cells, 10)).toBeNull();
    expect(totalSeasonCovariance(cells)).not.toBeNull();
    const groups = [0, 1, 2].map((g) => ({ season: String(g), t: Float64Array.from([2001, 2002, 2003, 2004]), y: Float64Array.from([1, 3, 2, 4].map((v) => v + g)) }));
    const limited = seasonalKendall(groups, { covarianceWorkLimit: 10 });
    expect(limited.varSCovariance).toBeNull();
    expect(limited.pCovariance).toBeNull();
    expect(limited.covarianceSkipped).toMatch(/not computed/);
    const full = seasonalKendall(groups);
    expect(full.varSCovariance).not.toBeNull();
    expect(full.covarianceSkipped).toBeUndefined();
    expect(limited.S).toBe(full.S);
  });
});
