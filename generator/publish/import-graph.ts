/**
 * Step: all of them (shared by render and cache/: what the code fingerprints of page reuse and the cache cover).
 * The project files a set of files imports, followed through relative import specifiers: what a
 * fingerprint of "the code behind a result" must cover (page-reuse.ts for the site,
 * cache/result-cache.ts for the bulletin model). Packages are covered by package-lock.json instead.
 */
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import { compareCodeUnits } from './tree-hash.ts';

const importPattern = /(?:\bfrom\s*|\bimport\s*\(?\s*)['"](\.{1,2}\/[^'"]+)['"]/g;
const typeOnly = /\b(?:import|export)\s+type\s[^;'"]*?from\s*['"][^'"]+['"]/g;
const scanned = /\.(?:ts|mts|js|mjs|astro)$/;

/**
 * Project files that the `start` files import, directly or through each other (relative import
 * specifiers in .ts, .js, .mjs and .astro files, type-only imports left out), the `start` files
 * not included unless imported. Relative paths from `root`, sorted.
 */
export async function importedFiles(root: string, start: readonly string[]): Promise<string[]> {
  const seen = new Set<string>(start);
  const queue = [...start];
  const found = new Set<string>();
  while (queue.length > 0) {
    const file = queue.pop() as string;
    if (!scanned.test(file)) continue;
    const text = await readFile(path.join(root, file), 'utf8').catch(() => null);
    if (text === null) continue;
    // type-only imports vanish when the code runs
    const code = text.replace(typeOnly, '');
    for (const match of code.matchAll(importPattern)) {
      const target = path
        .relative(root, path.resolve(root, path.dirname(file), match[1] ?? ''))
        .split(path.sep)
        .join('/');
      if (target.startsWith('..') || seen.has(target)) continue;
      seen.add(target);
      found.add(target);
      queue.push(target);
    }
  }
  return [...found].sort(compareCodeUnits);
}
