/**
 * The parts of a bulletin written for each kind of reader: shellfish growers and gatherers,
 * visitors, and reporters. Pure: numbers and sentences in, sections out.
 */
import type { Contact, SeasonRef, ShellfishUse } from '../model/types.ts';
import { formatNumber, formatPlain } from './numbers.ts';
import { belowDetectionWords } from './phrase-level.ts';
import { unitAfter } from './phrase-trend.ts';

export interface GrowersInput {
  shellfish: ShellfishUse;
  /** Shellfish tissue this season and over the last four seasons (median), in `unit`. */
  tissue: {
    seasonValue: number | null;
    /** the season's median was below the lab's detection limit (seasonValue is the limit) */
    seasonValueCensored?: boolean;
    assessmentValue: number | null;
    assessmentValueCensored?: boolean;
    unit: string;
    trendSentences: string[];
  } | null;
  nearestZone: { id: string; distanceKm: number } | null;
  driftAvailable: boolean;
}

/** "zone-3" → "zone 3" */
export function zoneName(id: string): string {
  return id.replace(/-/g, ' ');
}

export function growersSection(input: GrowersInput): { title: string; sentences: string[] } | null {
  if (input.shellfish === 'none') return null;
  const sentences: string[] = [];
  const tissue = input.tissue;
  if (tissue && tissue.seasonValue !== null && tissue.seasonValueCensored) {
    sentences.push(`In shellfish samples this season, the plastic was ${belowDetectionWords(formatPlain(tissue.seasonValue), tissue.unit)}.`);
  } else if (tissue && tissue.seasonValue !== null) {
    sentences.push(`Shellfish samples this season held a median of ${formatPlain(tissue.seasonValue)} ${unitAfter(formatPlain(tissue.seasonValue), tissue.unit)}.`);
  } else if (tissue && tissue.assessmentValue !== null && tissue.assessmentValueCensored) {
    sentences.push(`No shellfish were tested this season. Over the last four seasons the median was ${belowDetectionWords(formatPlain(tissue.assessmentValue), tissue.unit)}.`);
  } else if (tissue && tissue.assessmentValue !== null) {
    sentences.push(
      `No shellfish were tested this season. Over the last four seasons the median was ${formatPlain(tissue.assessmentValue)} ${unitAfter(formatPlain(tissue.assessmentValue), tissue.unit)}.`,
    );
  } else {
    sentences.push('No shellfish from here have been tested for plastic yet.');
  }
  if (tissue) sentences.push(...tissue.trendSentences);
  if (input.nearestZone) {
    sentences.push(
      `The nearest spot offshore where the drift model shows litter gathering is ${zoneName(input.nearestZone.id)}, about ${formatPlain(input.nearestZone.distanceKm)} km away.`,
    );
  } else if (input.driftAvailable) {
    sentences.push('The drift model shows no spot offshore near here where litter gathers.');
  }
  sentences.push('Read the shellfish cautions in the Cautions box before you harvest.');
  return { title: 'For shellfish growers and gatherers', sentences };
}

export interface VisitorsInput {
  litter: {
    seasonValue: number | null;
    unit: string;
    threshold: { value: number } | null;
    trendSentences: string[];
  } | null;
  drift: { arrivalsPerKm: number } | null;
}

/**
 * The comparison with the threshold value used in the European Union for coastline macro litter
 * (20 items per 100 m; Van Loon et al. 2020). It is a benchmark, not a legal limit, and applies to
 * EU coasts: the words say so. Compared on the printed (rounded) value, so the words agree with
 * the number the reader sees.
 */
export function thresholdSentence(seasonValue: number, threshold: number): string {
  const shown = Number(formatPlain(seasonValue).replace(/,/g, ''));
  const benchmark = `the threshold value used in the European Union (${formatPlain(threshold)} items per 100 m)`;
  const where = shown > threshold ? `above ${benchmark}` : shown === threshold ? `the same as ${benchmark}` : `below ${benchmark}`;
  return `That is ${where}. It is a yardstick for judging beaches, not a legal limit.`;
}

/**
 * Modelled arrivals are particles of a drift model, not counted litter: the sentence says so and
 * says what they are good for.
 */
export function driftSentences(arrivalsPerKm: number): string[] {
  const amount =
    arrivalsPerKm === 0
      ? 'no modelled particles reached this stretch this season'
      : `about ${formatPlain(arrivalsPerKm)} modelled ${formatPlain(arrivalsPerKm) === '1' ? 'particle' : 'particles'} per km of shore reached this stretch this season`;
  return [`In the drift model, ${amount}.`, 'This shows where floating litter tends to go, not how much there is.'];
}

export function visitorsSection(input: VisitorsInput): { title: string; sentences: string[] } {
  const sentences: string[] = [];
  const litter = input.litter;
  if (litter && litter.seasonValue !== null) {
    sentences.push(`Beach surveys this season found a median of ${formatPlain(litter.seasonValue)} ${unitAfter(formatPlain(litter.seasonValue), litter.unit)}.`);
    if (litter.threshold) sentences.push(thresholdSentence(litter.seasonValue, litter.threshold.value));
  } else {
    sentences.push('There was no beach survey here this season.');
  }
  if (litter) sentences.push(...litter.trendSentences);
  if (input.drift) sentences.push(...driftSentences(input.drift.arrivalsPerKm));
  sentences.push('If you pick up litter, follow the safety steps in the Cautions box.');
  return { title: 'For visitors', sentences };
}

export interface ReportersInput {
  segmentName: string;
  season: SeasonRef;
  published: string;
  publisher: Contact;
  permalink: string;
  keyNumbers: { label: string; value: string }[];
}

export function citation(input: ReportersInput): string {
  const year = input.published.slice(0, 4);
  return `${input.publisher.name} (${year}). ${input.segmentName}: coastal plastic bulletin, ${input.season.label}. Published ${input.published}. ${input.permalink}`;
}

export function reportersSection(input: ReportersInput): {
  keyNumbers: { label: string; value: string }[];
  citation: string;
  links: { label: string; href: string }[];
} {
  return {
    keyNumbers: input.keyNumbers,
    citation: citation(input),
    links: [
      { label: 'Observations (CSV)', href: `${input.permalink}observations.csv` },
      { label: 'Trend results (CSV)', href: `${input.permalink}results.csv` },
      { label: 'This bulletin as data (JSON)', href: `${input.permalink}bulletin.json` },
      { label: 'How the numbers are worked out', href: '/methods/' },
      { label: 'All places this season', href: `/seasons/${input.season.id}/` },
    ],
  };
}

export function countWords(n: number, one: string, many: string): string {
  return `${formatNumber(n, 0)} ${n === 1 ? one : many}`;
}
