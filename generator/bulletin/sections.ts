/**
 * The parts of a bulletin written for each kind of reader: shellfish growers and gatherers,
 * visitors, and reporters. Pure: numbers and sentences in, sections out.
 */
import type { Contact, SeasonRef, ShellfishUse } from '../model/types.ts';
import { formatNumber, formatSignificant } from './numbers.ts';

export interface GrowersInput {
  shellfish: ShellfishUse;
  /** Shellfish tissue this season and over the last four seasons (median), in `unit`. */
  tissue: { seasonValue: number | null; assessmentValue: number | null; unit: string; trendSentences: string[] } | null;
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
  if (tissue && tissue.seasonValue !== null) {
    sentences.push(`Shellfish samples this season held a median of ${formatSignificant(tissue.seasonValue)} ${tissue.unit}.`);
  } else if (tissue && tissue.assessmentValue !== null) {
    sentences.push(
      `No shellfish were tested this season. Over the last four seasons the median was ${formatSignificant(tissue.assessmentValue)} ${tissue.unit}.`,
    );
  } else {
    sentences.push('No shellfish from here have been tested for plastic yet.');
  }
  if (tissue) sentences.push(...tissue.trendSentences);
  if (input.nearestZone) {
    sentences.push(
      `The nearest spot offshore where the drift model shows litter gathering is ${zoneName(input.nearestZone.id)}, about ${formatSignificant(input.nearestZone.distanceKm)} km away.`,
    );
  } else if (input.driftAvailable) {
    sentences.push('The drift model shows no spot offshore near here where litter gathers.');
  }
  sentences.push('Read the shellfish cautions before you harvest.');
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

export function visitorsSection(input: VisitorsInput): { title: string; sentences: string[] } {
  const sentences: string[] = [];
  const litter = input.litter;
  if (litter && litter.seasonValue !== null) {
    sentences.push(`Beach surveys this season found a median of ${formatSignificant(litter.seasonValue)} ${litter.unit}.`);
    if (litter.threshold) {
      const limit = formatSignificant(litter.threshold.value);
      sentences.push(
        litter.seasonValue >= litter.threshold.value
          ? `That is at or above the EU limit of ${limit}.`
          : `That is below the EU limit of ${limit}.`,
      );
    }
  } else {
    sentences.push('There was no beach survey here this season.');
  }
  if (litter) sentences.push(...litter.trendSentences);
  if (input.drift) {
    sentences.push(`The drift model brought about ${formatSignificant(input.drift.arrivalsPerKm)} bits of litter ashore per km this season.`);
  }
  sentences.push('If you pick up litter, follow the safety steps below.');
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
      { label: 'Data behind this bulletin', href: `${input.permalink}data/` },
      { label: 'How we work it out', href: '/methods/' },
      { label: 'All bulletins for this season', href: `/seasons/${input.season.id}/` },
    ],
  };
}

export function countWords(n: number, one: string, many: string): string {
  return `${formatNumber(n, 0)} ${n === 1 ? one : many}`;
}
