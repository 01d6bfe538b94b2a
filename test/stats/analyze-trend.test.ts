import { describe, expect, test } from 'vitest';
import { analyzeTrend } from '../../generator/stats/analyze-trend.ts';
import type { SeriesPoint } from '../../generator/stats/types.ts';
import { assertInDelta } from '../asserts.ts';
import { monthlyConcentration, sulfateTime, sulfateValue } from './worked-examples.ts';

const series = (values: (number | null)[], start = 2000): SeriesPoint[] => values.map((value, i) => ({ t: start + i, value }));

describe('analyzeTrend', () => {
  test('USEPA 2009 Example 17-6 end to end: Mann–Kendall and Sen numbers as in EnvStats', () => {
    const points = sulfateTime.map((t, i) => ({ t, value: sulfateValue[i] as number }));
    const r = analyzeTrend(points, { minYears: 0 });
    expect(r.n).toBe(23);
    expect(r.mannKendall?.S).toBe(194);
    assertInDelta(r.sen?.slope, 26.66667, 5e-6);
    assertInDelta(r.sen?.upper, 35.71182, 5e-6);
    expect(r.insufficient).toBeNull();
    expect(r.serialCorrection?.method).toBe('hamed-rao-1998');
  });

  test('USEPA 2009 Example 14-10 with seasons: the Seasonal Kendall numbers as in EnvStats', () => {
    const points: SeriesPoint[] = [];
    for (const year of [1983, 1984, 1985]) {
      monthlyConcentration[year]?.forEach((value, month) => points.push({ t: year + month / 12, value, season: String(month + 1), cycle: year }));
    }
    const r = analyzeTrend(points, { seasonal: true, minYears: 0, minValues: 8 });
    expect(r.seasonalKendall?.S).toBe(35);
    assertInDelta(r.seasonalKendall?.slope, 0.06, 1e-12);
    assertInDelta(r.seasonalKendall?.p, 2.160712e-7, 5e-13);
  });

  test('missing values are dropped and counted out of n', () => {
    const r = analyzeTrend(series([1, null, 3, 4, null, 6, 7, 8, 9, 10]), {});
    expect(r.n).toBe(8);
  });

  test('n = 0…4: never throws, says why, no NaN', () => {
    for (let n = 0; n <= 4; n++) {
      const r = analyzeTrend(series(Array.from({ length: n }, (_, i) => i * 2 + (i % 2))), {});
      expect(r.n).toBe(n);
      expect(r.insufficient?.rule).toBe(n === 0 ? 'no-values' : 'few-values');
      expect(r.insufficient?.reason).toBe(n === 0 ? 'no values' : 'fewer than 8 values');
      expect(JSON.stringify(r)).not.toMatch(/NaN/);
      if (n < 2) expect(r.mannKendall).toBeNull();
      else expect(r.mannKendall?.S).toBeGreaterThan(0);
    }
  });

  test('constant series: S 0, no p, slope 0, "all values are the same"', () => {
    const r = analyzeTrend(series(Array(12).fill(5)), {});
    expect(r.mannKendall).toMatchObject({ S: 0, varS: 0, z: null, p: null });
    expect(r.sen?.slope).toBe(0);
    expect(r.insufficient?.reason).toBe('all values are the same');
  });

  test('all censored: slope not estimable, "most values are below the detection limit"', () => {
    const r = analyzeTrend(
      series(Array(10).fill(0.5)).map((p) => ({ ...p, censored: true })),
      {},
    );
    expect(r.nCensored).toBe(10);
    expect(r.sen?.slope).toBeNull();
    expect(r.sen?.notEstimable).toBe('most values are below the detection limit');
    expect(r.insufficient?.reason).toBe('most values are below the detection limit');
  });

  test('a high detection limit makes the slope not estimable', () => {
    const values = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10];
    const points = series(values).map((p, i) => (i === 2 ? { ...p, value: 20, censored: true } : p));
    const r = analyzeTrend(points, {});
    expect(r.sen?.notEstimable).toBe('detection limits are as high as the typical measured value');
  });

  test('a low detection limit: slope from the measured values, S from all', () => {
    const points = series([0.2, 3, 2, 4, 5, 6, 5, 8, 9, 10]).map((p, i) => (i === 0 ? { ...p, value: 1, censored: true } : p));
    const r = analyzeTrend(points, {});
    expect(r.sen?.notEstimable).toBeNull();
    expect(r.sen?.slope).not.toBeNull();
    expect(r.nCensored).toBe(1);
  });

  test('short span rule and its switch', () => {
    const points = Array.from({ length: 12 }, (_, i) => ({ t: 2020 + i / 4, value: i }));
    expect(analyzeTrend(points, {}).insufficient?.reason).toBe('values span less than 5 years');
    expect(analyzeTrend(points, { minYears: 0 }).insufficient).toBeNull();
  });

  test('seasonal rule: fewer than 2 seasons with 2 values', () => {
    const points = series([1, 2, 3, 4, 5, 6, 7, 8, 9]).map((p, i) => ({ ...p, season: i === 0 ? 'winter' : 'summer' }));
    expect(analyzeTrend(points, { seasonal: true }).insufficient?.rule).toBe('few-seasons');
  });

  test('NaN or Infinity is rejected with a clear error', () => {
    expect(() =>
      analyzeTrend(
        [
          { t: 1, value: 1 },
          { t: 2, value: Number.NaN },
        ],
        {},
      ),
    ).toThrow('analyzeTrend requires finite values; point 1 has value NaN');
    expect(() => analyzeTrend([{ t: Infinity, value: 1 }], {})).toThrow('analyzeTrend requires finite times; point 0 has time Infinity');
  });

  test('bootstrap: band and probabilityUp, deterministic', () => {
    const points = Array.from({ length: 40 }, (_, i) => ({ t: 2000 + i / 4, value: i * 0.1 + Math.cos(i) }));
    const a = analyzeTrend(points, { bootstrap: { resamples: 100, seed: 3 } });
    const b = analyzeTrend(points, { bootstrap: { resamples: 100, seed: 3 } });
    expect(a).toEqual(b);
    expect(a.band?.resamples).toBe(100);
    expect(a.probabilityUp).toBeGreaterThan(0.5);
  });
});
