/**
 * Step: render (moving finished files into the release folder).
 * Moving files of one folder tree into another (one rename each), and linking a file under a second name.
 */
import { copyFileSync, linkSync, mkdirSync, renameSync } from 'node:fs';
import path from 'node:path';
import { listFiles } from './tree-hash.ts';

/** Moves every file under `from` that `keep` accepts (path relative to `from`) to the same place under `to`. */
export async function moveFiles(from: string, to: string, keep: (file: string) => boolean = () => true): Promise<number> {
  const made = new Set<string>();
  let moved = 0;
  for (const file of await listFiles(from)) {
    if (!keep(file)) continue;
    const target = path.join(to, file);
    const dir = path.dirname(target);
    if (!made.has(dir)) {
      mkdirSync(dir, { recursive: true });
      made.add(dir);
    }
    renameSync(path.join(from, file), target);
    moved += 1;
  }
  return moved;
}

/** A second name for the same file; a copy where links cannot be made (another file system). */
export function linkOrCopy(from: string, to: string): void {
  try {
    linkSync(from, to);
  } catch (error) {
    const code = (error as { code?: string }).code;
    if (code !== 'EXDEV' && code !== 'EPERM' && code !== 'ENOTSUP') throw error;
    copyFileSync(from, to);
  }
}
