// Notes from the publisher in the bulletin model: season-wide notes on every bulletin and the
// overview of their season, segment notes on their bulletin only; a note added to a past,
// published season changes that season's archived bulletins, so the archive check refuses it
// unless a correction is recorded, as for any other change to a past bulletin (common practice
// for public bulletins: what was published stays, corrections are dated and shown).
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { assembleModel } from '../../generator/model/assemble-model.ts';
import { notesFor } from '../../generator/model/publisher-notes.ts';
import { writeModel } from '../../generator/model/write-model.ts';
import { assertArchiveIntact, compareLedgers, ledgerFromModel } from '../../generator/publish/check/archive-ledger.ts';
import type { LoadedScenario } from '../../generator/scenario/types.ts';
import { fixtureScenario, testEngine } from './fixture.ts';

let work: string;
beforeAll(async () => {
  work = await mkdtemp(path.join(tmpdir(), 'wrackline-notes-'));
});
afterAll(async () => {
  await rm(work, { recursive: true, force: true });
});

function withNotes(notes: { season: string; segment: string | null; text: string }[]): LoadedScenario {
  const scenario = fixtureScenario();
  return { ...scenario, settings: { ...scenario.settings, notes } };
}

async function ledgerOf(scenario: LoadedScenario, name: string) {
  const dir = path.join(work, name);
  await writeModel(dir, assembleModel(scenario, testEngine));
  return ledgerFromModel(dir);
}

describe('publisher notes', () => {
  test('season-wide notes come first, then the segment note; other seasons and segments get none', () => {
    const notes = [
      { season: '2026-autumn', segment: 'east-bay', text: 'bay' },
      { season: '2026-autumn', segment: null, text: 'storm' },
      { season: '2026-summer', segment: null, text: 'summer' },
    ];
    expect(notesFor(notes, '2026-autumn', 'east-bay')).toEqual([
      { scope: 'season', text: 'storm' },
      { scope: 'segment', text: 'bay' },
    ]);
    expect(notesFor(notes, '2026-autumn', 'north-beach')).toEqual([{ scope: 'season', text: 'storm' }]);
    expect(notesFor(notes, '2026-autumn', null)).toEqual([{ scope: 'season', text: 'storm' }]);
  });

  test('notes reach the bulletins and the season overview of the model', () => {
    const set = assembleModel(
      withNotes([
        { season: '2026-autumn', segment: null, text: 'A storm in *October*.' },
        { season: '2026-autumn', segment: 'east-bay', text: 'Bay note' },
      ]),
      testEngine,
    );
    const east = set.bulletins.find((b) => b.season.id === '2026-autumn' && b.segment.id === 'east-bay');
    const north = set.bulletins.find((b) => b.season.id === '2026-autumn' && b.segment.id === 'north-beach');
    expect(east?.notes).toEqual([
      { scope: 'season', text: 'A storm in *October*.' },
      { scope: 'segment', text: 'Bay note' },
    ]);
    expect(north?.notes).toEqual([{ scope: 'season', text: 'A storm in *October*.' }]);
    expect(set.bulletins.filter((b) => b.season.id === '2026-summer').every((b) => b.notes === undefined)).toBe(true);
    expect(set.regions.find((r) => r.season.id === '2026-autumn')?.notes).toEqual([{ scope: 'season', text: 'A storm in *October*.' }]);
  });

  test('a note added to a past season needs a correction, like any change to a past bulletin', async () => {
    const before = await ledgerOf(fixtureScenario(), 'before');
    const after = await ledgerOf(withNotes([{ season: '2026-summer', segment: 'north-beach', text: 'Added later.' }]), 'after');
    const violations = compareLedgers(before, after, []);
    expect(violations.map((v) => v.page)).toEqual(['seasons/2026-summer/north-beach/']);
    expect(() => assertArchiveIntact(before, after, [])).toThrow(/seasons\/2026-summer\/north-beach\//);
    // recorded as a correction in the settings: the bulletin then shows it, and the build passes
    const correction = { season: '2026-summer', segment: 'north-beach', date: '2026-09-15', reason: 'Note added.' };
    const noted = withNotes([{ season: '2026-summer', segment: 'north-beach', text: 'Added later.' }]);
    const corrected = await ledgerOf({ ...noted, settings: { ...noted.settings, corrections: [...noted.settings.corrections, correction] } }, 'corrected');
    expect(() => assertArchiveIntact(before, corrected, [...noted.settings.corrections, correction])).not.toThrow();
    // the current season may get a note freely
    const current = await ledgerOf(withNotes([{ season: '2026-autumn', segment: 'north-beach', text: 'New.' }]), 'current');
    expect(compareLedgers(before, current, [])).toEqual([]);
  });
});
