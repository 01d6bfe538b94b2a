/** Test helpers: a folder's full content as {path: sha256}, following the output link. */
import { realpath } from 'node:fs/promises';
import { hashTree } from '../../../generator/publish/tree-hash.ts';

export async function snapshot(folder: string): Promise<{ [file: string]: string }> {
  const files = await hashTree(await realpath(folder));
  return Object.fromEntries(files.map((entry) => [entry.file, entry.sha256]));
}
