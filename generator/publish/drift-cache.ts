/**
 * A file store for the drift memo (generator/read/drift-memo.ts): the drift figures of the last
 * build, kept in the cache folder as `drift-figures.json` with the key they belong to and a
 * fingerprint of the reading code (the package version and the text of generator/drift/ and
 * generator/read/). Only the latest reading is kept. A missing, damaged or outdated file is
 * ignored and rewritten; deleting it is always safe.
 */
import { createHash } from 'node:crypto';
import { mkdir, readFile, readdir, rename, writeFile } from 'node:fs/promises';
import path from 'node:path';
import type { DriftMemo, DriftMemoEntry } from '../read/drift-memo.ts';
import { compareCodeUnits } from './tree-hash.ts';

export const driftCacheFile = 'drift-figures.json';

/** Changes whenever the reading code or the package version changes. */
export async function readingFingerprint(packageRoot: string, version: string): Promise<string> {
  const hash = createHash('sha256').update(`wrackline ${version}\n`);
  for (const folder of ['generator/drift', 'generator/read']) {
    const full = path.join(packageRoot, folder);
    for (const name of (await readdir(full)).filter((item) => item.endsWith('.ts')).sort(compareCodeUnits)) {
      hash.update(`${folder}/${name}\0`).update(await readFile(path.join(full, name)));
    }
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
