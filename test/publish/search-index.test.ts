/**
 * The search index in parts (generator/publish/render/search-index.ts): which pages are indexed, how
 * they are shared among parts, when a part may be taken over from the release on line, and —
 * with the real pagefind — that a part's index depends on its own pages only, which is what
 * makes taking it over give the files a full build would write.
 */
import { createHash } from 'node:crypto';
import { mkdir, mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import fc from 'fast-check';
import { afterEach, beforeEach, describe, expect, test } from 'vitest';
import {
  indexSearchParts,
  pagesPerPart,
  pagesToIndex,
  partCount,
  partsToTakeOver,
  planSearchParts,
  readSearchParts,
  writeSearchParts,
} from '../../generator/publish/render/search-index.ts';
import { listFiles } from '../../generator/publish/tree-hash.ts';

let dir: string;
beforeEach(async () => {
  dir = await mkdtemp(path.join(tmpdir(), 'wrackline-search-'));
});
afterEach(async () => {
  await rm(dir, { recursive: true, force: true });
});

async function writeSite(root: string, files: { [file: string]: string }): Promise<void> {
  for (const [file, text] of Object.entries(files)) {
    await mkdir(path.dirname(path.join(root, file)), { recursive: true });
    await writeFile(path.join(root, file), text);
  }
}

function page(title: string, body: string, marked = true): string {
  return `<!doctype html><html lang="en"><head><title>${title}</title></head><body><main${marked ? ' data-pagefind-body' : ''}><h1>${title}</h1><p>${body}</p></main></body></html>`;
}

describe('planning the parts', () => {
  test('one part for one page, two at least from two pages, one more per 250 pages', () => {
    expect(partCount(0)).toBe(1);
    expect(partCount(1)).toBe(1);
    expect(partCount(2)).toBe(2);
    expect(partCount(500)).toBe(2);
    expect(partCount(501)).toBe(3);
    expect(partCount(2000)).toBe(2000 / pagesPerPart);
  });

  test('every page in exactly one part, pages sorted, the part of a page fixed by its path (fast-check)', () => {
    const pages = fc.uniqueArray(fc.stringMatching(/^segments\/[a-z0-9-]{1,12}\/index\.html$/), { maxLength: 600 });
    fc.assert(
      fc.property(pages, (list) => {
        const parts = planSearchParts(list);
        const all = parts.flatMap((part) => part.pages);
        expect(all.slice().sort()).toEqual(list.slice().sort());
        for (const part of parts) expect(part.pages).toEqual(part.pages.slice().sort((a, b) => (a < b ? -1 : a > b ? 1 : 0)));
        // Adding a page of the same count class leaves every other page where it was.
        if (list.length >= 2 && partCount(list.length) === partCount(list.length - 1)) {
          const fewer = planSearchParts(list.slice(1));
          const where = new Map(parts.flatMap((part) => part.pages.map((p) => [p, part.name] as const)));
          for (const part of fewer) for (const p of part.pages) expect(where.get(p)).toBe(part.name);
        }
      }),
      { numRuns: 300 },
    );
  });

  test('a part is taken over only with the same pages, each with the same hash as on line', () => {
    const planned = [
      { name: 'part-0', pages: ['a/index.html', 'b/index.html'] },
      { name: 'part-1', pages: ['c/index.html'] },
    ];
    const now = new Map([
      ['a/index.html', 'h1'],
      ['b/index.html', 'h2'],
      ['c/index.html', 'h3'],
    ]);
    const online = new Map([
      ['a/index.html', 'h1'],
      ['b/index.html', 'h2'],
      ['c/index.html', 'old'],
    ]);
    expect(partsToTakeOver(planned, planned, now, online).map((p) => p.name)).toEqual(['part-0']);
    expect(partsToTakeOver(null, planned, now, online)).toEqual([]);
    const otherPages = [
      { name: 'part-0', pages: ['a/index.html'] },
      { name: 'part-1', pages: ['c/index.html'] },
    ];
    expect(partsToTakeOver(otherPages, planned, now, now).map((p) => p.name)).toEqual(['part-1']);
  });

  test('marked pages are indexed; a taken-over page counts as the release on line counted it', async () => {
    await writeSite(dir, {
      'index.html': page('Overview', 'all places', false),
      'segments/north/index.html': page('North Beach', 'sand'),
      'segments/south/index.html': page('South Reef', 'rock'),
    });
    const files = await listFiles(dir);
    expect(await pagesToIndex(dir, files, new Set(), null)).toEqual(['segments/north/index.html', 'segments/south/index.html']);
    // south taken over, and the release on line did not index it: not read, not indexed
    const previous = [{ name: 'part-0', pages: ['segments/north/index.html'] }];
    expect(await pagesToIndex(dir, files, new Set(['segments/south/index.html']), previous)).toEqual(['segments/north/index.html']);
  });

  test('the parts list reads back; anything else reads as none', async () => {
    const parts = planSearchParts(['segments/a/index.html', 'segments/b/index.html', 'segments/c/index.html']);
    writeSearchParts(dir, parts);
    expect(readSearchParts(dir)).toEqual(parts);
    await writeFile(path.join(dir, 'search-index', 'parts.json'), '{"scheme":"other","parts":[]}');
    expect(readSearchParts(dir)).toBeNull();
  });
});

describe('with pagefind', () => {
  async function hashes(root: string): Promise<Map<string, string>> {
    const out = new Map<string, string>();
    for (const file of await listFiles(root))
      out.set(
        file,
        createHash('sha256')
          .update(await readFile(path.join(root, file)))
          .digest('hex'),
      );
    return out;
  }

  test("a part's index depends on its own pages only, not on where it was built or on other parts", { timeout: 60_000 }, async () => {
    const names = ['Brinmouth Sands', 'Kelp Point', 'Gullet Cove', 'Saltmarsh Reach', 'Heron Spit', 'Otter Strand'];
    const files = Object.fromEntries(names.map((name, i) => [`segments/s${i}/index.html`, page(name, `Beach litter near ${name}.`)]));
    const siteA = path.join(dir, 'a');
    const siteB = path.join(dir, 'b');
    await writeSite(siteA, files);
    // B: the same pages, and one page of another part changed
    const parts = planSearchParts(Object.keys(files));
    expect(parts.length).toBe(2);
    const [first, second] = parts as [(typeof parts)[0], (typeof parts)[0]];
    await writeSite(siteB, { ...files, [second.pages[0] as string]: page('Changed Name', 'other words') });
    await indexSearchParts(siteA, parts, path.join(dir, 'scratch-a'));
    await indexSearchParts(siteB, parts, path.join(dir, 'scratch-other-place'));
    const a = await hashes(path.join(siteA, 'search-index', first.name));
    const b = await hashes(path.join(siteB, 'search-index', first.name));
    expect(a.size).toBeGreaterThan(3);
    expect([...b.entries()]).toEqual([...a.entries()]);
    // the changed part's index did change
    const a2 = await hashes(path.join(siteA, 'search-index', second.name));
    const b2 = await hashes(path.join(siteB, 'search-index', second.name));
    expect([...b2.entries()]).not.toEqual([...a2.entries()]);
  });
});
