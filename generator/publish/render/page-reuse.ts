/**
 * Step: render (pages taken over from the release on line instead of rendered).
 * Reusing unchanged bulletin pages from the published release.
 *
 * Every page about one bulletin — `/seasons/<season>/<segment>/` with its three downloads, and
 * for the current season `/segments/<segment>/` and `/embed/<segment>/<indicator>/` — is rendered
 * from that bulletin's model file plus a few shared inputs. Each bulletin gets a render key, the
 * SHA-256 of:
 * - the site fingerprint: the text of every file under site/ and public/, of astro.config.mjs,
 *   package.json, package-lock.json and tsconfig.json, and of every project file these import,
 *   directly or not (e.g. generator/model/read-model.ts); any change there → every key changes;
 * - the seasons of site.json (which one is current, labels), its map and logo, and the sorted list of every
 *   bulletin id (which seasons a segment has a bulletin in: the page links to them);
 * - the parts of its season's region summary a bulletin page reads: each segment's name, kind,
 *   level and geometry (locator map), the accumulation zones, the publisher, the region's name,
 *   and the regional trends' indicator ids and labels (the "not measured here" line);
 * - its own model file, byte for byte (through its SHA-256).
 * The keys are stored in the release (`render-keys.json`). A rebuild hands Astro only the
 * bulletins whose key changed (pages that list every bulletin — overview, season indexes, feed,
 * methods, search — are always rendered in full) and hard-links the other bulletins' files from
 * the published release. Anything unsure renders everything: no keys on line, a different site
 * fingerprint, seasons or bulletin set, a key file that does not parse, or a published file that
 * neither the render nor the reuse produced (a route this module does not know).
 *
 * Keep `regionPageInputs` in step with the site: a bulletin page that starts reading another
 * field of the region summary (or of site.json) must add it there. The site change itself
 * renders everything once (new fingerprint); later rebuilds rely on the key alone.
 */
import { createHash } from 'node:crypto';
import { existsSync, readFileSync, readdirSync, renameSync } from 'node:fs';
import { readFile, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { importedFiles } from '../import-graph.ts';
import { folderMaker, linkFiles } from '../move-files.ts';
import { errorCode } from '../publish-error.ts';
import { compareCodeUnits, listFiles, sha256Hex } from '../tree-hash.ts';
import type { FileHash } from '../tree-hash.ts';
import { giveTurn } from '../../event-loop.ts';

const renderKeysFileName = 'render-keys.json';
/** Changes whenever the way keys are computed changes (old keys then never match). */
const keyScheme = 'wrackline-render-keys-2';

export interface RenderKeys {
  scheme: string;
  /** Site fingerprint, seasons and bulletin set together: equal or everything is rendered. */
  shared: string;
  /** Current season id: decides which bulletins own /segments/ and /embed/ pages. */
  current: string;
  /** "season/segment" → render key. */
  bulletins: { [id: string]: string };
}

function sha256(...parts: (string | Buffer)[]): string {
  const hash = createHash('sha256');
  for (const part of parts) hash.update(typeof part === 'string' ? `${part.length}:${part}` : part);
  return hash.digest('hex');
}

/** Everything the rendering of a page can depend on besides the model and installed packages. */
const siteInputs = ['site', 'public', 'astro.config.mjs', 'package.json', 'package-lock.json', 'tsconfig.json'];

/**
 * Project files outside `siteInputs` that the site imports, directly or through each other
 * (see import-graph.ts). Relative paths from `root`, sorted.
 */
export async function importedProjectFiles(root: string, start: readonly string[]): Promise<string[]> {
  const inside = (file: string): boolean => siteInputs.some((item) => file === item || file.startsWith(`${item}/`));
  return (await importedFiles(root, start)).filter((file) => !inside(file));
}

export async function siteFingerprint(root: string, version: string): Promise<string> {
  const files: string[] = [];
  for (const item of siteInputs) {
    const full = path.join(root, item);
    const listed = await listFiles(full).catch((error: unknown) => {
      if (errorCode(error) === 'ENOENT' || errorCode(error) === 'ENOTDIR') return [];
      throw error;
    });
    files.push(...listed.map((file) => `${item}/${file}`));
    if (listed.length === 0) {
      // a single file (or missing: recorded as missing so adding it later changes the key)
      const text = await readFile(full).catch(() => null);
      files.push(text === null ? `${item}\0missing` : item);
    }
  }
  files.push(
    ...(await importedProjectFiles(
      root,
      files.filter((file) => !file.endsWith('\0missing')),
    )),
  );
  const hash = createHash('sha256').update(`${keyScheme}\nwrackline ${version}\n`);
  for (const file of files.sort(compareCodeUnits)) {
    const text = file.endsWith('\0missing') ? null : await readFile(path.join(root, file)).catch(() => null);
    if (text === null) {
      hash.update(`${file}\0missing\n`);
      continue;
    }
    hash.update(`${file}\0`).update(text).update('\0');
  }
  return hash.digest('hex');
}

interface RegionJson {
  season?: unknown;
  published?: unknown;
  invented?: unknown;
  region?: unknown;
  publisher?: unknown;
  segments?: { id?: unknown; name?: unknown; kind?: unknown; shellfish?: unknown; level?: unknown; geometry?: unknown }[];
  zones?: unknown;
  regionalTrends?: { indicator?: unknown; label?: unknown }[];
}

/** The part of a region summary that bulletin pages read (see the header). */
function regionPageInputs(region: RegionJson): string {
  return JSON.stringify({
    season: region.season,
    published: region.published,
    invented: region.invented,
    region: region.region,
    publisher: region.publisher,
    segments: (region.segments ?? []).map((s) => ({ id: s.id, name: s.name, kind: s.kind, shellfish: s.shellfish, level: s.level, geometry: s.geometry })),
    zones: region.zones,
    regionalTrends: (region.regionalTrends ?? []).map((t) => ({ indicator: t.indicator, label: t.label })),
  });
}

/** The bulletin model files of a model folder written by writeModel, by "season/segment", sorted. */
function bulletinFiles(modelDir: string, seasons: readonly string[]): { id: string; season: string; file: string }[] {
  const files: { id: string; season: string; file: string }[] = [];
  for (const season of [...seasons].sort(compareCodeUnits)) {
    const dir = path.join(modelDir, 'bulletins', season);
    const names = existsSync(dir) ? readdirSync(dir) : [];
    for (const name of names.filter((n) => n.endsWith('.json')).sort(compareCodeUnits)) {
      files.push({ id: `${season}/${name.slice(0, -'.json'.length)}`, season, file: path.join(dir, name) });
    }
  }
  return files;
}

/** The seasons a model folder's site.json lists. */
export function modelSeasons(modelDir: string): { id: string; current?: boolean }[] {
  const site = JSON.parse(readFileSync(path.join(modelDir, 'site.json'), 'utf8')) as { seasons?: { id: string; current?: boolean }[] };
  return site.seasons ?? [];
}

/**
 * SHA-256 of each bulletin model file, by "season/segment". `known` gives hashes already worked
 * out from the same bytes (the model memo's); the other files are read and hashed.
 */
export async function modelFileHashes(modelDir: string, known: ReadonlyMap<string, string> = new Map()): Promise<Map<string, string>> {
  const hashes = new Map<string, string>();
  for (const [i, entry] of bulletinFiles(
    modelDir,
    modelSeasons(modelDir).map((s) => s.id),
  ).entries()) {
    const given = known.get(entry.id);
    if (given !== undefined) {
      hashes.set(entry.id, given);
      continue;
    }
    if (i % 64 === 63) await giveTurn();
    hashes.set(entry.id, sha256Hex(readFileSync(entry.file)));
  }
  return hashes;
}

/** Render keys of every bulletin in a model folder written by writeModel (`hashes`: modelFileHashes). */
export async function computeRenderKeys(modelDir: string, fingerprint: string, hashes?: ReadonlyMap<string, string>): Promise<RenderKeys> {
  const seasons = modelSeasons(modelDir);
  const current = seasons.find((s) => s.current)?.id ?? '';
  const files = bulletinFiles(
    modelDir,
    seasons.map((s) => s.id),
  );
  const fileHashes = hashes ?? (await modelFileHashes(modelDir));
  // land under every locator map, the logo in every header (site.json "map", "publisherLogo"): other ones, every bulletin page again
  const { map: siteMap = null, publisherLogo = null } = JSON.parse(readFileSync(path.join(modelDir, 'site.json'), 'utf8')) as { map?: unknown; publisherLogo?: unknown };
  const shared = sha256(keyScheme, fingerprint, JSON.stringify(seasons), current, files.map((f) => f.id).join('\n'), sha256(JSON.stringify([siteMap, publisherLogo])));
  const regionKeys = new Map<string, string>();
  for (const season of new Set(files.map((f) => f.season))) {
    const text = await readFile(path.join(modelDir, 'regions', `${season}.json`), 'utf8').catch(() => null);
    regionKeys.set(season, sha256(text === null ? 'no region' : regionPageInputs(JSON.parse(text) as RegionJson)));
  }
  const bulletins: { [id: string]: string } = {};
  for (const entry of files) {
    const own = fileHashes.get(entry.id);
    if (own === undefined) throw new Error(`render keys: no hash of the model file ${entry.file}`);
    bulletins[entry.id] = sha256(shared, regionKeys.get(entry.season) ?? '', own);
  }
  return { scheme: keyScheme, shared, current, bulletins };
}

export async function writeRenderKeys(siteDir: string, keys: RenderKeys): Promise<void> {
  const bulletins = Object.fromEntries(
    Object.keys(keys.bulletins)
      .sort(compareCodeUnits)
      .map((id) => [id, keys.bulletins[id]]),
  );
  const text = `${JSON.stringify({ scheme: keys.scheme, shared: keys.shared, current: keys.current, bulletins }, null, 2)}\n`;
  await writeFile(path.join(siteDir, renderKeysFileName), text);
}

export async function readRenderKeys(release: string): Promise<RenderKeys | null> {
  try {
    const parsed = JSON.parse(await readFile(path.join(release, renderKeysFileName), 'utf8')) as Partial<RenderKeys>;
    if (typeof parsed.scheme !== 'string' || typeof parsed.shared !== 'string' || typeof parsed.current !== 'string') return null;
    if (parsed.bulletins === null || typeof parsed.bulletins !== 'object') return null;
    return { scheme: parsed.scheme, shared: parsed.shared, current: parsed.current, bulletins: parsed.bulletins };
  } catch {
    return null;
  }
}

export type RenderPlan = { kind: 'all'; reason: string } | { kind: 'some'; render: string[]; reuse: string[] };

/** Which bulletins to render, given the keys on line (null: none) and the new keys. */
export function planRender(previous: RenderKeys | null, next: RenderKeys): RenderPlan {
  if (previous === null) return { kind: 'all', reason: 'the published release records no render keys' };
  if (previous.scheme !== next.scheme) return { kind: 'all', reason: 'the render keys were made by another version' };
  if (previous.shared !== next.shared || previous.current !== next.current) {
    return { kind: 'all', reason: 'the site code, the seasons or the set of bulletins changed' };
  }
  const render: string[] = [];
  const reuse: string[] = [];
  for (const id of Object.keys(next.bulletins).sort(compareCodeUnits)) {
    if (previous.bulletins[id] === next.bulletins[id]) reuse.push(id);
    else render.push(id);
  }
  return { kind: 'some', render, reuse };
}

/**
 * The bulletin ("season/segment") a site file belongs to, or null for a shared file. Mirrors
 * the page routes under site/pages/: seasons/[season]/[segment]/…, segments/[segment]/…,
 * embed/[segment]/… (the last two for the current season's bulletins).
 */
export function ownerOf(file: string, current: string): string | null {
  const parts = file.split('/');
  if (parts[0] === 'seasons' && parts.length >= 4) return `${parts[1]}/${parts[2]}`;
  if ((parts[0] === 'segments' || parts[0] === 'embed') && parts.length >= 3) return `${current}/${parts[1]}`;
  return null;
}

/**
 * Links (or, across file systems, copies) the files of `reuse` bulletins listed in the
 * published release's manifest into `stageDir`, a folder of their own, and checks each one's
 * SHA-256 against the manifest as it goes. Runs while Astro renders (it never writes where
 * Astro writes); placeStaged then moves the files in. Returns the files staged and those whose
 * content no longer matches the manifest (the release on line was changed by hand).
 */
export async function stageReused(
  published: string,
  listing: readonly FileHash[],
  stageDir: string,
  reuse: ReadonlySet<string>,
  current: string,
): Promise<{ staged: FileHash[]; altered: FileHash[] }> {
  const staged: FileHash[] = [];
  const altered: FileHash[] = [];
  const makeFolder = folderMaker();
  for (const [i, entry] of listing.entries()) {
    const owner = ownerOf(entry.file, current);
    if (owner === null || !reuse.has(owner)) continue;
    // Let the rendering process's output flow now and then.
    if (i % 64 === 63) await giveTurn();
    linkFiles(published, stageDir, [entry.file], makeFolder);
    const content = readFileSync(path.join(stageDir, entry.file));
    if (sha256Hex(content) !== entry.sha256 || content.length !== entry.bytes) altered.push(entry);
    staged.push(entry);
  }
  return { staged, altered };
}

/**
 * Moves staged files into `siteDir`, except where the render wrote the same file itself (a route
 * that does not follow the list: the fresh file is right). A staged folder that `siteDir` lacks
 * altogether (the render wrote nothing there) moves as a whole, one rename for all its files.
 * Renaming never changes a file's content, so the release on line (linked, not copied) is never
 * written to. Returns the listing of what was placed.
 */
export function placeStaged(stageDir: string, siteDir: string, staged: readonly FileHash[]): FileHash[] {
  const placed: FileHash[] = [];
  const present = new Map<string, boolean>();
  const moved = new Set<string>();
  const inSite = (folder: string): boolean => {
    let known = present.get(folder);
    if (known === undefined) {
      known = existsSync(path.join(siteDir, folder));
      present.set(folder, known);
    }
    return known;
  };
  for (const entry of staged) {
    const parts = entry.file.split('/');
    let done = false;
    // The shallowest folder of this file that the site lacks moves with everything staged in it.
    for (let depth = 1; depth < parts.length && !done; depth += 1) {
      const folder = parts.slice(0, depth).join('/');
      if (moved.has(folder)) done = true;
      else if (!inSite(folder)) {
        renameSync(path.join(stageDir, folder), path.join(siteDir, folder));
        moved.add(folder);
        present.set(folder, true);
        done = true;
      }
    }
    if (!done) {
      const to = path.join(siteDir, entry.file);
      if (existsSync(to)) continue;
      renameSync(path.join(stageDir, entry.file), to);
    }
    placed.push(entry);
  }
  return placed;
}

/** Files every build writes after rendering (never taken over, never expected from Astro). */
const afterRender = new Set(['manifest.json', 'archive-ledger.json', renderKeysFileName]);

/**
 * Files of the published release a full render would write again but the assembled tree lacks:
 * anything outside the re-rendered bulletins, the search index and the files written after
 * rendering. Not empty means a route this module does not know of (the build then renders all).
 */
export function missingAfterReuse(listing: readonly FileHash[], present: ReadonlySet<string>, rendered: ReadonlySet<string>, current: string): string[] {
  return listing
    .map((entry) => entry.file)
    .filter((file) => {
      if (present.has(file) || afterRender.has(file) || file.startsWith('search-index/')) return false;
      const owner = ownerOf(file, current);
      return owner === null || !rendered.has(owner);
    });
}
