import { describe, expect, test } from 'vitest';
import { probabilityUpFromCounts, trendBand } from '../../generator/stats/trend-band.ts';
import { sensSlope } from '../../generator/stats/sens-slope.ts';
import { assertInDelta } from '../asserts.ts';

const t = Float64Array.from({ length: 40 }, (_, i) => 2010 + i / 4);
// a rise of 0.3 per year with a fixed wiggle (no randomness in the data)
const y = t.map((v, i) => 0.3 * (v - 2010) + Math.sin(i * 1.7) * 0.8);

describe('trendBand', () => {
  test('nPos 95 of 100 → 95.5/101 = 0.94554 (Hirsch, Archfield & De Cicco 2015; EGRETci wBT)', () => {
    assertInDelta(probabilityUpFromCounts(95, 100), 0.94554, 5e-6);
    expect(() => probabilityUpFromCounts(101, 100)).toThrow(/0 ≤ nPositive ≤ nBoot/);
  });

  test('same input and seed → the same band; another seed → a different one', () => {
    const a = trendBand(t, y, { resamples: 200, seed: 11 });
    const b = trendBand(t, y, { resamples: 200, seed: 11 });
    const c = trendBand(t, y, { resamples: 200, seed: 12 });
    expect(a).toEqual(b);
    expect(a?.band.lower).not.toEqual(c?.band.lower);
  });

  test("the band brackets the Theil–Sen fit, whose slope is Sen's slope", () => {
    const r = trendBand(t, y, { resamples: 300, seed: 5 });
    const sen = sensSlope(t, y);
    expect(r).not.toBeNull();
    const band = r!.band;
    expect(band.blockLength).toBe(Math.ceil(Math.cbrt(40))); // ⌈n^(1/3)⌉ = 4
    band.t.forEach((time, i) => {
      assertInDelta(band.fit[i], (sen.intercept as number) + (sen.slope as number) * time, 1e-9);
      expect(band.lower[i]).toBeLessThanOrEqual(band.fit[i] as number);
      expect(band.upper[i]).toBeGreaterThanOrEqual(band.fit[i] as number);
    });
    // a clear rise: every resample rises → (300 + 0.5)/301
    assertInDelta(r!.probabilityUp, 300.5 / 301, 1e-12);
  });

  test('fewer than 3 values or one time: null; bad resamples rejected', () => {
    expect(trendBand(Float64Array.of(1, 2), Float64Array.of(1, 2), { resamples: 10, seed: 1 })).toBeNull();
    expect(trendBand(Float64Array.of(1, 1, 1), Float64Array.of(1, 2, 3), { resamples: 10, seed: 1 })).toBeNull();
    expect(() => trendBand(t, y, { resamples: 0, seed: 1 })).toThrow(/invalid resamples/);
  });
});
