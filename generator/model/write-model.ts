/**
 * Writes the bulletin model as JSON files (stable key order, 2-space indent, trailing newline):
 *   <dir>/site.json
 *   <dir>/regions/<seasonId>.json
 *   <dir>/bulletins/<seasonId>/<segmentId>.json
 *   <dir>/listing/<seasonId>.json   what pages listing many bulletins read (listing.ts), by segment id
 *   <dir>/publisher-logo/<sha256>.<ext>  the publisher's logo, when the settings give one (publisher-logo.ts)
 * Files are written to a temporary name and renamed, so a reader never sees half a file.
 */
import { mkdirSync, renameSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import type { BulletinModelSet } from './assemble-model.ts';
import { listingOf, type BulletinListing } from './listing.ts';
import { giveTurn } from '../event-loop.ts';
import { stableJson } from './stable-json.ts';
import { publisherLogoFolder } from './publisher-logo.ts';
import type { WrittenBulletin } from './written-bulletin.ts';

const safeName = /^[a-z0-9][a-z0-9-]*$/;

function checkedLogoName(name: string): string {
  if (!/^[0-9a-f]{32}\.(png|jpg|webp)$/.test(name)) throw new Error(`writeModel: publisher logo "${name}" is not a content-addressed file name`);
  return name;
}

function checkedName(kind: string, name: string): string {
  if (!safeName.test(name)) throw new Error(`writeModel: ${kind} "${name}" is not a safe file name`);
  return name;
}

// Synchronous writes: thousands of small files one after another are far quicker so than
// with a round trip through the thread pool for each (the event loop gets a turn between bulletins).
const madeDirs = new Set<string>();
function writeText(path: string, text: string | Buffer): void {
  const dir = dirname(path);
  if (!madeDirs.has(dir)) {
    mkdirSync(dir, { recursive: true });
    madeDirs.add(dir);
  }
  const temporary = `${path}.tmp`;
  writeFileSync(temporary, text);
  renameSync(temporary, path);
}

function writeJson(path: string, value: unknown): void {
  writeText(path, stableJson(value));
}

/** `written`: bulletins whose model file text is ready (assemble-with-memo.ts), written as they are. */
export async function writeModel(dir: string, set: BulletinModelSet & { written?: readonly WrittenBulletin[] }): Promise<void> {
  madeDirs.clear();
  mkdirSync(dir, { recursive: true });
  writeJson(join(dir, 'site.json'), set.site);
  if (set.publisherLogo) writeText(join(dir, publisherLogoFolder, checkedLogoName(set.publisherLogo.file)), Buffer.from(set.publisherLogo.bytes));
  for (const region of set.regions) {
    writeJson(join(dir, 'regions', `${checkedName('season', region.season.id)}.json`), region);
  }
  for (const [i, bulletin] of set.bulletins.entries()) {
    if (i % 32 === 31) await giveTurn();
    writeJson(join(dir, 'bulletins', checkedName('season', bulletin.season.id), `${checkedName('segment', bulletin.segment.id)}.json`), bulletin);
  }
  const listings = new Map<string, BulletinListing[]>();
  const list = (listing: BulletinListing): void => {
    const season = listings.get(listing.season.id);
    if (season) season.push(listing);
    else listings.set(listing.season.id, [listing]);
  };
  for (const bulletin of set.bulletins) list(listingOf(bulletin));
  for (const [i, bulletin] of (set.written ?? []).entries()) {
    if (i % 64 === 63) await giveTurn();
    writeText(join(dir, 'bulletins', checkedName('season', bulletin.seasonId), `${checkedName('segment', bulletin.segmentId)}.json`), bulletin.text);
    list(bulletin.listing);
  }
  for (const [season, entries] of listings) {
    entries.sort((a, b) => (a.segment.id < b.segment.id ? -1 : a.segment.id > b.segment.id ? 1 : 0));
    writeJson(join(dir, 'listing', `${checkedName('season', season)}.json`), entries);
  }
}
