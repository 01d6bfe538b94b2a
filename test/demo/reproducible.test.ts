/**
 * The demo generator is deterministic: running it again into a fresh folder reproduces every
 * committed file byte for byte, and its gzip output carries no modification time (RFC 1952,
 * section 2.3.1: MTIME = 0 means no time stamp is available).
 */
import { mkdtemp, readFile, readdir, rm, stat } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { makeDemo, type DemoSummary } from '../../content/demo/make-demo.ts';
import { DEMO_DIR } from './demo-tables.ts';

let outDir = '';
let summary: DemoSummary;

beforeAll(async () => {
  outDir = await mkdtemp(join(tmpdir(), 'wrackline-demo-'));
  summary = await makeDemo(outDir);
}, 120_000);

afterAll(async () => {
  if (outDir) await rm(outDir, { recursive: true, force: true });
});

describe('demo generator', () => {
  test('writes the same bytes as the committed files', async () => {
    expect(summary.files.length).toBeGreaterThanOrEqual(10);
    for (const file of summary.files) {
      const fresh = await readFile(join(outDir, file.path));
      const committed = await readFile(join(DEMO_DIR, file.path));
      expect(fresh.equals(committed), `${file.path} differs from the committed copy; run npm run demo:make`).toBe(true);
    }
  });

  test('gzip header has no time stamp (RFC 1952 §2.3.1: MTIME bytes 4–7 are zero)', async () => {
    const bytes = await readFile(join(DEMO_DIR, 'drift/positions.csv.gz'));
    expect([...bytes.subarray(0, 3)]).toEqual([0x1f, 0x8b, 8]);
    expect([...bytes.subarray(4, 8)]).toEqual([0, 0, 0, 0]);
  });

  test('committed demo files stay under 15 MB in total', async () => {
    let total = 0;
    const walk = async (dir: string): Promise<void> => {
      for (const entry of await readdir(dir, { withFileTypes: true })) {
        const path = join(dir, entry.name);
        if (entry.isDirectory()) await walk(path);
        else total += (await stat(path)).size;
      }
    };
    await walk(DEMO_DIR);
    expect(total).toBeLessThan(15e6);
  });

  test('writes a few hundred thousand drift positions', () => {
    expect(summary.positions).toBeGreaterThan(200_000);
    expect(summary.positions).toBeLessThan(600_000);
  });
});
