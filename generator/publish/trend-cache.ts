/**
 * A cache of per-series trend results, so a rebuild after a small data change recomputes only
 * the series that changed. It wraps the model's trend engine: `analyze(points, options)` is
 * looked up by the SHA-256 of the series, the options and a fingerprint of the statistics code
 * (the package version and the text of every file in generator/stats/ and generator/random/,
 * which the statistics import, and of the model's link to them), and computed on a miss.
 *
 * The Regional Kendall test of a season and indicator is kept the same way, keyed by every
 * segment's series together (any change anywhere recomputes it).
 *
 * What is not cached, because it depends on all segments at once and is cheap: the
 * Benjamini–Hochberg adjustment, region percentiles, levels and sentences. Those are recomputed
 * on every build, so results stay exactly those of a build without cache (a test compares the
 * two). Results handed out from the cache are frozen.
 *
 * The cache is one JSON file in the cache folder; deleting the folder is always safe. Only
 * entries used by the latest build are kept, so it does not grow without bound. A file that
 * cannot be read or parsed is ignored (and rewritten).
 */
import { createHash } from 'node:crypto';
import { mkdir, readFile, readdir, rename, writeFile } from 'node:fs/promises';
import path from 'node:path';
import type { RegionalResult, TrendEngine, TrendOutcome } from '../model/evaluate-season.ts';
import type { TrendResult } from '../stats/types.ts';
import { canonicalJson } from './archive-ledger.ts';
import { compareCodeUnits } from './tree-hash.ts';

export const trendCacheFile = 'trend-results.json';

interface CacheFile {
  fingerprint: string;
  entries: { [key: string]: TrendResult };
  /** Regional Kendall results (null: the test could not run), keyed like the entries. */
  regional?: { [key: string]: RegionalResult | null };
}

/** Changes whenever the statistics code or the package version changes. */
export async function statisticsFingerprint(packageRoot: string, version: string): Promise<string> {
  const hash = createHash('sha256').update(`wrackline ${version}\n`);
  const folders = ['generator/stats', 'generator/random', 'generator/model/trend-engine.ts'];
  for (const item of folders) {
    const full = path.join(packageRoot, item);
    const files = item.endsWith('.ts')
      ? [full]
      : (await readdir(full)).filter((name) => name.endsWith('.ts')).sort(compareCodeUnits).map((name) => path.join(full, name));
    for (const file of files) hash.update(`${path.relative(packageRoot, file)}\0`).update(await readFile(file));
  }
  return hash.digest('hex');
}

/**
 * Freezes a value read from the cache and everything in it, so a caller that tried to change a
 * result shared through the cache would fail at once (modules run in strict mode) instead of
 * changing it silently. Cheaper than a copy per hit.
 */
function deepFreeze<T>(value: T): T {
  if (value !== null && typeof value === 'object' && !Object.isFrozen(value)) {
    Object.freeze(value);
    for (const child of Object.values(value as object)) deepFreeze(child);
  }
  return value;
}

export interface CachedEngine {
  engine: TrendEngine;
  stats(): { hits: number; misses: number };
  /** Writes the entries used in this build. */
  save(): Promise<void>;
}

export async function openTrendCache(cacheDir: string, fingerprint: string, inner: TrendEngine): Promise<CachedEngine> {
  let stored: CacheFile['entries'] = {};
  let storedRegional: NonNullable<CacheFile['regional']> = {};
  try {
    const parsed = JSON.parse(await readFile(path.join(cacheDir, trendCacheFile), 'utf8')) as CacheFile;
    if (parsed.fingerprint === fingerprint && parsed.entries && typeof parsed.entries === 'object') {
      stored = parsed.entries;
      if (parsed.regional && typeof parsed.regional === 'object') storedRegional = parsed.regional;
    }
  } catch {
    // no cache yet, or a damaged one: start empty
  }
  const used: CacheFile['entries'] = {};
  const usedRegional: NonNullable<CacheFile['regional']> = {};
  let hits = 0;
  let misses = 0;
  const engine: TrendEngine = {
    analyze(points, options) {
      const key = createHash('sha256').update(canonicalJson({ points, options })).digest('hex');
      const found = used[key] ?? stored[key];
      if (found !== undefined) {
        hits += 1;
        used[key] = found;
        // Frozen (see deepFreeze): no caller can change the cached value.
        return deepFreeze(found);
      }
      misses += 1;
      const result = inner.analyze(points, options);
      // Stored as it will be read back (JSON), so a hit now and a hit next build are the same.
      used[key] = JSON.parse(JSON.stringify(result)) as TrendResult;
      return result;
    },
    // A season's series at once: look-ups first, then the misses in one batch to the inner engine
    // (which may spread them over the cores); results, counts and stored entries are those of
    // calling `analyze` on each request in order.
    analyzeMany(requests) {
      const keys = requests.map(({ points, options }) => createHash('sha256').update(canonicalJson({ points, options })).digest('hex'));
      const missIndex = new Map<string, number>();
      const missRequests: typeof requests[number][] = [];
      keys.forEach((key, i) => {
        if (used[key] !== undefined || stored[key] !== undefined || missIndex.has(key)) return;
        missIndex.set(key, missRequests.length);
        missRequests.push(requests[i] as (typeof requests)[number]);
      });
      const computed = inner.analyzeMany
        ? inner.analyzeMany(missRequests)
        : missRequests.map((request): TrendOutcome => {
            try {
              return { result: inner.analyze(request.points, request.options) };
            } catch (error) {
              return { error: error instanceof Error ? error.message : String(error) };
            }
          });
      return keys.map((key, i): TrendOutcome => {
        const found = used[key] ?? stored[key];
        if (found !== undefined) {
          hits += 1;
          used[key] = found;
          return { result: deepFreeze(found) };
        }
        misses += 1;
        const outcome = computed[missIndex.get(key) ?? -1] ?? { error: `no result for request ${i}` };
        if ('result' in outcome) used[key] = JSON.parse(JSON.stringify(outcome.result)) as TrendResult;
        return outcome;
      });
    },
    adjust: (pValues) => inner.adjust(pValues),
    // The regional test reads every segment's series; it is looked up the same way. An error is
    // not remembered (it is raised again).
    regional(series, options) {
      const key = createHash('sha256').update(canonicalJson({ regional: series, options })).digest('hex');
      const found = key in usedRegional ? usedRegional[key] : key in storedRegional ? storedRegional[key] : undefined;
      if (found !== undefined) {
        usedRegional[key] = found;
        return deepFreeze(found);
      }
      const result = inner.regional(series, options);
      usedRegional[key] = result === null ? null : (JSON.parse(JSON.stringify(result)) as RegionalResult);
      return result;
    },
  };
  return {
    engine,
    stats: () => ({ hits, misses }),
    async save() {
      await mkdir(cacheDir, { recursive: true });
      const temporary = path.join(cacheDir, `${trendCacheFile}.${process.pid}`);
      await writeFile(temporary, JSON.stringify({ fingerprint, entries: used, regional: usedRegional } satisfies CacheFile));
      await rename(temporary, path.join(cacheDir, trendCacheFile));
    },
  };
}
