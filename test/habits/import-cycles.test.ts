/**
 * No import cycle anywhere in generator/: every module can be read, tested and moved on its own
 * only while its imports lead away from it. The relative imports of every .ts and .mjs file under
 * generator/ are followed (static `import` and `export … from`, side-effect imports and
 * `import('…')`, as TypeScript's own pre-processor lists them, so comments and strings are not
 * taken for imports). Type-only imports count as well: a cycle through types still ties the
 * modules together (Biome's noImportCycles is set the same way, `ignoreTypes: false`). Package
 * imports are left out; a file loaded by name at run time (a worker's `tsImport`) is not an import.
 */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import ts from 'typescript';
import { expect, test } from 'vitest';
import { listFiles } from '../../generator/publish/tree-hash.ts';
import { packageRoot } from '../../generator/publish/render/astro-render.ts';

type Graph = ReadonlyMap<string, readonly string[]>;

/** Each module of `folder` (relative to the package root) with the project modules it imports directly. */
async function importGraph(folder: string): Promise<Graph> {
  const files = (await listFiles(path.join(packageRoot, folder))).filter((file) => /\.(?:ts|mjs)$/.test(file)).map((file) => `${folder}/${file}`);
  const graph = new Map<string, string[]>();
  for (const file of files) {
    const text = readFileSync(path.join(packageRoot, file), 'utf8');
    const imports = ts
      .preProcessFile(text, true, true)
      .importedFiles.map((entry) => entry.fileName)
      .filter((name) => name.startsWith('./') || name.startsWith('../'))
      .map((name) => path.posix.join(path.posix.dirname(file), name));
    graph.set(file, [...new Set(imports)]);
  }
  return graph;
}

/** One cycle of the graph as the path around it (first module again at the end), or null when there is none. */
function findCycle(graph: Graph): string[] | null {
  const done = new Set<string>();
  const onPath: string[] = [];
  const visit = (file: string): string[] | null => {
    const at = onPath.indexOf(file);
    if (at >= 0) return [...onPath.slice(at), file];
    if (done.has(file) || !graph.has(file)) return null;
    onPath.push(file);
    for (const next of graph.get(file) ?? []) {
      const cycle = visit(next);
      if (cycle) return cycle;
    }
    onPath.pop();
    done.add(file);
    return null;
  };
  for (const file of [...graph.keys()].sort()) {
    const cycle = visit(file);
    if (cycle) return cycle;
  }
  return null;
}

test('the cycle finder names a cycle and passes a graph without one', () => {
  const cyclic = new Map([
    ['a.ts', ['b.ts']],
    ['b.ts', ['c.ts', 'd.ts']],
    ['c.ts', ['a.ts']],
    ['d.ts', []],
  ]);
  expect(findCycle(cyclic)).toEqual(['a.ts', 'b.ts', 'c.ts', 'a.ts']);
  expect(findCycle(new Map([['x.ts', ['x.ts']]]))).toEqual(['x.ts', 'x.ts']);
  // a diamond is no cycle
  const diamond = new Map([
    ['a.ts', ['b.ts', 'c.ts']],
    ['b.ts', ['d.ts']],
    ['c.ts', ['d.ts']],
    ['d.ts', []],
  ]);
  expect(findCycle(diamond)).toBeNull();
});

test('the graph of generator/ follows relative imports, type-only ones included', async () => {
  const graph = await importGraph('generator');
  expect(graph.size).toBeGreaterThan(100);
  // known edges: a value import, a type-only import and an import out of a subfolder
  expect(graph.get('generator/publish/build-release.ts')).toContain('generator/publish/swap/release-swap.ts');
  expect(graph.get('generator/publish/build-steps.ts')).toContain('generator/publish/render/search-index.ts');
  expect(graph.get('generator/publish/render/page-reuse.ts')).toContain('generator/event-loop.ts');
  // every import inside generator/ leads to a module of the graph (package.json, imported for its version, lies outside)
  const inside = (target: string): boolean => target.startsWith('generator/');
  const missing = [...graph].flatMap(([file, imports]) => imports.filter((target) => inside(target) && !graph.has(target)).map((target) => `${file} → ${target}`));
  expect(missing).toEqual([]);
});

test('no import cycle in generator/', async () => {
  const cycle = findCycle(await importGraph('generator'));
  expect(cycle === null ? 'no cycle' : `import cycle: ${cycle.join(' → ')}`).toBe('no cycle');
});
