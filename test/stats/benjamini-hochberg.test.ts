import { describe, expect, test } from 'vitest';
import { benjaminiHochberg, benjaminiHochbergDecision } from '../../generator/stats/benjamini-hochberg.ts';
import { assertInDelta } from '../asserts.ts';

// Benjamini & Hochberg 1995, 15 p-values of Neuhaus et al. 1992 (as in the SciPy false_discovery_control docstring).
const pValues = Object.freeze([0.0001, 0.0004, 0.0019, 0.0095, 0.0201, 0.0278, 0.0298, 0.0344, 0.0459, 0.324, 0.4262, 0.5719, 0.6528, 0.759, 1.0]);

describe('benjaminiHochberg', () => {
  test('BH 1995 example: adjusted p-values (SciPy false_discovery_control docstring)', () => {
    const expected = [0.0015, 0.003, 0.0095, 0.035625, 0.0603, 0.063857, 0.063857, 0.0645, 0.0765, 0.486, 0.581182, 0.714875, 0.753231, 0.813214, 1];
    const adjusted = benjaminiHochberg(pValues);
    expected.forEach((value, i) => assertInDelta(adjusted[i], value, 5e-7));
  });
  test('BH 1995 example: 4 rejections at q 0.05, cutoff 0.0095; rank-5 threshold 5·0.05/15 = 0.016667 < 0.0201', () => {
    const decision = benjaminiHochbergDecision(pValues, 0.05);
    expect(decision.rejected).toBe(4);
    expect(decision.cutoff).toBe(0.0095);
    assertInDelta((5 * 0.05) / 15, 0.016667, 5e-7);
    // Bonferroni rejects 3 (p ≤ 0.05/15) (BH 1995)
    expect(pValues.filter((p) => p <= 0.05 / 15).length).toBe(3);
  });
  test('order of the input is kept', () => {
    const shuffled = [pValues[9], pValues[0], pValues[3]] as number[];
    const adjusted = benjaminiHochberg(shuffled);
    expect(adjusted).toEqual([(0.324 * 3) / 3, 0.0001 * 3, (0.0095 * 3) / 2]);
  });
  test('empty input and bad p-values', () => {
    expect(benjaminiHochberg([])).toEqual([]);
    expect(() => benjaminiHochberg([0.5, Number.NaN])).toThrow(/index 1 has NaN/);
    expect(() => benjaminiHochbergDecision([0.5], 0)).toThrow(/invalid false-discovery rate/);
  });
});
