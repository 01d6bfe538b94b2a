/**
 * Build-time rendering helpers of the site (no browser): maps, charts, CSV, link and JSON-LD
 * escaping. Inputs come from the invented fixture model in test/fixtures/model.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { geoArea } from 'd3-geo';
import { parseHTML } from 'linkedom';
import { describe, expect, it } from 'vitest';
import type { Bulletin, IndicatorBulletin } from '../../generator/model/types.ts';
import { dateFromDecimalYear, renderIndicatorChart, roundSvgNumbers, yScale } from '../../site/lib/chart.ts';
import { observationsCsv, toCsv } from '../../generator/model/download-tables.ts';
import { escapeXml, formatDate, formatPShort, jsonLdText, ordinal, regionalFigures, safeHttpUrl, safeMailto, safeTel } from '../../site/lib/format.ts';
import { prepareSegments, renderMap } from '../../site/lib/map.ts';

const fixture = join(import.meta.dirname, '..', 'fixtures', 'model');
const bulletin = JSON.parse(readFileSync(join(fixture, 'bulletins', '2026-autumn', 'tamsey-estuary.json'), 'utf8')) as Bulletin;
const hostile = '<script>alert(1)</script>"><img src=x onerror=alert(2)>';

describe('renderMap', () => {
  const segments = [
    {
      id: 'a',
      name: `North ${hostile}`,
      level: 'heavy' as const,
      levelLabel: 'Heavy',
      geometry: {
        type: 'LineString' as const,
        coordinates: [
          [-5.4, 51.0],
          [-5.3, 51.05],
        ],
      },
    },
    {
      id: 'b',
      name: 'South',
      level: 'scant' as const,
      levelLabel: 'Scant',
      geometry: {
        type: 'LineString' as const,
        coordinates: [
          [-5.3, 51.05],
          [-5.2, 51.1],
        ],
      },
    },
  ];
  // RFC 7946 §3.1.6: exterior rings counter-clockwise (right-hand rule) — the opposite of
  // d3-geo's spherical convention, where such a ring is the rest of the globe.
  const ccwHull: [number, number][] = [
    [-5.35, 50.95],
    [-5.25, 50.95],
    [-5.25, 51.0],
    [-5.35, 51.0],
    [-5.35, 50.95],
  ];
  const zone = { id: 'zone-1', lon: -5.3, lat: 50.97, particles: 100, radiusKm: 3, hull: ccwHull };

  it('escapes input names inside <title> and keeps the SVG well formed', () => {
    const svg = renderMap({ idPrefix: 'm', title: hostile, description: 'd', segments: prepareSegments(segments), zones: [zone] });
    expect(svg).not.toContain('<script');
    expect(svg).not.toContain('<img');
    const { document } = parseHTML(`<!doctype html><html><body>${svg}</body></html>`);
    const titles = [...document.querySelectorAll('title')].map((t) => t.textContent);
    expect(titles).toContain(`North ${hostile}: Heavy, level 4 of 4`);
    expect(document.querySelectorAll('script, img').length).toBe(0);
  });

  it('draws a counter-clockwise (RFC 7946) zone hull as a small area, not the whole globe', () => {
    expect(geoArea({ type: 'Polygon', coordinates: [ccwHull] })).toBeGreaterThan(2 * Math.PI); // the trap
    const svg = renderMap({ idPrefix: 'm', title: 't', description: 'd', segments: prepareSegments(segments), zones: [zone], width: 400 });
    const { document } = parseHTML(`<!doctype html><html><body>${svg}</body></html>`);
    const zonePath = [...document.querySelectorAll('path')].find((p) => (p.getAttribute('fill') ?? '').includes('zone'));
    expect(zonePath).toBeDefined();
    const numbers = (zonePath!.getAttribute('d') ?? '').match(/-?\d+(\.\d+)?/g)!.map(Number);
    const xs = numbers.filter((_, i) => i % 2 === 0);
    // a whole-globe fill would span the full frame width (0…400) edge to edge
    expect(Math.max(...xs) - Math.min(...xs)).toBeLessThan(300);
  });

  it('marks the level by line style as well as colour: dotted for level 1, solid for level 4', () => {
    const svg = renderMap({ idPrefix: 'm', title: 't', description: 'd', segments: prepareSegments(segments) });
    const { document } = parseHTML(`<!doctype html><html><body>${svg}</body></html>`);
    const byTitle = (start: string) => [...document.querySelectorAll('path')].find((p) => p.querySelector('title')?.textContent?.startsWith(start));
    expect(byTitle('South')?.getAttribute('stroke-dasharray')).toBeTruthy();
    expect(byTitle('North')?.getAttribute('stroke-dasharray')).toBeNull();
    // numbered badges carry the level as text
    expect([...document.querySelectorAll('.badge text')].map((t) => t.textContent).sort()).toEqual(['1', '4']);
  });

  it('links each segment and its badge to its bulletin when asked, outside the tab order', () => {
    const svg = renderMap({
      idPrefix: 'm',
      title: 't',
      description: 'd',
      segments: prepareSegments(segments),
      zones: [{ ...zone, radiusKm: 10.496393620584156, particles: 1234 }],
      linkOf: (id) => `/segments/${id}/?x=1&y=2`,
    });
    const { document } = parseHTML(`<!doctype html><html><body>${svg}</body></html>`);
    // links inside an image would be hidden from assistive technology: the map is a group then
    expect(document.querySelector('svg')?.getAttribute('role')).toBe('group');
    const links = [...document.querySelectorAll('a')];
    expect(links.map((a) => a.getAttribute('href')).sort()).toEqual(['/segments/a/?x=1&y=2', '/segments/a/?x=1&y=2', '/segments/b/?x=1&y=2', '/segments/b/?x=1&y=2']);
    expect(links.every((a) => a.getAttribute('tabindex') === '-1')).toBe(true);
    expect(links.find((a) => a.getAttribute('href')?.startsWith('/segments/a/'))?.getAttribute('aria-label')).toBe(`North ${hostile}: Heavy, level 4 of 4`);
    expect(svg).not.toContain('<img');
    // the zone's tooltip gives rounded figures, as the zone table does
    expect([...document.querySelectorAll('title')].map((t) => t.textContent)).toContain('Offshore accumulation zone 1: about 1234 modelled particles within 10.5 km');
    const plain = renderMap({ idPrefix: 'm', title: 't', description: 'd', segments: prepareSegments(segments) });
    expect(plain).not.toContain('<a ');
    expect(plain).toContain('role="img"');
  });

  it('frames a locator map on the highlighted segment and ringed', () => {
    const svg = renderMap({ idPrefix: 'loc', title: 't', description: 'd', segments: prepareSegments(segments), highlight: 'b' });
    expect(svg).toContain('stroke-dasharray="4 3"');
    expect(svg).toMatch(/role="img" aria-labelledby="loc-title loc-desc"/);
  });
});

describe('renderIndicatorChart', () => {
  const indicator = bulletin.indicators.find((i) => i.indicator === 'shellfish-tissue') as IndicatorBulletin;

  it('is an image with an accessible name and no labelled plain groups (axe aria-prohibited-attr)', () => {
    const svg = renderIndicatorChart(indicator, { cacheKey: 'test/aria' });
    expect(svg.startsWith('<svg role="img"')).toBe(true);
    expect(svg).toContain(`aria-label="${indicator.label}: `);
    expect(svg).not.toMatch(/<g\b[^>]*aria-label=/);
  });

  it('draws every observation, and marks each censored one as below the detection limit', () => {
    const svg = renderIndicatorChart(indicator, { cacheKey: 'test/censored' });
    const { document } = parseHTML(`<!doctype html><html><body>${svg}</body></html>`);
    const titles = [...document.querySelectorAll('title')].map((t) => t.textContent ?? '');
    const censored = indicator.observations.filter((o) => o.censored).length;
    expect(censored).toBeGreaterThan(0);
    expect(titles.filter((t) => t.includes("below the lab's detection limit (")).length).toBe(censored);
    expect(titles.length).toBe(indicator.observations.filter((o) => o.value !== null).length);
  });

  it('renders the same input to the same string (reproducible builds)', () => {
    expect(renderIndicatorChart(indicator, { cacheKey: 'test/r1' })).toBe(renderIndicatorChart(indicator, { cacheKey: 'test/r2' }));
  });

  it('draws one panel per season of the year when the model says seasons disagree', () => {
    const beach = bulletin.indicators.find((i) => i.indicator === 'beach-litter')!;
    const svg = renderIndicatorChart({ ...beach, seasonsDisagree: true }, { cacheKey: 'test/seasonal' });
    const { document } = parseHTML(`<!doctype html><html><body>${svg}</body></html>`);
    const labels = [...document.querySelectorAll('text')].map((t) => t.textContent);
    for (const season of ['winter', 'spring', 'summer', 'autumn']) expect(labels).toContain(season);
  });
});

describe('chart axes and trend marks', () => {
  const tickTexts = (svg: string): string[] => {
    const { document } = parseHTML(`<!doctype html><html><body>${svg}</body></html>`);
    return [...document.querySelectorAll('text')].map((t) => t.textContent ?? '');
  };
  const beach = bulletin.indicators.find((i) => i.indicator === 'beach-litter')!;
  const counts = (values: number[]): IndicatorBulletin => ({
    ...beach,
    indicator: 'wildlife-reports',
    unitShort: 'animals',
    threshold: null,
    direction: 'rising',
    seasonsDisagree: false,
    observations: values.map((value, i) => ({
      date: `${2017 + Math.floor(i / 4)}-0${1 + (i % 4) * 2}-15`,
      t: 2017 + i / 4 + 0.1,
      season: `${2017 + Math.floor(i / 4)}-spring`,
      value,
      censored: false,
    })),
  });

  it('gives counts whole-number ticks only (animals cannot be fractional)', () => {
    const svg = renderIndicatorChart(counts([0, 1, 0, 2, 1, 3, 0, 1, 2, 1, 0, 3]), { cacheKey: 'test/count-ticks' });
    const numeric = tickTexts(svg).filter((t) => /^[−-]?[\d.]+$/.test(t) && !/^20\d\d$/.test(t));
    expect(numeric.length).toBeGreaterThan(1);
    for (const label of numeric) expect(label).toMatch(/^[−-]?\d+$/);
  });

  it('draws an all-zero count on a 0–1 axis, never with long decimals', () => {
    const scale = yScale({ indicator: 'wildlife-reports', unitShort: 'animals', threshold: null }, [0, 0, 0], [], []);
    expect(scale['domain']).toEqual([0, 1]);
    expect(scale['ticks']).toEqual([0, 1]);
    const svg = renderIndicatorChart(counts([0, 0, 0, 0, 0, 0]), { cacheKey: 'test/count-zero' });
    expect(tickTexts(svg).some((t) => /\d\.\d{3,}/.test(t))).toBe(false);
    const measured = yScale({ indicator: 'water-microplastics', unitShort: 'particles/m³', threshold: null }, [0, 0], [], []);
    expect(measured['domain']).toEqual([0, 1]);
  });

  it('draws no trend line where the seasons disagree or the data are too few', () => {
    const withBand = renderIndicatorChart(beach, { cacheKey: 'test/band' });
    const seasonal = renderIndicatorChart({ ...beach, seasonsDisagree: true }, { cacheKey: 'test/no-line-seasonal' });
    const few = renderIndicatorChart({ ...beach, direction: 'too-little-data' }, { cacheKey: 'test/no-line-few' });
    const hasLine = (svg: string) => svg.includes('stroke="#0f4c5c"');
    expect(beach.trend?.band ?? beach.trend?.sen?.slope ?? null).not.toBeNull();
    expect(hasLine(withBand)).toBe(true);
    expect(hasLine(seasonal)).toBe(false);
    expect(hasLine(few)).toBe(false);
  });
});

describe('regional figures', () => {
  it('prints the test as secondary text with a true minus sign and a rounded p', () => {
    expect(regionalFigures({ S: -254, p: 0.4512, slope: 0, unitShort: 'items/100 m' })).toBe(
      "Regional Kendall test: S = \u2212254, p = 0.45; median change 0 items/100 m a year (Sen's slope).",
    );
    expect(regionalFigures({ S: 968, p: 0.00001, slope: -0.0123, unitShort: 'particles/m³' })).toBe(
      "Regional Kendall test: S = 968, p < 0.001; median change \u22120.012 particles/m³ a year (Sen's slope).",
    );
    expect(formatPShort(0.0062)).toBe('0.006');
    expect(ordinal(51.7)).toBe('52nd');
    expect(ordinal(11)).toBe('11th');
    expect(ordinal(23)).toBe('23rd');
  });
});

describe('roundSvgNumbers', () => {
  it('rounds geometry to one decimal and leaves tick label text alone', () => {
    const input = '<g transform="translate(12.3456,7.891)"><path d="M1.23456,2.98765L3.14159,0.001"/><text y="0.32em">0.025</text></g>';
    expect(roundSvgNumbers(input)).toBe('<g transform="translate(12.3,7.9)"><path d="M1.2,3L3.1,0"/><text y="0.3em">0.025</text></g>');
  });
});

describe('dateFromDecimalYear', () => {
  it('maps the start and the middle of a year (365.25-day year)', () => {
    expect(dateFromDecimalYear(2026).toISOString()).toBe('2026-01-01T00:00:00.000Z');
    expect(dateFromDecimalYear(2026.5).toISOString()).toBe('2026-07-02T15:00:00.000Z');
  });
});

describe('CSV downloads', () => {
  // RFC 4180 §2: fields holding commas, quotes or line breaks are quoted, quotes doubled; CRLF ends records.
  it('quotes per RFC 4180 and defuses spreadsheet formulas in text cells (common practice)', () => {
    expect(
      toCsv(
        ['a', 'b'],
        [
          ['x,y', 'say "hi"'],
          ['=SUM(A1)', -2],
        ],
      ),
    ).toBe('a,b\r\n"x,y","say ""hi"""\r\n\'=SUM(A1),-2\r\n');
  });

  it('writes one row per observation of every indicator', () => {
    const rows = observationsCsv(bulletin).trimEnd().split('\r\n');
    expect(rows.length - 1).toBe(bulletin.indicators.reduce((n, i) => n + i.observations.length, 0));
    expect(rows[0]).toBe('segment_id,bulletin_season,indicator,date,sample_season,value,below_detection_limit,unit,note');
  });
});

describe('links and escaping', () => {
  it('links input addresses only when they are http(s)', () => {
    expect(safeHttpUrl('https://example.org/a?b=1')).toBe('https://example.org/a?b=1');
    expect(safeHttpUrl('javascript:alert(1)')).toBeNull();
    expect(safeHttpUrl(' JAVASCRIPT:alert(1)')).toBeNull();
    expect(safeHttpUrl('data:text/html,<script>')).toBeNull();
    expect(safeHttpUrl('/relative')).toBeNull();
    expect(safeMailto('x@y.org"><script>')).toBeNull();
    expect(safeMailto('health@example.org')).toBe('mailto:health@example.org');
    expect(safeTel('+00 1234 (560) 001')).toBe('tel:+001234560001');
    expect(safeTel('call us')).toBeNull();
  });

  it('escapes text for SVG and keeps JSON-LD from closing its script element', () => {
    expect(escapeXml(`a<b>&"'`)).toBe('a&lt;b&gt;&amp;&quot;&#39;');
    const text = jsonLdText({ name: '</script><script>alert(1)</script>' });
    expect(text).not.toContain('</');
    expect(text).not.toContain('<');
    expect(JSON.parse(text)).toEqual({ name: '</script><script>alert(1)</script>' });
  });

  it('writes dates from the model without the clock or the locale', () => {
    expect(formatDate('2026-12-01')).toBe('1 December 2026');
    expect(formatDate('not a date')).toBe('not a date');
  });
});
