/**
 * Step: render (the search index, made from the rendered pages while they are checked).
 * The site's search index, in parts. Pagefind indexes the pages that ask for it (marked
 * `data-pagefind-body`: the current season's bulletins); the pages are shared among parts by a
 * hash of their path, each part is a pagefind index of its own under `search-index/<part>/`, and
 * the search page loads the first and merges the others into it (pagefind's `mergeIndex`).
 * `search-index/parts.json` names the parts and their pages.
 *
 * Why parts: one index of every page must be built again whenever any page changes, and pagefind
 * takes about 1.3 ms a page on two cores (2,000 pages: 2.7 s). In parts, a rebuild after one
 * bulletin changed indexes one part; a part whose pages are byte for byte those of the release
 * on line is taken over from it (its files are checked against that release's manifest like
 * every other file taken over). A part's index depends only on its own pages, so a taken-over
 * part is the part a full build would write.
 *
 * Two parts at least as soon as there are two pages, so the merging is used (and tested) on small
 * sites too; one more per 250 pages.
 */
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { packageRoot, resolvePackageBin, runNodeScript } from './astro-render.ts';
import { linkFiles } from '../move-files.ts';
import { compareCodeUnits } from '../tree-hash.ts';
import type { FileHash } from '../tree-hash.ts';
import { giveTurn } from '../../event-loop.ts';

export const searchIndexFolder = 'search-index';
const searchPartsFileName = `${searchIndexFolder}/parts.json`;
export const pagesPerPart = 250;
const partsScheme = 'wrackline-search-parts-1';

export interface SearchPart {
  /** "part-<n>"; its index lives in search-index/<name>/ */
  name: string;
  /** site paths of its pages ("segments/x/index.html"), sorted */
  pages: string[];
}

interface SearchParts {
  scheme: string;
  parts: (SearchPart & { path: string })[];
}

/** How many parts for this many pages (see the header). */
export function partCount(pages: number): number {
  return pages <= 1 ? 1 : Math.max(2, Math.ceil(pages / pagesPerPart));
}

/** FNV-1a (32 bit) of a page's path: which part it belongs to does not depend on the other pages. */
function pathHash(page: string): number {
  let hash = 0x811c9dc5;
  for (let i = 0; i < page.length; i += 1) {
    hash ^= page.charCodeAt(i);
    hash = Math.imul(hash, 0x01000193) >>> 0;
  }
  return hash;
}

/** The parts for a set of pages; parts that would be empty are left out. */
export function planSearchParts(pages: readonly string[]): SearchPart[] {
  const count = partCount(pages.length);
  const lists: string[][] = Array.from({ length: count }, () => []);
  for (const page of [...pages].sort(compareCodeUnits)) lists[pathHash(page) % count]?.push(page);
  return lists.flatMap((list, i) => (list.length > 0 ? [{ name: `part-${i}`, pages: list }] : []));
}

/** The parts recorded in a release; null when there are none or they do not parse. */
export function readSearchParts(release: string): SearchPart[] | null {
  try {
    const parsed = JSON.parse(readFileSync(path.join(release, searchPartsFileName), 'utf8')) as Partial<SearchParts>;
    if (parsed.scheme !== partsScheme || !Array.isArray(parsed.parts)) return null;
    const parts: SearchPart[] = [];
    for (const part of parsed.parts) {
      if (typeof part?.name !== 'string' || !/^part-\d+$/.test(part.name) || !Array.isArray(part.pages)) return null;
      if (!part.pages.every((page): page is string => typeof page === 'string')) return null;
      parts.push({ name: part.name, pages: part.pages });
    }
    return parts;
  } catch {
    return null;
  }
}

/**
 * The HTML pages that ask to be indexed. A page taken over from the release on line is the page
 * that release indexed, byte for byte: it is in the index exactly when that release's parts list
 * it, so it is not read again (when the release records its parts).
 */
export async function pagesToIndex(siteDir: string, files: readonly string[], takenOver: ReadonlySet<string>, previous: readonly SearchPart[] | null): Promise<string[]> {
  const listedBefore = previous === null ? null : new Set(previous.flatMap((part) => part.pages));
  const pages: string[] = [];
  for (const [i, file] of files.entries()) {
    if (!file.endsWith('.html')) continue;
    if (listedBefore !== null && takenOver.has(file)) {
      if (listedBefore.has(file)) pages.push(file);
      continue;
    }
    if (i % 64 === 63) await giveTurn();
    if (readFileSync(path.join(siteDir, file)).includes('data-pagefind-body')) pages.push(file);
  }
  return pages.sort(compareCodeUnits);
}

/**
 * The parts that can be taken over from the release on line: the same name and pages there,
 * and each page with the same SHA-256 now as in that release's manifest.
 */
export function partsToTakeOver(
  previous: readonly SearchPart[] | null,
  planned: readonly SearchPart[],
  hashNow: ReadonlyMap<string, string>,
  hashPublished: ReadonlyMap<string, string>,
): SearchPart[] {
  if (previous === null) return [];
  const before = new Map(previous.map((part) => [part.name, part]));
  return planned.filter((part) => {
    const old = before.get(part.name);
    if (!old || old.pages.length !== part.pages.length || old.pages.some((page, i) => page !== part.pages[i])) return false;
    return part.pages.every((page) => hashNow.get(page) !== undefined && hashNow.get(page) === hashPublished.get(page));
  });
}

/** Links the files of taken-over parts from the published release (checked afterwards against its manifest). */
export function linkParts(published: string, listing: readonly FileHash[], siteDir: string, parts: readonly SearchPart[]): void {
  const prefixes = parts.map((part) => `${searchIndexFolder}/${part.name}/`);
  const files = listing.map((entry) => entry.file).filter((file) => prefixes.some((prefix) => file.startsWith(prefix)));
  linkFiles(published, siteDir, files);
}

/**
 * Indexes one part with pagefind: its pages are linked into a scratch folder of their own (at the
 * same site paths, so result links are right), which pagefind reads whole; the index goes to
 * `<siteDir>/search-index/<part>/`.
 */
async function indexSearchPart(siteDir: string, part: SearchPart, scratchDir: string): Promise<void> {
  const pagesRoot = path.join(scratchDir, part.name);
  linkFiles(siteDir, pagesRoot, part.pages);
  const pagefind = resolvePackageBin('pagefind', 'pagefind');
  const output = path.join(path.resolve(siteDir), searchIndexFolder, part.name);
  const result = await runNodeScript(pagefind, ['--site', path.resolve(pagesRoot), '--output-path', output, '--quiet'], { cwd: packageRoot, env: { ...process.env } });
  if (result.code !== 0) {
    throw new Error(`pagefind exited with code ${result.code} indexing ${part.name}. Its last output:\n${result.tail.map((line) => `  | ${line}`).join('\n')}`);
  }
}

/** Indexes the parts, two pagefind processes at a time. */
export async function indexSearchParts(siteDir: string, parts: readonly SearchPart[], scratchDir: string): Promise<void> {
  const queue = [...parts];
  const worker = async (): Promise<void> => {
    for (let part = queue.shift(); part !== undefined; part = queue.shift()) await indexSearchPart(siteDir, part, scratchDir);
  };
  await Promise.all([worker(), worker()]);
}

export function writeSearchParts(siteDir: string, parts: readonly SearchPart[]): void {
  const listed: SearchParts = { scheme: partsScheme, parts: parts.map((part) => ({ name: part.name, path: `/${searchIndexFolder}/${part.name}/`, pages: part.pages })) };
  mkdirSync(path.join(siteDir, searchIndexFolder), { recursive: true });
  writeFileSync(path.join(siteDir, searchPartsFileName), `${JSON.stringify(listed, null, 2)}\n`);
}
