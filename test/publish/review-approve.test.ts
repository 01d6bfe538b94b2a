// Stage, review, approve on the demo: the summer season is published, the autumn season is staged
// as a candidate over it (nothing on line changes), `wrackline review` lists what changes for
// readers, and `wrackline approve` publishes it in one step — refused while the inputs or the
// release on line differ from what the candidate was staged from and over.
//
// The expected level and claim changes are not taken from the review code: they come from the
// model builder's own comparison of each autumn bulletin with the season before (its
// `previousLevel`, and the summer bulletin's trend directions), read from the candidate's
// bulletin downloads. The demo's two known level changes are pinned by name as well.
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { cp, mkdtemp, readFile, readlink, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import type { Bulletin } from '../../generator/model/types.ts';
import { packageRoot, runCli } from './helpers/cli-build.ts';

let work: string;
let scenario: string;
let out: string;
let fullSettings: string;
let onLineBefore: string;

const candidateSite = (): string => path.join(`${out}.wrackline`, 'candidate', 'site');

function readBulletins(site: string, season: string): Map<string, Bulletin> {
  const dir = path.join(site, 'seasons', season);
  const found = new Map<string, Bulletin>();
  for (const segment of readdirSync(dir, { withFileTypes: true })) {
    if (!segment.isDirectory()) continue;
    const file = path.join(dir, segment.name, 'bulletin.json');
    if (existsSync(file)) found.set(segment.name, JSON.parse(readFileSync(file, 'utf8')) as Bulletin);
  }
  return found;
}

beforeAll(async () => {
  work = await mkdtemp(path.join(tmpdir(), 'wrackline-review-'));
  scenario = path.join(work, 'scenario');
  out = path.join(work, 'site');
  await cp(path.join(packageRoot, 'content', 'demo'), scenario, { recursive: true });
  fullSettings = await readFile(path.join(scenario, 'scenario.json'), 'utf8');
  const settings = JSON.parse(fullSettings) as { publications: { season: string }[] };
  settings.publications = settings.publications.filter((p) => p.season !== '2026-autumn');
  await writeFile(path.join(scenario, 'scenario.json'), JSON.stringify(settings, null, 1));
  const summer = await runCli(['build', '--scenario', scenario, '--out', out]);
  expect(summer.code, summer.stderr).toBe(0);
  onLineBefore = await readlink(out);
  await writeFile(path.join(scenario, 'scenario.json'), fullSettings);
  const staged = await runCli(['build', '--scenario', scenario, '--out', out, '--candidate']);
  expect(staged.code, staged.stderr).toBe(0);
}, 900_000);

afterAll(async () => {
  await rm(work, { recursive: true, force: true });
});

describe('stage, review, approve (demo: autumn over summer)', () => {
  test('staging leaves the release on line as it was', async () => {
    expect(await readlink(out)).toBe(onLineBefore);
    expect(existsSync(path.join(out, 'seasons', '2026-autumn'))).toBe(false);
    expect(existsSync(path.join(candidateSite(), 'seasons', '2026-autumn', 'corrab-sands', 'index.html'))).toBe(true);
  });

  test('the review lists the level changes and claim changes the model itself reports', async () => {
    const review = await runCli(['review', '--out', out], {}, { lock: false });
    expect(review.code, review.stderr).toBe(0);
    const text = review.stdout;
    console.log(text.split('\n').slice(0, 40).join('\n'));

    const autumn = readBulletins(candidateSite(), '2026-autumn');
    const summer = readBulletins(candidateSite(), '2026-summer');
    const moved = [...autumn.values()].filter((b) => b.previousLevel !== null && b.previousLevel.rank !== b.level.rank);
    expect(text).toContain(`Levels that change (${moved.length})`);
    for (const b of moved) {
      const way = b.level.rank > b.previousLevel!.rank ? 'UP' : 'DOWN';
      expect(text).toContain(`${b.segment.name}: ${way} from ${b.previousLevel!.label} (level ${b.previousLevel!.rank}, 2026-summer) to ${b.level.label} (level ${b.level.rank} of 4, 2026-autumn)`);
    }
    // The demo's known level changes between summer and autumn 2026 (observed in its model).
    expect(moved.map((b) => b.segment.id).sort()).toEqual(['brenna-sands', 'tharra-island-east']);
    expect(text).toContain('Brenna Sands: DOWN from Marked (level 3, 2026-summer) to Noticeable (level 2 of 4, 2026-autumn)');
    expect(text).toContain('no longer matches rule litter-high (marked)');

    // Trend claims: rising/falling in one season and not the other, or reversed.
    let claims = 0;
    for (const [segment, b] of autumn) {
      const before = new Map((summer.get(segment)?.indicators ?? []).map((i) => [i.indicator, i.direction]));
      for (const indicator of b.indicators) {
        const was = before.get(indicator.indicator) ?? null;
        const claim = (d: string | null): boolean => d === 'rising' || d === 'falling';
        if (claim(was) !== claim(indicator.direction) || (claim(was) && was !== indicator.direction)) claims += 1;
      }
    }
    expect(text).toContain(`Trend claims that change (${claims})`);

    // Sentences, old beside new, with the numbers that moved.
    expect(text).toContain('      old: Beach litter and plastic in the sea water are going up at Brenna Sands, where plastic pollution is Marked (level 3 of 4) in summer 2026.');
    expect(text).toContain('      new: Beach litter and plastic in the sea water are going up at Brenna Sands, where plastic pollution is Noticeable (level 2 of 4) in autumn 2026.');
    expect(text).toMatch(/numbers moved beyond their rounding: \d/);
    // Records dated after the summer publication date were left out then and are taken back in.
    expect(text).toMatch(/DateInFuture: 0 newly left out, \d+ taken back in/);
    expect(text).toContain('  + /seasons/2026-autumn/corrab-sands/');
    expect(text).toContain('Pages removed (0)');

    // The private page: beside the candidate, in no release.
    const page = path.join(`${out}.wrackline`, 'candidate', 'review.html');
    const html = await readFile(page, 'utf8');
    expect(html).toContain('Private review page: not part of the published site.');
    expect(html).toContain('Levels that change (2)');
    expect(html).not.toMatch(/<script/i);
    expect(existsSync(path.join(out, 'review.html'))).toBe(false);
  }, 120_000);

  test('approval is refused while an input differs from the staged one', async () => {
    await writeFile(path.join(scenario, 'scenario.json'), `${fullSettings}\n`);
    const refused = await runCli(['approve', '--out', out, '--by', 'Mara Quillon', '--at', '2026-12-02T09:30:00Z'], {}, { lock: false });
    await writeFile(path.join(scenario, 'scenario.json'), fullSettings);
    expect(refused.code).toBe(1);
    expect(refused.stderr).toContain("refused: the candidate's inputs changed since it was staged (scenario.json");
    expect(await readlink(out)).toBe(onLineBefore);
  });

  test('approval is refused after the release on line changed, then publishes once it is back', async () => {
    const onLinePage = path.join(out, '404.html');
    const original = await readFile(onLinePage);
    await writeFile(onLinePage, Buffer.concat([original, Buffer.from('<!-- changed by hand -->\n')]));
    const refused = await runCli(['approve', '--out', out, '--by', 'Mara Quillon', '--at', '2026-12-02T09:30:00Z'], {}, { lock: false });
    await writeFile(onLinePage, original);
    expect(refused.code).toBe(1);
    expect(refused.stderr).toContain('refused: the release on line changed since the candidate was staged');
    expect(refused.stderr).toContain('Nothing was published.');
    expect(await readlink(out)).toBe(onLineBefore);

    const approved = await runCli(['approve', '--out', out, '--by', 'Mara Quillon', '--at', '2026-12-02T09:30:00Z'], {}, { lock: false });
    expect(approved.code, approved.stderr).toBe(0);
    expect(await readlink(out)).not.toBe(onLineBefore);
    expect(existsSync(path.join(out, 'seasons', '2026-autumn', 'corrab-sands', 'index.html'))).toBe(true);
    const manifest = JSON.parse(await readFile(path.join(out, 'manifest.json'), 'utf8')) as { approval?: { by: string; at: string; replaced: string } };
    expect(manifest.approval?.by).toBe('Mara Quillon');
    expect(manifest.approval?.at).toBe('2026-12-02T09:30:00Z');
    expect(manifest.approval?.replaced).toBe(path.basename(onLineBefore));
    const methods = await readFile(path.join(out, 'methods', 'index.html'), 'utf8');
    expect(methods).toContain('Approved for publication by Mara Quillon on 2026-12-02 at 09:30 UTC, from the command line (wrackline approve)');
    expect(existsSync(path.join(`${out}.wrackline`, 'candidate'))).toBe(false);
  }, 120_000);
});
