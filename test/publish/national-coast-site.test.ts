// A built national coast (the scale scenario of bench/, 160 segments: above the 150 where the
// overview shows areas; three years so it builds in a test) with a publisher logo:
// - the logo in the header of every kind of page, served under its content-addressed name with
//   the bytes given, with empty alt text beside the publisher's name in the same link (W3C WCAG 2.1 technique H2);
// - one Atom feed per area, checked against RFC 4287 (Nottingham & Sayre 2005) section by section
//   (helpers/atom-feed.ts, the checks of the per-segment feeds), an entry per published season
//   dated from the scenario's publication dates, ids unique across every feed of the site, and
//   linked from the area page (in its head and visibly).
import { createHash } from 'node:crypto';
import { existsSync, readFileSync, readdirSync } from 'node:fs';
import { copyFile, mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { makeScaleScenario } from '../../bench/scale-scenario.ts';
import { checkAtomFeed } from './helpers/atom-feed.ts';
import { runCli } from './helpers/cli-build.ts';

let work: string;
let out: string;
let settings: { publisher: { name: string }; publications: { season: string; date: string }[]; region: { id: string } };
const logo = readFileSync(path.join(import.meta.dirname, '..', 'fixtures', 'images', 'logo-120x48.png'));

beforeAll(async () => {
  work = await mkdtemp(path.join(tmpdir(), 'wrackline-national-'));
  const scenario = path.join(work, 'scenario');
  out = path.join(work, 'site');
  await makeScaleScenario(scenario, { segments: 160, years: 3, positions: 2000 });
  await copyFile(path.join(import.meta.dirname, '..', 'fixtures', 'images', 'logo-120x48.png'), path.join(scenario, 'logo.png'));
  const file = path.join(scenario, 'scenario.json');
  const json = JSON.parse(await readFile(file, 'utf8')) as typeof settings & { publisherLogo?: string };
  json.publisherLogo = 'logo.png';
  await writeFile(file, JSON.stringify(json, null, 1));
  settings = json;
  const built = await runCli(['build', '--scenario', scenario, '--out', out, '--quiet', '--no-cache']);
  expect(built.code, built.stderr).toBe(0);
}, 900_000);

afterAll(async () => {
  if (work) await rm(work, { recursive: true, force: true });
});

describe('publisher logo in the header', () => {
  test('served under the first 32 hex digits of its SHA-256, byte for byte, and shown on every kind of page beside the publisher name, with empty alt text', async () => {
    const name = `${createHash('sha256').update(logo).digest('hex').slice(0, 32)}.png`;
    expect(readFileSync(path.join(out, 'publisher-logo', name)).equals(logo)).toBe(true);
    expect(readdirSync(path.join(out, 'publisher-logo'))).toEqual([name]);
    const area = readdirSync(path.join(out, 'areas'))[0];
    const segment = readdirSync(path.join(out, 'segments'))[0];
    const pages = ['index.html', `areas/${area}/index.html`, `segments/${segment}/index.html`, `seasons/2026-summer/${segment}/index.html`, 'methods/index.html'];
    const img = `<img class="publisher-logo" src="/publisher-logo/${name}" alt="" width="120" height="48">`;
    for (const page of pages) {
      const html = await readFile(path.join(out, page), 'utf8');
      expect(html, page).toContain(`<a class="wordmark with-logo" href="/">${img}${settings.publisher.name} <span>`);
    }
  });
});

describe('per-area Atom feeds', () => {
  test('every area has a valid feed with an entry per published season, dated from the scenario, linked from its page', async () => {
    const published = new Map(settings.publications.map((p) => [p.season, `${p.date}T00:00:00Z`]));
    const areas = readdirSync(path.join(out, 'areas'));
    expect(areas.length).toBeGreaterThan(1);
    const segmentIds = new Set<string>();
    for (const segment of readdirSync(path.join(out, 'feeds')).filter((f) => f.endsWith('.xml'))) {
      for (const entry of (await checkAtomFeed(await readFile(path.join(out, 'feeds', segment), 'utf8'), segment)).entries) segmentIds.add(entry.id);
    }
    const areaIds = new Set<string>();
    const feedIds = new Set<string>();
    for (const area of areas) {
      const feed = await checkAtomFeed(await readFile(path.join(out, 'feeds', 'areas', `${area}.xml`), 'utf8'), `feeds/areas/${area}.xml`);
      expect(feed.author).toBe(settings.publisher.name); // §4.1.1 / §3.2
      expect(feed.self).toEqual([`/feeds/areas/${area}.xml`]);
      expect(feed.alternate).toBe(`/areas/${area}/`);
      expect(feedIds.has(feed.id)).toBe(false);
      feedIds.add(feed.id);
      // one entry per published season, newest first
      expect(feed.entries.map((e) => e.id.slice(e.id.lastIndexOf('/') + 1))).toEqual(settings.publications.map((p) => p.season).reverse());
      for (const entry of feed.entries) {
        const season = entry.id.slice(entry.id.lastIndexOf('/') + 1);
        // stable: made of the region, area and season ids only (tag URI, RFC 4151)
        expect(entry.id).toBe(`tag:wrackline,${settings.publications[0]!.date.slice(0, 4)}:${settings.region.id}/areas/${area}/${season}`);
        expect(areaIds.has(entry.id) || segmentIds.has(entry.id), `${entry.id} unique across the site's feeds`).toBe(false);
        areaIds.add(entry.id);
        expect(entry.updated).toBe(published.get(season)); // from the scenario, not the clock
        expect(entry.published).toBe(published.get(season));
        expect(entry.title).toMatch(/, (Summer|Autumn) 2026: (highest level \w+ \(level [1-4] of 4\)|Level not set)$/);
        expect(entry.summary).toMatch(/^Invented data for demonstration\. .+: the highest level is /);
        expect(existsSync(path.join(out, entry.alternate, 'index.html')), entry.alternate).toBe(true);
      }
      expect(feed.updated).toBe(published.get(settings.publications[settings.publications.length - 1]!.season));
      // the area page links to its feed, in its head and visibly
      const page = await readFile(path.join(out, 'areas', area, 'index.html'), 'utf8');
      expect(page).toMatch(new RegExp(`<link rel="alternate" type="application/atom\\+xml" title="[^"]+" href="/feeds/areas/${area}\\.xml">`));
      expect(page).toContain(`<a href="/feeds/areas/${area}.xml" type="application/atom+xml">Follow `);
    }
  });
});
