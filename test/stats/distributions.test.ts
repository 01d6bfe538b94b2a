import { describe, expect, test } from 'vitest';
import { normalQuantile, normalUpperTail } from '../../generator/stats/normal-distribution.ts';
import { chiSquareUpperTail } from '../../generator/stats/chi-square-distribution.ts';
import { assertInDelta } from '../asserts.ts';

// Reference values from SciPy 1.10.1 (scipy.stats.norm.sf / norm.ppf / chi2.sf), recomputed here.
describe('normal and chi-square distributions', () => {
  test('normal upper tail (SciPy norm.sf)', () => {
    const cases: [number, number][] = [
      [0, 0.5],
      [1.96, 0.024997895148220435],
      [3, 0.0013498980316300933],
      [3.93548, 4.151528949715375e-5],
      [5.107322, 1.63378330071754e-7],
      [8, 6.22096057427174e-16],
      [-1.5, 0.9331927987311419],
    ];
    for (const [x, p] of cases) assertInDelta(normalUpperTail(x), p, p * 1e-12);
  });
  test('normal quantile (SciPy norm.ppf)', () => {
    assertInDelta(normalQuantile(0.975), 1.959963984540054, 1e-13);
    assertInDelta(normalQuantile(0.01), -2.3263478740408408, 1e-13);
    assertInDelta(normalQuantile(0.999999), 4.753424308817087, 1e-12);
    expect(normalQuantile(0.5)).toBe(0);
    expect(() => normalQuantile(1)).toThrow(/p in \(0, 1\)/);
  });
  test('chi-square upper tail (SciPy chi2.sf)', () => {
    assertInDelta(chiSquareUpperTail(3.841458820694124, 1), 0.05, 1e-14);
    assertInDelta(chiSquareUpperTail(8.3077, 1), 0.003947735137025114, 1e-14);
    assertInDelta(chiSquareUpperTail(30, 10), 0.000856641210775301, 1e-15);
    assertInDelta(chiSquareUpperTail(0.1071882, 11), 0.9999999996601869, 1e-14);
  });
});
