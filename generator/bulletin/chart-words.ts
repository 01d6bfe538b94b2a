/**
 * What an indicator chart draws, and the chart's short text alternative, from one rule so the
 * words always match the picture.
 *
 * The rule:
 * - every value 0 (e.g. no animal ever reported): no chart at all, a sentence and the data table;
 * - seasons of the year disagree: one panel per season, observations only (the model has no
 *   per-season slope, so no trend line is drawn);
 * - too little data for a trend: observations only, no trend line (a line would suggest a claim the
 *   bulletin does not make);
 * - otherwise Sen's line, with its bootstrap band when the model has one.
 */
import type { Direction } from '../model/types.ts';
import type { TrendResult } from '../stats/types.ts';

export type ChartTrendMark = 'band' | 'line' | 'none';

export interface ChartPlanInput {
  direction: Direction;
  seasonsDisagree: boolean;
  trend: TrendResult | null;
  /** Observed values (null = missing). */
  values: readonly (number | null)[];
}

/** True when there is at least one value and every value is exactly 0. */
export function everyValueZero(values: readonly (number | null)[]): boolean {
  const present = values.filter((v): v is number => v !== null);
  return present.length > 0 && present.every((v) => v === 0);
}

/** Which trend mark the chart draws. */
export function chartTrendMark(input: ChartPlanInput): ChartTrendMark {
  if (input.seasonsDisagree || input.direction === 'too-little-data' || everyValueZero(input.values)) return 'none';
  const band = input.trend?.band ?? null;
  if (band && band.t.length > 1) return 'band';
  const sen = input.trend?.sen ?? null;
  if (sen && sen.slope !== null && sen.intercept !== null && input.values.filter((v) => v !== null).length > 1) return 'line';
  return 'none';
}

/** True when the chart is replaced by a sentence (every value 0: nothing to draw). */
export function chartOmitted(input: ChartPlanInput): boolean {
  return everyValueZero(input.values);
}

/** The sentence about the trend mark (or its absence) closing a chart's text alternative. */
export function chartTrendWords(input: ChartPlanInput, confidence: number): string {
  if (chartOmitted(input)) return 'Every value is 0, so no chart is drawn.';
  if (input.seasonsDisagree) {
    return 'One panel per season of the year, because the seasons do not move together; the dots are the samples and no trend line is drawn.';
  }
  const mark = chartTrendMark(input);
  if (mark === 'band') return `The line is the trend (Sen's slope), with its ${Math.round(confidence * 100)}% band.`;
  if (mark === 'line') return "The line is the trend (Sen's slope).";
  if (input.direction === 'too-little-data') return 'No trend line is drawn: there is too little data for one.';
  return 'No trend line is drawn.';
}
