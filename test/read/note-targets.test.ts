// Publisher notes that point nowhere (settings "notes"): a note naming a season that is not
// published, or a segment the segments file does not have, is an error at check naming the
// settings file, the note by its index, the value, what was expected and the nearest known id
// (Levenshtein edit distance), never a note dropped silently. Each of the first three tests
// failed before the check existed (verified: with the call in load-scenario.ts removed, check
// reported no issue for them).
import { readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import { afterAll, describe, expect, test } from 'vitest';
import { loadScenario } from '../../generator/read/load-scenario.ts';
import { noteTargetProblems } from '../../generator/read/note-targets.ts';
import { baseScenario, expectIssue, scenarioCopy } from './fixture-scenario.ts';

type Note = { season: string; segment: string | null; text: string };
const made: string[] = [];
afterAll(() => {
  for (const dir of made) rmSync(dir, { recursive: true, force: true });
});

async function checkWithNotes(notes: Note[]) {
  const settings = JSON.parse(readFileSync(path.join(baseScenario, 'scenario.json'), 'utf8')) as { [key: string]: unknown };
  const dir = scenarioCopy({ files: { 'scenario.json': JSON.stringify({ ...settings, notes }, null, 2) } });
  made.push(dir);
  return (await loadScenario(dir)).report;
}

describe('publisher notes that point nowhere', () => {
  test('a misspelt season is an error naming the note, the value and the season meant', async () => {
    const report = await checkWithNotes([
      { season: '2026-autumn', segment: null, text: 'Fine.' },
      { season: '2026-autum', segment: null, text: 'Storm in October.' },
    ]);
    expect(report.ok).toBe(false);
    const found = expectIssue(report.issues, { code: 'NoteTargetUnknown', file: 'scenario.json', column: '$.notes[1].season', severity: 'error', excluded: true });
    expect(found.message).toBe(
      'scenario.json, at $.notes[1].season: "2026-autum" is not known; expected a season listed in "publications" ("2026-summer", "2026-autumn"); did you mean "2026-autumn"?',
    );
    expect(found.value).toBe('2026-autum');
  });

  test('a well-formed season that is not published is an error too (no near season to suggest)', async () => {
    const report = await checkWithNotes([{ season: '2025-winter', segment: 'north-beach', text: 'Old note.' }]);
    const found = expectIssue(report.issues, { code: 'NoteTargetUnknown', file: 'scenario.json', column: '$.notes[0].season', severity: 'error' });
    expect(found.message).toBe('scenario.json, at $.notes[0].season: "2025-winter" is not known; expected a season listed in "publications" ("2026-summer", "2026-autumn")');
  });

  test('an unknown segment is an error naming the note, the value and the segment meant', async () => {
    const report = await checkWithNotes([{ season: '2026-autumn', segment: 'harbor-mouth', text: 'Dredging.' }]);
    expect(report.ok).toBe(false);
    const found = expectIssue(report.issues, { code: 'NoteTargetUnknown', file: 'scenario.json', column: '$.notes[0].segment', severity: 'error' });
    expect(found.message).toBe(
      'scenario.json, at $.notes[0].segment: "harbor-mouth" is not known; expected a segment id of the segments file, or null for the whole season ("harbour-mouth", "north-beach", "seal-island"); did you mean "harbour-mouth"?',
    );
  });

  test('notes naming a published season and a known segment (or none) pass', async () => {
    const report = await checkWithNotes([
      { season: '2026-summer', segment: null, text: 'Season note.' },
      { season: '2026-autumn', segment: 'seal-island', text: 'Segment note.' },
    ]);
    expect(report.issues.filter((i) => i.code === 'NoteTargetUnknown')).toEqual([]);
  });

  test('a segment left out of the segments file is named as such, and no segments at all checks seasons only', () => {
    const notes = [{ season: '2026-autumn', segment: 'broken-reef', text: 'x' }];
    expect(noteTargetProblems(notes, ['2026-autumn'], ['north-beach'], new Set(['broken-reef']))).toEqual([
      { path: '$.notes[0].segment', value: 'broken-reef', expected: 'a segment that is kept (this one was left out of the segments file; see its own error)', suggestion: null },
    ]);
    expect(noteTargetProblems(notes, ['2026-autumn'], [])).toEqual([]);
  });
});
