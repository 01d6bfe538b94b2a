/**
 * Reads what `compare-releases.ts` compares from a release folder: the bulletin models (each
 * bulletin's `bulletin.json` download), the records left out (`validation/left-out.json`) and
 * the files its manifest lists. Only files the manifest lists are read, by checked slug paths.
 */
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import type { Bulletin } from '../model/types.ts';
import { readManifest } from '../publish/tree-hash.ts';
import type { LeftOutRecord, ReleaseContent } from './compare-releases.ts';

export const leftOutFile = 'validation/left-out.json';
const bulletinFile = /^seasons\/([a-z0-9][a-z0-9-]*)\/([a-z0-9][a-z0-9_-]*)\/bulletin\.json$/i;

export async function readRelease(folder: string): Promise<ReleaseContent> {
  const manifest = await readManifest(folder);
  if (manifest === null) throw new Error(`${folder} has no readable manifest.json: not a release of wrackline`);
  const files = manifest.files.map((entry) => entry.file);
  const bulletins = new Map<string, Bulletin>();
  for (const file of files) {
    const match = bulletinFile.exec(file);
    if (!match) continue;
    const text = await readFile(path.join(folder, file), 'utf8');
    let bulletin: Bulletin;
    try {
      bulletin = JSON.parse(text) as Bulletin;
    } catch (error) {
      throw new Error(`${path.join(folder, file)} is not valid JSON (${error instanceof Error ? error.message : String(error)})`);
    }
    bulletins.set(`${match[1]}/${match[2]}`, bulletin);
  }
  let leftOut: LeftOutRecord[] | null = null;
  if (files.includes(leftOutFile)) {
    const parsed = JSON.parse(await readFile(path.join(folder, leftOutFile), 'utf8')) as { records?: LeftOutRecord[] };
    leftOut = Array.isArray(parsed.records) ? parsed.records : null;
  }
  return { bulletins, pages: files, leftOut };
}
