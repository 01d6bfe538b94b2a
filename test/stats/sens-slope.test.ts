import { describe, expect, test } from 'vitest';
import { sensSlope } from '../../generator/stats/sens-slope.ts';
import { selectPairwiseSlopes } from '../../generator/stats/slope-selection.ts';
import { assertInDelta } from '../asserts.ts';
import datasets from '../reference/datasets.json' with { type: 'json' };
import scipyReference from '../reference/scipy-reference.json' with { type: 'json' };
import { littleValues, sulfateTime, sulfateValue } from './worked-examples.ts';

const f = (values: number[]) => Float64Array.from(values);
const oneTo = (n: number) => f(Array.from({ length: n }, (_, i) => i + 1));

describe('sensSlope', () => {
  test('Holy Cross example: slope 0.566667 of 91 slopes; 95% CI 0.32313–0.86978 interpolated (recomputed with SciPy/NumPy; Gilbert 1987 §16.5)', () => {
    const r = sensSlope(oneTo(14), f(littleValues));
    expect(r.nSlopes).toBe(91);
    assertInDelta(r.slope, 0.566667, 5e-7);
    assertInDelta(r.lower, 0.32313, 5e-6);
    assertInDelta(r.upper, 0.86978, 5e-6);
  });

  test('Holy Cross example with rounded ranks gives 0.325–0.8667 (the other convention, recomputed)', () => {
    // C = 1.96·√332.667 = 35.748; M1 = 27.626 → 28; M2 + 1 = 64.374 → 64
    const [low, high] = selectPairwiseSlopes(oneTo(14), f(littleValues), [28, 64]);
    assertInDelta(low, 0.325, 1e-12);
    assertInDelta(high, 0.8667, 5e-5);
  });

  test('USEPA 2009 Example 17-6: slope 26.66667, CI 20.00000–35.71182, intercept −1909.333 (EnvStats kendallTrendTest)', () => {
    const r = sensSlope(f(sulfateTime), f(sulfateValue));
    assertInDelta(r.slope, 26.66667, 5e-6);
    assertInDelta(r.lower, 20, 5e-6);
    assertInDelta(r.upper, 35.71182, 5e-6);
    assertInDelta(r.intercept, -1909.333, 5e-4);
  });

  test('the slope-selection path gives the same numbers as listing every slope', () => {
    const direct = sensSlope(f(sulfateTime), f(sulfateValue));
    const selected = sensSlope(f(sulfateTime), f(sulfateValue), { directLimit: 0, seed: 99 });
    expect(selected).toEqual(direct);
  });

  test('limits are null when the ranks fall outside 1..N′ (n = 4, Gilbert 1987 §16.5)', () => {
    // slopes −1, 0.5, 1, 4/3, 2, 3 → median (1 + 4/3)/2; Var(S) = 8.667, C = 5.77: M1 = 0.11 < 1, M2 + 1 = 6.9 > 6
    const r = sensSlope(oneTo(4), f([1, 3, 2, 5]));
    assertInDelta(r.slope, 7 / 6, 1e-12);
    expect(r.lower).toBeNull();
    expect(r.upper).toBeNull();
  });
});

describe('sensSlope against SciPy theilslopes (SciPy 1.10.1, committed)', () => {
  // SciPy: same median slope, Conover intercept ("separate"), interval from ROUNDED ranks.
  // Convention: we interpolate Gilbert's ranks; here we check our selection at SciPy's own ranks.
  for (const name of ['Nile', 'LakeHuron', 'nottem', 'co2', 'NileHundreds'] as const) {
    test(`${name}`, () => {
      const data = datasets[name];
      const ref = scipyReference[name].theilslopes;
      const t = f(data.t);
      const y = f(data.y);
      const r = sensSlope(t, y);
      expect(r.nSlopes).toBe(ref.nSlopes);
      assertInDelta(r.slope, ref.slope, 1e-12 * Math.max(1, Math.abs(ref.slope)));
      assertInDelta(r.intercept, ref.intercept, 1e-9 * Math.max(1, Math.abs(ref.intercept)));
      const [low, high] = selectPairwiseSlopes(t, y, [ref.lowRank, ref.highRank], { directLimit: 0 });
      expect(low).toBe(ref.low);
      expect(high).toBe(ref.high);
      // our interpolated limits bracket the same region: within one rank of SciPy's
      expect(r.lower).not.toBeNull();
      expect(r.upper).not.toBeNull();
    });
  }
});

describe('sensSlope edge cases', () => {
  test('n = 0 and 1 and equal times: not estimable', () => {
    expect(sensSlope(f([]), f([])).notEstimable).toBe('fewer than two distinct times');
    expect(sensSlope(f([1]), f([1])).slope).toBeNull();
    expect(sensSlope(f([2, 2, 2]), f([1, 5, 3])).slope).toBeNull();
  });
  test('n = 2: the one slope; limits null', () => {
    const r = sensSlope(f([0, 2]), f([1, 5]));
    expect(r.slope).toBe(2);
    expect(r.lower).toBeNull();
    expect(r.upper).toBeNull();
  });
  test('constant series: slope 0, intercept the value', () => {
    const r = sensSlope(oneTo(12), f(Array(12).fill(3)));
    expect(r.slope).toBe(0);
    expect(r.intercept).toBe(3);
  });
  test('bad confidence and NaN are rejected', () => {
    expect(() => sensSlope(oneTo(3), oneTo(3), { confidence: 1 })).toThrow(/invalid confidence; not in \(0, 1\): 1/);
    expect(() => sensSlope(oneTo(3), f([1, Number.NaN, 2]))).toThrow(/finite values/);
  });
});

test('slope selection rejects times out of order', () => {
  expect(() => selectPairwiseSlopes(Float64Array.of(1, 3, 2), Float64Array.of(1, 2, 3), [1])).toThrow(/sorted ascending; index 2 has 2 after 3/);
});
