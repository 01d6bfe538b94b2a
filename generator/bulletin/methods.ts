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
  'A yearly rate of change and its range are rounded to the place of the first digit of the range width; other numbers are shown to two significant figures.';
