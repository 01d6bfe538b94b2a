/**
 * Step: read and model (the cache both draw on). The one cache of the build: results of earlier builds, found again
 * by the digest of their inputs. Every cache the build keeps — trend results (trend-results.ts),
 * drift figures (drift-figures.ts), the model memo (model-memo.ts) — is a shelf of this module,
 * with one format and one set of rules:
 *
 * - Key: the SHA-256 (64 lower-case hex digits) of everything the result is made from, worked out
 *   by the user of the shelf. A key that is not such a digest is never looked up or stored.
 * - Code fingerprint: each shelf belongs to one fingerprint of the code that makes its results
 *   (`codeFingerprint`: the package version and the text of the code files). A shelf saved under
 *   another fingerprint counts as empty.
 * - Format: one JSON file per shelf, `<cache>/<shelf>.json`:
 *     {"format": "wrackline-cache-1", "shelf": name, "fingerprint": …, "entries": {key: value},
 *      "files": {key: SHA-256}}
 *   A shelf may keep bytes beside a value (a bulletin's model file): `<cache>/<shelf>/<key>`, used
 *   only while its bytes still have the SHA-256 recorded in `files`.
 * - What is kept: only the entries this build used or made; `save()` writes them and deletes the
 *   files no longer used, and does not write at all when nothing changed.
 * - Anything that does not read, parse or match is ignored: the result is computed afresh and
 *   the shelf rewritten. So deleting any file of the cache folder, or the whole folder, is always
 *   safe; it only makes the next build slower.
 * Files are written under a temporary name and renamed, so a killed build leaves whole files.
 */
import { createHash } from 'node:crypto';
import { mkdirSync, readFileSync, readdirSync, renameSync, unlinkSync, writeFileSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { giveTurn } from '../../event-loop.ts';
import { importedFiles } from '../import-graph.ts';
import { compareCodeUnits, listFiles, sha256Hex } from '../tree-hash.ts';

export const cacheFormat = 'wrackline-cache-1';

const keyPattern = /^[0-9a-f]{64}$/;
const shelfName = /^[a-z][a-z0-9-]*$/;

/** Whether `key` can be a cache key: a SHA-256 in lower-case hex. */
export function isCacheKey(key: string): boolean {
  return keyPattern.test(key);
}

interface ShelfFile<T> {
  format: typeof cacheFormat;
  shelf: string;
  fingerprint: string;
  entries: { [key: string]: T };
  files: { [key: string]: string };
}

interface Shelf<T> {
  readonly name: string;
  /** The value of `key` kept in this build, or saved by an earlier build with the same fingerprint. */
  get(key: string): T | undefined;
  /** Records `value` as the result of `key` in this build. */
  keep(key: string, value: T): void;
  /** The bytes kept beside `key` and their SHA-256, when they still have the recorded one; undefined otherwise. */
  file(key: string): { bytes: Buffer; sha256: string } | undefined;
  /** Records `value` and the bytes beside it; bytes read back through `file()` are not written again. */
  keepFile(key: string, bytes: Buffer, value: T): void;
  /** Writes what this build kept (only that), when it differs from what is on disk. */
  save(): Promise<void>;
}

function isRecord(value: unknown): value is { [key: string]: unknown } {
  return value !== null && typeof value === 'object' && !Array.isArray(value);
}

/** The path of a shelf's file. */
export function shelfFile(cacheDir: string, name: string): string {
  return path.join(cacheDir, `${name}.json`);
}

/** Opens the shelf `name` of the cache folder for the code `fingerprint`; a missing or unusable shelf is empty. */
export async function openShelf<T>(cacheDir: string, name: string, fingerprint: string): Promise<Shelf<T>> {
  if (!shelfName.test(name)) throw new Error(`openShelf: "${name}" is not a shelf name`);
  const file = shelfFile(cacheDir, name);
  const folder = path.join(cacheDir, name);
  let stored: Pick<ShelfFile<T>, 'entries' | 'files'> = { entries: {}, files: {} };
  try {
    const parsed = JSON.parse(await readFile(file, 'utf8')) as unknown;
    if (isRecord(parsed) && parsed.format === cacheFormat && parsed.shelf === name && parsed.fingerprint === fingerprint && isRecord(parsed.entries) && isRecord(parsed.files)) {
      stored = parsed as unknown as ShelfFile<T>;
    }
  } catch {
    // no shelf yet, or a damaged one: start empty
  }
  const storedCount = Object.keys(stored.entries).length;
  const kept: { [key: string]: T } = {};
  const keptFiles: { [key: string]: string } = {};
  let keptCount = 0;
  let changed = false;
  /** bytes made in this build, written by save() */
  const fresh = new Map<string, Buffer>();
  /** keys whose bytes on disk were read and matched their hash in this build */
  const verified = new Set<string>();

  const record = (key: string, value: T): void => {
    if (!keyPattern.test(key)) throw new Error(`cache shelf ${name}: "${key}" is not a cache key`);
    if (!(key in kept)) keptCount += 1;
    if (stored.entries[key] !== value) changed = true;
    kept[key] = value;
  };

  return {
    name,
    get(key) {
      if (!keyPattern.test(key)) return undefined;
      return key in kept ? kept[key] : Object.hasOwn(stored.entries, key) ? stored.entries[key] : undefined;
    },
    keep(key, value) {
      record(key, value);
    },
    file(key) {
      const expected = stored.files[key];
      if (!keyPattern.test(key) || typeof expected !== 'string') return undefined;
      let bytes: Buffer;
      try {
        bytes = readFileSync(path.join(folder, key));
      } catch {
        return undefined;
      }
      if (sha256Hex(bytes) !== expected) return undefined;
      verified.add(key);
      return { bytes, sha256: expected };
    },
    keepFile(key, bytes, value) {
      record(key, value);
      const known = stored.files[key];
      if (verified.has(key) && known !== undefined) {
        // read back in this build: on disk already, with this hash
        keptFiles[key] = known;
        return;
      }
      changed = true;
      fresh.set(key, bytes);
    },
    async save() {
      if (!changed && keptCount === storedCount && fresh.size === 0) return;
      mkdirSync(cacheDir, { recursive: true });
      if (fresh.size > 0 || Object.keys(keptFiles).length > 0) mkdirSync(folder, { recursive: true });
      let i = 0;
      for (const [key, bytes] of fresh) {
        if (++i % 64 === 0) await giveTurn();
        const target = path.join(folder, key);
        const temporary = `${target}.${process.pid}.tmp`;
        writeFileSync(temporary, bytes);
        renameSync(temporary, target);
        keptFiles[key] = sha256Hex(bytes);
      }
      const temporary = `${file}.${process.pid}.tmp`;
      writeFileSync(temporary, JSON.stringify({ format: cacheFormat, shelf: name, fingerprint, entries: kept, files: keptFiles } satisfies ShelfFile<T>));
      renameSync(temporary, file);
      let names: string[] = [];
      try {
        names = readdirSync(folder);
      } catch {
        // no files on this shelf
      }
      for (const entry of names) {
        if (keptFiles[entry] !== undefined) continue;
        try {
          unlinkSync(path.join(folder, entry));
        } catch {
          // gone already
        }
      }
      stored = { entries: { ...kept }, files: { ...keptFiles } };
      changed = false;
      fresh.clear();
    },
  };
}

interface CodeParts {
  /** Files or folders (every code file under them) taken whole, relative to the package root. */
  whole: readonly string[];
  /** Files taken with every project file they import, directly or not (import-graph.ts). */
  withImports?: readonly string[];
}

/**
 * The code fingerprint of a shelf: the SHA-256 of the package version and the path and text of
 * every file in `parts`, sorted by path. A file that cannot be read counts as "missing".
 */
export async function codeFingerprint(packageRoot: string, version: string, parts: CodeParts): Promise<string> {
  const files = new Set<string>();
  for (const item of parts.whole) {
    if (/\.[a-z]+$/.test(item)) files.add(item);
    else for (const file of await listFiles(path.join(packageRoot, item))) if (/\.(?:ts|mts|js|mjs)$/.test(file)) files.add(`${item}/${file}`);
  }
  const entries = parts.withImports ?? [];
  for (const file of [...entries, ...(await importedFiles(packageRoot, entries))]) files.add(file);
  const hash = createHash('sha256').update(`${cacheFormat}\nwrackline ${version}\n`);
  for (const file of [...files].sort(compareCodeUnits)) {
    const text = await readFile(path.join(packageRoot, file)).catch(() => null);
    hash
      .update(`${file}\0`)
      .update(text ?? 'missing')
      .update('\0');
  }
  return hash.digest('hex');
}
