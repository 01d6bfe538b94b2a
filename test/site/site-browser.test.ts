/**
 * Real-browser checks of the built site: Debian's chromium driven by playwright-core against
 * the static output served on 127.0.0.1 by a small server in this file.
 *
 * The site is built once in beforeAll: by default the invented demo scenario (content/demo) goes
 * through the whole job, `wrackline build`, into a temporary folder; WRACKLINE_TEST_MODEL names a
 * model folder to render with astro alone (e.g. the fixture model in test/fixtures/model), and
 * WRACKLINE_TEST_SITE an already built site folder. Screenshots go to test-artifacts/screenshots/.
 *
 * External references for the checks: axe-core's WCAG 2.1 A/AA rule set (Deque, axe-core 4.x,
 * tags wcag2a, wcag2aa, wcag21a, wcag21aa); RFC 4287 (Atom) for the feed's required elements;
 * ISO 216 A4 paper for the print check (the PDF page count comes from chromium's printer).
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, realpathSync, rmSync, statSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { extname, join, normalize, resolve, sep } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { indexSearchParts, planSearchParts, readSearchParts, writeSearchParts } from '../../generator/publish/render/search-index.ts';

const root = resolve(import.meta.dirname, '..', '..');
const require = createRequire(import.meta.url);
const chromiumPath = '/usr/bin/chromium';
const shots = join(root, 'test-artifacts', 'screenshots');
const haveBrowser = existsSync(chromiumPath);

let siteDir = '';
let ownBuild = '';
let server: Server | null = null;
let origin = '';
let context: BrowserContext | null = null;
let profileDir = '';
const consoleProblems: string[] = [];

const types: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.csv': 'text/csv; charset=utf-8',
  '.xml': 'application/atom+xml; charset=utf-8',
  '.svg': 'image/svg+xml',
  '.png': 'image/png',
  '.wasm': 'application/wasm',
  '.pf_meta': 'application/octet-stream',
  '.pf_index': 'application/octet-stream',
  '.pf_fragment': 'application/octet-stream',
  '.pagefind': 'application/octet-stream',
};

/** Serves `dir` read-only: folders answer with their index.html, unknown paths with 404.html. */
function serve(dir: string): Promise<{ server: Server; origin: string }> {
  const base = resolve(dir);
  const srv = createServer((request, response) => {
    const path = decodeURIComponent(new URL(request.url ?? '/', 'http://127.0.0.1').pathname);
    let file = normalize(join(base, path));
    if (file !== base && !file.startsWith(base + sep)) {
      response.writeHead(400).end('bad path');
      return;
    }
    if (existsSync(file) && statSync(file).isDirectory()) {
      if (!path.endsWith('/')) {
        response.writeHead(301, { Location: `${path}/` }).end();
        return;
      }
      file = join(file, 'index.html');
    }
    if (!existsSync(file)) {
      const notFound = join(base, '404.html');
      response.writeHead(404, { 'Content-Type': types['.html']! }).end(existsSync(notFound) ? readFileSync(notFound) : 'not found');
      return;
    }
    response.writeHead(200, { 'Content-Type': types[extname(file)] ?? 'application/octet-stream' }).end(readFileSync(file));
  });
  return new Promise((done) =>
    srv.listen(0, '127.0.0.1', () => {
      const address = srv.address();
      done({ server: srv, origin: `http://127.0.0.1:${typeof address === 'object' && address ? address.port : 0}` });
    }),
  );
}

async function buildSite(): Promise<string> {
  const given = process.env['WRACKLINE_TEST_SITE'];
  if (given) return resolve(given);
  const modelFolder = process.env['WRACKLINE_TEST_MODEL'];
  ownBuild = mkdtempSync(join(tmpdir(), 'wrackline-site-test-'));
  if (modelFolder === undefined) {
    const out = join(ownBuild, 'site');
    const cli = [join(root, 'bin', 'wrackline.mjs'), 'build', '--scenario', join(root, 'content', 'demo'), '--out', out, '--quiet', '--no-cache'];
    execFileSync(process.execPath, cli, { cwd: root, env: { ...process.env, TZ: 'UTC' }, stdio: 'pipe' });
    return realpathSync(out);
  }
  const model = resolve(modelFolder);
  const astro = join(root, 'node_modules', 'astro', 'astro.js');
  const env = { ...process.env, WRACKLINE_MODEL: model, ASTRO_TELEMETRY_DISABLED: '1', TZ: 'UTC' };
  const command = existsSync('/usr/bin/flock') ? ['/usr/bin/flock', '/tmp/astro.lock', process.execPath] : [process.execPath];
  execFileSync(command[0]!, [...command.slice(1), astro, 'build', '--outDir', ownBuild], { cwd: root, env, stdio: 'pipe' });
  // The search index, as the publish step makes it (generator/publish/render/search-index.ts).
  const parts = planSearchParts(htmlPages(ownBuild).filter((file) => readFileSync(join(ownBuild, file), 'utf8').includes('data-pagefind-body')));
  await indexSearchParts(ownBuild, parts, mkdtempSync(join(tmpdir(), 'wrackline-search-parts-')));
  writeSearchParts(ownBuild, parts);
  return ownBuild;
}

function htmlPages(dir: string, prefix = ''): string[] {
  const out: string[] = [];
  for (const name of readdirSync(join(dir, prefix)).sort()) {
    const rel = prefix ? `${prefix}/${name}` : name;
    if (statSync(join(dir, rel)).isDirectory()) {
      if (name !== 'pagefind') out.push(...htmlPages(dir, rel));
    } else if (name.endsWith('.html')) out.push(rel);
  }
  return out;
}

async function openPage(url: string): Promise<{ page: Page; status: number }> {
  const page = await context!.newPage();
  page.on('console', (message) => {
    if (message.type() === 'error' || message.type() === 'warning') consoleProblems.push(`${url}: console ${message.type()}: ${message.text()}`);
  });
  page.on('pageerror', (error) => consoleProblems.push(`${url}: page error: ${error.message}`));
  page.on('requestfailed', (request) => consoleProblems.push(`${url}: request failed: ${request.url()}`));
  const response = await page.goto(origin + url, { waitUntil: 'load' });
  return { page, status: response?.status() ?? 0 };
}

describe.skipIf(!haveBrowser)('published site in a real browser', () => {
  const pages: { url: string; status: number; links: string[] }[] = [];
  let firstBulletin = '';

  beforeAll(async () => {
    siteDir = await buildSite();
    ({ server, origin } = await serve(siteDir));
    profileDir = mkdtempSync(join(tmpdir(), 'wrackline-chromium-'));
    context = await chromium.launchPersistentContext(profileDir, {
      executablePath: chromiumPath,
      headless: true,
      args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'],
      viewport: { width: 1280, height: 800 },
    });
    mkdirSync(shots, { recursive: true });

    // Crawl every internal link from the overview, breadth first.
    const queue = ['/'];
    const seen = new Set(queue);
    while (queue.length > 0) {
      const url = queue.shift()!;
      const isHtml = url.endsWith('/');
      if (!isHtml) {
        const response = await fetch(origin + url);
        pages.push({ url, status: response.status, links: [] });
        continue;
      }
      const { page, status } = await openPage(url);
      const links = await page.$$eval('a[href]', (anchors) => anchors.map((a) => a.getAttribute('href') ?? ''));
      await page.close();
      pages.push({ url, status, links });
      for (const href of links) {
        const target = new URL(href, origin + url);
        if (target.origin !== origin) continue;
        const path = target.pathname;
        if (!seen.has(path)) {
          seen.add(path);
          queue.push(path);
        }
      }
    }
    firstBulletin = pages.find((p) => /^\/segments\/[^/]+\/$/.test(p.url))?.url ?? '';
  });

  afterAll(async () => {
    await context?.close();
    await new Promise((done) => (server ? server.close(done) : done(undefined)));
    if (profileDir) rmSync(profileDir, { recursive: true, force: true });
    if (ownBuild) rmSync(ownBuild, { recursive: true, force: true });
  });

  it('has one bulletin page per segment of the scenario, each with an inline map and chart (no script needed)', () => {
    // Which segments to expect: the demo's own segments file when the demo was built.
    if (process.env['WRACKLINE_TEST_SITE'] || process.env['WRACKLINE_TEST_MODEL']) return;
    const geojson = JSON.parse(readFileSync(join(root, 'content', 'demo', 'segments.geojson'), 'utf8')) as {
      features: { properties: { id: string } }[];
    };
    expect(geojson.features.length).toBeGreaterThanOrEqual(12);
    for (const feature of geojson.features) {
      const file = join(siteDir, 'segments', feature.properties.id, 'index.html');
      expect(existsSync(file), file).toBe(true);
      const html = readFileSync(file, 'utf8');
      expect(html, feature.properties.id).toMatch(/class="map-figure"[\s\S]*?<svg/);
      expect(html, feature.properties.id).toMatch(/class="chart-figure"[\s\S]*?(<svg|class="chart-empty")/);
      // A drawn chart wherever some indicator has a non-zero value (an all-zero series is
      // stated in words instead, with its data table).
      const bulletin = JSON.parse(readFileSync(join(siteDir, 'seasons', '2026-autumn', feature.properties.id, 'bulletin.json'), 'utf8')) as {
        indicators: { observations: { value: number | null }[] }[];
      };
      const anyNonZero = bulletin.indicators.some((indicator) => indicator.observations.some((o) => o.value !== null && o.value !== 0));
      if (anyNonZero) expect(html, feature.properties.id).toMatch(/class="chart-frame"><svg/);
      expect(html).toContain('Data invented for demonstration');
    }
  });

  it('reaches every built page from the overview, with no broken internal link', () => {
    const broken = pages.filter((p) => p.status !== 200).map((p) => `${p.url} → ${p.status}`);
    expect(broken).toEqual([]);
    const reached = new Set(pages.map((p) => p.url));
    const built = htmlPages(siteDir)
      .filter((f) => f !== '404.html')
      .map((f) => `/${f.replace(/index\.html$/, '')}`);
    expect(built.filter((u) => !reached.has(u))).toEqual([]);
    expect(firstBulletin).not.toBe('');
  });

  it('logs no console error or warning on any page', () => {
    expect(consoleProblems).toEqual([]);
  });

  it('passes axe-core WCAG 2.1 A and AA with zero violations on the key pages', async () => {
    const axeSource = readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8');
    const extra = pages
      .map((p) => p.url)
      .filter((u) => /^\/seasons\/[^/]+\/$/.test(u) || u.startsWith('/embed/'))
      .slice(0, 2);
    const targets = ['/', firstBulletin, '/seasons/', '/methods/', '/validation/', '/search/', ...extra];
    const results: Record<string, string[]> = {};
    for (const url of targets) {
      const { page } = await openPage(url);
      // evaluate runs over the DevTools protocol, so the page's CSP (no inline script) stays in force
      await page.evaluate(axeSource);
      const violations = await page.evaluate(async () => {
        const axe = (globalThis as unknown as { axe: { run: (ctx: unknown, opts: unknown) => Promise<{ violations: { id: string; nodes: { target: string[] }[] }[] }> } }).axe;
        const result = await axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] } });
        return result.violations.map(
          (v) =>
            `${v.id}: ${v.nodes
              .slice(0, 3)
              .map((n) => n.target.join(' '))
              .join(' | ')}`,
        );
      });
      results[url] = violations;
      await page.close();
    }
    expect(results).toEqual(Object.fromEntries(targets.map((t) => [t, []])));
  });

  it('overview map: land drawn, every badge and place name placed, no two boxes overlapping (390 and 1280 px)', async () => {
    for (const width of [390, 1280]) {
      const { page } = await openPage('/');
      await page.setViewportSize({ width, height: 900 });
      const found = await page.evaluate(() => {
        const rects = [...document.querySelectorAll('svg.map .badge circle, svg.map .place-label, svg.map .zone-label')].map((n) => n.getBoundingClientRect());
        const overlaps: string[] = [];
        for (let i = 0; i < rects.length; i++)
          for (let j = i + 1; j < rects.length; j++) {
            const a = rects[i]!;
            const b = rects[j]!;
            if (a.left < b.right && b.left < a.right && a.top < b.bottom && b.top < a.bottom) overlaps.push(`${i}×${j}`);
          }
        return {
          badges: document.querySelectorAll('svg.map .badge').length,
          places: document.querySelectorAll('svg.map .place-label').length,
          land: document.querySelectorAll('svg.map path.land').length,
          overlaps,
        };
      });
      await page.close();
      if (!process.env['WRACKLINE_TEST_SITE'] && !process.env['WRACKLINE_TEST_MODEL']) {
        const geojson = JSON.parse(readFileSync(join(root, 'content', 'demo', 'segments.geojson'), 'utf8')) as { features: unknown[] };
        expect(found.badges).toBe(geojson.features.length);
        expect(found.land).toBe(1);
        expect(found.places).toBeGreaterThanOrEqual(4);
      }
      expect(found.overlaps).toEqual([]);
    }
  });

  it('has no horizontal overflow at 390×844 and 1280×800, and saves screenshots', async () => {
    const htmlUrls = pages.filter((p) => p.url.endsWith('/')).map((p) => p.url);
    const overflow: string[] = [];
    const named: Record<string, string> = {
      '/': 'overview',
      [firstBulletin]: 'bulletin',
      '/seasons/': 'archive',
      '/methods/': 'methods',
      '/validation/': 'validation',
      '/search/': 'search',
    };
    const embed = htmlUrls.find((u) => u.startsWith('/embed/'));
    if (embed) named[embed] = 'embed';
    const archived = htmlUrls.find((u) => /^\/seasons\/[^/]+\/[^/]+\/$/.test(u) && !u.includes(pages.find((p) => p.url === firstBulletin)?.url ?? '§'));
    if (archived) named[archived] = 'bulletin-permalink';
    for (const [width, height] of [
      [390, 844],
      [1280, 800],
    ] as const) {
      const page = await context!.newPage();
      await page.setViewportSize({ width, height });
      for (const url of htmlUrls.slice(0, 400)) {
        await page.goto(origin + url, { waitUntil: 'load' });
        const [scroll, client] = await page.evaluate(() => [document.documentElement.scrollWidth, document.documentElement.clientWidth]);
        if (scroll! > client!) overflow.push(`${url} at ${width}px: ${scroll} > ${client}`);
        const name = named[url];
        if (name) await page.screenshot({ path: join(shots, `${name}-${width}.png`), fullPage: true });
      }
      await page.close();
    }
    expect(overflow).toEqual([]);
  }, 600_000);

  it('keeps each bulletin page (HTML + CSS, inline SVG included) within 150 KB', () => {
    const css = htmlPages(siteDir).length > 0 ? statSync(join(siteDir, 'wrackline.css')).size : 0;
    const sizes = htmlPages(siteDir)
      .filter((f) => /^(segments|seasons\/[^/]+)\/[^/]+\/index\.html$/.test(f))
      .map((f) => ({ f, bytes: statSync(join(siteDir, f)).size + css }));
    expect(sizes.length).toBeGreaterThan(0);
    const largest = sizes.reduce((a, b) => (b.bytes > a.bytes ? b : a));
    console.log(`site: ${htmlPages(siteDir).length} HTML pages; largest bulletin ${largest.f} = ${(largest.bytes / 1024).toFixed(1)} KB with CSS`);
    expect(sizes.filter((s) => s.bytes > 150 * 1024)).toEqual([]);
  });

  it('reads with JavaScript off: the bulletin text, map and charts are all in the HTML', async () => {
    const page = await context!.newPage();
    const session = await context!.newCDPSession(page);
    await session.send('Emulation.setScriptExecutionDisabled', { value: true });
    await page.goto(origin + firstBulletin);
    await expect(page.locator('h1').innerText()).resolves.not.toBe('');
    expect(await page.locator('svg.map').count()).toBe(1);
    expect(await page.locator('.chart-figure svg').count()).toBeGreaterThan(0);
    expect(await page.locator('.invented').count()).toBe(1);
    await page.close();
  });

  it('prints every current bulletin on at most two A4 pages', async () => {
    const bulletins = pages
      .map((p) => p.url)
      .filter((u) => /^\/segments\/[^/]+\/$/.test(u))
      .slice(0, 60);
    const page = await context!.newPage();
    const counts: Record<string, number> = {};
    for (const url of bulletins) {
      await page.goto(origin + url);
      const pdf = await page.pdf({ format: 'A4', printBackground: false, preferCSSPageSize: true });
      counts[url] = (pdf.toString('latin1').match(/\/Type\s*\/Page[^s]/g) ?? []).length;
    }
    await page.emulateMedia({ media: 'print' });
    await page.goto(origin + firstBulletin);
    await page.screenshot({ path: join(shots, 'bulletin-print-preview.png'), fullPage: true });
    await page.close();
    expect(Object.values(counts).every((n) => n >= 1)).toBe(true);
    expect(Object.entries(counts).filter(([, n]) => n > 2)).toEqual([]);
  }, 300_000);

  it('serves an Atom feed with the elements RFC 4287 requires', async () => {
    const page = await context!.newPage();
    await page.goto(`${origin}/`);
    const xml = await (await fetch(`${origin}/feed.xml`)).text();
    const summary = await page.evaluate((text) => {
      const doc = new DOMParser().parseFromString(text, 'application/xml');
      const ns = 'http://www.w3.org/2005/Atom';
      const feed = doc.documentElement;
      const entries = [...doc.getElementsByTagNameNS(ns, 'entry')];
      return {
        wellFormed: doc.getElementsByTagName('parsererror').length === 0,
        root: `${feed.namespaceURI} ${feed.localName}`,
        feedHas: ['id', 'title', 'updated', 'author'].every((n) => feed.getElementsByTagNameNS(ns, n).length > 0),
        entries: entries.length,
        entriesComplete: entries.every((e) => ['id', 'title', 'updated', 'link'].every((n) => e.getElementsByTagNameNS(ns, n).length > 0)),
      };
    }, xml);
    await page.close();
    expect(summary).toMatchObject({ wellFormed: true, root: 'http://www.w3.org/2005/Atom feed', feedHas: true, entriesComplete: true });
    const bulletins = htmlPages(siteDir).filter((f) => /^seasons\/[^/]+\/[^/]+\/index\.html$/.test(f)).length;
    expect(summary.entries).toBe(bulletins);
  });

  it('finds a segment through the optional search box, and lists every segment without it', async () => {
    const { page } = await openPage('/search/');
    const listed = await page.locator('.place-list a').count();
    expect(listed).toBeGreaterThan(0);
    const name = (await page.locator('.place-list a').first().innerText()).split(' ')[0]!;
    await page.locator('#search-box:not([hidden])').waitFor({ timeout: 10_000 });
    await page.fill('#search-input', name);
    await page.locator('#search-results a').first().waitFor({ timeout: 10_000 });
    expect(await page.locator('#search-results a').first().getAttribute('href')).toMatch(/^\/segments\/[^/]+\/$/);
    // The index comes in parts merged in the browser: a place from each part is found.
    const parts = readSearchParts(siteDir) ?? [];
    expect(parts.length).toBeGreaterThanOrEqual(2);
    for (const part of parts) {
      const href = `/${(part.pages[0] ?? '').replace(/index\.html$/, '')}`;
      const placeName = await page.locator(`.place-list a[href="${href}"]`).innerText();
      await page.fill('#search-input', '');
      await page.fill('#search-input', placeName);
      await page.locator(`#search-results a[href="${href}"]`).waitFor({ timeout: 10_000 });
    }
    await page.close();
    expect(consoleProblems).toEqual([]);
  });

  it('opens a bulletin when a segment is tapped on the overview map (phone)', async () => {
    const { page } = await openPage('/');
    await page.setViewportSize({ width: 390, height: 844 });
    const link = page
      .locator('svg.map a')
      .filter({ has: page.locator('.badge') })
      .first();
    const href = await link.getAttribute('href');
    expect(href).toMatch(/^\/segments\/[^/]+\/$/);
    expect(await link.getAttribute('tabindex')).toBe('-1');
    const name = (await link.getAttribute('aria-label'))?.split(':')[0];
    await Promise.all([page.waitForURL(`${origin}${href}`), link.click()]);
    expect(await page.locator('h1').first().innerText()).toBe(name);
    await page.close();
    expect(consoleProblems).toEqual([]);
  });

  it('links input-supplied addresses only when they are http(s), and shows input text literally', async () => {
    for (const p of pages.filter((x) => x.url.endsWith('/'))) {
      expect(p.links.filter((h) => /^\s*(javascript|data|vbscript):/i.test(h))).toEqual([]);
    }
    const { page } = await openPage(firstBulletin);
    const jsonLd = await page.locator('script[type="application/ld+json"]').textContent();
    expect(() => JSON.parse(jsonLd ?? '')).not.toThrow();
    expect(JSON.parse(jsonLd ?? '{}')['@type']).toBe('Dataset');
    await page.close();
  });
});
