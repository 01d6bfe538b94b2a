/**
 * The model memo: results of earlier builds by input key (generator/model/input-keys.ts), so a
 * rebuild after a small data change evaluates, judges and composes only what changed
 * (generator/model/assemble-with-memo.ts).
 *
 * On disk, in the cache folder:
 *   model-memo.json          code fingerprint; series summaries and Regional Kendall results by
 *                            key; the SHA-256 and listing (listing.ts) of each kept bulletin
 *                            model file by key
 *   bulletin-models/<key>.json  the bulletin model files, as written into the model folder
 * A bulletin file is used only when its bytes still have the recorded SHA-256; anything that
 * does not read, parse or match is ignored and computed afresh. The memo belongs to one code
 * fingerprint (`modelFingerprint`: the code that makes the model, the package version and the
 * locked packages): a change there starts it empty. Only entries used by the latest
 * build are kept. Deleting the folder is always safe.
 */
import { createHash } from 'node:crypto';
import { mkdirSync, readFileSync, readdirSync, renameSync, unlinkSync, writeFileSync } from 'node:fs';
import { readFile, readdir } from 'node:fs/promises';
import path from 'node:path';
import type { ModelMemo } from '../model/assemble-with-memo.ts';
import type { RegionalResult } from '../model/evaluation-types.ts';
import type { SeriesSummary } from '../model/judge-season.ts';
import type { BulletinListing } from '../model/listing.ts';
import { giveTurn } from '../event-loop.ts';
import { importedFiles } from './import-graph.ts';
import { compareCodeUnits } from './tree-hash.ts';

export const modelMemoFile = 'model-memo.json';
export const bulletinMemoFolder = 'bulletin-models';

interface MemoFile {
  fingerprint: string;
  summaries: { [key: string]: SeriesSummary };
  regional: { [key: string]: RegionalResult | null };
  /** per bulletin key: the SHA-256 of its file and its listing */
  bulletins: { [key: string]: { sha256: string; listing: BulletinListing } };
}

const keyPattern = /^[0-9a-f]{64}$/;

async function folderFiles(root: string, folder: string, out: string[]): Promise<void> {
  for (const entry of await readdir(path.join(root, folder), { withFileTypes: true })) {
    const child = `${folder}/${entry.name}`;
    if (entry.isDirectory()) await folderFiles(root, child, out);
    else if (entry.isFile() && /\.(?:ts|mts|js|mjs)$/.test(entry.name)) out.push(child);
  }
}

/** Where the model is made: the memo path and the trend engine, with all they import. */
const modelEntries = ['generator/model/assemble-with-memo.ts', 'generator/model/trend-engine.ts'];
/** Loaded by file name (worker threads), so not found by following imports: taken whole. */
const wholeFolders = ['generator/stats', 'generator/random'];

/**
 * Changes whenever the code that makes the model changes: the files the model entries import
 * (directly or not), the statistics folders, the package version and the locked packages.
 */
export async function modelFingerprint(packageRoot: string, version: string): Promise<string> {
  const files = new Set<string>([...modelEntries, ...(await importedFiles(packageRoot, modelEntries)), 'package.json', 'package-lock.json']);
  for (const folder of wholeFolders) {
    const found: string[] = [];
    await folderFiles(packageRoot, folder, found);
    for (const file of found) files.add(file);
  }
  const hash = createHash('sha256').update(`wrackline-model-memo-1\nwrackline ${version}\n`);
  for (const file of [...files].sort(compareCodeUnits)) {
    const text = await readFile(path.join(packageRoot, file)).catch(() => null);
    hash.update(`${file}\0`).update(text ?? 'missing').update('\0');
  }
  return hash.digest('hex');
}

export interface OpenedModelMemo {
  memo: ModelMemo;
  /** Writes the entries used in this build; removes the bulletin files no longer used. */
  save(): Promise<void>;
}

function sha256(data: Buffer): string {
  return createHash('sha256').update(data).digest('hex');
}

export async function openModelMemo(cacheDir: string, fingerprint: string): Promise<OpenedModelMemo> {
  let stored: MemoFile = { fingerprint, summaries: {}, regional: {}, bulletins: {} };
  try {
    const parsed = JSON.parse(await readFile(path.join(cacheDir, modelMemoFile), 'utf8')) as Partial<MemoFile>;
    if (
      parsed.fingerprint === fingerprint &&
      parsed.summaries && typeof parsed.summaries === 'object' &&
      parsed.regional && typeof parsed.regional === 'object' &&
      parsed.bulletins && typeof parsed.bulletins === 'object'
    ) {
      stored = parsed as MemoFile;
    }
  } catch {
    // no memo yet, or a damaged one: start empty
  }
  const folder = path.join(cacheDir, bulletinMemoFolder);
  const used: MemoFile = { fingerprint, summaries: {}, regional: {}, bulletins: {} };
  /** bulletin files to write: composed in this build */
  const fresh = new Map<string, { text: Buffer; listing: BulletinListing }>();
  /** bulletin files read from the memo whose hash matched */
  const verified = new Set<string>();
  const memo: ModelMemo = {
    summary: (key) => stored.summaries[key],
    keepSummary(key, summary) {
      used.summaries[key] = summary;
    },
    regional: (key) => (key in stored.regional ? stored.regional[key] : undefined),
    keepRegional(key, result) {
      used.regional[key] = result;
    },
    bulletin(key) {
      const entry = stored.bulletins[key];
      const expected = entry?.sha256;
      if (entry === undefined || typeof expected !== 'string' || !keyPattern.test(key)) return undefined;
      let text: Buffer;
      try {
        text = readFileSync(path.join(folder, `${key}.json`));
      } catch {
        return undefined;
      }
      if (sha256(text) !== expected) return undefined;
      verified.add(key);
      return { text, sha256: expected, listing: entry.listing };
    },
    keepBulletin(key, text, listing) {
      if (!keyPattern.test(key)) throw new Error(`model memo: "${key}" is not an input key`);
      const known = stored.bulletins[key];
      if (verified.has(key) && known !== undefined) {
        // taken from the memo: its file is on disk already, with this hash
        used.bulletins[key] = known;
        return;
      }
      fresh.set(key, { text, listing });
    },
  };
  return {
    memo,
    async save() {
      mkdirSync(folder, { recursive: true });
      let i = 0;
      for (const [key, { text, listing }] of fresh) {
        if (++i % 64 === 0) await giveTurn();
        const target = path.join(folder, `${key}.json`);
        const temporary = `${target}.${process.pid}.tmp`;
        writeFileSync(temporary, text);
        renameSync(temporary, target);
        used.bulletins[key] = { sha256: sha256(text), listing };
      }
      const temporary = path.join(cacheDir, `${modelMemoFile}.${process.pid}.tmp`);
      writeFileSync(temporary, JSON.stringify(used));
      renameSync(temporary, path.join(cacheDir, modelMemoFile));
      for (const name of readdirSync(folder)) {
        const key = name.endsWith('.json') ? name.slice(0, -'.json'.length) : null;
        if (key !== null && used.bulletins[key] !== undefined) continue;
        try {
          unlinkSync(path.join(folder, name));
        } catch {
          // gone already
        }
      }
    },
  };
}
