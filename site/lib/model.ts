/**
 * The bulletin model folder the generator wrote (WRACKLINE_MODEL, default
 * `.wrackline/model`; layout in generator/model/write-model.ts). Read once per build: the site
 * file, the region summaries and the listings (what pages about many bulletins read of each);
 * a whole bulletin is read when a page about it is rendered (`bulletinOf`). Pages only render
 * what is here.
 */
import { readFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import type { BulletinListing } from '../../generator/model/listing.ts';
import type { Bulletin, RegionSummary, SiteModel } from '../../generator/model/types.ts';

export interface LoadedModel {
  site: SiteModel;
  regions: Map<string, RegionSummary>;
  /** listings of the bulletins by season id, each sorted by segment name then id */
  bulletins: Map<string, BulletinListing[]>;
}

let cached: Promise<LoadedModel> | null = null;

export function modelDir(): string {
  return resolve(process.env['WRACKLINE_MODEL'] ?? '.wrackline/model');
}

const slug = /^[a-z0-9][a-z0-9_-]*$/i;

function readJson<T>(file: string): T {
  const text = readFileSync(file, 'utf8');
  try {
    return JSON.parse(text) as T;
  } catch (error) {
    throw new Error(`${file} is not valid JSON (${error instanceof Error ? error.message : String(error)})`);
  }
}

function safeName(value: string, what: string): string {
  if (!slug.test(value)) throw new Error(`${what} "${value}" is not a plain slug`);
  return value;
}

async function load(dir: string): Promise<LoadedModel> {
  const site = readJson<SiteModel>(join(dir, 'site.json'));
  const regions = new Map<string, RegionSummary>();
  const bulletins = new Map<string, BulletinListing[]>();
  for (const season of site.seasons) {
    const id = safeName(season.id, 'season id');
    regions.set(id, readJson<RegionSummary>(join(dir, 'regions', `${id}.json`)));
    const list = readJson<BulletinListing[]>(join(dir, 'listing', `${id}.json`));
    list.sort((a, b) => a.segment.name.localeCompare(b.segment.name, 'en') || (a.segment.id < b.segment.id ? -1 : a.segment.id > b.segment.id ? 1 : 0));
    bulletins.set(id, list);
  }
  return { site, regions, bulletins };
}

const whole = new Map<string, Bulletin>();

/**
 * The bulletin as the pages use it: an indicator whose samples are shown as season summaries
 * (`sampleSummaries`, more than 400 samples) keeps only its first and last sample, which is all
 * its pages read of them (where the trend line starts and ends, the earliest date). A series of
 * a million samples would otherwise keep hundreds of megabytes in the Astro process for every
 * bulletin it renders; every sample stays in the downloads, which the generator writes.
 */
export function pageBulletin(bulletin: Bulletin): Bulletin {
  if (!bulletin.indicators.some((i) => i.sampleSummaries && i.observations.length > 2)) return bulletin;
  return {
    ...bulletin,
    indicators: bulletin.indicators.map((i) => {
      if (!i.sampleSummaries || i.observations.length <= 2) return i;
      const first = i.observations[0];
      const last = i.observations[i.observations.length - 1];
      return { ...i, observations: first && last ? [first, last] : [] };
    }),
  };
}

/** The bulletin a listing stands for (as the pages use it: pageBulletin), read from its model file once per build. */
export function bulletinOf(listing: { season: { id: string }; segment: { id: string } }): Bulletin {
  const key = `${listing.season.id}/${listing.segment.id}`;
  let bulletin = whole.get(key);
  if (!bulletin) {
    const file = join(modelDir(), 'bulletins', safeName(listing.season.id, 'season id'), `${safeName(listing.segment.id, 'segment id')}.json`);
    bulletin = pageBulletin(readJson<Bulletin>(file));
    whole.set(key, bulletin);
  }
  return bulletin;
}

export function loadModel(): Promise<LoadedModel> {
  cached ??= load(modelDir()).catch((error: unknown) => {
    throw new Error(`cannot read the bulletin model in ${modelDir()}: ${error instanceof Error ? error.message : String(error)}`);
  });
  return cached;
}

/** Seasons newest first (by start date). */
export function seasonsNewestFirst(model: LoadedModel): SiteModel['seasons'] {
  return [...model.site.seasons].sort((a, b) => (a.start < b.start ? 1 : a.start > b.start ? -1 : 0));
}

export function currentSeason(model: LoadedModel): SiteModel['seasons'][number] {
  const current = model.site.seasons.find((s) => s.current) ?? seasonsNewestFirst(model)[0];
  if (!current) throw new Error(`bulletin model in ${modelDir()} lists no season`);
  return current;
}

export function bulletinsOf(model: LoadedModel, seasonId: string): BulletinListing[] {
  return model.bulletins.get(seasonId) ?? [];
}

export function regionOf(model: LoadedModel, seasonId: string): RegionSummary {
  const region = model.regions.get(seasonId);
  if (!region) throw new Error(`bulletin model has no region summary for season ${seasonId}`);
  return region;
}

let renderOnly: Set<string> | null | undefined;
/**
 * The bulletins whose own pages this build renders (for getStaticPaths of bulletin pages only;
 * pages listing bulletins use bulletinsOf). All of them, unless WRACKLINE_RENDER_ONLY names a
 * JSON list of "season/segment" ids: a rebuild takes the other pages over from the published
 * release (generator/publish/render/page-reuse.ts).
 */
export function pageBulletins(list: readonly BulletinListing[]): Bulletin[] {
  if (renderOnly === undefined) {
    const file = process.env['WRACKLINE_RENDER_ONLY'];
    renderOnly = file ? new Set(JSON.parse(readFileSync(file, 'utf8')) as string[]) : null;
  }
  const only = renderOnly;
  return (only === null ? list : list.filter((b) => only.has(`${b.season.id}/${b.segment.id}`))).map(bulletinOf);
}
