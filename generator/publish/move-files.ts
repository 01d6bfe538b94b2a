/**
 * Step: all of them (shared: render gathers its parts and takes over pages, swap links an approved candidate).
 * Moving files of one folder tree into another (one rename each), and linking files under a second name.
 */
import { copyFileSync, linkSync, mkdirSync, renameSync } from 'node:fs';
import path from 'node:path';
import { errorCode } from './publish-error.ts';
import { listFiles } from './tree-hash.ts';

/** Makes the folder of each path it is given, each folder once. */
export function folderMaker(): (file: string) => void {
  const made = new Set<string>();
  return (file) => {
    const dir = path.dirname(file);
    if (made.has(dir)) return;
    mkdirSync(dir, { recursive: true });
    made.add(dir);
  };
}

/** Moves every file under `from` that `keep` accepts (path relative to `from`) to the same place under `to`. */
export async function moveFiles(from: string, to: string, keep: (file: string) => boolean = () => true): Promise<void> {
  const makeFolder = folderMaker();
  for (const file of await listFiles(from)) {
    if (!keep(file)) continue;
    const target = path.join(to, file);
    makeFolder(target);
    renameSync(path.join(from, file), target);
  }
}

/** A second name for the same file; a copy where links cannot be made (another file system). */
export function linkOrCopy(from: string, to: string): void {
  try {
    linkSync(from, to);
  } catch (error) {
    const code = errorCode(error);
    if (code !== 'EXDEV' && code !== 'EPERM' && code !== 'ENOTSUP') throw error;
    copyFileSync(from, to);
  }
}

/** Links (or copies, see linkOrCopy) each of `files`, relative paths, from the tree `from` to the same place under `to`. */
export function linkFiles(from: string, to: string, files: Iterable<string>, makeFolder: (file: string) => void = folderMaker()): void {
  for (const file of files) {
    const target = path.join(to, file);
    makeFolder(target);
    linkOrCopy(path.join(from, file), target);
  }
}
