import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';
import { isoToDecimalYear, runTrend } from '../../generator/cli/trend.ts';
import { assertInDelta } from '../asserts.ts';
import { littleValues, monthlyConcentration, sulfateTime, sulfateValue } from './worked-examples.ts';

const folder = mkdtempSync(join(tmpdir(), 'wrackline-trend-'));
function csv(name: string, text: string): string {
  const path = join(folder, name);
  writeFileSync(path, text);
  return path;
}

async function run(argv: string[]): Promise<{ code: number; out: string; err: string }> {
  const out: string[] = [];
  const err: string[] = [];
  const code = await runTrend(argv, { stdout: (text) => out.push(text), stderr: (text) => err.push(text) });
  return { code, out: out.join('\n'), err: err.join('\n') };
}

describe('wrackline trend', () => {
  test('--json prints the contract fields (USEPA 2009 Ex. 17-6; EnvStats values)', async () => {
    const file = csv('sulfate.csv', `time,value\n${sulfateTime.map((t, i) => `${t},${sulfateValue[i]}`).join('\n')}\n`);
    const { code, out } = await run([file, '--json']);
    expect(code).toBe(0);
    const json = JSON.parse(out);
    expect(Object.keys(json)).toEqual(expect.arrayContaining(['n', 'mannKendall', 'sen']));
    expect(json).not.toHaveProperty('seasonalKendall');
    expect(json.n).toBe(23);
    expect(Object.keys(json.mannKendall)).toEqual(expect.arrayContaining(['S', 'varS', 'z', 'p', 'tau', 'pExact']));
    expect(Object.keys(json.sen)).toEqual(expect.arrayContaining(['slope', 'lower', 'upper', 'intercept', 'confidence']));
    expect(json.mannKendall.S).toBe(194);
    assertInDelta(json.mannKendall.varS, 1428, 1e-9);
    assertInDelta(json.sen.slope, 26.66667, 5e-6);
    assertInDelta(json.sen.lower, 20, 5e-6);
    assertInDelta(json.sen.upper, 35.71182, 5e-6);
    expect(json.sen.confidence).toBe(0.95);
  });

  test('--seasonal with time,season,value (USEPA 2009 Ex. 14-10; EnvStats values) and --confidence', async () => {
    const rows: string[] = [];
    for (const year of [1983, 1984, 1985]) {
      monthlyConcentration[year]?.forEach((value, month) => rows.push(`${year + month / 12},m${month + 1},${value}`));
    }
    const file = csv('monthly.csv', `time,season,value\n${rows.join('\n')}\n`);
    const { code, out } = await run([file, '--json', '--seasonal', '--confidence', '0.95']);
    expect(code).toBe(0);
    const json = JSON.parse(out);
    expect(Object.keys(json.seasonalKendall)).toEqual(expect.arrayContaining(['S', 'varS', 'z', 'p', 'slope', 'lower', 'upper']));
    expect(json.seasonalKendall.S).toBe(35);
    assertInDelta(json.seasonalKendall.varS, 43, 1e-9);
    // numeric time year + month/12: the same month is 1 apart (to rounding) → 0.06 per unit
    assertInDelta(json.seasonalKendall.slope, 0.06, 1e-9);
    assertInDelta(json.seasonalKendall.lower, 0.05786914, 5e-9);
    assertInDelta(json.seasonalKendall.upper, 0.07213086, 5e-9);
  });

  test('undefined quantities are null, never NaN; "<x" is censored; empty is missing', async () => {
    const file = csv('short.csv', 'time,value\n1,<0.5\n2,\n3,4\n');
    const { code, out } = await run([file, '--json']);
    expect(code).toBe(0);
    expect(out).not.toMatch(/NaN|Infinity/);
    const json = JSON.parse(out);
    expect(json.n).toBe(2);
    expect(json.nCensored).toBe(1);
    expect(json.mannKendall.z).toBe(0); // S = 1, z = (1 − 1)/1
    expect(json.sen.lower).toBeNull();
    expect(json.insufficient.reason).toBe('fewer than 8 values');
  });

  test('summary without --json reads as plain text', async () => {
    const file = csv('little.csv', `time,value\n${littleValues.map((v, i) => `${i + 1},${v}`).join('\n')}\n`);
    const { code, out } = await run([file]);
    expect(code).toBe(0);
    expect(out).toContain('14 values used');
    expect(out).toContain('Mann–Kendall: S = 54');
    // three significant digits throughout (D. Little, Holy Cross: Sen 0.566667, CI 0.32313–0.86978, check value 3)
    expect(out).toContain("Sen's slope: 0.567 per unit of time (95% interval 0.323 to 0.87)");
  });

  test("case 7: the readable output starts with a plain verdict in the bulletins' words, per year for years", async () => {
    // D. Little, "A Mann-Kendall Example (By Hand)": S = 54, two-sided p = 0.00366, Sen 0.566667
    const file = csv('little-years.csv', `time,value\n${littleValues.map((v, i) => `${2013 + i},${v}`).join('\n')}\n`);
    const { code, out } = await run([file]);
    expect(code).toBe(0);
    const lines = out.split('\n');
    // seeded bootstrap (500 resamples): the chance of a rise, in the Hirsch et al. (2015) words
    expect(lines[0]).toBe('Going up: a rise is highly likely; the chance is more than 99 in 100.');
    expect(lines[1]).toBe('About 0.6 more per year; the 95% confidence interval runs from 0.3 to 0.9 more.');
    expect(out).toContain("Sen's slope: 0.567 per year");
  });

  test('case 7: columns by name (--time, --value), or the first two columns with a note', async () => {
    const rows = littleValues.map((v, i) => `${2013 + i},x,${v}`).join('\n');
    const named = await run([csv('named.csv', `year,site,count\n${rows}\n`), '--time', 'year', '--value', 'count']);
    expect(named.code).toBe(0);
    expect(named.out).toContain('14 values used');
    expect(named.out).not.toContain('Note:');
    const first = await run([csv('first-two.csv', `year,count\n${littleValues.map((v, i) => `${2013 + i},${v}`).join('\n')}\n`)]);
    expect(first.code).toBe(0);
    expect(first.out).toContain(
      'Note: no column is named time or value, so the first two columns are used: "year" as the time and "count" as the value (name them with --time and --value).',
    );
    const missing = await run([csv('missing.csv', 'year,count\n1,2\n'), '--value', 'items']);
    expect(missing.code).toBe(2);
    expect(missing.err).toContain('it has no column "items" (--value)');
    // --json stays as it was: the same object whatever the readable output says
    const json = JSON.parse((await run([csv('first-json.csv', `year,count\n${littleValues.map((v, i) => `${2013 + i},${v}`).join('\n')}\n`), '--json'])).out);
    expect(json.mannKendall.S).toBe(54);
    expect(Object.keys(json)).toEqual(['n', 'nCensored', 'mannKendall', 'sen', 'serialCorrection', 'insufficient']);
  });

  test('bad CSV: exit 2 naming line and column', async () => {
    const bad = await run([csv('bad.csv', 'time,value\n1,2\n2,abc\n'), '--json']);
    expect(bad.code).toBe(2);
    expect(bad.err).toContain('line 3, column value: "abc" is not a number');
    const badTime = await run([csv('bad-time.csv', 'time,value\n2026-02-30,1\n')]);
    expect(badTime.code).toBe(2);
    expect(badTime.err).toContain('line 2, column time: "2026-02-30"');
    const header = await run([csv('header.csv', 'when,value\n1,2\n')]);
    expect(header.code).toBe(2);
    expect(header.err).toContain('line 1: header is "when,value"');
    const fields = await run([csv('fields.csv', 'time,value\n1,2,3\n')]);
    expect(fields.err).toContain('line 2: 3 fields; expected 2');
  });

  test('bad usage: exit 2', async () => {
    expect((await run([])).code).toBe(2);
    expect((await run([join(folder, 'absent.csv')])).code).toBe(2);
    expect((await run([csv('ok.csv', 'time,value\n1,2\n'), '--confidence', '95'])).err).toContain('--confidence "95" is not a number between 0 and 1');
    expect((await run([csv('ok2.csv', 'time,value\n1,2\n'), '--seasonal'])).code).toBe(2);
    expect((await run(['--help'])).code).toBe(0);
  });

  test('ISO dates become decimal years (middle of the day; date-times at their instant)', () => {
    assertInDelta(isoToDecimalYear('2026-01-01'), 2026 + 0.5 / 365, 1e-12);
    assertInDelta(isoToDecimalYear('2024-12-31'), 2024 + 365.5 / 366, 1e-12);
    assertInDelta(isoToDecimalYear('2026-07-02T12:00:00Z'), 2026 + 182.5 / 365, 1e-12);
    assertInDelta(isoToDecimalYear('2026-07-02T14:00:00+02:00'), 2026 + 182.5 / 365, 1e-12);
    expect(isoToDecimalYear('2026-13-01')).toBeNull();
    expect(isoToDecimalYear('yesterday')).toBeNull();
  });
});
