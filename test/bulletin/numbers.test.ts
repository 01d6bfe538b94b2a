import { describe, expect, test } from 'vitest';
import { formatNumber, formatSignificant, roundRate, roundSignificant } from '../../generator/bulletin/numbers.ts';

describe('rounding to what the data support', () => {
  test('two significant figures for single numbers', () => {
    // 37 items on 85 m → 43.53 items/100 m (Galgani et al. 2013 normalisation; check value 14).
    expect(formatSignificant((37 * 100) / 85)).toBe('44');
    expect(formatSignificant(0.4712)).toBe('0.47');
    expect(formatSignificant(1234)).toBe('1,200');
    expect(roundSignificant(0.0996)).toBe(0.1);
    expect(formatSignificant(0.0996)).toBe('0.10');
  });
  test('a rate is rounded to the place of the leading digit of its range width', () => {
    const wide = roundRate(6.2, 2.3, 10.1); // width 7.8 → whole numbers
    expect(wide.text).toEqual({ slope: '6', lower: '2', upper: '10' });
    const narrow = roundRate(0.566667, 0.32313, 0.86978); // width 0.55 → one decimal (check value 3 data)
    expect(narrow.text).toEqual({ slope: '0.6', lower: '0.3', upper: '0.9' });
    const huge = roundRate(263, 120, 410); // width 290 → hundreds
    expect(huge.text).toEqual({ slope: '300', lower: '100', upper: '400' });
  });
  test('without a range, two significant figures', () => {
    expect(roundRate(0.0347, null, null).text.slope).toBe('0.035');
  });
  test('negative numbers use the minus sign and never print minus zero', () => {
    expect(formatNumber(-2, 0)).toBe('\u22122');
    expect(formatNumber(-0.04, 0)).toBe('0');
  });
});
