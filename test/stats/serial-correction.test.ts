import { describe, expect, test } from 'vitest';
import { analyzeTrend } from '../../generator/stats/analyze-trend.ts';
import { decimalYear } from '../../generator/model/seasons.ts';
import { averageRanks, hamedRaoCorrection, hamedRaoFactor, tieTolerance, yueWangFactor } from '../../generator/stats/serial-correction.ts';
import { assertInDelta } from '../asserts.ts';

describe('serial correlation corrections', () => {
  test('Yue & Wang 2004 with only ρ₁ = 0.5, n = 20: n/n* = 1.95 (formula)', () => {
    assertInDelta(yueWangFactor(20, [0.5]), 1.95, 1e-12);
  });
  test('Hamed & Rao 1998 with no significant lag: factor 1 (eq. 18)', () => {
    expect(hamedRaoFactor(20, [])).toBe(1);
  });
  test('Hamed & Rao 1998 eq. 18 with ρ(1) = 0.5, n = 10: 1 + 2/(10·9·8)·9·8·7·0.5', () => {
    assertInDelta(hamedRaoFactor(10, [{ lag: 1, rho: 0.5 }]), 1 + (2 / 720) * 504 * 0.5, 1e-12);
  });
  test('a series with no serial dependence after detrending keeps the plain variance', () => {
    // y = 2t exactly: detrended residuals are all 0, ranks all tied → no autocorrelation
    const t = Float64Array.from({ length: 12 }, (_, i) => i);
    const y = t.map((v) => 2 * v);
    const r = hamedRaoCorrection(t, y, { S: 66, varS: 212.6667, slope: 2 });
    expect(r.factor).toBe(1);
    expect(r.varS).toBe(212.6667);
  });
  test('a strongly alternating series gets a negative lag-1 correlation', () => {
    const t = Float64Array.from({ length: 30 }, (_, i) => i);
    const y = t.map((v) => (v % 2 === 0 ? 1 : -1) + 0.01 * v);
    const r = hamedRaoCorrection(t, y, { S: 10, varS: 3141.667, slope: 0.01 });
    expect(r.significantLags).toContain(1);
    // eq. 18 gives n/n* < 1 here; the correction is bounded at 1 (our rule, serial-correction.ts header)
    expect(r.factor).toBe(1);
  });
  test('average ranks give ties the mean rank', () => {
    expect(Array.from(averageRanks([3, 1, 3, 2]))).toEqual([3.5, 1, 3.5, 2]);
  });
});

describe('case 6, a serial-correlation figure that is not stable', () => {
  test('case 6: the same 12 values give the same Hamed–Rao factor with whole years and with ISO dates', () => {
    // Exactly linear series: before, ranks of the detrended values were decided by rounding noise and
    // the factor was 1, 1.20 or 1.29 depending on the time format (seen on this code before the fix).
    for (const [step, start] of [
      [0.1, 0.3],
      [0.7, 1.1],
      [1.3, 0.2],
      [0.01, 0.05],
      [2.2, 0.1],
    ] as const) {
      const values = Array.from({ length: 12 }, (_, i) => Number((start + step * i).toFixed(4)));
      const factors = new Set<number>();
      const ps = new Set<number | null>();
      const formats: ((year: number) => number)[] = [
        (year) => year,
        (year) => decimalYear(`${year}-01-01`),
        (year) => decimalYear(`${year}-07-01`),
        (year) => decimalYear(`${year}-03-15`),
      ];
      for (const time of formats) {
        const r = analyzeTrend(
          values.map((value, i) => ({ t: time(2015 + i), value })),
          {},
        );
        factors.add(r.serialCorrection?.factor ?? NaN);
        ps.add(r.serialCorrection?.p ?? null);
      }
      expect([...factors]).toEqual([1]);
      expect(ps.size).toBe(1);
    }
  });
  test('case 6: ties under the stated tolerance, and a factor below 1 is bounded at 1', () => {
    expect(Array.from(averageRanks([1, 1 + 1e-12, 2, 3], 1e-9))).toEqual([1.5, 1.5, 3, 4]);
    expect(Array.from(averageRanks([1, 1.5, 2], 0.6))).toEqual([2, 2, 2]);
    expect(tieTolerance(3.6525, 0)).toBeCloseTo(0.02, 12); // two days of a trend of 3.6525 a year
    expect(hamedRaoFactor(12, [{ lag: 1, rho: -0.6 }])).toBeLessThan(1); // eq. 18 unbounded
  });
});
