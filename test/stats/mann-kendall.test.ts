import { describe, expect, test } from 'vitest';
import { mannKendall } from '../../generator/stats/mann-kendall.ts';
import { kendallExactTwoSidedP } from '../../generator/stats/kendall-exact-distribution.ts';
import { kendallVariance } from '../../generator/stats/kendall-variance.ts';
import { assertInDelta } from '../asserts.ts';
import rKendall from '../reference/r-kendall.json' with { type: 'json' };
import datasets from '../reference/datasets.json' with { type: 'json' };
import scipyReference from '../reference/scipy-reference.json' with { type: 'json' };

const f = (values: number[]) => Float64Array.from(values);
const oneTo = (n: number) => f(Array.from({ length: n }, (_, i) => i + 1));

import { littleValues, sulfateTime, sulfateValue } from './worked-examples.ts';

describe('mannKendall', () => {
  test('1..10: S 45, Var 125, z 3.93548, p 8.30e-5 (Mann 1945 / Gilbert 1987 eqs. 16.2–16.5, by formula)', () => {
    const r = mannKendall(oneTo(10), oneTo(10));
    expect(r.S).toBe(45);
    expect(r.varS).toBe(125);
    assertInDelta(r.z, 3.93548, 5e-6); // 44/√125 = 3.935480
    assertInDelta(r.p, 8.3e-5, 5e-8); // two-sided, continuity corrected
    expect(r.tau).toBe(1);
    // exact: only the identity order reaches S = 45 in each tail: 2/10!
    assertInDelta(r.pExact, 2 / 3628800, 1e-15);
  });

  test('Holy Cross hand example: S 54, Var 332.667, z 2.9058, p₁ 0.00183, p₂ 0.00366 (Little, "A Mann-Kendall Example (By Hand)")', () => {
    const r = mannKendall(oneTo(14), f(littleValues));
    expect(r.S).toBe(54);
    assertInDelta(r.varS, (14 * 13 * 33) / 18 - (2 * 1 * 9) / 18, 1e-9); // one tie pair (12.9)
    assertInDelta(r.varS, 332.667, 5e-4);
    assertInDelta(r.z, 2.9058, 5e-5);
    assertInDelta((r.p as number) / 2, 0.00183, 5e-6); // one-sided
    assertInDelta(r.p, 0.00366, 5e-6);
    expect(r.pExact).toBeNull(); // n > 10
  });

  test('USEPA 2009 Example 17-6 sulfate: S 194, Var 1428, z 5.107322, p 3.267574e-07, tau 0.7667984 (EnvStats kendallTrendTest, reproducing the Unified Guidance)', () => {
    const r = mannKendall(f(sulfateTime), f(sulfateValue));
    expect(r.S).toBe(194);
    expect(r.valueTies.sort()).toEqual([2, 2, 3]); // tie groups 3, 2, 2
    assertInDelta(r.varS, 1428, 1e-9);
    assertInDelta(r.z, 5.107322, 5e-7);
    assertInDelta(r.p, 3.267574e-7, 5e-13);
    // Convention: EnvStats prints tau-a = S / [n(n−1)/2]; our `tau` is tau-b (0.7745), `tauA` is the EnvStats form.
    assertInDelta(r.tauA, 0.7667984, 5e-8);
    assertInDelta(r.tau, 194 / Math.sqrt(253 * (253 - 3 - 1 - 1)), 1e-12);
  });

  test('[2.10, 2.10, 2.17]: S 2, Var 2.6667 (tie formula, Gilbert 1987 eq. 16.4)', () => {
    const r = mannKendall(oneTo(3), f([2.1, 2.1, 2.17]));
    expect(r.S).toBe(2);
    assertInDelta(r.varS, 8 / 3, 1e-12);
    expect(r.pExact).toBeNull(); // ties
  });

  test('[3, 6, 9, 6, 8, 6, 7, 3]: S 0, z 0, p 1 (recomputed with SciPy)', () => {
    const r = mannKendall(oneTo(8), f([3, 6, 9, 6, 8, 6, 7, 3]));
    expect(r.S).toBe(0);
    expect(r.z).toBe(0);
    expect(r.p).toBe(1);
  });

  test('ties in time use the general variance (Kendall 1975 eq. 4.4; EnvStats eq. 9)', () => {
    // times 1,1,2,3 and values 1,2,2,3: u = [2] (time), t = [2] (value)
    const v = kendallVariance(4, [2], [2]);
    const expected = (4 * 3 * 13 - 2 * 1 * 9 - 2 * 1 * 9) / 18 + 0 + (2 * 2) / (2 * 4 * 3);
    assertInDelta(v, expected, 1e-12);
    const r = mannKendall(f([1, 1, 2, 3]), f([1, 2, 2, 3]));
    // points 1..4; pairs with t_i < t_j: (1,3)→+1, (1,4)→+1, (2,3)→0 (tie), (2,4)→+1, (3,4)→+1; (1,2) share a time
    expect(r.S).toBe(4);
  });
});

describe('mannKendall against R stats::cor.test(method = "kendall") (R 4.2.2, committed in test/reference)', () => {
  // R's statistic is S/√Var(S) with the same tie-corrected variance; continuity = TRUE gives our z.
  // Convention: R's default has no continuity correction; we compare our S/√Var and our corrected z.
  for (const name of ['Nile', 'LakeHuron', 'nottem', 'co2', 'NileHundreds'] as const) {
    test(`${name}: tau-b, z, p`, () => {
      const data = datasets[name];
      const ref = rKendall[name];
      const r = mannKendall(f(data.t), f(data.y));
      assertInDelta(r.tau, ref.tau, 1e-12);
      assertInDelta(r.S / Math.sqrt(r.varS), ref.z, 1e-9);
      assertInDelta(r.z, ref.zContinuity, 1e-9);
      assertInDelta(r.p, ref.pContinuity, Math.max(1e-14, ref.pContinuity * 1e-8));
    });
  }

  test('LakeHuron first 9 values: exact p from the null distribution equals R (exact = TRUE)', () => {
    const ref = rKendall.LakeHuron9Exact;
    const r = mannKendall(oneTo(9), f(ref.y));
    assertInDelta(r.tau, ref.tau, 1e-12);
    assertInDelta(r.pExact, ref.p, 1e-12);
  });
});

describe('mannKendall against SciPy kendalltau (SciPy 1.10.1, method="asymptotic", committed)', () => {
  // SciPy's p has no continuity correction: compare with 2·P(Z > |S|/√Var).
  for (const name of ['Nile', 'LakeHuron', 'nottem', 'co2', 'NileHundreds'] as const) {
    test(`${name}: tau-b`, () => {
      const data = datasets[name];
      const r = mannKendall(f(data.t), f(data.y));
      assertInDelta(r.tau, scipyReference[name].kendalltau.tau, 1e-12);
    });
  }
});

describe('exact distribution of S', () => {
  test('n = 4: P(|S| ≥ 6) = 2/24 and P(|S| ≥ 0) = 1 (Kendall 1975 §4.3, by enumeration)', () => {
    assertInDelta(kendallExactTwoSidedP(4, 6), 2 / 24, 1e-15);
    expect(kendallExactTwoSidedP(4, 0)).toBe(1);
  });
  test('n = 3: S ∈ {−3, −1, 1, 3} with counts 1, 2, 2, 1', () => {
    assertInDelta(kendallExactTwoSidedP(3, 1), 1, 1e-15);
    assertInDelta(kendallExactTwoSidedP(3, 3), 2 / 6, 1e-15);
  });
});

describe('mannKendall input checks', () => {
  test('NaN and Infinity are rejected with the index', () => {
    expect(() => mannKendall(f([1, 2, 3]), f([1, Number.NaN, 3]))).toThrow(/finite values; index 1 has NaN/);
    expect(() => mannKendall(f([1, Infinity, 3]), f([1, 2, 3]))).toThrow(/finite times; index 1 has Infinity/);
    expect(() => mannKendall(f([1, 2]), f([1, 2, 3]))).toThrow(/equal length/);
  });
  test('n = 0, 1: S 0, Var 0, z and p null', () => {
    for (const n of [0, 1]) {
      const r = mannKendall(oneTo(n), oneTo(n));
      expect(r).toMatchObject({ S: 0, varS: 0, z: null, p: null, tau: null });
    }
  });
  test('n = 2: S 1, Var 1, exact p 1', () => {
    const r = mannKendall(oneTo(2), f([1, 5]));
    expect(r.S).toBe(1);
    expect(r.varS).toBe(1);
    expect(r.z).toBe(0);
    expect(r.pExact).toBe(1);
  });
  test('all values tied: Var 0 and z, p, tau null', () => {
    const r = mannKendall(oneTo(6), f([4, 4, 4, 4, 4, 4]));
    expect(r).toMatchObject({ S: 0, varS: 0, z: null, p: null, tau: null });
  });
  test('all censored at one limit: S 0, no variance', () => {
    const r = mannKendall(oneTo(5), f([1, 1, 1, 1, 1]), Uint8Array.from([1, 1, 1, 1, 1]));
    expect(r.S).toBe(0);
    expect(r.varS).toBe(0);
    expect(r.p).toBeNull();
  });
  test('censored pairs: "<1" below 2 counts, "<5" against 2 is a tie (Helsel 2012 rule)', () => {
    // times 1..3: <1, 2, <5 → (1,2): +1, (1,3): tie, (2,3): tie
    expect(mannKendall(oneTo(3), f([1, 2, 5]), Uint8Array.from([1, 0, 1])).S).toBe(1);
  });
});

test('mannKendall leaves its inputs unchanged', () => {
  const t = f(sulfateTime);
  const y = f(sulfateValue);
  mannKendall(t, y);
  expect(Array.from(t)).toEqual(sulfateTime);
  expect(Array.from(y)).toEqual(sulfateValue);
});
