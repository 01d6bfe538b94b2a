/**
 * Small stand-ins for the reader, the model builder and the renderer, so the publishing
 * guarantees are tested without depending on the real statistics or the Astro site. The model
 * objects carry only the fields the publishing step reads (season, segment, permalink,
 * correction, and a few numbers so content can change); they are cast to the contract types.
 */
import { mkdir, writeFile } from 'node:fs/promises';
import path from 'node:path';
import type { Bulletin, RegionSummary, SiteModel, ValidationReport } from '../../../generator/model/types.ts';
import type { BuildSteps, ModelSet } from '../../../generator/publish/build-steps.ts';
import type { LoadedScenario } from '../../../generator/scenario/types.ts';

export const policy = "default-src 'self'; script-src 'self'; style-src 'self' 'unsafe-inline'; img-src 'self' data:; object-src 'none'; base-uri 'none'";

export interface FakeOptions {
  segments?: string[];
  seasons?: string[];
  /** Per "season/segment": a number shown on the page; change it to change the content. */
  values?: { [key: string]: number };
  corrections?: { season: string; segment: string | null; date: string; reason: string }[];
  /** "season/segment" keys whose bulletin shows the correction. */
  corrected?: string[];
  invalid?: boolean;
}

export function fakeScenario(options: FakeOptions = {}): LoadedScenario {
  const report: ValidationReport = options.invalid
    ? {
        ok: false,
        files: [{ file: 'tables/beach-litter.csv', read: 3, kept: 2, excluded: 1 }],
        issues: [
          {
            file: 'tables/beach-litter.csv',
            row: 3,
            column: 'items',
            value: '-4',
            expected: 'a whole number ≥ 0',
            message: 'items must not be negative',
            severity: 'error',
            excluded: true,
          },
        ],
      }
    : { ok: true, files: [], issues: [] };
  return {
    dir: '/fake',
    settings: { corrections: options.corrections ?? [] } as unknown as LoadedScenario['settings'],
    segments: (options.segments ?? ['north-bay', 'south-reef']).map((id) => ({ id })) as unknown as LoadedScenario['segments'],
    records: [],
    drift: null,
    inputs: [],
    report,
  };
}

export function fakeModel(options: FakeOptions = {}): ModelSet {
  const segments = options.segments ?? ['north-bay', 'south-reef'];
  const seasons = options.seasons ?? ['2026-summer', '2026-autumn'];
  const site = {
    schemaVersion: 1,
    invented: true,
    seasons: seasons.map((id, index) => ({ id, label: id, start: '', end: '', published: '', current: index === seasons.length - 1 })),
  } as unknown as SiteModel;
  const regions = seasons.map((id) => ({ schemaVersion: 1, season: { id }, segments: segments.map((segment) => ({ id: segment })) }) as unknown as RegionSummary);
  const bulletins: Bulletin[] = [];
  for (const season of seasons) {
    for (const segment of segments) {
      const key = `${season}/${segment}`;
      const correction = options.corrected?.includes(key) ? ((options.corrections ?? []).find((item) => item.season === season) ?? null) : null;
      bulletins.push({
        schemaVersion: 1,
        season: { id: season, label: season },
        segment: { id: segment, name: `Segment ${segment}` },
        headline: `Value ${options.values?.[key] ?? 1}`,
        correction: correction ? { date: correction.date, reason: correction.reason } : null,
        permalink: `/seasons/${season}/${segment}/`,
      } as unknown as Bulletin);
    }
  }
  return { site, regions, bulletins };
}

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (character) => `&#${character.charCodeAt(0)};`);
}

export async function writeFakeModel(dir: string, set: ModelSet): Promise<void> {
  await writeFile(path.join(dir, 'site.json'), `${JSON.stringify(set.site, null, 2)}\n`);
  await mkdir(path.join(dir, 'regions'), { recursive: true });
  for (const region of set.regions) {
    await writeFile(path.join(dir, 'regions', `${region.season.id}.json`), `${JSON.stringify(region, null, 2)}\n`);
  }
  for (const bulletin of set.bulletins) {
    const folder = path.join(dir, 'bulletins', bulletin.season.id);
    await mkdir(folder, { recursive: true });
    await writeFile(path.join(folder, `${bulletin.segment.id}.json`), `${JSON.stringify(bulletin, null, 2)}\n`);
  }
}

export function page(title: string, body: string, extraHead = ''): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta http-equiv="Content-Security-Policy" content="${policy}"><title>${escapeHtml(title)}</title>${extraHead}</head><body>${body}</body></html>\n`;
}

export interface FakeStepOptions extends FakeOptions {
  /** Thrown from the renderer after it wrote half of the pages. */
  failWhileRendering?: boolean;
  /** Written into every page's head (e.g. an inline script) to trip the safety check. */
  extraHead?: string;
  /** Called after half the pages are written (the kill test waits here). */
  midRender?: () => Promise<void>;
}

export function fakeSteps(options: FakeStepOptions = {}): BuildSteps {
  return {
    load: async () => fakeScenario(options),
    model: async () => fakeModel(options),
    write: (dir, set) => writeFakeModel(dir, set),
    render: async ({ outDir, onPage, modelDir }) => {
      const { readdir, readFile } = await import('node:fs/promises');
      const site = JSON.parse(await readFile(path.join(modelDir, 'site.json'), 'utf8')) as SiteModel;
      const pages: { file: string; html: string }[] = [{ file: 'index.html', html: page('Overview', '<h1>Invented coast</h1>', options.extraHead) }];
      for (const season of site.seasons) {
        const folder = path.join(modelDir, 'bulletins', season.id);
        for (const name of (await readdir(folder)).sort()) {
          const bulletin = JSON.parse(await readFile(path.join(folder, name), 'utf8')) as Bulletin;
          const note = bulletin.correction ? `<p>Corrected on ${bulletin.correction.date}: ${escapeHtml(bulletin.correction.reason)}</p>` : '';
          pages.push({
            file: `${bulletin.permalink.replace(/^\//, '')}index.html`,
            html: page(bulletin.segment.name, `<h1>${escapeHtml(bulletin.segment.name)}</h1><p>${escapeHtml(bulletin.headline)}</p>${note}`, options.extraHead),
          });
        }
      }
      let done = 0;
      for (const [index, item] of pages.entries()) {
        if (index === Math.floor(pages.length / 2)) {
          if (options.midRender) await options.midRender();
          if (options.failWhileRendering) throw new Error('renderer failed half way (test)');
        }
        await mkdir(path.dirname(path.join(outDir, item.file)), { recursive: true });
        await writeFile(path.join(outDir, item.file), item.html);
        done += 1;
        onPage(done);
      }
      return { pages: pages.length };
    },
    index: async () => {},
  };
}
