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
import { checkAtomFeed } from './helpers/atom-feed.ts';
import { packageRoot, runCli } from './helpers/cli-build.ts';

let work: string;
let scenario: string;
let out: string;
let fullSettings: string;
let onLineBefore: string;
const hostileNote = [
  '<script>window.__hostile = 1</script> **Storm** [click me](javascript:window.__hostile=2)',
  '<img src=x onerror="window.__hostile=3"> <a href="https://evil.example/" onclick="window.__hostile=4">raw link</a>',
  '[data link](data:text/html,<script>window.__hostile=5</script>) <iframe src="/"></iframe> <b onmouseover="window.__hostile=6">bold</b>',
].join('\n');

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
  // The autumn season gets a note from the publisher for the whole season and a hostile one for
  // one segment: script, event handlers, javascript: and data: links, raw HTML.
  const withNotes = JSON.parse(fullSettings) as { notes?: unknown[] };
  withNotes.notes = [
    {
      season: '2026-autumn',
      segment: null,
      text: 'A storm in **October** moved a lot of litter onto these beaches.\n\n- surveys after it: see [the data checks](/validation/)\n- *figures are invented*',
    },
    { season: '2026-autumn', segment: 'corrab-sands', text: hostileNote },
  ];
  fullSettings = JSON.stringify(withNotes, null, 1);
  await writeFile(path.join(scenario, 'scenario.json'), fullSettings);
  const staged = await runCli(['build', '--scenario', scenario, '--out', out, '--candidate']);
  expect(staged.code, staged.stderr).toBe(0);
}, 2_400_000);

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
      expect(text).toContain(
        `${b.segment.name}: ${way} from ${b.previousLevel!.label} (level ${b.previousLevel!.rank}, 2026-summer) to ${b.level.label} (level ${b.level.rank} of 4, 2026-autumn)`,
      );
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
    expect(text).toContain(
      '      new: Beach litter and plastic in the sea water are going up at Brenna Sands, where plastic pollution is Noticeable (level 2 of 4) in autumn 2026.',
    );
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

// A hostile note from the settings, through the whole build, in Chromium (Debian's, launched the
// way the other browser tests do): nothing runs, no element or attribute of it survives, links
// keep only allowed schemes, and what was typed is shown as text. The HTML5 parsing of the page
// is the browser's own; the allowed subset is ours (site/lib/note-markup.ts).
describe.skipIf(!existsSync('/usr/bin/chromium'))('a hostile publisher note in a real browser', () => {
  test('renders as inert text', async () => {
    const { startServer } = await import('../../generator/cli/serve.ts');
    const { chromium } = await import('playwright-core');
    const { mkdtempSync } = await import('node:fs');
    const root = existsSync(path.join(out, 'seasons', '2026-autumn')) ? out : candidateSite();
    const { server, url } = await startServer({ dir: root, port: 0 });
    const profile = mkdtempSync(path.join(tmpdir(), 'wrackline-chromium-'));
    const context = await chromium.launchPersistentContext(profile, {
      executablePath: '/usr/bin/chromium',
      headless: true,
      args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'],
    });
    try {
      const page = await context.newPage();
      const dialogs: string[] = [];
      page.on('dialog', (dialog) => {
        dialogs.push(dialog.message());
        void dialog.dismiss();
      });
      await page.goto(`${url}seasons/2026-autumn/corrab-sands/`, { waitUntil: 'load' });
      const notes = page.locator('aside.publisher-note');
      expect(await notes.count()).toBe(2);
      const hostile = notes.nth(1);
      expect(await hostile.locator('h2').innerText()).toBe('Note from Tessavar Coastal Observatory');
      // hover and click everything in the box: handlers, if any survived, would fire
      for (const element of await hostile.locator('.publisher-note-body *').all()) await element.hover().catch(() => {});
      const found = await hostile.evaluate((box) => ({
        elements: [...box.querySelectorAll('.publisher-note-body *')].map((e) => e.tagName.toLowerCase()),
        handlers: [...box.querySelectorAll('*')].flatMap((e) => [...e.attributes].map((a) => a.name)).filter((name) => name.startsWith('on')),
        hrefs: [...box.querySelectorAll('a')].map((a) => a.getAttribute('href')),
        text: (box as HTMLElement).innerText,
        hostile: (window as unknown as { __hostile?: number }).__hostile ?? null,
      }));
      expect(found.hostile).toBeNull();
      expect(dialogs).toEqual([]);
      expect(found.handlers).toEqual([]);
      expect(found.elements.filter((tag) => !['p', 'strong', 'em', 'a', 'br', 'ul', 'ol', 'li'].includes(tag))).toEqual([]);
      expect(found.hrefs).toEqual([]);
      expect(found.text).toContain('<script>window.__hostile = 1</script>');
      expect(found.text).toContain('[click me](javascript:window.__hostile=2)');
      expect(found.text).toContain('<img src=x onerror="window.__hostile=3">');
      expect(found.text).toContain('<iframe src="/"></iframe>');
      // the allowed subset works: emphasis, a list, a link within the site
      const season = notes.nth(0);
      expect(await season.locator('h2').innerText()).toBe('Note from Tessavar Coastal Observatory about autumn 2026');
      expect(await season.locator('strong').innerText()).toBe('October');
      expect(await season.locator('li').count()).toBe(2);
      expect(await season.locator('a').getAttribute('href')).toBe('/validation/');
      await hostile.scrollIntoViewIfNeeded();
      await page.screenshot({ path: path.join(tmpdir(), 'wrackline-note.png'), fullPage: false });
    } finally {
      await context.close();
      server.closeAllConnections();
      server.close();
      await rm(profile, { recursive: true, force: true });
    }
  }, 120_000);
});

// Per-segment Atom feeds of the approved demo release (both seasons), checked against RFC 4287
// (Nottingham & Sayre 2005), section by section (helpers/atom-feed.ts); dates against the
// scenario's publication dates. The per-area feeds get the same checks in national-coast-site.test.ts.
describe('per-segment Atom feeds', () => {
  test('every segment has a valid feed with an entry per season, dated from the scenario', async () => {
    const settings = JSON.parse(fullSettings) as { publications: { season: string; date: string }[] };
    const published = new Map(settings.publications.map((p) => [p.season, `${p.date}T00:00:00Z`]));
    const segments = readdirSync(path.join(out, 'segments'));
    expect(segments.length).toBe(30);
    const allEntryIds = new Map<string, string>();
    for (const segment of segments) {
      const feed = await checkAtomFeed(await readFile(path.join(out, 'feeds', `${segment}.xml`), 'utf8'), `feeds/${segment}.xml`);
      expect(feed.author).toBe('Tessavar Coastal Observatory'); // §3.2: name required
      expect(feed.self).toEqual([`/feeds/${segment}.xml`]);
      expect(feed.alternate).not.toBeNull();
      expect(feed.title).toContain('Tessavar Coastal Observatory: ');
      expect(feed.entries.length).toBeGreaterThan(0);
      for (const entry of feed.entries) {
        expect(existsSync(path.join(out, entry.alternate, 'index.html')), entry.alternate).toBe(true);
        const season = /^\/seasons\/([^/]+)\//.exec(entry.alternate)?.[1] ?? '';
        // the same entry has the same id in every feed it is in (§4.2.6: an id identifies an entry)
        if (allEntryIds.has(entry.id)) expect(allEntryIds.get(entry.id)).toBe(entry.alternate);
        allEntryIds.set(entry.id, entry.alternate);
        expect(entry.updated).toBe(published.get(season)); // from the scenario, not the clock
        expect(entry.published).toBe(published.get(season));
        // a place with no survey in the last four seasons has no level (never the lowest one)
        expect(entry.title).toMatch(/\(level [1-4] of 4\)$|: Level not set$/);
        expect(entry.summary.length).toBeGreaterThan(20);
      }
      // the bulletin links to its feed, visibly and in its head
      const page = await readFile(path.join(out, 'segments', segment, 'index.html'), 'utf8');
      expect(page).toContain(`<link rel="alternate" type="application/atom+xml"`);
      expect(page).toContain(`href="/feeds/${segment}.xml"`);
    }
    // the site-wide feed stays, with every entry of the segment feeds
    const siteFeed = await readFile(path.join(out, 'feed.xml'), 'utf8');
    for (const id of allEntryIds.keys()) expect(siteFeed).toContain(`<id>${id}</id>`);
  });
});
