/**
 * The bulletin model folder the generator wrote (WRACKLINE_MODEL, default
 * `.wrackline/model`), read once per build through the generator's own readModel and
 * indexed for the pages. Pages only render what is here.
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { readModel } from '../../generator/model/read-model.ts';
import type { Bulletin, RegionSummary, SiteModel } from '../../generator/model/types.ts';

export interface LoadedModel {
  site: SiteModel;
  regions: Map<string, RegionSummary>;
  /** bulletins by season id, each sorted by segment name then id */
  bulletins: Map<string, Bulletin[]>;
}

let cached: Promise<LoadedModel> | null = null;

export function modelDir(): string {
  return resolve(process.env['WRACKLINE_MODEL'] ?? '.wrackline/model');
}

async function load(dir: string): Promise<LoadedModel> {
  const set = await readModel(dir);
  const regions = new Map<string, RegionSummary>();
  for (const region of set.regions) regions.set(region.season.id, region);
  const bulletins = new Map<string, Bulletin[]>();
  for (const season of set.site.seasons) bulletins.set(season.id, []);
  for (const bulletin of set.bulletins) bulletins.get(bulletin.season.id)?.push(bulletin);
  for (const list of bulletins.values()) {
    list.sort((a, b) => a.segment.name.localeCompare(b.segment.name, 'en') || (a.segment.id < b.segment.id ? -1 : a.segment.id > b.segment.id ? 1 : 0));
  }
  return { site: set.site, regions, bulletins };
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

export function bulletinsOf(model: LoadedModel, seasonId: string): Bulletin[] {
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
 * release (generator/publish/page-reuse.ts).
 */
export function pageBulletins(list: Bulletin[]): Bulletin[] {
  if (renderOnly === undefined) {
    const file = process.env['WRACKLINE_RENDER_ONLY'];
    renderOnly = file ? new Set(JSON.parse(readFileSync(file, 'utf8')) as string[]) : null;
  }
  const only = renderOnly;
  return only === null ? list : list.filter((b) => only.has(`${b.season.id}/${b.segment.id}`));
}
