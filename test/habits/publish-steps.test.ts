/**
 * The publishing room (generator/publish/) is grouped by the step each file serves: render/,
 * check/ and swap/ beside cache/, with the conductor and the helpers every step shares at the top.
 * Each file's first comment names its step ("Step: …"), and a file in a step's folder names that
 * step, so the folder and the file never disagree about where it belongs.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { expect, test } from 'vitest';
import { listFiles } from '../../generator/publish/tree-hash.ts';
import { packageRoot } from '../../generator/publish/render/astro-render.ts';

const room = path.join(packageRoot, 'generator', 'publish');

/** The first comment of a module (a block comment or a run of line comments), '' when it starts otherwise. */
function firstComment(text: string): string {
  const block = /^\/\*\*?([\s\S]*?)\*\//.exec(text);
  if (block) return block[1] ?? '';
  const lines = /^(?:\/\/.*\n)+/.exec(text);
  return lines ? lines[0] : '';
}

test('every file of the publishing room names the step it serves, and a step folder holds only its step', async () => {
  const files = (await listFiles(room)).filter((file) => /\.(?:ts|mjs)$/.test(file));
  expect(files.length).toBeGreaterThan(20);
  const wrong: string[] = [];
  for (const file of files) {
    const step = /Step: ([a-z]+)/.exec(firstComment(readFileSync(path.join(room, file), 'utf8')))?.[1];
    const folder = file.includes('/') ? file.split('/')[0] : null;
    if (step === undefined) wrong.push(`${file}: its first comment names no step`);
    else if ((folder === 'render' || folder === 'check' || folder === 'swap') && step !== folder) wrong.push(`${file}: in ${folder}/ but serves "${step}"`);
  }
  expect(wrong).toEqual([]);
});

test('the first comment is read from the top of the file only', () => {
  expect(firstComment('/**\n * Step: render (x).\n */\nimport a;')).toContain('Step: render');
  expect(firstComment('// Step: check (y).\n// more\nimport a;')).toContain('Step: check');
  expect(firstComment('import a;\n/** Step: swap */')).toBe('');
});
