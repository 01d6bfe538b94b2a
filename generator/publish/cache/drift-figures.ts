/**
 * Step: read. The drift figures of the last build (generator/read/drift-memo.ts), on a
 * shelf of the result cache (result-cache.ts) keyed by the drift memo key, under a fingerprint of
 * the reading code (the package version and the text of generator/drift/, generator/read/ and
 * what they import from elsewhere). Only the latest reading is kept.
 */
import type { DriftMemo, DriftMemoEntry } from '../../read/drift-memo.ts';
import { codeFingerprint, openShelf } from './result-cache.ts';

/** The shelf (result-cache.ts) of this cache. */
export const driftShelf = 'drift-figures';

/**
 * Changes whenever the reading code or the package version changes: the drift and read folders
 * and what they import from elsewhere in the project (the messages of errors.ts, the settings
 * and scenario types, the indicator registry).
 */
export function readingFingerprint(packageRoot: string, version: string): Promise<string> {
  return codeFingerprint(packageRoot, version, {
    whole: ['generator/drift', 'generator/read', 'generator/scenario', 'generator/indicators', 'generator/errors.ts'],
  });
}

/**
 * The memo of one build. A new reading is kept in memory and written by `save()`, which the
 * build calls only once the scenario has passed validation (an invalid scenario leaves nothing
 * next to the output).
 */
export async function openDriftCache(cacheDir: string, fingerprint: string): Promise<DriftMemo & { reused(): boolean; save(): Promise<void> }> {
  const shelf = await openShelf<DriftMemoEntry>(cacheDir, driftShelf, fingerprint);
  let reused = false;
  return {
    reused: () => reused,
    async get(key) {
      const entry = shelf.get(key);
      if (entry === undefined || typeof entry !== 'object' || entry === null) return null;
      reused = true;
      shelf.keep(key, entry);
      return entry;
    },
    async set(key, entry) {
      shelf.keep(key, entry);
    },
    save: () => shelf.save(),
  };
}
