/**
 * Where a scenario file really is: its path with every symbolic link resolved (realpath), and
 * whether that place is inside the scenario folder (itself resolved). A link that leads out of
 * the folder is refused, so a scenario can never make Wrackline read, quote or publish a file the
 * user did not put in it. There is no opt-in: copy the file into the folder instead.
 */
import { realpath } from 'node:fs/promises';
import path from 'node:path';

export type Placement = { inside: true; real: string } | { inside: false; real: string };

export function isInsideFolder(folder: string, candidate: string): boolean {
  const relative = path.relative(folder, candidate);
  return relative !== '' && !relative.startsWith(`..${path.sep}`) && relative !== '..' && !path.isAbsolute(relative);
}

/** Resolves `relative` under the (already resolved) `realFolder`; throws when it does not exist. */
export async function placeInFolder(realFolder: string, relative: string): Promise<Placement> {
  const real = await realpath(path.join(realFolder, relative));
  return isInsideFolder(realFolder, real) ? { inside: true, real } : { inside: false, real };
}
