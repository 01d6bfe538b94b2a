import { describe, expect, test } from 'vitest';
import { likelihoodWord, probabilityUpFromCounts } from '../../generator/bulletin/likelihood.ts';
import { assertInDelta } from '../asserts.ts';

// Hirsch, Archfield & De Cicco 2015, bands as coded in the authors' USGS EGRETci package
// (R/wBTCode.R, wordLike): right-closed intervals.
describe('likelihood words (Hirsch, Archfield & De Cicco 2015)', () => {
  test('EGRETci example: 0.01, 0.5, 0.55, 0.99', () => {
    expect([0.01, 0.5, 0.55, 0.99].map(likelihoodWord)).toEqual(['highly unlikely', 'about as likely as not', 'about as likely as not', 'highly likely']);
  });
  test('band edges are right-closed: 0.95 very likely, 0.9501 highly likely, 0.66 about as likely as not', () => {
    expect(likelihoodWord(0.95)).toBe('very likely');
    expect(likelihoodWord(0.9501)).toBe('highly likely');
    expect(likelihoodWord(0.66)).toBe('about as likely as not');
    expect(likelihoodWord(0.05)).toBe('highly unlikely');
    expect(likelihoodWord(0.1)).toBe('very unlikely');
    expect(likelihoodWord(0.33)).toBe('unlikely');
    expect(likelihoodWord(0.9)).toBe('likely');
  });
  test('95 upward of 100 resamples → 95.5/101 = 0.94554 → very likely (EGRETci)', () => {
    const p = probabilityUpFromCounts(95, 100);
    assertInDelta(p, 0.94554, 1e-5);
    expect(likelihoodWord(p)).toBe('very likely');
  });
  test('unknown or impossible probabilities give no word', () => {
    expect(likelihoodWord(null)).toBeNull();
    expect(likelihoodWord(Number.NaN)).toBeNull();
    expect(likelihoodWord(1.2)).toBeNull();
  });
});
