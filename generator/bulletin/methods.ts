/**
 * Sentences for the methods page: how we avoid false alarms across many segments, which
 * likelihood words we use, and how numbers are rounded.
 */
import { formatNumber } from './numbers.ts';

/**
 * The two sentences explaining the false-discovery check (Benjamini & Hochberg 1995,
 * J. R. Statist. Soc. B 57:289–300).
 */
export function falseAlarmSentences(falseDiscoveryRate: number): [string, string] {
  const rate = `${formatNumber(falseDiscoveryRate * 100, falseDiscoveryRate * 100 < 1 ? 1 : 0)}%`;
  return [
    'When we test many stretches of coast at once, a few will seem to change by chance alone.',
    `So we call a measure rising or falling only when it still stands out after the Benjamini–Hochberg adjustment across all the region's stretches, which keeps false alarms to about ${rate} of the changes we report; otherwise we say the direction is uncertain.`,
  ];
}

export const likelihoodMethodSentence =
  'How sure we are of a rise or fall is the bootstrap chance of that direction, put into the words of Hirsch, Archfield and De Cicco (2015): highly unlikely, very unlikely, unlikely, about as likely as not, likely, very likely, highly likely.';

export const roundingMethodSentence =
  'A yearly rate of change and its 95% confidence interval are rounded to the place of the first digit of the interval width; other numbers are shown to two significant figures. An end of the interval is never rounded to zero or across zero: where the interval runs from a fall to a rise, or an end would round to zero, each end is shown to two significant figures.';

/** When a place has no level (no survey in the last four seasons); the drift sentence only where a drift model was given. */
export function noLevelMethodSentences(driftModel: boolean): string[] {
  return [
    'A level needs a survey from the last four seasons. Where there is none, we set no level: missing surveys are never read as the lowest level.',
    'Such a place is drawn on every map as a thin grey dashed line, with an open ring and a question mark in its badge, and the region summary counts it apart.',
    driftModel
      ? 'The bulletin says when the last survey was and what it found. Where the drift model alone still meets a rule, the place gets that level, and the bulletin says that only the drift model set it.'
      : 'The bulletin says when the last survey was and what it found.',
  ];
}

/** How the region's sentence treats places whose trends go different ways. */
export const regionalHomogeneitySentence =
  'Before we tell one direction for the whole region, we test whether the places share one trend (the chi-square test for homogeneity of van Belle and Hughes, 1984). Where they do not, and some places go up while others go down, we say how many go each way, counting only the rises and falls the bulletins claim.';

/** Values reported below the lab's detection limit. */
export const belowDetectionMethodSentence =
  'A value reported below the lab\'s detection limit is never shown as a measurement: the words, tables and downloads say "below the lab\'s detection limit" and give the limit, and the downloads keep the flag.';

/**
 * How the bulletins word a confidence interval, kept apart from the likelihood words (one scheme,
 * Hirsch et al. 2015, for the chance of a direction; the interval gets its statistical name).
 */
export const intervalMethodSentence =
  'The range around a yearly rate is its 95% confidence interval (from Sen\'s slope, or the Seasonal Kendall slope where seasons differ), written as amounts such as "2 fewer to 7 more"; we keep the words likely and unlikely for the chance of a rise or fall alone.';

/** Why a level and a trend can point different ways. */
export const levelAndTrendMethodSentence =
  'The level uses the median of the last four seasons, while a trend uses every year on record, so a level can go down while a long-term trend is still going up.';

/**
 * What the serial-correlation correction does here, exactly as the code does it: computed and
 * published, but the claims rest on the plain test (stats/serial-correction.ts).
 */
export const serialCorrectionMethodSentence =
  "Samples close in time tend to resemble each other, which can make a trend test too confident. We work out the Hamed–Rao correction for this and give it in each bulletin's downloads, where it can only enlarge the variance of the test. The rises and falls the bulletins claim rest on the plain test (the Seasonal Kendall test where seasons differ) and the check across places.";
