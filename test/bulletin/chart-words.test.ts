/**
 * The chart rule shared by the chart and its text alternative: what is drawn and what the words
 * say must agree. The rule itself is ours (generator/bulletin/chart-words.ts); the requirement
 * that a text alternative describe what the image shows is WCAG 2.1 success criterion 1.1.1
 * (W3C, 2018).
 */
import { describe, expect, it } from 'vitest';
import { chartOmitted, chartTrendMark, chartTrendWords, everyValueZero, type ChartPlanInput } from '../../generator/bulletin/chart-words.ts';
import type { TrendResult } from '../../generator/stats/types.ts';

const trend = (withBand: boolean): TrendResult => ({
  n: 10,
  nCensored: 0,
  mannKendall: null,
  sen: { slope: 1.5, lower: 0.5, upper: 2.5, intercept: -3000, confidence: 0.95 },
  band: withBand ? { t: [2017, 2026], fit: [1, 2], lower: [0, 1], upper: [2, 3], resamples: 100, blockLength: 2, seed: 1 } : null,
  insufficient: null,
});
const base: ChartPlanInput = { direction: 'rising', seasonsDisagree: false, trend: trend(true), values: [1, 2, 3, 4] };

describe('chart trend mark and its words', () => {
  it('draws the band, or the line alone, and says so', () => {
    expect(chartTrendMark(base)).toBe('band');
    expect(chartTrendWords(base, 0.95)).toBe("The line is the trend (Sen's slope), with its 95% band.");
    const lineOnly = { ...base, trend: trend(false) };
    expect(chartTrendMark(lineOnly)).toBe('line');
    expect(chartTrendWords(lineOnly, 0.9)).toBe("The line is the trend (Sen's slope).");
  });

  it('never claims a line where seasons disagree (panels only)', () => {
    const seasonal = { ...base, seasonsDisagree: true };
    expect(chartTrendMark(seasonal)).toBe('none');
    expect(chartTrendWords(seasonal, 0.95)).not.toMatch(/line is the trend/);
    expect(chartTrendWords(seasonal, 0.95)).toMatch(/one panel per season/i);
  });

  it('draws no line for too little data', () => {
    const few = { ...base, direction: 'too-little-data' as const };
    expect(chartTrendMark(few)).toBe('none');
    expect(chartTrendWords(few, 0.95)).toMatch(/too little data/);
  });

  it('omits the chart when every value is 0, but not when none is known', () => {
    const zeros = { ...base, direction: 'too-little-data' as const, values: [0, 0, null, 0] };
    expect(everyValueZero(zeros.values)).toBe(true);
    expect(chartOmitted(zeros)).toBe(true);
    expect(chartTrendMark(zeros)).toBe('none');
    expect(chartTrendWords(zeros, 0.95)).toBe('Every value is 0, so no chart is drawn.');
    expect(everyValueZero([null, null])).toBe(false);
    expect(everyValueZero([])).toBe(false);
  });
});
