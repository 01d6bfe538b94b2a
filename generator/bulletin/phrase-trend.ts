/**
 * Sentences about one indicator's trend at one segment: stats in, sentences out.
 *
 * Rules the wording keeps:
 * - A rise or fall is claimed only when the direction is "rising" or "falling", which the model
 *   sets only when the Benjamini–Hochberg q-value across the region's segments is below the
 *   false-discovery rate. Otherwise the words say the direction is uncertain.
 * - How sure we are uses one scheme: the Hirsch, Archfield & De Cicco (2015) bands applied to the
 *   probability of the direction claimed (P(up) for a rise, 1 − P(up) for a fall); see likelihood.ts.
 * - Sen's slope and its range are rounded by the width rule of numbers.ts; a claimed rise or fall is
 *   never printed as a change of 0: one more digit is shown until it is not 0 (up to three more).
 * - Seasons that disagree: the van Belle & Hughes (1984) heterogeneity test at p < 1 − confidence.
 */
import type { Direction } from '../model/types.ts';
import type { TrendResult } from '../stats/types.ts';
import { lowerFirst } from './indicator-words.ts';
import { likelihoodWord } from './likelihood.ts';
import { formatNumber, roundRate, roundToDecimals, type RoundedRate } from './numbers.ts';

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
  /** Samples behind the trend and the years they span; null when there are none. */
  samples: { count: number; firstYear: number; lastYear: number } | null;
}

/** The rounded rate a sentence prints, or null when none is printed. Exported for tests. */
export function printedRate(input: TrendPhraseInput): RoundedRate | null {
  const slope = slopeOf(input.trend);
  if (!slope || slope.slope === null) return null;
  let rate = roundRate(slope.slope, slope.lower, slope.upper);
  if ((input.direction === 'rising' || input.direction === 'falling') && rate.slope === 0) {
    for (let extra = 1; extra <= 3 && rate.slope === 0; extra += 1) {
      rate = roundRateAt(slope.slope, slope.lower, slope.upper, rate.decimals + 1);
    }
  }
  return rate;
}

function roundRateAt(slope: number, lower: number | null, upper: number | null, decimals: number): RoundedRate {
  const r = (x: number): number => roundToDecimals(x, decimals);
  const s = r(slope);
  const lo = lower === null ? null : r(lower);
  const hi = upper === null ? null : r(upper);
  return {
    slope: s,
    lower: lo,
    upper: hi,
    decimals,
    text: {
      slope: formatNumber(s, decimals),
      lower: lo === null ? null : formatNumber(lo, decimals),
      upper: hi === null ? null : formatNumber(hi, decimals),
    },
  };
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

/** "94 in 100" */
export function chanceWords(probability: number): string {
  return `${formatNumber(Math.round(probability * 100), 0)} in 100`;
}

function percent(confidence: number): string {
  return `${formatNumber(Math.round(confidence * 100), 0)}%`;
}

function endSentence(text: string): string {
  const trimmed = text.trim();
  return /[.!?]$/.test(trimmed) ? trimmed : `${trimmed}.`;
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
      if (alone && input.segmentsTested > 1) {
        sentences.push(
          `On its own this place seems to change. But we test ${formatNumber(input.segmentsTested, 0)} places at once, and a change this size could be chance.`,
        );
      } else {
        sentences.push('The change we see could be chance.');
      }
      return sentences;
    }
    case 'too-little-data': {
      if (!input.trend || input.trend.n === 0) return [`There are no samples of ${lower} here yet, so we cannot say.`];
      const reason = input.trend.insufficient?.reason ?? 'not enough values';
      return [`Too little data to say if ${lower} is changing: ${endSentence(lowerFirst(reason))}`];
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
  const range =
    rate.text.lower !== null && rate.text.upper !== null ? ` The ${percent(input.confidence)} range is ${rate.text.lower} to ${rate.text.upper}.` : '';
  if (input.direction === 'rising' || input.direction === 'falling') {
    const size = formatNumber(Math.abs(rate.slope), rate.decimals);
    const more = input.direction === 'rising' ? 'more' : 'fewer';
    let claimedRange = range;
    if (input.direction === 'falling' && rate.lower !== null && rate.upper !== null) {
      // A fall is told as "fewer", so its range is told as sizes of the fall: −10 to −2 → 2 to 10.
      claimedRange = ` The ${percent(input.confidence)} range is ${formatNumber(-rate.upper, rate.decimals)} to ${formatNumber(-rate.lower, rate.decimals)} ${more}.`;
    }
    return [`That is about ${size} ${more} ${input.unit} each year.${claimedRange}`];
  }
  const signed = rate.slope > 0 ? `+${rate.text.slope}` : rate.text.slope;
  const includesZero = rate.lower !== null && rate.upper !== null && rate.lower <= 0 && rate.upper >= 0;
  const tail = includesZero ? ' That range takes in no change at all.' : '';
  return [`Our best guess is a change of ${signed} ${input.unit} a year.${range}${tail}`];
}

export function censoredSentences(input: TrendPhraseInput): string[] {
  const trend = input.trend;
  if (!trend || trend.nCensored === 0) return [];
  const sentences = [
    `${formatNumber(trend.nCensored, 0)} of ${formatNumber(trend.n, 0)} values were too low for the lab to measure.`,
  ];
  return sentences;
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
  return [`This rests on ${formatNumber(s.count, 0)} ${s.count === 1 ? 'sample' : 'samples'} ${span}.`];
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
  return [
    ...directionSentences(input),
    ...censoredSentences(input),
    ...rateSentences(input),
    ...disagreementSentences(input),
    ...samplesSentence(input),
  ];
}
