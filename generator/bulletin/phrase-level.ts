/**
 * Sentences about a segment's level: the headline, the level now and last season, why, why it
 * changed, and what changed since last season. Pure: level results and names in, sentences out.
 *
 * The headline answers a reader's first two questions in one sentence: is plastic here going up
 * or down (only the directions that pass the false-discovery check are named), and how bad is it
 * now (the level, with its rank in words).
 */
import type { Direction, LevelResult } from '../model/types.ts';
import { levelWords } from '../risk/levels.ts';
import { lowerFirst, upperFirst } from './indicator-words.ts';
import { unitAfter } from './phrase-trend.ts';

export interface MovingMeasure {
  subject: string;
  direction: Direction;
}

/**
 * "Beach litter is going up at Brenna Sands, where plastic pollution is Noticeable (level 2 of 4)
 * in autumn 2026."
 */
export function headline(segmentName: string, level: LevelResult, seasonLabel: string, moving?: readonly MovingMeasure[]): string {
  const season = lowerFirst(seasonLabel);
  // No level: the headline says so and why, before anything else.
  if (level.id === 'not-set') return `Level not set at ${segmentName} in ${season}: ${lowerFirst(level.note ?? 'there is no recent survey here.')}`;
  const where = level.note
    ? `${level.note.startsWith('Only the drift model') ? 'the drift model alone puts' : 'reports of harmed animals alone put'} plastic pollution at ${levelWords(level.id)} in ${season}, with no recent survey`
    : `plastic pollution is ${levelWords(level.id)} in ${season}`;
  if (moving === undefined) return `${segmentName}: ${where}.`;
  if (moving.length === 0) return `No samples here yet show a rise or fall in plastic at ${segmentName}, where ${where}.`;
  const trend = movingClause(moving);
  if (trend) return `${upperFirst(trend)} at ${segmentName}, where ${where}.`;
  const known = moving.some((m) => m.direction === 'no-clear-direction');
  if (known) return `No clear rise or fall in plastic at ${segmentName}, where ${where}.`;
  return `Too soon to tell if plastic is rising or falling at ${segmentName}, where ${where}.`;
}

/** The last survey of a place that has none in the last four seasons, as a note prints it. */
export interface LastSurvey {
  /** "autumn 2022" */
  seasonLabel: string;
  /** the season's median as printed, "62" */
  valueText: string;
  censored: boolean;
  /** unit in words, "items per 100 m of beach" */
  unit: string;
}

/**
 * Why a place has no level, or why its level rests on the drift model alone. Absence of evidence
 * is never read as the lowest level.
 * "No survey here in the last four seasons; the last, in autumn 2022, found 62 items per 100 m of beach."
 * "No survey has been made here."
 * "Only the drift model sets this level: no survey was made here in the last four seasons."
 */
export function noRecentSurveyNote(last: LastSurvey | null, setBy: 'drift-model' | 'wildlife-reports' | null): string {
  if (setBy !== null) {
    const who = setBy === 'drift-model' ? 'Only the drift model sets this level' : 'Only reports of animals harmed by litter set this level';
    return last === null ? `${who}: no survey has been made here.` : `${who}: no survey was made here in the last four seasons.`;
  }
  if (last === null) return 'No survey has been made here.';
  const found = last.censored ? `plastic ${belowDetectionWords(last.valueText, last.unit)}` : `${last.valueText} ${unitAfter(last.valueText, last.unit)}`;
  return `No survey here in the last four seasons; the last, in ${last.seasonLabel}, found ${found}.`;
}

export function levelNowSentence(level: LevelResult): string {
  if (level.id === 'not-set') return 'No level is set this season.';
  return `The level this season is ${levelWords(level.id)}.`;
}

export function levelLastSeasonSentence(previous: LevelResult | null): string {
  return previous && previous.id !== 'not-set' ? `Last season it was ${levelWords(previous.id)}.` : 'We have no level for last season.';
}

/** The level now and last season in one sentence (the summary's first sentence). */
export function levelSummarySentence(level: LevelResult, previous: LevelResult | null): string {
  if (level.id === 'not-set') {
    return previous && previous.id !== 'not-set'
      ? `No level is set this season. Last season it was ${levelWords(previous.id)}.`
      : previous
        ? 'No level is set this season, nor was one last season.'
        : 'No level is set this season. We have no level for last season.';
  }
  const now = `The level this season is ${levelWords(level.id)}`;
  if (!previous || previous.id === 'not-set') return `${now}. We have no level for last season.`;
  if (previous.rank === level.rank) return `${now}, the same as last season.`;
  return `${now}, ${level.rank > previous.rank ? 'up' : 'down'} from ${levelWords(previous.id)} last season.`;
}

/** Lower-case the first letter of a rule text, unless it starts an acronym or a name ("EU", "Clean Coast Index"). */
function ruleClause(text: string): string {
  if (/^[A-Z]{2}/u.test(text)) return text;
  if (/^The Clean Coast Index/u.test(text)) return `the${text.slice(3)}`;
  return lowerFirst(text);
}

export function whySentence(level: LevelResult): string {
  // the headline already tells what the last survey found; here, the rule
  if (level.id === 'not-set') return 'Why no level: a level needs a survey from the last four seasons.';
  const top = level.hits[0];
  if (!top) return 'No rule for a higher level applies here, so the level is the lowest.';
  const why = `Why this level: ${ruleClause(top.text)}`;
  return level.note ? `${why} ${level.note}` : why;
}

export function levelChangeSentence(level: LevelResult, previous: LevelResult | null): string | null {
  if (!previous) return null;
  if (level.id === 'not-set' && previous.id === 'not-set') return null;
  if (level.id === 'not-set') return `Last season the level was ${levelWords(previous.id)}; this season no level is set.`;
  if (previous.id === 'not-set') return `Last season no level was set; this season it is ${levelWords(level.id)}.`;
  if (level.rank > previous.rank) return `The level went up from ${levelWords(previous.id)} to ${levelWords(level.id)}.`;
  if (level.rank < previous.rank) return `The level went down from ${levelWords(previous.id)} to ${levelWords(level.id)}.`;
  return `The level stayed at ${levelWords(level.id)}.`;
}

/**
 * "The level went down from Marked (level 3 of 4) to Noticeable (level 2 of 4) because the median
 * beach litter over the last four seasons fell to 92 items per 100 m of beach, below 100."
 * `reason` is a clause naming the rule that started or stopped applying (see risk/explain-change.ts);
 * without one the plain level-change sentence is returned.
 */
export function levelChangeWithReason(level: LevelResult, previous: LevelResult | null, reason: string | null): string | null {
  const plain = levelChangeSentence(level, previous);
  if (!plain || !previous || previous.rank === level.rank || !reason || level.rank === 0 || previous.rank === 0) return plain;
  return `${plain.slice(0, -1)} because ${reason}.`;
}

/**
 * Said when the level moved one way while a measure's long-term trend goes the other way, so a
 * reader told both sees why they can differ.
 */
export function levelAndTrendSentence(level: LevelResult, previous: LevelResult | null, moving: readonly MovingMeasure[]): string | null {
  if (!previous || previous.rank === level.rank || level.rank === 0 || previous.rank === 0) return null;
  const against = level.rank < previous.rank ? 'rising' : 'falling';
  if (!moving.some((m) => m.direction === against)) return null;
  return 'The level looks at the last four seasons; the trend looks at all the years, so the two can differ.';
}

export const directionPhrases: { readonly [K in Direction]: string } = {
  rising: 'going up',
  falling: 'going down',
  'no-clear-direction': 'no clear direction',
  'too-little-data': 'too little data',
};

function pastDirection(subject: string, direction: Direction): string {
  const lower = lowerFirst(subject);
  switch (direction) {
    case 'rising':
      return `${lower} was going up`;
    case 'falling':
      return `${lower} was going down`;
    case 'no-clear-direction':
      return `we could not tell if ${lower} was going up or down`;
    case 'too-little-data':
      return `there was too little data to tell if ${lower} was changing`;
  }
}

function presentDirection(direction: Direction): string {
  switch (direction) {
    case 'rising':
      return 'it is going up';
    case 'falling':
      return 'it is going down';
    case 'no-clear-direction':
      return 'we cannot tell if it is going up or down';
    case 'too-little-data':
      return 'there is too little data to tell';
  }
}

/**
 * "Last season we could not tell if beach litter was going up or down; now it is going up."
 * Null when nothing changed.
 */
export function directionChangeSentence(subject: string, now: Direction, before: Direction | null): string | null {
  if (before === null || before === now) return null;
  return `Last season ${pastDirection(subject, before)}; now ${presentDirection(now)}.`;
}

/** A season's median as printed: the number, or whether it was below the lab's detection limit. */
export interface PrintedValue {
  /** the number as printed (two significant figures), "0.05" */
  text: string;
  /** true when the median is a sample reported below the lab's detection limit; `text` is then that limit */
  censored: boolean;
}

/** "below the lab's detection limit (0.05)": a value reported as "<0.05" is never read as a measurement. */
export function belowDetectionWords(limit: string, unit?: string): string {
  // a unit's own brackets become a comma inside these ("per gram of shellfish, wet weight")
  const inner = unit ? ` ${unitAfter(limit, unit).replace(/ \((.*)\)$/u, ', $1')}` : '';
  return `below the lab's detection limit (${limit}${inner})`;
}

/** "0.62", or "below the lab's detection limit (0.05)". */
export function printedValueWords(value: PrintedValue): string {
  return value.censored ? belowDetectionWords(value.text) : value.text;
}

/**
 * "Beach litter this season: 44 items per 100 m of beach, against 30 last season."
 * A censored value reads "below the lab's detection limit (0.05 …)", never as a measurement:
 * "Plastic in shellfish this season: below the lab's detection limit (0.05 particles per gram of
 * shellfish (wet weight)), against 0.62 last season."
 */
export function seasonValueSentence(subject: string, unit: string, now: string | PrintedValue | null, before: string | PrintedValue | null): string | null {
  if (now === null) return null;
  const current: PrintedValue = typeof now === 'string' ? { text: now, censored: false } : now;
  const last: PrintedValue | null = before === null ? null : typeof before === 'string' ? { text: before, censored: false } : before;
  const shown = current.censored ? belowDetectionWords(current.text, unit) : `${current.text} ${unitAfter(current.text, unit)}`;
  if (last === null) return `${subject} this season: ${shown}.`;
  if (current.censored && last.censored && current.text === last.text) return `${subject} this season: ${shown}, as it was last season.`;
  if (last.censored) return `${subject} this season: ${shown}; last season it was ${belowDetectionWords(last.text)}.`;
  return `${subject} this season: ${shown}, against ${last.text} last season.`;
}

/**
 * For counts summed per season (animals reported): whole numbers, singular and plural, and "no"
 * for zero. `what` is the plural noun phrase, "animals harmed by litter".
 * "No animals harmed by litter were reported this season or last season."
 * "1 animal harmed by litter was reported this season, against 3 last season."
 */
export function seasonCountSentence(what: string, now: number | null, before: number | null): string | null {
  if (now === null) return null;
  const singular = what.replace(/^(\S+?)s(?=\s|$)/u, '$1');
  const count = (n: number): string => (n === 0 ? 'none' : String(n));
  if (now === 0) {
    if (before === 0) return `No ${what} were reported this season or last season.`;
    if (before === null) return `No ${what} were reported this season.`;
    return `No ${what} were reported this season, against ${count(before)} last season.`;
  }
  const subject = now === 1 ? `1 ${singular} was` : `${now} ${what} were`;
  if (before === null) return `${subject} reported this season.`;
  if (before === now) return `${subject} reported this season, the same as last season.`;
  return `${subject} reported this season, against ${count(before)} last season.`;
}

function movingClause(moving: readonly MovingMeasure[], lowerAll = false): string | null {
  const up = moving.filter((m) => m.direction === 'rising').map((m) => m.subject);
  const down = moving.filter((m) => m.direction === 'falling').map((m) => m.subject);
  const parts: string[] = [];
  if (up.length > 0) parts.push(`${listSubjects(up, lowerAll)} ${up.length === 1 ? 'is' : 'are'} going up`);
  if (down.length > 0) parts.push(`${listSubjects(down, lowerAll || up.length > 0)} ${down.length === 1 ? 'is' : 'are'} going down`);
  return parts.length === 0 ? null : parts.join(', and ');
}

/** The main trend sentence of the summary, from the indicators that are going up or down. */
export function mainTrendSentence(moving: readonly MovingMeasure[]): string {
  const clause = movingClause(moving);
  if (clause) return `${clause}.`;
  if (moving.length > 0 && moving.every((m) => m.direction === 'too-little-data')) {
    return 'There are too few samples here yet to tell if any measure is going up or down.';
  }
  return 'No measure here is clearly going up or down.';
}

function listSubjects(subjects: readonly string[], lowerAll = false): string {
  const words = subjects.map((s, i) => (i === 0 && !lowerAll ? s : lowerFirst(s)));
  if (words.length <= 1) return words.join('');
  return `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}`;
}
