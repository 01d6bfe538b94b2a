/**
 * Maps in a real browser (Debian's chromium through playwright-core): badge and label boxes as
 * Chromium lays them out (getBoundingClientRect) never overlap, on the dense 60-segment test coast
 * and on a national coast shown by areas: the scale scenario of bench/ (bench/scale-scenario.ts,
 * here with 400 segments and three years so it builds in a test), its overview and an area page.
 * Also: axe-core WCAG 2.1 A/AA (Deque, axe-core 4.x, tags wcag2a, wcag2aa, wcag21a, wcag21aa)
 * finds nothing on those pages, nothing overflows at 390 px, and every page stays under
 * 150 KB of HTML and CSS. The demo overview is checked in test/site/site-browser.test.ts.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, realpathSync, rmSync, statSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { extname, join, normalize, resolve, sep } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { chromium, type BrowserContext, type Page } from 'playwright-core';
import { makeScaleScenario } from '../../bench/scale-scenario.ts';
import { prepareLand, prepareSegments, renderMap } from '../../site/lib/map.ts';
import { denseCoast, denseLand } from './dense-coast.ts';

const root = resolve(import.meta.dirname, '..', '..');
const require = createRequire(import.meta.url);
const chromiumPath = '/usr/bin/chromium';
const shots = join(root, 'test-artifacts', 'screenshots');
const haveBrowser = existsSync(chromiumPath);
const pageLimit = 150 * 1024;

let work = '';
let siteDir = '';
let server: Server | null = null;
let origin = '';
let context: BrowserContext | null = null;

function serve(dir: string): Promise<{ server: Server; origin: string }> {
  const base = resolve(dir);
  const types: Record<string, string> = {
    '.html': 'text/html; charset=utf-8',
    '.css': 'text/css; charset=utf-8',
    '.js': 'text/javascript; charset=utf-8',
    '.svg': 'image/svg+xml',
    '.json': 'application/json',
  };
  const srv = createServer((request, response) => {
    const path = decodeURIComponent(new URL(request.url ?? '/', 'http://127.0.0.1').pathname);
    let file = normalize(join(base, path));
    if (file !== base && !file.startsWith(base + sep)) return void response.writeHead(400).end();
    if (existsSync(file) && statSync(file).isDirectory()) file = join(file, 'index.html');
    if (!existsSync(file)) return void response.writeHead(404).end('not found');
    response.writeHead(200, { 'Content-Type': types[extname(file)] ?? 'application/octet-stream' }).end(readFileSync(file));
  });
  return new Promise((done) =>
    srv.listen(0, '127.0.0.1', () => {
      const address = srv.address();
      done({ server: srv, origin: `http://127.0.0.1:${typeof address === 'object' && address ? address.port : 0}` });
    }),
  );
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

/** Pairs of badge/label boxes that overlap, as Chromium lays out the map. */
async function overlapsOn(page: Page): Promise<{ boxes: number; badges: number; overlaps: string[] }> {
  return page.evaluate(() => {
    const nodes = [...document.querySelectorAll('svg.map .badge circle, svg.map .place-label, svg.map .zone-label')];
    const rects = nodes.map((n) => n.getBoundingClientRect());
    const overlaps: string[] = [];
    for (let i = 0; i < rects.length; i++)
      for (let j = i + 1; j < rects.length; j++) {
        const a = rects[i]!;
        const b = rects[j]!;
        if (a.left < b.right && b.left < a.right && a.top < b.bottom && b.top < a.bottom) overlaps.push(`${i}×${j}`);
      }
    return { boxes: rects.length, badges: document.querySelectorAll('svg.map .badge').length, overlaps };
  });
}

async function axeViolations(page: Page): Promise<string[]> {
  await page.evaluate(readFileSync(require.resolve('axe-core/axe.min.js'), 'utf8'));
  return page.evaluate(async () => {
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
}

describe.skipIf(!haveBrowser)('maps in a real browser', () => {
  let areaUrl = '';

  beforeAll(async () => {
    work = mkdtempSync(join(tmpdir(), 'wrackline-maps-'));
    const scenario = join(work, 'scenario');
    await makeScaleScenario(scenario, { segments: 400, years: 3, positions: 20_000 });
    const out = join(work, 'site');
    execFileSync(process.execPath, [join(root, 'bin', 'wrackline.mjs'), 'build', '--scenario', scenario, '--out', out, '--quiet', '--no-cache'], {
      cwd: root,
      env: { ...process.env, TZ: 'UTC' },
      stdio: 'pipe',
    });
    siteDir = realpathSync(out);
    ({ server, origin } = await serve(siteDir));
    context = await chromium.launchPersistentContext(join(work, 'profile'), {
      executablePath: chromiumPath,
      headless: true,
      args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'],
    });
    mkdirSync(shots, { recursive: true });
    const first = readdirSync(join(siteDir, 'areas')).sort()[0];
    areaUrl = first ? `/areas/${first}/` : '';
  }, 900_000);

  afterAll(async () => {
    await context?.close();
    await new Promise((done) => (server ? server.close(done) : done(undefined)));
    if (work) rmSync(work, { recursive: true, force: true });
  });

  it('dense 60-segment coast: 60 badges and 3 place names, no two boxes overlapping, at 390 and 1280 px', async () => {
    const svg = renderMap({
      idPrefix: 'dense',
      title: 'Dense test coast',
      description: 'Sixty invented segments',
      segments: prepareSegments(denseCoast()),
      land: prepareLand(denseLand()),
      width: 560,
      places: [
        { name: 'Northport', lon: 8.62, lat: 64.2 },
        { name: 'Skerry Sound', lon: 8.3, lat: 63.35 },
        { name: 'Southvik', lon: 8.7, lat: 61.9 },
      ],
    });
    for (const width of [390, 1280]) {
      const page = await context!.newPage();
      await page.setViewportSize({ width, height: 900 });
      await page.setContent(
        `<!doctype html><html lang="en"><head><title>Dense coast</title></head><body style="margin:0"><main><div style="max-width:640px">${svg.replace('<svg ', '<svg style="display:block;width:100%;height:auto" ')}</div></main></body></html>`,
      );
      const found = await overlapsOn(page);
      await page.screenshot({ path: join(shots, `dense-coast-${width}.png`) });
      expect(found.badges).toBe(60);
      expect(found.boxes).toBe(63);
      expect(found.overlaps).toEqual([]);
      await page.close();
    }
  });

  it('national coast: the overview shows areas, each area has a page, and every page is under 150 KB', () => {
    const overview = readFileSync(join(siteDir, 'index.html'), 'utf8');
    expect(overview).toContain('Areas of the coast');
    expect(areaUrl).not.toBe('');
    const css =
      readdirSync(siteDir)
        .filter((f) => f.endsWith('.css'))
        .reduce((n, f) => n + statSync(join(siteDir, f)).size, 0) +
      (existsSync(join(siteDir, '_astro'))
        ? readdirSync(join(siteDir, '_astro'))
            .filter((f) => f.endsWith('.css'))
            .reduce((n, f) => n + statSync(join(siteDir, '_astro', f)).size, 0)
        : 0);
    const heavy = htmlPages(siteDir)
      .map((f) => ({ f, bytes: statSync(join(siteDir, f)).size + css }))
      .filter((p) => p.bytes >= pageLimit);
    expect(heavy).toEqual([]);
  });

  for (const which of ['overview', 'area page'] as const) {
    it(`national coast ${which}: no overlapping badges, no overflow at 390 px, axe finds nothing`, async () => {
      const url = which === 'overview' ? '/' : areaUrl;
      for (const width of [390, 1280]) {
        const page = await context!.newPage();
        await page.setViewportSize({ width, height: 900 });
        await page.goto(origin + url, { waitUntil: 'load' });
        const found = await overlapsOn(page);
        expect(found.badges).toBeGreaterThan(which === 'overview' ? 5 : 20);
        expect(found.overlaps).toEqual([]);
        const [scroll, client] = await page.evaluate(() => [document.documentElement.scrollWidth, document.documentElement.clientWidth]);
        expect(scroll).toBeLessThanOrEqual(client!);
        await page.screenshot({ path: join(shots, `national-${which.replace(' ', '-')}-${width}.png`), fullPage: false });
        if (width === 1280) expect(await axeViolations(page)).toEqual([]);
        await page.close();
      }
    });
  }
});
