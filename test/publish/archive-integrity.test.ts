// Archive integrity: once a season is past, its published bulletins stay as they were; a build
// that would change or drop one is refused with a message naming the page, unless the scenario
// records a correction, which the bulletin then carries. Keeping published bulletins unchanged
// and marking dated corrections is common practice for public bulletins.
import { mkdtemp, readFile, readlink, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, test } from 'vitest';
import { runBuild } from '../../generator/cli/build.ts';
import { canonicalJson, compareLedgers } from '../../generator/publish/check/archive-ledger.ts';
import type { ArchiveLedger } from '../../generator/publish/check/archive-ledger.ts';
import { createProgress } from '../../generator/progress/progress.ts';
import { fakeSteps } from './helpers/fake-site.ts';
import type { FakeStepOptions } from './helpers/fake-site.ts';
import { snapshot } from './helpers/tree.ts';

let work: string;
let out: string;
beforeEach(async () => {
  work = await mkdtemp(path.join(tmpdir(), 'wrackline-archive-'));
  out = path.join(work, 'site');
});
afterEach(async () => {
  await rm(work, { recursive: true, force: true });
});

async function build(options: FakeStepOptions): Promise<{ code: number; errors: string }> {
  const errors: string[] = [];
  const code = await runBuild(['--out', out, '--no-cache'], {
    steps: fakeSteps(options),
    progress: createProgress({ quiet: true }),
    stderr: (text) => errors.push(text),
  });
  return { code, errors: errors.join('\n') };
}

const summerOnly = { seasons: ['2026-summer'] };
const twoSeasons = { seasons: ['2026-summer', '2026-autumn'] };

describe('archive integrity', () => {
  test('the current season may be revised; once past, it is frozen', async () => {
    expect((await build({ ...summerOnly, values: { '2026-summer/north-bay': 1 } })).code).toBe(0);
    // Still the current season: a revision is allowed.
    expect((await build({ ...summerOnly, values: { '2026-summer/north-bay': 2 } })).code).toBe(0);
    // Autumn is published; summer is now past and keeps what was published (value 2).
    expect((await build({ ...twoSeasons, values: { '2026-summer/north-bay': 2 } })).code).toBe(0);
    const before = await snapshot(out);
    const refused = await build({ ...twoSeasons, values: { '2026-summer/north-bay': 3 } });
    expect(refused.code).toBe(1);
    expect(refused.errors).toContain('/seasons/2026-summer/north-bay/ — bulletin 2026-summer / north-bay would change (changed: headline)');
    expect(refused.errors).toContain('"corrections"');
    expect(await snapshot(out)).toEqual(before);
  });

  test('a recorded correction lets the page change, and the page shows it', async () => {
    expect((await build({ ...twoSeasons })).code).toBe(0);
    const correction = { season: '2026-summer', segment: 'north-bay', date: '2026-12-10', reason: 'a survey was entered twice' };
    const notShown = await build({ ...twoSeasons, values: { '2026-summer/north-bay': 5 }, corrections: [correction] });
    expect(notShown.code).toBe(1);
    expect(notShown.errors).toContain('its "correction" field is empty');
    const accepted = await build({
      ...twoSeasons,
      values: { '2026-summer/north-bay': 5 },
      corrections: [correction],
      corrected: ['2026-summer/north-bay'],
    });
    expect(accepted.code).toBe(0);
    const html = await readFile(path.join(out, 'seasons/2026-summer/north-bay/index.html'), 'utf8');
    expect(html).toContain('Corrected on 2026-12-10: a survey was entered twice');
    // The corrected content is now what is archived: changing it again is refused.
    const link = await readlink(out);
    const again = await build({ ...twoSeasons, values: { '2026-summer/north-bay': 6 }, corrections: [], corrected: [] });
    expect(again.code).toBe(1);
    expect(await readlink(out)).toBe(link);
  });

  test('a published past-season page cannot disappear', async () => {
    expect((await build({ ...twoSeasons, segments: ['north-bay', 'south-reef'] })).code).toBe(0);
    const refused = await build({ ...twoSeasons, segments: ['north-bay'] });
    expect(refused.code).toBe(1);
    expect(refused.errors).toContain('/seasons/2026-summer/south-reef/ — bulletin 2026-summer / south-reef was published and would be removed');
  });

  test('a correction for the whole season (segment null) covers every page of it', async () => {
    expect((await build({ ...twoSeasons })).code).toBe(0);
    const correction = { season: '2026-summer', segment: null, date: '2026-12-11', reason: 'units fixed' };
    const result = await build({
      ...twoSeasons,
      values: { '2026-summer/north-bay': 9, '2026-summer/south-reef': 9 },
      corrections: [correction],
      corrected: ['2026-summer/north-bay', '2026-summer/south-reef'],
    });
    expect(result.code).toBe(0);
  });
});

describe('ledger comparison', () => {
  const entry = (sha256: string) => ({ segment: 'a', page: 'seasons/s/a/', sha256, parts: { headline: sha256 }, correction: null });
  const ledger = (sha256: string, current: boolean): ArchiveLedger => ({
    generator: 'wrackline',
    seasons: [{ season: 's', current, entries: [entry(sha256)] }],
  });

  test('nothing published before: nothing to compare', () => {
    expect(compareLedgers(null, ledger('x', false), [])).toEqual([]);
  });

  test('a changed past entry is reported with the changed fields', () => {
    expect(compareLedgers(ledger('x', true), ledger('y', false), [])).toEqual([{ season: 's', segment: 'a', page: 'seasons/s/a/', problem: 'changed', fields: ['headline'] }]);
  });

  test('canonical JSON ignores key order and keeps array order', () => {
    expect(canonicalJson({ b: 1, a: [2, 1] })).toBe(canonicalJson({ a: [2, 1], b: 1 }));
    expect(canonicalJson({ a: [1, 2] })).not.toBe(canonicalJson({ a: [2, 1] }));
  });
});
