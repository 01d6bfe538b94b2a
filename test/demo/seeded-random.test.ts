/**
 * The seeded random source: reproducible sequences and the right moments. Moment checks use the
 * textbook means and variances (uniform: 1/2 and 1/12; normal: μ, σ²; Poisson: λ, λ) with
 * tolerances of several standard errors for the sample size used (common practice).
 */
import { describe, expect, test } from 'vitest';
import { createSeededRandom, hashLabel } from '../../generator/random/seeded-random.ts';
import { assertInDelta } from '../asserts.ts';

const N = 100_000;

describe('createSeededRandom', () => {
  test('the same seed gives the same sequence; another seed a different one', () => {
    const a = createSeededRandom(7);
    const b = createSeededRandom(7);
    const c = createSeededRandom(8);
    const seqA = Array.from({ length: 20 }, () => a.uniform());
    expect(Array.from({ length: 20 }, () => b.uniform())).toEqual(seqA);
    expect(Array.from({ length: 20 }, () => c.uniform())).not.toEqual(seqA);
  });

  test('derived streams depend on seed and label only', () => {
    const a = createSeededRandom(3);
    a.uniform();
    a.normal();
    const b = createSeededRandom(3);
    expect(a.derive('x').uniform()).toBe(b.derive('x').uniform());
    expect(b.derive('x').uniform()).not.toBe(b.derive('y').uniform());
  });

  test('uniform in [0, 1) with mean 1/2 and variance 1/12', () => {
    const random = createSeededRandom(11);
    let sum = 0;
    let sumSq = 0;
    let outside = 0;
    for (let i = 0; i < N; i++) {
      const u = random.uniform();
      if (!(u >= 0 && u < 1)) outside++;
      sum += u;
      sumSq += u * u;
    }
    expect(outside).toBe(0);
    const mean = sum / N;
    assertInDelta(mean, 0.5, 0.005); // standard error 0.29/√N ≈ 0.0009
    assertInDelta(sumSq / N - mean * mean, 1 / 12, 0.002);
  });

  test('normal deviates have the requested mean and standard deviation (Box–Muller)', () => {
    const random = createSeededRandom(12);
    let sum = 0;
    let sumSq = 0;
    for (let i = 0; i < N; i++) {
      const z = random.normal(2, 3);
      sum += z;
      sumSq += z * z;
    }
    const mean = sum / N;
    assertInDelta(mean, 2, 0.05); // standard error 3/√N ≈ 0.0095
    assertInDelta(Math.sqrt(sumSq / N - mean * mean), 3, 0.05);
  });

  test('Poisson counts have mean and variance λ', () => {
    const random = createSeededRandom(13);
    let sum = 0;
    let sumSq = 0;
    for (let i = 0; i < N; i++) {
      const k = random.poisson(2.5);
      sum += k;
      sumSq += k * k;
    }
    const mean = sum / N;
    assertInDelta(mean, 2.5, 0.03);
    assertInDelta(sumSq / N - mean * mean, 2.5, 0.06);
    expect(() => random.poisson(-1)).toThrow(/invalid mean/);
  });

  test('integer covers both ends; FNV-1a hash of "a" is 0xe40c292c (FNV test vector; value from memory)', () => {
    const random = createSeededRandom(14);
    const seen = new Set<number>();
    for (let i = 0; i < 1000; i++) seen.add(random.integer(1, 3));
    expect([...seen].sort()).toEqual([1, 2, 3]);
    expect(hashLabel('a')).toBe(0xe40c292c);
  });
});
