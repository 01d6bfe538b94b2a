/**
 * Step: swap (the release folder made current in one step).
 * Atomic publishing of a built site into the output folder.
 *
 * Design: the output path (`--out`, e.g. `dist`) is a symbolic link to a complete, never
 * modified release folder. Everything lives in one sibling state folder, `<out>.wrackline/`:
 *
 *   dist                      -> dist.wrackline/releases/r-<content digest>   (relative link)
 *   dist.wrackline/lock       pid of the build holding this output
 *   dist.wrackline/state.json {"current": …, "previous": …}
 *   dist.wrackline/releases/  published trees, named by the digest of their manifest
 *   dist.wrackline/work-<pid>-<label>/  temporary folders of a running build
 *   dist.wrackline/retired-<release>/   releases no longer kept, deleted by the next build
 *
 * A build writes only into its work folders. Publishing renames the finished tree into
 * `releases/`, creates a new link beside the old one and renames it over `dist`. rename(2) of a
 * link over a link is atomic on POSIX file systems, so every reader sees either the whole old
 * release or the whole new one; there is no moment when `dist` is missing or mixed. A failed
 * or killed build never touches `dist` or any release folder, so the published site stays
 * byte-identical. The next run takes over the lock of a dead process and deletes its work
 * folders. The current and the previous release are kept (the previous one for a manual roll
 * back); older ones leave `releases/` after a successful swap (one rename) and are deleted by
 * the next build while it works.
 *
 * Why not rename the folders themselves: swapping two directories by name needs two renames
 * (old away, new in) with a gap between them, since Node has no access to an atomic exchange
 * (Linux renameat2 RENAME_EXCHANGE). A link swap is one rename. The one two-step moment is the
 * first run on an existing real folder published earlier: it is moved into `releases/` and
 * linked. `state.json` is written first, so if the process dies between the two steps the next
 * run finds `dist` missing, reads `state.json` and restores the link.
 *
 * Limits: needs a file system with symbolic links (not FAT; on Windows, developer mode). Data is
 * not fsync'ed, so a power cut right after a build may lose that build (never the old release).
 */
import { existsSync } from 'node:fs';
import { lstat, mkdir, open, readFile, readdir, readlink, rename, rm, rmdir, stat, symlink, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { errorCode, PublishError } from '../publish-error.ts';
import { removeInWorker } from './remove-in-worker.ts';
import { differenceFromListing, manifestFileName, readManifest } from '../tree-hash.ts';

interface PublishPlace {
  /** Absolute output path (the link). */
  out: string;
  /** `<out>.wrackline`, absolute. */
  state: string;
  releases: string;
}

interface SwapState {
  current: string | null;
  previous: string | null;
}

export function placeFor(out: string): PublishPlace {
  const absolute = path.resolve(out);
  const state = `${absolute}.wrackline`;
  return { out: absolute, state, releases: path.join(state, 'releases') };
}

function processIsAlive(pid: number): boolean {
  if (!Number.isInteger(pid) || pid <= 0) return false;
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    return errorCode(error) === 'EPERM';
  }
}

async function readState(place: PublishPlace): Promise<SwapState> {
  try {
    const parsed = JSON.parse(await readFile(path.join(place.state, 'state.json'), 'utf8')) as Partial<SwapState>;
    return { current: parsed.current ?? null, previous: parsed.previous ?? null };
  } catch {
    return { current: null, previous: null };
  }
}

async function writeState(place: PublishPlace, state: SwapState): Promise<void> {
  const temporary = path.join(place.state, `state.json.${process.pid}`);
  await writeFile(temporary, `${JSON.stringify(state, null, 2)}\n`);
  await rename(temporary, path.join(place.state, 'state.json'));
}

/** Link text for a release, relative to the folder that holds `out`. */
function linkTarget(place: PublishPlace, releaseId: string): string {
  return path.join(path.basename(place.state), 'releases', releaseId);
}

async function swapLink(place: PublishPlace, releaseId: string): Promise<void> {
  const temporaryLink = path.join(place.state, `link-${process.pid}`);
  await rm(temporaryLink, { force: true });
  await symlink(linkTarget(place, releaseId), temporaryLink, 'dir');
  await rename(temporaryLink, place.out);
}

/** What is at `out` now. */
export async function inspectOutput(place: PublishPlace): Promise<{ kind: 'missing' } | { kind: 'link'; release: string | null } | { kind: 'folder' } | { kind: 'other' }> {
  let info;
  try {
    info = await lstat(place.out);
  } catch (error) {
    if (errorCode(error) === 'ENOENT') return { kind: 'missing' };
    throw error;
  }
  if (info.isSymbolicLink()) {
    const text = await readlink(place.out);
    const resolved = path.resolve(path.dirname(place.out), text);
    const fromReleases = path.relative(place.releases, resolved);
    const ours = fromReleases !== '' && !fromReleases.startsWith('..') && !fromReleases.includes(path.sep);
    return { kind: 'link', release: ours ? fromReleases : null };
  }
  if (info.isDirectory()) return { kind: 'folder' };
  return { kind: 'other' };
}

/** Whether `folder` holds a manifest written by this tool. */
export async function isOurPublishedFolder(folder: string): Promise<boolean> {
  try {
    const manifest = JSON.parse(await readFile(path.join(folder, manifestFileName), 'utf8')) as { generator?: unknown };
    return manifest.generator === 'wrackline';
  } catch {
    return false;
  }
}

export interface PublishSession {
  place: PublishPlace;
  /** Creates a fresh, empty work folder next to the output (same file system). */
  workFolder(label: string): Promise<string>;
  /** The folder `out` currently shows, or null when nothing is published. */
  publishedFolder(): Promise<string | null>;
  /** Moves a finished tree into `releases/<releaseId>` and swaps the link to it. */
  publish(tree: string, releaseId: string): Promise<{ release: string; unchanged: boolean }>;
  /** Removes this run's work folders and gives the lock back. */
  close(): Promise<void>;
}

/**
 * Whether `folder` holds exactly the files of the finished `tree` (its manifest's listing, byte for
 * byte, and the same manifest): a release folder named by a digest may have been changed by hand.
 */
async function holdsTree(folder: string, tree: string): Promise<boolean> {
  const wanted = await readManifest(tree);
  if (wanted === null || (await differenceFromListing(folder, wanted.files)) !== null) return false;
  const manifests = await Promise.all([readFile(path.join(folder, manifestFileName)), readFile(path.join(tree, manifestFileName))]);
  return manifests[0].equals(manifests[1]);
}

/**
 * Takes the output's lock (failing when a live build holds it), restores a link lost by a run
 * killed during the first conversion, and deletes work folders left by killed runs.
 */
export async function openPublishSession(out: string, log: (line: string) => void = () => {}): Promise<PublishSession> {
  const place = placeFor(out);
  const found = await inspectOutput(place);
  if (found.kind === 'other') {
    throw new PublishError(`cannot publish into ${place.out}: it exists and is not a folder`, 2);
  }
  if (found.kind === 'link' && found.release === null) {
    throw new PublishError(
      `cannot publish into ${place.out}: it is a link to ${await readlink(place.out)}, not to a release of ${place.state}; remove the link or choose another --out`,
      2,
    );
  }
  // Checked whether or not the state folder exists: the cache may have created it already.
  if (found.kind === 'folder') {
    const entries = await readdir(place.out);
    if (entries.length > 0 && !(await isOurPublishedFolder(place.out))) {
      throw new PublishError(
        `refusing to replace ${place.out}: it is a folder that was not published by wrackline (no wrackline manifest.json); remove it or choose another --out`,
        2,
      );
    }
  }
  await mkdir(place.releases, { recursive: true });

  const lockFile = path.join(place.state, 'lock');
  for (let attempt = 0; ; attempt += 1) {
    try {
      const handle = await open(lockFile, 'wx');
      await handle.writeFile(`${process.pid}\n`);
      await handle.close();
      break;
    } catch (error) {
      if (errorCode(error) !== 'EEXIST' || attempt > 3) throw error;
      const holder = Number.parseInt((await readFile(lockFile, 'utf8').catch(() => '')).trim(), 10);
      if (processIsAlive(holder) && holder !== process.pid) {
        throw new PublishError(`another wrackline build (process ${holder}) is publishing into ${place.out}; wait for it to finish`, 2);
      }
      log(`taking over the lock of a stopped build (process ${Number.isNaN(holder) ? 'unknown' : holder})`);
      await rm(lockFile, { force: true });
    }
  }

  // Recovery: a run killed between moving an old real folder away and linking it back.
  const state = await readState(place);
  if ((await inspectOutput(place)).kind === 'missing' && state.current && existsSync(path.join(place.releases, state.current))) {
    log(`restoring ${place.out} -> release ${state.current} left unlinked by a stopped build`);
    await swapLink(place, state.current);
  }

  // Clean-up: work folders and temporary links of runs that no longer hold the lock.
  const retired: string[] = [];
  for (const entry of await readdir(place.state)) {
    if (entry.startsWith('work-') || entry.startsWith('link-') || entry.startsWith('state.json.')) {
      log(`removing ${entry} left by a stopped build`);
      await rm(path.join(place.state, entry), { recursive: true, force: true, maxRetries: 3 });
    }
    if (entry.startsWith('retired-')) retired.push(entry);
  }
  // Releases retired by the last build are deleted while this one works (awaited in close()).
  const deletingRetired = removeInWorker(retired.map((entry) => path.join(place.state, entry)));

  const mine: string[] = [];
  let counter = 0;

  return {
    place,
    async workFolder(label) {
      counter += 1;
      const folder = path.join(place.state, `work-${process.pid}-${counter}-${label}`);
      await rm(folder, { recursive: true, force: true });
      await mkdir(folder, { recursive: true });
      mine.push(folder);
      return folder;
    },
    async publishedFolder() {
      const now = await inspectOutput(place);
      if (now.kind === 'folder') return place.out;
      if (now.kind === 'link' && now.release) return path.join(place.releases, now.release);
      return null;
    },
    async publish(tree, digestId) {
      const before = await readState(place);
      let releaseId = digestId;
      let release = path.join(place.releases, releaseId);
      const existing = await stat(release).catch(() => null);
      if (existing && (await holdsTree(release, tree))) {
        // Same content digest, and the folder still holds exactly that content: keep it untouched.
        await rm(tree, { recursive: true, force: true });
      } else {
        // A folder of that name whose files were changed by hand is left as it is (a reader may
        // be on it); the new tree gets a name of its own and the link moves to it.
        for (let n = 2; existing && existsSync(release); n += 1) {
          releaseId = `${digestId}-${n}`;
          release = path.join(place.releases, releaseId);
        }
        await rename(tree, release);
      }
      const now = await inspectOutput(place);
      if (now.kind === 'link' && now.release === releaseId) {
        return { release, unchanged: true };
      }
      let previous = before.current;
      if (now.kind === 'folder') {
        // First run over a folder published without the link: move it into releases/.
        const entries = await readdir(place.out);
        if (entries.length === 0) {
          await rmdir(place.out);
        } else {
          const legacyId = `legacy-${process.pid}-${Date.now().toString(36)}`;
          await writeState(place, { current: legacyId, previous: before.current });
          await rename(place.out, path.join(place.releases, legacyId));
          previous = legacyId;
        }
      } else if (now.kind === 'link' && now.release) {
        previous = now.release;
      }
      await writeState(place, { current: releaseId, previous });
      await swapLink(place, releaseId);
      // Keep the current and the previous release. Older ones leave releases/ at once (one
      // rename each) and are deleted by the next build while it works: deleting thousands of
      // files here would only make this build later.
      for (const entry of await readdir(place.releases)) {
        if (entry !== releaseId && entry !== previous) {
          const target = path.join(place.state, `retired-${entry}`);
          await rm(target, { recursive: true, force: true, maxRetries: 3 });
          await rename(path.join(place.releases, entry), target);
        }
      }
      return { release, unchanged: false };
    },
    async close() {
      await deletingRetired;
      for (const folder of mine) await rm(folder, { recursive: true, force: true, maxRetries: 3 });
      await rm(lockFile, { force: true });
    },
  };
}
