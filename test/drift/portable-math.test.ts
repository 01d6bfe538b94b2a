// Portable sine, cosine and arcsine (generator/drift/portable-math.ts) against the engine's own
// Math functions (V8's port of fdlibm, Sun Microsystems 1993) and exact values.
import { describe, expect, test } from 'vitest';
import { portableAsin, portableCos, portableSin } from '../../generator/drift/portable-math.ts';

const ulp = (x: number): number => Math.max(Number.MIN_VALUE, Math.abs(x) * Number.EPSILON);

describe('portable trigonometry', () => {
  test('within 2 units in the last place of Math.sin, Math.cos and Math.asin', () => {
    for (let i = 0; i <= 20_000; i++) {
      const x = -Math.PI + (2 * Math.PI * i) / 20_000;
      expect(Math.abs(portableSin(x) - Math.sin(x))).toBeLessThanOrEqual(2 * ulp(1));
      expect(Math.abs(portableCos(x) - Math.cos(x))).toBeLessThanOrEqual(2 * ulp(1));
      const y = -1 + (2 * i) / 20_000;
      expect(Math.abs(portableAsin(y) - Math.asin(y))).toBeLessThanOrEqual(2 * ulp(Math.PI / 2));
    }
    for (const small of [1e-3, 2.3e-4, 1e-7, 1e-12]) {
      expect(Math.abs(portableSin(small) - Math.sin(small))).toBeLessThanOrEqual(2 * ulp(small));
      expect(Math.abs(portableAsin(small) - Math.asin(small))).toBeLessThanOrEqual(2 * ulp(small));
    }
  });

  test('exact values: sin 0 = 0, cos 0 = 1, asin ±1 = ±π/2, sin π/6 = 1/2, asin 1/2 = π/6', () => {
    expect(portableSin(0)).toBe(0);
    expect(portableCos(0)).toBe(1);
    expect(portableAsin(1)).toBe(Math.PI / 2);
    expect(portableAsin(-1)).toBe(-Math.PI / 2);
    expect(Math.abs(portableSin(Math.PI / 6) - 0.5)).toBeLessThanOrEqual(ulp(0.5));
    expect(Math.abs(portableAsin(0.5) - Math.PI / 6)).toBeLessThanOrEqual(ulp(Math.PI / 6));
    expect(portableAsin(1.5)).toBeNaN();
  });
});
