/**
 * Step: swap (where the release will go, checked before anything is created).
 * Checks the place `--out` names before a build creates anything there (not even the cache in
 * `<out>.wrackline/`), so a request that cannot or must not be carried out ends at once with one
 * plain sentence, and a user's own folder is never taken over:
 *
 * - `--out` inside a kernel folder (/proc, /sys, /dev) is refused: writing there can hang;
 * - every folder on the way must be a folder: a link that leads nowhere, or a file, is named;
 * - the nearest existing folder must be writable (not read-only, not forbidden);
 * - it must have some free space (`minimumFreeBytes`) left;
 * - an existing `--out` must be a release link of this tool, an empty folder, or a folder this
 *   tool published (with its manifest): a folder holding anything else belongs to someone else.
 *
 * Failures that only show while writing (the disk fills up mid-build) are put into words by
 * `plainWriteFailure`.
 */
import { constants } from 'node:fs';
import { access, lstat, readdir, readlink, stat, statfs } from 'node:fs/promises';
import path from 'node:path';
import { errorCode } from '../publish-error.ts';
import { inspectOutput, isOurPublishedFolder, placeFor } from './release-swap.ts';

const minimumFreeBytes = 16 * 1024 * 1024;
const systemFolders = ['/proc', '/sys', '/dev'];

/** Why a build must not use `out`, in one or two plain sentences; null when it may. */
export async function outputPlaceProblem(out: string): Promise<string | null> {
  const absolute = path.resolve(out);
  const inSystem = (p: string): string | undefined => systemFolders.find((root) => p === root || p.startsWith(`${root}/`));
  const system = inSystem(absolute);
  if (system) return `--out ${absolute} is inside ${system}, a folder of the operating system, not a place for a site. Choose a folder of your own, e.g. --out site`;

  // Walk up to the nearest folder that exists, naming what is in the way.
  let existing = path.dirname(absolute);
  for (;;) {
    let info;
    try {
      info = await lstat(existing);
    } catch (error) {
      if (errorCode(error) === 'ENOENT' || errorCode(error) === 'ENOTDIR') {
        const parent = path.dirname(existing);
        if (parent === existing) return `--out ${absolute}: no folder on its way exists`;
        existing = parent;
        continue;
      }
      return `--out ${absolute}: cannot look at ${existing} (${errorCode(error) ?? String(error)}). Choose another --out`;
    }
    if (info.isSymbolicLink()) {
      const target = await readlink(existing);
      const followed = await stat(existing).catch(() => null);
      if (!followed) return `--out ${absolute} goes through ${existing}, a link to ${target}, which does not exist. Create that folder or choose another --out`;
      if (!followed.isDirectory()) return `--out ${absolute} goes through ${existing}, a link to ${target}, which is not a folder. Choose another --out`;
      const real = path.resolve(path.dirname(existing), target);
      const linkedSystem = inSystem(real);
      if (linkedSystem) return `--out ${absolute} goes through ${existing}, a link into ${linkedSystem}, a folder of the operating system. Choose a folder of your own`;
      break;
    }
    if (!info.isDirectory()) return `--out ${absolute} goes through ${existing}, which is a file, not a folder. Choose another --out`;
    break;
  }
  try {
    await access(existing, constants.W_OK);
  } catch (error) {
    const code = errorCode(error);
    const why = code === 'EROFS' ? 'is on a read-only file system' : 'cannot be written by this user';
    return `--out ${absolute}: ${existing} ${why} (${code ?? 'no access'}). Choose a folder you can write to`;
  }
  try {
    const space = await statfs(existing);
    const free = space.bavail * space.bsize;
    if (free < minimumFreeBytes) {
      return `--out ${absolute}: the disk holding ${existing} has only ${Math.floor(free / 1024).toLocaleString('en-GB')} KB free; a build needs at least ${minimumFreeBytes / 1024 / 1024} MB. Free some space or choose another --out`;
    }
  } catch {
    // statfs unsupported: the writes themselves will tell
  }

  const place = placeFor(absolute);
  const stateInfo = await lstat(place.state).catch(() => null);
  if (stateInfo && !stateInfo.isDirectory())
    return `--out ${absolute}: ${place.state} exists and is not a folder; this tool keeps its releases and cache there. Move it away or choose another --out`;
  const found = await inspectOutput(place).catch(() => ({ kind: 'other' as const }));
  if (found.kind === 'other') return `--out ${absolute} exists and is not a folder. Choose another --out`;
  if (found.kind === 'link' && found.release === null) {
    return `--out ${absolute} is a link to ${await readlink(absolute)}, not to a release of ${place.state}. Remove the link or choose another --out`;
  }
  if (found.kind === 'folder') {
    const entries = await readdir(absolute);
    if (entries.length > 0 && !(await isOurPublishedFolder(absolute))) {
      return `refusing to replace ${absolute}: it is a folder of ${entries.length.toLocaleString('en-GB')} item(s) not published by this tool (no wrackline manifest.json), and publishing would replace it. Remove it or choose another --out`;
    }
  }
  return null;
}

const writeFailures: { [code: string]: string } = {
  ENOSPC: 'the disk is full',
  EDQUOT: 'the disk quota is used up',
  EROFS: 'the file system is read-only',
  EACCES: 'permission denied',
  EPERM: 'operation not permitted',
  ENOENT: 'a folder on the way disappeared',
  ENOTDIR: 'a file stands where a folder should be',
  EIO: 'the disk reported an input/output error',
  ELOOP: 'too many links on the way',
  ENAMETOOLONG: 'a path is too long',
  EMFILE: 'too many files are open',
};

/**
 * One or two plain lines for a failure of the file system while building, or null when the error
 * is something else. Astro's own failure text is searched for the same causes.
 */
export function plainWriteFailure(error: unknown, out: string): string | null {
  const code = errorCode(error);
  const message = error instanceof Error ? error.message : String(error);
  const found =
    code && writeFailures[code] ? code : (Object.keys(writeFailures).find((c) => message.includes(c)) ?? (/no space left on device/i.test(message) ? 'ENOSPC' : undefined));
  if (!found) return null;
  const where = typeof error === 'object' && error !== null && 'path' in error ? String((error as { path: unknown }).path) : path.resolve(out);
  return `cannot write ${where}: ${writeFailures[found]} (${found}). Nothing was published; the site at ${path.resolve(out)} is as it was.\nFix the place (space, permissions) or choose another --out, then build again`;
}
