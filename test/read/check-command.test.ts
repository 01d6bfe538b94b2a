// `wrackline check`: prints the validation report and exits 0 (usable), 1 (errors) or 2 (unreadable
// folder or bad usage). Run on the fixture, on a broken copy of the demo scenario, and on nothing.
import { cpSync, existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, test } from 'vitest';
import { runCheck } from '../../generator/cli/check.ts';
import { scenarioCopy } from './fixture-scenario.ts';

const demoDir = fileURLToPath(new URL('../../content/demo', import.meta.url));

async function run(argv: string[]): Promise<{ code: number; out: string; err: string }> {
  let out = '';
  let err = '';
  const code = await runCheck(argv, { stdout: (t) => (out += `${t}\n`), stderr: (t) => (err += `${t}\n`), progressStream: { write: () => true, isTTY: false } });
  return { code, out, err };
}

describe('wrackline check', () => {
  test('a clean scenario exits 0 and lists every file with its counts', async () => {
    const { code, out } = await run(['--scenario', scenarioCopy()]);
    expect(code).toBe(0);
    expect(out).toMatch(/tables\/beach-litter\.csv\s+5\s+5\s+0/);
    expect(out).toContain('Result: usable');
  });

  test('records left out are warnings: still exit 0, each one listed', async () => {
    // One bad row among 22 (4.5 %) stays under the loss guard's default 5 %.
    const good = Array.from({ length: 21 }, (_, i) => `WR-${i + 1},seal-island,2026-02-${String(i + 1).padStart(2, '0')},entanglement,1`).join('\n');
    const dir = scenarioCopy({ files: { 'tables/wildlife-reports.csv': `report_id,segment_id,date,kind,animals\n${good}\nWR-99,seal-island,2026-02-27,entanglement,-1\n` } });
    const { code, out } = await run(['--scenario', dir]);
    expect(code).toBe(0);
    expect(out).toContain('tables/wildlife-reports.csv row 23, column animals: "-1" is too small');
  });

  test.skipIf(!existsSync(join(demoDir, 'datapackage.json')))(
    'a broken copy of the demo exits 1 and shows the report',
    async () => {
      const dir = mkdtempSync(join(tmpdir(), 'wrackline-demo-broken-'));
      cpSync(demoDir, dir, { recursive: true });
      const table = join(dir, 'tables/beach-litter.csv');
      const lines = readFileSync(table, 'utf8').split('\n');
      lines[0] = (lines[0] ?? '').replace('surveyed_length_m', 'length');
      writeFileSync(table, lines.join('\n'));
      const { code, out } = await run(['--scenario', dir]);
      expect(code).toBe(1);
      expect(out).toContain('tables/beach-litter.csv row 1, column surveyed_length_m: the header has no column "surveyed_length_m"');
      expect(out).toContain('Result: not usable');
    },
    60_000,
  );

  test('--json prints the report as JSON', async () => {
    const { code, out } = await run(['--scenario', scenarioCopy(), '--json']);
    expect(code).toBe(0);
    const report = JSON.parse(out) as { ok: boolean; files: unknown[] };
    expect(report.ok).toBe(true);
    expect(report.files).toHaveLength(6);
  });

  test('an unreadable folder exits 2; so does a bad option', async () => {
    const missing = await run(['--scenario', join(tmpdir(), 'no-such-wrackline-scenario')]);
    expect(missing.code).toBe(2);
    expect(missing.err).toContain('cannot read the scenario folder');
    const empty = await run(['--scenario', mkdtempSync(join(tmpdir(), 'wrackline-empty-'))]);
    expect(empty.code).toBe(2);
    expect(empty.err).toContain('datapackage.json');
    expect((await run(['--frobnicate'])).code).toBe(2);
  });
});
