// With the real reader: a scenario with an unusable table stops the build with exit 1, a summary that
// names file, row, column and value, and nothing created at or next to the output folder.
import { existsSync } from 'node:fs';
import { cp, mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, expect, test } from 'vitest';
import { packageRoot, runCli } from './helpers/cli-build.ts';

let work: string;
beforeAll(async () => {
  work = await mkdtemp(path.join(tmpdir(), 'wrackline-invalid-'));
});
afterAll(async () => {
  await rm(work, { recursive: true, force: true });
});

test('invalid data: exit 1, a readable summary, nothing written', async () => {
  const scenario = path.join(work, 'scenario');
  await cp(path.join(packageRoot, 'content', 'demo'), scenario, { recursive: true });
  const table = path.join(scenario, 'tables', 'beach-litter.csv');
  // An essential column renamed: the table cannot be used (a bad single row would only be
  // excluded and listed as a warning, and the build would go on).
  const lines = (await readFile(table, 'utf8')).split('\n');
  lines[0] = (lines[0] ?? '')
    .split(',')
    .map((name) => (name === 'items' ? 'item_count' : name))
    .join(',');
  await writeFile(table, lines.join('\n'));

  const out = path.join(work, 'site');
  const result = await runCli(['build', '--scenario', scenario, '--out', out], {}, { lock: false });
  expect(result.code).toBe(1);
  expect(result.stderr).toMatch(/error\(s\).*nothing was built or published/);
  expect(result.stderr).toContain('tables/beach-litter.csv row 1, column items: the header has no column "items"');
  expect(existsSync(out)).toBe(false);
  expect(existsSync(`${out}.wrackline`)).toBe(false);
}, 300_000);
