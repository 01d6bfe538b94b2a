/**
 * Reads a model folder written by writeModel. Used by the site (getStaticPaths) and by tests.
 * Regions are returned in the order of site.seasons; bulletins by season then segment id.
 */
import { readFileSync } from 'node:fs';
import { readdir } from 'node:fs/promises';
import { join } from 'node:path';
import type { BulletinModelSet } from './assemble-model.ts';
import type { Bulletin, RegionSummary, SiteModel } from './types.ts';

// Read synchronously: thousands of small files one after another (see write-model.ts).
async function readJson<T>(path: string): Promise<T> {
  const text = readFileSync(path, 'utf8');
  try {
    return JSON.parse(text) as T;
  } catch (error) {
    throw new Error(`readModel: ${path} is not valid JSON (${error instanceof Error ? error.message : String(error)})`);
  }
}

async function listJson(dir: string): Promise<string[]> {
  try {
    return (await readdir(dir)).filter((name) => name.endsWith('.json')).sort();
  } catch {
    return [];
  }
}

export async function readModel(dir: string): Promise<BulletinModelSet> {
  const site = await readJson<SiteModel>(join(dir, 'site.json'));
  const regions: RegionSummary[] = [];
  const bulletins: Bulletin[] = [];
  for (const season of site.seasons) {
    const regionFile = join(dir, 'regions', `${season.id}.json`);
    regions.push(await readJson<RegionSummary>(regionFile));
    const folder = join(dir, 'bulletins', season.id);
    for (const name of await listJson(folder)) bulletins.push(await readJson<Bulletin>(join(folder, name)));
  }
  return { site, regions, bulletins };
}
