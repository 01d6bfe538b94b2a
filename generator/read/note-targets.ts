/**
 * Publisher notes that point nowhere (settings `notes`): a note is shown on the bulletins of its
 * season, so a note naming a season that is not published, or a segment the segments file does
 * not have, would never be shown. Each is an error at `check`, naming the settings file, the note
 * (its index), the value, what was expected and the nearest known id (Levenshtein edit distance,
 * category-words.ts), never a note dropped silently.
 *
 * `noteTargetProblems` is the pure decision; `checkNoteTargets` reports it.
 */
import { NoteTargetUnknown } from '../errors.ts';
import type { ScenarioSettings } from '../scenario/settings.ts';
import type { Segment } from '../scenario/types.ts';
import { didYouMean, nearestWord } from './category-words.ts';
import type { IssueLog } from './issue-log.ts';

export interface NoteTargetProblem {
  /** JSON path of the offending value, e.g. "$.notes[2].segment". */
  path: string;
  value: string;
  expected: string;
  suggestion: string | null;
}

function listed(ids: readonly string[]): string {
  const shown = ids.slice(0, 6).map((id) => `"${id}"`);
  return ids.length > 6 ? `${shown.join(', ')}, … (${ids.length} in all)` : shown.join(', ');
}

/**
 * Every note whose season is not among `publishedSeasons`, or whose segment (when not null) is
 * not among `segmentIds`. A segment left out of the segments file (`leftOut`, reported there) is
 * named as such. With no segments at all (the segments file was not usable) segments are not checked.
 */
export function noteTargetProblems(
  notes: ScenarioSettings['notes'],
  publishedSeasons: readonly string[],
  segmentIds: readonly string[],
  leftOut: ReadonlySet<string> = new Set(),
): NoteTargetProblem[] {
  const problems: NoteTargetProblem[] = [];
  const seasons = new Set(publishedSeasons);
  const segments = new Set(segmentIds);
  notes.forEach((note, i) => {
    if (!seasons.has(note.season)) {
      problems.push({
        path: `$.notes[${i}].season`,
        value: note.season,
        expected: `a season listed in "publications" (${listed(publishedSeasons)})`,
        suggestion: nearestWord(note.season, publishedSeasons),
      });
    }
    if (note.segment !== null && segmentIds.length > 0 && !segments.has(note.segment)) {
      problems.push({
        path: `$.notes[${i}].segment`,
        value: note.segment,
        expected: leftOut.has(note.segment)
          ? 'a segment that is kept (this one was left out of the segments file; see its own error)'
          : `a segment id of the segments file, or null for the whole season (${listed(segmentIds)})`,
        suggestion: leftOut.has(note.segment) ? null : nearestWord(note.segment, segmentIds),
      });
    }
  });
  return problems;
}

export function checkNoteTargets(settings: ScenarioSettings, segments: readonly Segment[], leftOut: ReadonlySet<string>, settingsFile: string, log: IssueLog): void {
  const published = settings.publications.map((p) => p.season);
  const ids = segments.map((s) => s.id).sort();
  for (const problem of noteTargetProblems(settings.notes, published, ids, leftOut)) {
    const expected = `${problem.expected}${didYouMean(problem.suggestion)}`;
    log.add(NoteTargetUnknown, NoteTargetUnknown.message(settingsFile, problem.path, JSON.stringify(problem.value), expected), {
      file: settingsFile,
      row: null,
      column: problem.path,
      value: problem.value,
      expected,
      severity: 'error',
      excluded: true,
    });
  }
}
