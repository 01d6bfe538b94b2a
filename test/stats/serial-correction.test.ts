import { describe, expect, test } from 'vitest';
import { averageRanks, hamedRaoCorrection, hamedRaoFactor, yueWangFactor } from '../../generator/stats/serial-correction.ts';
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
    expect(r.factor).toBeLessThan(1);
  });
  test('average ranks give ties the mean rank', () => {
    expect(Array.from(averageRanks([3, 1, 3, 2]))).toEqual([3.5, 1, 3.5, 2]);
  });
});
