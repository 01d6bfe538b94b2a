/**
 * Step: check (past-season pages against the release on line, before the swap).
 * The archive ledger: a record, kept in every published folder as `archive-ledger.json`, of the
 * content hash of each bulletin and region summary of each season. Before a new release is
 * swapped in, the seasons that are past in the new build are compared with the ledger of the
 * release on line now; a past-season page that would change or disappear stops the build,
 * unless the scenario records a correction for that season (and segment), which the page must
 * then show. Keeping published bulletins unchanged, with dated corrections, is common practice
 * for public bulletins.
 *
 * What is hashed is the bulletin model (the content of the page), not the page's HTML, so a
 * restyled layout does not count as a change of a published bulletin while any changed number,
 * sentence or level does. Objects are hashed with their keys sorted, so key order is irrelevant.
 */
import { readFileSync } from 'node:fs';
import { readdir } from 'node:fs/promises';
import path from 'node:path';
import type { Bulletin, RegionSummary, SiteModel } from '../../model/types.ts';
import { PublishError } from '../publish-error.ts';
import { assertSlug, resolveInside } from './safe-path.ts';
import { compareCodeUnits, sha256Hex } from '../tree-hash.ts';
import { giveTurn } from '../../event-loop.ts';

export const ledgerFileName = 'archive-ledger.json';

interface LedgerEntry {
  /** Segment id; null for the season's region summary. */
  segment: string | null;
  /** Site path of the page, e.g. "seasons/2026-summer/north-bay/". */
  page: string;
  sha256: string;
  /** Hash of each top-level field, so a refusal can say what changed. */
  parts: { [field: string]: string };
  correction: { date: string; reason: string } | null;
}

interface LedgerSeason {
  season: string;
  current: boolean;
  entries: LedgerEntry[];
}

export interface ArchiveLedger {
  generator: 'wrackline';
  seasons: LedgerSeason[];
}

export interface Correction {
  season: string;
  segment: string | null;
  date: string;
  reason: string;
}

/** JSON with object keys sorted at every depth: the same value always gives the same text. */
export function canonicalJson(value: unknown): string {
  try {
    return JSON.stringify(value, sortedKeys) ?? 'null';
  } catch (error) {
    if (error !== integerKeys) throw error;
    return canonicalJsonByHand(value);
  }
}

const integerKeys = new Error('an object has integer-like keys');
const integerLike = /^(?:0|[1-9]\d*)$/;

/**
 * JSON.stringify replacer: objects whose keys are not in code-unit order are copied with sorted
 * keys (most values, e.g. read from files written with sorted keys, need no copy). Objects with
 * integer-like keys cannot be reordered (JavaScript lists those keys first, by number): the
 * whole value then goes through canonicalJsonByHand.
 */
function sortedKeys(this: unknown, _key: string, value: unknown): unknown {
  if (value === null || typeof value !== 'object' || Array.isArray(value)) return value;
  const record = value as { [key: string]: unknown };
  const keys = Object.keys(record);
  let sorted = true;
  for (let i = 0; i < keys.length; i += 1) {
    const key = keys[i] as string;
    if (integerLike.test(key)) throw integerKeys;
    if (i > 0 && (keys[i - 1] as string) > key) sorted = false;
  }
  if (sorted) return value;
  const copy: { [key: string]: unknown } = {};
  for (const key of keys.sort(compareCodeUnits)) copy[key] = record[key];
  return copy;
}

/** The same text, built by hand (any key order). */
function canonicalJsonByHand(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map((item) => canonicalJsonByHand(item)).join(',')}]`;
  if (value !== null && typeof value === 'object') {
    const record = value as { [key: string]: unknown };
    const keys = Object.keys(record)
      .filter((key) => record[key] !== undefined)
      .sort(compareCodeUnits);
    return `{${keys.map((key) => `${JSON.stringify(key)}:${canonicalJsonByHand(record[key])}`).join(',')}}`;
  }
  return JSON.stringify(value) ?? 'null';
}

function entryFor(segment: string | null, page: string, content: { [field: string]: unknown }, correction: LedgerEntry['correction']): LedgerEntry {
  const parts: { [field: string]: string } = {};
  // The whole content's canonical text is made of its fields' texts (same as canonicalJson(content)).
  const pieces: string[] = [];
  for (const field of Object.keys(content).sort(compareCodeUnits)) {
    const text = canonicalJson(content[field]);
    parts[field] = sha256Hex(text).slice(0, 16);
    if (content[field] !== undefined) pieces.push(`${JSON.stringify(field)}:${text}`);
  }
  return { segment, page, sha256: sha256Hex(`{${pieces.join(',')}}`), parts, correction };
}

async function readJson<T>(file: string): Promise<T> {
  // Synchronous read, one small file after another; the caller yields between files.
  return JSON.parse(readFileSync(file, 'utf8')) as T;
}

async function readRegion(modelDir: string, season: string): Promise<RegionSummary | null> {
  return readJson<RegionSummary>(path.join(modelDir, 'regions', `${season}.json`)).catch(() => null);
}

/**
 * Entries that may be taken over from the ledger of the release on line. An entry depends on the
 * bytes of the bulletin's model file alone, and that release's `bulletin.json` download is that
 * file: a model file with the SHA-256 of the download on line has the entry on line.
 */
export interface LedgerReuse {
  previous: ArchiveLedger;
  /** SHA-256 of each bulletin model file, by "season/segment" */
  modelHashes: ReadonlyMap<string, string>;
  /** SHA-256 of each file of the release on line, by site path */
  publishedHashes: ReadonlyMap<string, string>;
}

/** Builds the ledger of a model folder (site.json, regions, bulletins/<season>/<segment>.json). */
export async function ledgerFromModel(modelDir: string, reuse?: LedgerReuse): Promise<ArchiveLedger> {
  const onLine = new Map<string, LedgerEntry>();
  for (const season of reuse?.previous.seasons ?? []) {
    for (const entry of season.entries) if (entry.segment !== null) onLine.set(`${season.season}/${entry.segment}`, entry);
  }
  const site = await readJson<SiteModel>(path.join(modelDir, 'site.json'));
  const seasons: LedgerSeason[] = [];
  for (const season of site.seasons) {
    assertSlug(season.id, 'season id');
    const entries: LedgerEntry[] = [];
    const region = await readRegion(modelDir, season.id);
    if (region) {
      entries.push(entryFor(null, `seasons/${season.id}/`, region as unknown as { [field: string]: unknown }, null));
    }
    const folder = path.join(modelDir, 'bulletins', season.id);
    const files = (await readdir(folder).catch(() => [] as string[])).filter((name) => name.endsWith('.json')).sort(compareCodeUnits);
    for (const [i, name] of files.entries()) {
      // Let other work (a child process's output) through now and then.
      if (i % 16 === 15) await giveTurn();
      const segmentId = name.slice(0, -'.json'.length);
      const known = onLine.get(`${season.id}/${segmentId}`);
      const own = reuse?.modelHashes.get(`${season.id}/${segmentId}`);
      if (reuse && known && own !== undefined && own === reuse.publishedHashes.get(`seasons/${season.id}/${segmentId}/bulletin.json`)) {
        assertSlug(segmentId, `segment id in ${path.join('bulletins', season.id, name)}`);
        entries.push(known);
        continue;
      }
      const bulletin = await readJson<Bulletin>(path.join(folder, name));
      assertSlug(bulletin.segment.id, `segment id in ${path.join('bulletins', season.id, name)}`);
      const page = bulletin.permalink.replace(/^\/+/, '');
      resolveInside('/site-root', page); // throws when the permalink would leave the site
      entries.push(entryFor(bulletin.segment.id, page, bulletin as unknown as { [field: string]: unknown }, bulletin.correction));
    }
    seasons.push({ season: season.id, current: season.current, entries });
  }
  return { generator: 'wrackline', seasons };
}

export async function readLedger(publishedFolder: string): Promise<ArchiveLedger | null> {
  try {
    return await readJson<ArchiveLedger>(path.join(publishedFolder, ledgerFileName));
  } catch {
    return null;
  }
}

interface ArchiveViolation {
  season: string;
  segment: string | null;
  page: string;
  problem: 'changed' | 'removed' | 'correction-not-shown';
  fields: string[];
}

function correctionCovers(corrections: readonly Correction[], season: string, segment: string | null): Correction | null {
  return corrections.find((correction) => correction.season === season && (correction.segment === null || segment === null || correction.segment === segment)) ?? null;
}

/**
 * Compares the seasons that are past in `next` with what `previous` published. Returns every
 * violation; an empty list means the archive is intact.
 */
export function compareLedgers(previous: ArchiveLedger | null, next: ArchiveLedger, corrections: readonly Correction[]): ArchiveViolation[] {
  if (previous === null) return [];
  const violations: ArchiveViolation[] = [];
  const nextSeasons = new Map(next.seasons.map((season) => [season.season, season]));
  for (const published of previous.seasons) {
    const now = nextSeasons.get(published.season);
    if (now?.current) continue; // the season being published may still be revised
    const nowEntries = new Map((now?.entries ?? []).map((entry) => [`${entry.segment ?? ''}`, entry]));
    for (const entry of published.entries) {
      const replacement = nowEntries.get(`${entry.segment ?? ''}`);
      const base = { season: published.season, segment: entry.segment, page: entry.page };
      if (!replacement) {
        violations.push({ ...base, problem: 'removed', fields: [] });
        continue;
      }
      if (replacement.sha256 === entry.sha256) continue;
      const fields = [...new Set([...Object.keys(entry.parts), ...Object.keys(replacement.parts)])]
        .filter((field) => entry.parts[field] !== replacement.parts[field])
        .sort(compareCodeUnits);
      const correction = correctionCovers(corrections, published.season, entry.segment);
      if (!correction) {
        violations.push({ ...base, problem: 'changed', fields });
      } else if (entry.segment !== null && replacement.correction === null) {
        violations.push({ ...base, problem: 'correction-not-shown', fields });
      }
    }
  }
  return violations;
}

/** A readable refusal naming each page (at most `limit` listed). */
function describeViolations(violations: readonly ArchiveViolation[], limit = 12): string {
  const lines = violations.slice(0, limit).map((violation) => {
    const what = violation.segment === null ? `region summary of ${violation.season}` : `bulletin ${violation.season} / ${violation.segment}`;
    const fields = violation.fields.length > 0 ? ` (changed: ${violation.fields.join(', ')})` : '';
    if (violation.problem === 'removed') return `  - /${violation.page} — ${what} was published and would be removed`;
    if (violation.problem === 'correction-not-shown') {
      return `  - /${violation.page} — ${what} changes under a recorded correction, but its "correction" field is empty, so the page would not say so${fields}`;
    }
    return `  - /${violation.page} — ${what} would change${fields}`;
  });
  const more = violations.length > limit ? [`  … and ${violations.length - limit} more`] : [];
  return [
    `The build would change ${violations.length} already published past-season page(s):`,
    ...lines,
    ...more,
    'Published bulletins stay as they were. If the change is a deliberate correction, record it in the scenario settings under',
    '"corrections" (season, segment or null for the whole season, date, reason); the page then says it was corrected.',
  ].join('\n');
}

export function assertArchiveIntact(previous: ArchiveLedger | null, next: ArchiveLedger, corrections: readonly Correction[]): void {
  const violations = compareLedgers(previous, next, corrections);
  if (violations.length > 0) throw new PublishError(describeViolations(violations), 1);
}
