/**
 * Sentences about one indicator's trend at one segment: stats in, sentences out.
 *
 * Rules the wording keeps:
 * - A rise or fall is claimed only when the direction is "rising" or "falling", which the model
 *   sets only when the Benjamini–Hochberg q-value across the region's segments is below the
 *   false-discovery rate. Otherwise the words say the direction is uncertain. Claimed rates start
 *   "That is about …"; uncertain ones start "Our best guess is …".
 * - How sure we are of a direction uses one scheme only: the Hirsch, Archfield & De Cicco (2015)
 *   bands applied to the probability of the direction claimed (P(up) for a rise, 1 − P(up) for a
 *   fall); see likelihood.ts. Those seven words (highly unlikely … highly likely) are kept for that
 *   probability alone.
 * - The range around Sen's slope is called by its statistical name, "the 95% confidence interval",
 *   and told as plain amounts in words ("runs from 2 fewer to 7 more"). It never borrows a
 *   likelihood word ("likely between 3 and 8" would read as the Hirsch "likely", 66–90%, which a
 *   95% interval is not), and signed numbers are never printed: negative amounts are "fewer".
 * - Sen's slope and its interval are rounded by the width rule of numbers.ts; a claimed rise or fall
 *   is never printed as a change of 0: one more digit is shown until it is not 0 (up to three more).
 * - A unit after the number 1 is singular ("1 fewer item per 100 m").
 * - "Too little data" names the reason in everyday words (how many samples there are and how many
 *   the scenario's minimum-data rule needs, or that most samples were below what the lab can
 *   measure).
 * - Seasons that disagree: the van Belle & Hughes (1984) heterogeneity test at p < 1 − confidence,
 *   told as which seasons went up and which went down.
 */
import type { Direction } from '../model/types.ts';
import type { TrendResult } from '../stats/types.ts';
import { lowerFirst, upperFirst } from './indicator-words.ts';
import { likelihoodWord } from './likelihood.ts';
import { formatNumber, keepBoundsApartFromZero, roundRate, roundRateAt, type RoundedRate } from './numbers.ts';

export interface TrendPhraseInput {
  /** Singular subject, "Beach litter". */
  subject: string;
  /** Unit in words, plural noun first: "items per 100 m of beach". */
  unit: string;
  trend: TrendResult | null;
  direction: Direction;
  qValue: number | null;
  probabilityUp: number | null;
  falseDiscoveryRate: number;
  confidence: number;
  /** How many segments were tested together for this indicator (for the false-discovery words). */
  segmentsTested: number;
  /** Season name → label, "winter" → "Winter". */
  seasonLabels: { [name: string]: string };
  /** Samples (or seasons, for counts summed per season) behind the trend and the years they span. */
  samples: { count: number; firstYear: number; lastYear: number; noun?: 'samples' | 'seasons' } | null;
  /** The scenario's minimum-data rule (settings.trend), used to explain "too little data". */
  minValues?: number;
  minYears?: number;
}

/** The rounded rate a sentence prints, or null when none is printed. Exported for tests. */
export function printedRate(input: TrendPhraseInput): RoundedRate | null {
  const slope = slopeOf(input.trend);
  if (!slope || slope.slope === null) return null;
  let rate = roundRate(slope.slope, slope.lower, slope.upper);
  if ((input.direction === 'rising' || input.direction === 'falling') && rate.slope === 0) {
    for (let extra = 1; extra <= 3 && rate.slope === 0; extra += 1) {
      rate = keepBoundsApartFromZero(roundRateAt(slope.slope, slope.lower, slope.upper, rate.decimals + 1), slope.slope, slope.lower, slope.upper);
    }
  }
  return rate;
}

/** Slope and range: Seasonal Kendall when it ran, else Sen's slope. */
export function slopeOf(trend: TrendResult | null): { slope: number | null; lower: number | null; upper: number | null } | null {
  if (!trend) return null;
  if (trend.sen?.notEstimable) return null;
  const seasonal = trend.seasonalKendall;
  if (seasonal && seasonal.slope !== null) return { slope: seasonal.slope, lower: seasonal.lower, upper: seasonal.upper };
  if (trend.sen && trend.sen.slope !== null) return { slope: trend.sen.slope, lower: trend.sen.lower, upper: trend.sen.upper };
  return null;
}

/** "94 in 100"; never "100 in 100" or "0 in 100", which would claim certainty. */
export function chanceWords(probability: number): string {
  const rounded = Math.round(probability * 100);
  if (rounded >= 100) return 'more than 99 in 100';
  if (rounded <= 0) return 'less than 1 in 100';
  return `${formatNumber(rounded, 0)} in 100`;
}

function percent(confidence: number): string {
  return `${formatNumber(Math.round(confidence * 100), 0)}%`;
}

function endSentence(text: string): string {
  const trimmed = text.trim();
  return /[.!?]$/.test(trimmed) ? trimmed : `${trimmed}.`;
}

/**
 * A unit after a printed number: "1 item per 100 m", "2 items per 100 m". Only the first word of
 * the unit changes, and only when the number printed is exactly "1".
 */
export function unitAfter(printed: string, unit: string): string {
  if (printed !== '1') return unit;
  return unit.replace(/^(\p{L}+?)s(?=[\s/]|$)/u, '$1');
}

/** "3 more", "2 fewer", "no change": a signed rounded amount in words (sizes are never signed). */
export function amountWords(value: number, decimals: number): string {
  if (value === 0) return 'no change';
  return `${formatNumber(Math.abs(value), decimals)} ${value > 0 ? 'more' : 'fewer'}`;
}

/** The printed number of an amount, or null for "no change". */
function amountNumber(value: number, decimals: number): string | null {
  return value === 0 ? null : formatNumber(Math.abs(value), decimals);
}

/**
 * A confidence interval in words, from its rounded ends: "2 to 10 more", "0.4 to 1.2 fewer",
 * "2 fewer to 7 more", "no change to 0.5 more". Never with a likelihood word (see the header).
 */
export function intervalWords(lower: number, upper: number, decimals: number, upperDecimals = decimals): string {
  const lowerDecimals = decimals;
  if (lower > 0) return `${formatNumber(lower, lowerDecimals)} to ${formatNumber(upper, upperDecimals)} more`;
  if (upper < 0) return `${formatNumber(-upper, upperDecimals)} to ${formatNumber(-lower, lowerDecimals)} fewer`;
  if (lower === 0 && upper === 0) return 'no change';
  return `${amountWords(lower, lowerDecimals)} to ${amountWords(upper, upperDecimals)}`;
}

/** Interval words of a rounded rate (each bound with its own decimals). */
export function rateIntervalWords(rate: RoundedRate): string | null {
  if (rate.lower === null || rate.upper === null) return null;
  return intervalWords(rate.lower, rate.upper, rate.lowerDecimals, rate.upperDecimals);
}

/** The number printed last in interval words (for singular/plural of the unit after it). */
function lastIntervalNumber(rate: RoundedRate): string | null {
  if (rate.lower === null || rate.upper === null) return null;
  if (rate.upper < 0) return amountNumber(rate.lower, rate.lowerDecimals);
  return amountNumber(rate.upper, rate.upperDecimals);
}

/**
 * Plain words for a "too little data" reason, keyed by the rule that failed. The trend test reads
 * one value per season (the median of its samples, or the season's total for counts), so the
 * counts here are seasons.
 */
export function insufficientReason(input: TrendPhraseInput): string {
  const trend = input.trend;
  const rule = trend?.insufficient?.rule ?? '';
  const counted = input.samples?.noun === 'seasons';
  const have = trend ? trend.n : 0;
  const seasonsHave = counted
    ? `only ${formatNumber(have, 0)} ${have === 1 ? 'season has' : 'seasons have'} been counted so far`
    : `only ${formatNumber(have, 0)} ${have === 1 ? 'season has' : 'seasons have'} samples so far`;
  switch (rule) {
    case 'few-values':
    case 'min-values':
    case 'n': {
      const need = input.minValues;
      return need !== undefined && have < need ? `${seasonsHave}, and we need at least ${formatNumber(need, 0)}` : seasonsHave;
    }
    case 'short-span':
    case 'min-years':
      return input.minYears !== undefined
        ? `the ${counted ? 'counts' : 'samples'} so far cover less than ${formatNumber(input.minYears, 0)} years, and we need at least ${formatNumber(input.minYears, 0)}`
        : `the ${counted ? 'counts' : 'samples'} so far cover too few years`;
    case 'mostly-censored':
      return trend && trend.nCensored > 0
        ? `in ${formatNumber(trend.nCensored, 0)} of ${formatNumber(trend.n, 0)} seasons, the plastic was too little for the lab to measure`
        : 'in most seasons, the plastic was too little for the lab to measure';
    case 'no-change':
      return 'every value so far is the same';
    case 'few-seasons':
      return 'no two seasons of the year have enough samples each';
    default:
      return lowerFirst(trend?.insufficient?.reason ?? 'there are not enough samples');
  }
}

export function directionSentences(input: TrendPhraseInput): string[] {
  const subject = input.subject;
  const lower = lowerFirst(subject);
  switch (input.direction) {
    case 'rising':
    case 'falling': {
      const up = input.direction === 'rising';
      const sentences = [`${subject} is going ${up ? 'up' : 'down'}.`];
      if (input.probabilityUp !== null) {
        const p = up ? input.probabilityUp : 1 - input.probabilityUp;
        const word = likelihoodWord(p);
        if (word) sentences.push(`A ${up ? 'rise' : 'fall'} is ${word}: the chance is ${chanceWords(p)}.`);
      }
      return sentences;
    }
    case 'no-clear-direction': {
      const sentences = [`We cannot tell if ${lower} is going up or down.`];
      const p = input.trend?.seasonalKendall?.p ?? input.trend?.mannKendall?.p ?? null;
      const alone = p !== null && p < input.falseDiscoveryRate;
      const passed = input.qValue !== null && input.qValue < input.falseDiscoveryRate;
      if (passed) {
        // The test passed the false-discovery check, but the slope is zero or points the other way
        // (see generator/model/direction.ts), so no direction is claimed.
        const slope = slopeOf(input.trend)?.slope ?? null;
        sentences.push(
          slope === 0
            ? 'The values hint at a change, but our best estimate of the yearly change is zero, so we do not call it a rise or a fall.'
            : 'The values hint at a change, but our estimates do not agree on its direction, so we do not call it a rise or a fall.',
        );
      } else if (alone && input.segmentsTested > 1) {
        sentences.push(
          `On its own this place seems to show a change. But we test ${formatNumber(input.segmentsTested, 0)} places at once, and a change this size could be chance.`,
        );
      } else {
        sentences.push('The change we see could be chance.');
      }
      return sentences;
    }
    case 'too-little-data': {
      if (!input.trend || input.trend.n === 0) return [`There are no samples of ${lower} here yet, so we cannot say.`];
      return [`Too little data to say if ${lower} is changing.`, endSentence(upperFirst(insufficientReason(input)))];
    }
  }
}

export function rateSentences(input: TrendPhraseInput): string[] {
  if (input.direction === 'too-little-data') return [];
  const rate = printedRate(input);
  if (!rate) {
    if (input.trend?.sen?.notEstimable) return ['So we give no yearly rate of change.'];
    return [];
  }
  const ci = `The ${percent(input.confidence)} confidence interval`;
  const d = rate.decimals;
  const slopeNumber = amountNumber(rate.slope, d);
  const slopeUnit = unitAfter(slopeNumber ?? '', input.unit);
  const hasInterval = rate.lower !== null && rate.upper !== null;
  if (input.direction === 'rising' || input.direction === 'falling') {
    const sentences = [`That is about ${amountWords(rate.slope, d)} ${slopeUnit} each year.`];
    const interval = rateIntervalWords(rate);
    if (interval !== null) sentences.push(`${ci} runs from ${interval}.`);
    return sentences;
  }
  if (rate.lower !== null && rate.upper !== null && rate.slope === 0 && rate.lower === 0 && rate.upper === 0) {
    return [
      input.samples?.noun === 'seasons'
        ? 'Most seasons had the same count, so we cannot give a yearly rate of change.'
        : 'Most values are the same, so we cannot give a yearly rate of change.',
    ];
  }
  if (rate.slope === 0) {
    if (rate.lower === null || rate.upper === null) return ['Our best guess is close to no change.'];
    const last = lastIntervalNumber(rate);
    return ['Our best guess is close to no change.', `${ci} runs from ${rateIntervalWords(rate)} ${unitAfter(last ?? '', input.unit)} each year.`];
  }
  const sentences = [`Our best guess is about ${amountWords(rate.slope, d)} ${slopeUnit} each year.`];
  if (hasInterval && rate.lower !== null && rate.upper !== null) {
    const spansZero = rate.lower <= 0 && rate.upper >= 0;
    sentences.push(spansZero ? `But ${lowerFirst(ci)} runs from ${rateIntervalWords(rate)}, so there may be no change at all.` : `${ci} runs from ${rateIntervalWords(rate)}.`);
  }
  return sentences;
}

export function censoredSentences(input: TrendPhraseInput): string[] {
  const trend = input.trend;
  if (!trend || trend.nCensored === 0) return [];
  // Already said in the reason when most values are too low to measure.
  if (input.direction === 'too-little-data' && trend.insufficient?.rule === 'mostly-censored') return [];
  return [`In ${formatNumber(trend.nCensored, 0)} of ${formatNumber(trend.n, 0)} seasons, the plastic was too little for the lab to measure.`];
}

export function disagreementSentences(input: TrendPhraseInput): string[] {
  const seasonal = input.trend?.seasonalKendall;
  const het = seasonal?.heterogeneity;
  if (!seasonal || !het || !(het.p < 1 - input.confidence)) return [];
  const ups = seasonal.seasons.filter((s) => s.S > 0).map((s) => lowerFirst(input.seasonLabels[s.season] ?? s.season));
  const downs = seasonal.seasons.filter((s) => s.S < 0).map((s) => lowerFirst(input.seasonLabels[s.season] ?? s.season));
  if (ups.length > 0 && downs.length > 0) {
    return [`The seasons do not agree: it went up in ${joinWords(ups)} but down in ${joinWords(downs)}.`];
  }
  return ['The seasons do not agree: the change is much bigger in some seasons than in others.'];
}

export function samplesSentence(input: TrendPhraseInput): string[] {
  const s = input.samples;
  if (!s || s.count === 0) return [];
  const span = s.firstYear === s.lastYear ? `in ${s.firstYear}` : `from ${s.firstYear} to ${s.lastYear}`;
  const noun = s.noun === 'seasons' ? (s.count === 1 ? 'season' : 'seasons') : s.count === 1 ? 'sample' : 'samples';
  return [`This rests on ${formatNumber(s.count, 0)} ${noun} ${span}.`];
}

/** Whether `seasonsDisagree` holds for a trend (same test as disagreementSentences). */
export function seasonsDisagree(trend: TrendResult | null, confidence: number): boolean {
  const het = trend?.seasonalKendall?.heterogeneity;
  return Boolean(het && het.p < 1 - confidence);
}

export function joinWords(words: readonly string[]): string {
  if (words.length <= 1) return words.join('');
  return `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}`;
}

/** All sentences about one indicator's trend, in reading order. */
export function phraseTrend(input: TrendPhraseInput): string[] {
  return [...directionSentences(input), ...censoredSentences(input), ...rateSentences(input), ...disagreementSentences(input), ...samplesSentence(input)];
}

/**
 * For counts summed per season (wildlife reports) when every season counted 0: say so instead of
 * "too little data". `what` is the plural noun phrase, e.g. "animals harmed by litter".
 */
export function noneReportedSentences(what: string, firstYear: number, lastYear: number): string[] {
  const span = firstYear === lastYear ? `in ${firstYear}` : `from ${firstYear} to ${lastYear}`;
  return [`No ${what} were reported here ${span}, so there is no trend to tell.`];
}
