/**
 * Step: model. The model memo: results of earlier builds by input key
 * (generator/model/input-keys.ts), so a rebuild after a small data change evaluates, judges and
 * composes only what changed (generator/model/assemble-with-memo.ts).
 *
 * Three shelves of the result cache (result-cache.ts), under one code fingerprint
 * (`modelFingerprint`: the code that makes the model, the package version and the locked
 * packages; a change there starts the memo empty):
 *   series-summaries    a series summary (judge-season.ts) by series key
 *   regional-results    a Regional Kendall result (null: the test could not run) by key
 *   bulletin-models     a bulletin's listing (listing.ts) by bulletin key, with its model file,
 *                       as written into the model folder, kept beside it (bulletin-models/<key>)
 * A bulletin file is used only when its bytes still have the recorded SHA-256.
 */
import type { ModelMemo } from '../../model/assemble-with-memo.ts';
import type { RegionalResult } from '../../model/evaluation-types.ts';
import type { SeriesSummary } from '../../model/judge-season.ts';
import type { BulletinListing } from '../../model/listing.ts';
import { codeFingerprint, isCacheKey, openShelf } from './result-cache.ts';

/** The shelves (result-cache.ts) of the memo. */
export const summaryShelf = 'series-summaries';
export const regionalShelf = 'regional-results';
export const bulletinShelf = 'bulletin-models';

/**
 * Changes whenever the code that makes the model changes: the files the model entries (the memo
 * path and the trend engine) import, directly or not; the statistics folders, taken whole because
 * worker threads load them by file name; the package version and the locked packages.
 */
export function modelFingerprint(packageRoot: string, version: string): Promise<string> {
  return codeFingerprint(packageRoot, version, {
    whole: ['generator/stats', 'generator/random', 'package.json', 'package-lock.json'],
    withImports: ['generator/model/assemble-with-memo.ts', 'generator/model/trend-engine.ts'],
  });
}

interface OpenedModelMemo {
  memo: ModelMemo;
  /** Writes the entries used in this build; removes the bulletin files no longer used. */
  save(): Promise<void>;
}

export async function openModelMemo(cacheDir: string, fingerprint: string): Promise<OpenedModelMemo> {
  const [summaries, regional, bulletins] = await Promise.all([
    openShelf<SeriesSummary>(cacheDir, summaryShelf, fingerprint),
    openShelf<RegionalResult | null>(cacheDir, regionalShelf, fingerprint),
    openShelf<BulletinListing>(cacheDir, bulletinShelf, fingerprint),
  ]);
  const memo: ModelMemo = {
    summary: (key) => summaries.get(key),
    keepSummary: (key, summary) => summaries.keep(key, summary),
    regional: (key) => regional.get(key),
    keepRegional: (key, result) => regional.keep(key, result),
    bulletin(key) {
      const listing = bulletins.get(key);
      if (listing === undefined) return undefined;
      const file = bulletins.file(key);
      if (file === undefined) return undefined;
      return { text: file.bytes, sha256: file.sha256, listing };
    },
    keepBulletin(key, text, listing) {
      if (!isCacheKey(key)) throw new Error(`model memo: "${key}" is not an input key`);
      bulletins.keepFile(key, text, listing);
    },
  };
  return {
    memo,
    async save() {
      await Promise.all([summaries.save(), regional.save(), bulletins.save()]);
    },
  };
}
