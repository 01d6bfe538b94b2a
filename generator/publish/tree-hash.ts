/**
 * Step: all of them (shared: every step compares trees by these hashes; the swap step's manifest is this list).
 * Content hashes of a folder tree: every regular file's SHA-256 and size, keyed by its path
 * relative to the root with forward slashes, sorted by that path (code-unit order, the same on
 * every machine). The publishing step writes this list as `manifest.json`; the reproducibility
 * test compares two such lists.
 */
import { createHash } from 'node:crypto';
import { createReadStream, readFileSync, readdirSync } from 'node:fs';
import { readFile, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { giveTurn } from '../event-loop.ts';

export interface FileHash {
  file: string;
  sha256: string;
  bytes: number;
}

export const manifestFileName = 'manifest.json';

/** SHA-256 of text or bytes, in lower-case hex. */
export function sha256Hex(data: string | Buffer): string {
  return createHash('sha256').update(data).digest('hex');
}

export async function hashFile(file: string): Promise<{ sha256: string; bytes: number }> {
  const hash = createHash('sha256');
  let bytes = 0;
  for await (const chunk of createReadStream(file)) {
    const buffer = chunk as Buffer;
    bytes += buffer.length;
    hash.update(buffer);
  }
  return { sha256: hash.digest('hex'), bytes };
}

/** Lists regular files under `root` (following no symlinks inside it), relative, sorted. */
export async function listFiles(root: string): Promise<string[]> {
  const out: string[] = [];
  // Synchronous listing: thousands of folders one after another are far quicker so.
  function walk(relative: string): void {
    const entries = readdirSync(path.join(root, relative), { withFileTypes: true });
    for (const entry of entries) {
      const child = relative === '' ? entry.name : `${relative}/${entry.name}`;
      if (entry.isDirectory()) walk(child);
      else if (entry.isFile()) out.push(child);
    }
  }
  walk('');
  return out.sort(compareCodeUnits);
}

export function compareCodeUnits(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}

/**
 * Hashes every file under `root`; `skip` leaves named relative paths out. Site files are small
 * (tens of kilobytes), so each is read whole: far quicker than a stream per file. The event loop
 * gets a turn every few files, so child processes' output keeps flowing meanwhile.
 */
export async function hashTree(root: string, skip: ReadonlySet<string> = new Set()): Promise<FileHash[]> {
  return hashFilesIn(
    root,
    (await listFiles(root)).filter((file) => !skip.has(file)),
  );
}

/** Hashes the listed files (relative to `root`), in the order given. */
export async function hashFilesIn(root: string, files: readonly string[]): Promise<FileHash[]> {
  const result: FileHash[] = [];
  for (const [i, file] of files.entries()) {
    if (i % 64 === 63) await giveTurn();
    const content = readFileSync(path.join(root, file));
    result.push({ file, sha256: sha256Hex(content), bytes: content.length });
  }
  return result;
}

/** One hash over a whole tree listing: changes when any file's path or content changes. */
export function treeDigest(files: readonly FileHash[]): string {
  const hash = createHash('sha256');
  for (const entry of files) hash.update(`${entry.file}\0${entry.sha256}\0${entry.bytes}\n`);
  return hash.digest('hex');
}

/** Writes `manifest.json` from a listing of every other file (sorted here) and returns it. */
export async function writeManifest(root: string, listing?: readonly FileHash[], extra: { [field: string]: unknown } = {}): Promise<FileHash[]> {
  const files = listing
    ? listing.filter((entry) => entry.file !== manifestFileName).sort((a, b) => compareCodeUnits(a.file, b.file))
    : await hashTree(root, new Set([manifestFileName]));
  const body = { generator: 'wrackline', ...extra, files };
  await writeFile(path.join(root, manifestFileName), `${JSON.stringify(body, null, 2)}\n`);
  return files;
}

/**
 * The first file in which the tree at `root` differs from a manifest's `listing`: a file not
 * listed (besides the manifest itself), a listed file missing, or one whose SHA-256 or size
 * differs; null when the tree holds exactly the listed files.
 */
export async function differenceFromListing(root: string, listing: readonly FileHash[]): Promise<string | null> {
  const listed = new Set([...listing.map((entry) => entry.file), manifestFileName]);
  const present = new Set(await listFiles(root));
  const differs = [...present].find((file) => !listed.has(file)) ?? [...listed].find((file) => !present.has(file));
  if (differs !== undefined) return differs;
  const hashes = await hashFilesIn(
    root,
    listing.map((entry) => entry.file),
  );
  return listing.find((entry, i) => hashes[i]?.sha256 !== entry.sha256 || hashes[i]?.bytes !== entry.bytes)?.file ?? null;
}

/** A published folder's manifest (its listing and extra fields), or null when it has none. */
export async function readManifest(root: string): Promise<{ files: FileHash[]; [field: string]: unknown } | null> {
  try {
    const parsed = JSON.parse(await readFile(path.join(root, manifestFileName), 'utf8')) as { files?: FileHash[] };
    return Array.isArray(parsed.files) ? { ...parsed, files: parsed.files } : null;
  } catch {
    return null;
  }
}
