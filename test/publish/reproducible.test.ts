// Reproducible builds: the same scenario built twice — into different folders, with and without
// the trend-result cache, cold and warm — gives byte-identical files (every file's SHA-256
// compared). No clock, no machine-dependent paths, stable ordering, seeded randomness: common
// practice for reproducible builds (reproducible-builds.org definition: "identical copies of
// specified artifacts" from the same source).
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, expect, test } from 'vitest';
import { packageRoot, runCli } from './helpers/cli-build.ts';
import { snapshot } from './helpers/tree.ts';

const scenario = path.join(packageRoot, 'content', 'demo');
let work: string;

beforeAll(async () => {
  work = await mkdtemp(path.join(tmpdir(), 'wrackline-repro-'));
});
afterAll(async () => {
  await rm(work, { recursive: true, force: true });
});

function compare(a: { [file: string]: string }, b: { [file: string]: string }): { same: number; differ: string[]; onlyOne: string[] } {
  const files = [...new Set([...Object.keys(a), ...Object.keys(b)])].sort();
  const differ = files.filter((file) => a[file] !== undefined && b[file] !== undefined && a[file] !== b[file]);
  const onlyOne = files.filter((file) => a[file] === undefined || b[file] === undefined);
  return { same: files.length - differ.length - onlyOne.length, differ, onlyOne };
}

test('building the demo twice gives byte-identical output, with or without the cache', { timeout: 900_000 }, async () => {
  const cache = path.join(work, 'cache');
  const runs = [
    { name: 'first build, no cache', args: ['--out', path.join(work, 'a'), '--no-cache'] },
    { name: 'second build, cold cache', args: ['--out', path.join(work, 'b'), '--cache', cache] },
    { name: 'third build, warm cache', args: ['--out', path.join(work, 'c'), '--cache', cache] },
  ];
  const trees: { [file: string]: string }[] = [];
  for (const run of runs) {
    const result = await runCli(['build', '--scenario', scenario, ...run.args]);
    expect(result.code, `${run.name}: ${result.stderr}`).toBe(0);
    trees.push(await snapshot(run.args[1] ?? ''));
  }
  const [first, ...others] = trees;
  if (!first) throw new Error('no build');
  const lines = [`reproducibility: ${Object.keys(first).length} files in the first build`];
  others.forEach((tree, index) => {
    const result = compare(first, tree);
    lines.push(
      `  ${runs[0]?.name} vs ${runs[index + 1]?.name}: ${result.same} identical, ${result.differ.length} differ, ${result.onlyOne.length} in one only` +
        (result.differ.length + result.onlyOne.length > 0 ? ` (${[...result.differ, ...result.onlyOne].slice(0, 10).join(', ')})` : ''),
    );
  });
  console.log(lines.join('\n'));
  expect(Object.keys(first).length).toBeGreaterThan(30);
  for (const tree of others) expect(compare(first, tree)).toEqual({ same: Object.keys(first).length, differ: [], onlyOne: [] });
});
