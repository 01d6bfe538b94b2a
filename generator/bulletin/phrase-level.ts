/**
 * Sentences about a segment's level: the headline, the level now and last season, why, and what
 * changed since last season. Pure: level results and names in, sentences out.
 */
import type { Direction, LevelResult } from '../model/types.ts';
import { levelWords } from '../risk/levels.ts';
import { lowerFirst } from './indicator-words.ts';

export function headline(segmentName: string, level: LevelResult, seasonLabel: string): string {
  return `${segmentName}: plastic pollution is ${levelWords(level.id)} in ${lowerFirst(seasonLabel)}.`;
}

export function levelNowSentence(level: LevelResult): string {
  return `The level this season is ${levelWords(level.id)}.`;
}

export function levelLastSeasonSentence(previous: LevelResult | null): string {
  return previous ? `Last season it was ${levelWords(previous.id)}.` : 'We have no level for last season.';
}

export function whySentence(level: LevelResult): string {
  const top = level.hits[0];
  if (!top) return 'No rule for a higher level matched, so the level is the lowest.';
  return `Why this level: ${top.text}`;
}

export function levelChangeSentence(level: LevelResult, previous: LevelResult | null): string | null {
  if (!previous) return null;
  if (level.rank > previous.rank) return `The level went up from ${levelWords(previous.id)} to ${levelWords(level.id)}.`;
  if (level.rank < previous.rank) return `The level went down from ${levelWords(previous.id)} to ${levelWords(level.id)}.`;
  return `The level stayed at ${levelWords(level.id)}.`;
}

export const directionPhrases: { readonly [K in Direction]: string } = {
  rising: 'going up',
  falling: 'going down',
  'no-clear-direction': 'no clear direction',
  'too-little-data': 'too little data',
};

/** "Beach litter: last season no clear direction; now going up." Null when nothing changed. */
export function directionChangeSentence(subject: string, now: Direction, before: Direction | null): string | null {
  if (before === null || before === now) return null;
  return `${subject}: last season ${directionPhrases[before]}; now ${directionPhrases[now]}.`;
}

/** "Beach litter this season: 44 items per 100 m of beach, against 30 last season." */
export function seasonValueSentence(
  subject: string,
  unit: string,
  now: string | null,
  before: string | null,
): string | null {
  if (now === null) return null;
  if (before === null) return `${subject} this season: ${now} ${unit}.`;
  return `${subject} this season: ${now} ${unit}, against ${before} last season.`;
}

/** The main trend sentence of the summary, from the indicators that are going up or down. */
export function mainTrendSentence(moving: { subject: string; direction: Direction }[]): string {
  const up = moving.filter((m) => m.direction === 'rising').map((m) => m.subject);
  const down = moving.filter((m) => m.direction === 'falling').map((m) => m.subject);
  const parts: string[] = [];
  if (up.length > 0) parts.push(`${listSubjects(up)} ${up.length === 1 ? 'is' : 'are'} going up`);
  if (down.length > 0) parts.push(`${listSubjects(down, up.length > 0)} ${down.length === 1 ? 'is' : 'are'} going down`);
  if (parts.length === 0) return 'No measure here is clearly going up or down.';
  return `${parts.join(', and ')}.`;
}

function listSubjects(subjects: readonly string[], lowerAll = false): string {
  const words = subjects.map((s, i) => (i === 0 && !lowerAll ? s : lowerFirst(s)));
  if (words.length <= 1) return words.join('');
  return `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}`;
}
