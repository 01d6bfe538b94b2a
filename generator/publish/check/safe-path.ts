/**
 * Step: check (output paths, wherever a file is written).
 * Output paths that cannot leave the output folder. Ids that become folder names (segment ids,
 * season ids) must be slugs; every path is also resolved and checked to lie inside its root,
 * so a hostile id that slipped past the slug rule still cannot write elsewhere.
 */
import path from 'node:path';
import { PublishError } from '../publish-error.ts';

/** Same rule as the scenario settings' slugs: lower-case letters, digits and hyphens. */
const slugPattern = /^[a-z0-9][a-z0-9-]{0,62}$/;

export function isSlug(value: string): boolean {
  return slugPattern.test(value);
}

/** Throws unless `value` is a slug; `what` names it in the message ("segment id"). */
export function assertSlug(value: string, what: string): void {
  if (!isSlug(value)) {
    throw new PublishError(`${what} ${JSON.stringify(value)} is not a slug: expected 1–63 lower-case letters, digits and hyphens, starting with a letter or digit`);
  }
}

/**
 * Joins `relative` onto `root` and returns the absolute path, throwing when the result is not
 * strictly inside `root` (absolute inputs, "..", or a path equal to the root itself).
 */
export function resolveInside(root: string, relative: string): string {
  const base = path.resolve(root);
  if (path.isAbsolute(relative)) {
    throw new PublishError(`output path ${JSON.stringify(relative)} is absolute; expected a path inside ${base}`);
  }
  const target = path.resolve(base, relative);
  const fromRoot = path.relative(base, target);
  if (fromRoot === '' || fromRoot.startsWith('..') || path.isAbsolute(fromRoot)) {
    throw new PublishError(`output path ${JSON.stringify(relative)} resolves outside the output folder ${base}`);
  }
  return target;
}
