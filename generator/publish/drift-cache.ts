/**
 * A file store for the drift memo (generator/read/drift-memo.ts): the drift figures of the last
 * build, kept in the cache folder as `drift-figures.json` with the key they belong to and a
 * fingerprint of the reading code (the package version and the text of generator/drift/,
 * generator/read/ and what they import). Only the latest reading is kept. A missing, damaged or outdated file is
 * ignored and rewritten; deleting it is always safe.
 */
import { createHash } from 'node:crypto';
import { mkdir, readFile, readdir, rename, writeFile } from 'node:fs/promises';
import path from 'node:path';
import type { DriftMemo, DriftMemoEntry } from '../read/drift-memo.ts';
import { compareCodeUnits } from './tree-hash.ts';

export const driftCacheFile = 'drift-figures.json';

/**
 * Changes whenever the reading code or the package version changes: the drift and read folders
 * and what they import from elsewhere in the project (the messages of errors.ts, the settings
 * and scenario types, the indicator registry).
 */
export async function readingFingerprint(packageRoot: string, version: string): Promise<string> {
  const hash = createHash('sha256').update(`wrackline ${version}\n`);
  for (const item of ['generator/drift', 'generator/read', 'generator/scenario', 'generator/indicators', 'generator/errors.ts']) {
    const full = path.join(packageRoot, item);
    const files = item.endsWith('.ts')
      ? [item]
      : (await readdir(full)).filter((name) => name.endsWith('.ts')).sort(compareCodeUnits).map((name) => `${item}/${name}`);
    for (const file of files) hash.update(`${file}\0`).update(await readFile(path.join(packageRoot, file)));
  }
  return hash.digest('hex');
}

interface StoredFigures {
  fingerprint: string;
  key: string;
  entry: DriftMemoEntry;
}

/**
 * The memo of one build. A new reading is kept in memory and written by `save()`, which the
 * build calls only once the scenario has passed validation (an invalid scenario leaves nothing
 * next to the output).
 */
export function openDriftCache(cacheDir: string, fingerprint: string): DriftMemo & { reused(): boolean; save(): Promise<void> } {
  const file = path.join(cacheDir, driftCacheFile);
  let reused = false;
  let pending: StoredFigures | null = null;
  return {
    reused: () => reused,
    async get(key) {
      try {
        const stored = JSON.parse(await readFile(file, 'utf8')) as StoredFigures;
        if (stored.fingerprint !== fingerprint || stored.key !== key || typeof stored.entry !== 'object' || stored.entry === null) return null;
        reused = true;
        return stored.entry;
      } catch {
        return null;
      }
    },
    async set(key, entry) {
      pending = { fingerprint, key, entry };
    },
    async save() {
      if (pending === null) return;
      await mkdir(cacheDir, { recursive: true });
      const temporary = `${file}.${process.pid}`;
      await writeFile(temporary, JSON.stringify(pending));
      await rename(temporary, file);
      pending = null;
    },
  };
}
