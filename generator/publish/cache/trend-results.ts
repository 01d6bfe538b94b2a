/**
 * Step: model. Trend results of earlier builds, so a rebuild after a small data change
 * recomputes only the series that changed. It wraps the model's trend engine: `analyze(points,
 * options)` is looked up by the SHA-256 of the series and the options, on a shelf of the result
 * cache (result-cache.ts) whose code fingerprint covers the statistics (the package version and
 * every file in generator/stats/ and generator/random/, and the model's link to them), and
 * computed on a miss.
 *
 * The Regional Kendall test of a season and indicator is kept the same way, on a shelf of its own,
 * keyed by every segment's series together (any change anywhere recomputes it).
 *
 * What is not cached, because it depends on all segments at once and is cheap: the
 * Benjamini–Hochberg adjustment, region percentiles, levels and sentences. Those are recomputed
 * on every build, so results stay exactly those of a build without cache (a test compares the
 * two). Results handed out from the cache are frozen.
 */
import type { RegionalResult, TrendEngine, TrendOutcome } from '../../model/evaluate-season.ts';
import type { TrendResult } from '../../stats/types.ts';
import { canonicalJson } from '../check/archive-ledger.ts';
import { sha256Hex } from '../tree-hash.ts';
import { codeFingerprint, openShelf } from './result-cache.ts';

/** The shelves (result-cache.ts) of this cache. */
export const trendShelf = 'trend-results';
const regionalShelf = 'regional-trends';

/** Changes whenever the statistics code or the package version changes. */
export function statisticsFingerprint(packageRoot: string, version: string): Promise<string> {
  return codeFingerprint(packageRoot, version, { whole: ['generator/stats', 'generator/random', 'generator/model/trend-engine.ts'] });
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

interface CachedEngine {
  engine: TrendEngine;
  stats(): { hits: number; misses: number };
  /** Writes the entries used in this build. */
  save(): Promise<void>;
}

function keyOf(value: unknown): string {
  return sha256Hex(canonicalJson(value));
}

/** Stored as it will be read back (JSON), so a hit now and a hit next build are the same. */
function asRead<T>(value: T): T {
  return JSON.parse(JSON.stringify(value)) as T;
}

export async function openTrendCache(cacheDir: string, fingerprint: string, inner: TrendEngine): Promise<CachedEngine> {
  const [results, regionals] = await Promise.all([
    openShelf<TrendResult>(cacheDir, trendShelf, fingerprint),
    openShelf<RegionalResult | null>(cacheDir, regionalShelf, fingerprint),
  ]);
  let hits = 0;
  let misses = 0;
  /** The cached result of `key`, kept for this build and frozen (see deepFreeze: no caller can change it). */
  const hit = (key: string): TrendResult | undefined => {
    const found = results.get(key);
    if (found === undefined) return undefined;
    hits += 1;
    results.keep(key, found);
    return deepFreeze(found);
  };
  const engine: TrendEngine = {
    analyze(points, options) {
      const key = keyOf({ points, options });
      const found = hit(key);
      if (found !== undefined) return found;
      misses += 1;
      const result = inner.analyze(points, options);
      results.keep(key, asRead(result));
      return result;
    },
    // A season's series at once: look-ups first, then the misses in one batch to the inner engine
    // (which may spread them over the cores); results, counts and stored entries are those of
    // calling `analyze` on each request in order.
    analyzeMany(requests) {
      const keys = requests.map(({ points, options }) => keyOf({ points, options }));
      const missIndex = new Map<string, number>();
      const missRequests: (typeof requests)[number][] = [];
      keys.forEach((key, i) => {
        if (results.get(key) !== undefined || missIndex.has(key)) return;
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
        const found = hit(key);
        if (found !== undefined) return { result: found };
        misses += 1;
        const outcome = computed[missIndex.get(key) ?? -1] ?? { error: `no result for request ${i}` };
        if ('result' in outcome) results.keep(key, asRead(outcome.result));
        return outcome;
      });
    },
    adjust: (pValues) => inner.adjust(pValues),
    // The regional test reads every segment's series; it is looked up the same way. An error is
    // not remembered (it is raised again).
    regional(series, options) {
      const key = keyOf({ regional: series, options });
      const found = regionals.get(key);
      if (found !== undefined) {
        regionals.keep(key, found);
        return deepFreeze(found);
      }
      const result = inner.regional(series, options);
      regionals.keep(key, result === null ? null : asRead(result));
      return result;
    },
  };
  return {
    engine,
    stats: () => ({ hits, misses }),
    async save() {
      await Promise.all([results.save(), regionals.save()]);
    },
  };
}
