/**
 * The demo scenario shows every pattern a bulletin has to word. Checked with an independent small
 * Mann–Kendall test (test/demo/simple-kendall.ts; Mann 1945, Kendall 1975, Gilbert 1987 ch. 16) on
 * the committed tables, and with the project's own trend engine where it is present.
 */
import { existsSync } from 'node:fs';
import { describe, expect, test } from 'vitest';
import { mannKendallSimple } from './simple-kendall.ts';
import { median, readTable, seasonName, series } from './demo-tables.ts';

const beach = readTable('beach-litter');
const water = readTable('water-microplastics');
const shellfish = readTable('shellfish-tissue');
const wildlife = readTable('wildlife-reports');

const litter = (id: string) => series(beach, id, 'items').filter((point) => Number.isFinite(point.value) && point.value >= 0);
const values = (points: { value: number }[]) => points.map((point) => point.value);

describe('demo trend shapes (beach litter, items/100 m)', () => {
  test('a clear rise: corrab-sands', () => {
    const mk = mannKendallSimple(values(litter('corrab-sands')));
    expect(mk.S).toBeGreaterThan(0);
    expect(mk.p).toBeLessThan(0.001);
  });

  test('a clear fall: ostry-beach, varrack-sands and naddor-sands', () => {
    for (const id of ['ostry-beach', 'varrack-sands', 'naddor-sands']) {
      const mk = mannKendallSimple(values(litter(id)));
      expect(mk.S, id).toBeLessThan(0);
      expect(mk.p, id).toBeLessThan(0.001);
    }
  });

  test('no clear direction: pellow-strand and tamsk-beach', () => {
    for (const id of ['pellow-strand', 'tamsk-beach']) {
      const mk = mannKendallSimple(values(litter(id)));
      expect(mk.n, id).toBeGreaterThanOrEqual(30);
      expect(mk.p, id).toBeGreaterThan(0.3);
    }
  });

  test('too little data for any claim: lissow-beach has fewer than 8 values within one year', () => {
    const points = litter('lissow-beach');
    expect(points.length).toBeGreaterThan(0);
    expect(points.length).toBeLessThan(8);
    expect(new Set(points.map((point) => point.date.slice(0, 4))).size).toBe(1);
  });

  test('strongly seasonal: garrith-beach winter median is over three times the summer median', () => {
    const points = litter('garrith-beach');
    const winter = median(values(points.filter((point) => seasonName(point.date) === 'winter')));
    const summer = median(values(points.filter((point) => seasonName(point.date) === 'summer')));
    expect(winter / summer).toBeGreaterThan(3);
    expect(mannKendallSimple(values(points)).p).toBeGreaterThan(0.2);
  });

  test('a step change: quarrow-harbour median doubles from 2021 on', () => {
    const points = litter('quarrow-harbour');
    const before = median(values(points.filter((point) => point.date < '2021-03-01')));
    const after = median(values(points.filter((point) => point.date >= '2021-03-01')));
    expect(after / before).toBeGreaterThan(2);
  });

  test('autocorrelated noise: quarrow-town-beach lag-1 autocorrelation of log values above 0.5', () => {
    const logs = values(litter('quarrow-town-beach')).map(Math.log);
    const mean = logs.reduce((sum, v) => sum + v, 0) / logs.length;
    let numerator = 0;
    let denominator = 0;
    for (let i = 0; i < logs.length; i++) {
      const d = (logs[i] as number) - mean;
      denominator += d * d;
      if (i > 0) numerator += d * ((logs[i - 1] as number) - mean);
    }
    expect(numerator / denominator).toBeGreaterThan(0.5);
  });

  test('seasons disagree: tolvar-beach winter rises, summer falls (both p < 0.01)', () => {
    const points = litter('tolvar-beach');
    const winter = mannKendallSimple(values(points.filter((point) => seasonName(point.date) === 'winter')));
    const summer = mannKendallSimple(values(points.filter((point) => seasonName(point.date) === 'summer')));
    expect(winter.S).toBeGreaterThan(0);
    expect(winter.p).toBeLessThan(0.01);
    expect(summer.S).toBeLessThan(0);
    expect(summer.p).toBeLessThan(0.01);
  });

  test('gappy record: fennock-dunes has a gap of more than three years', () => {
    const days = litter('fennock-dunes').map((point) => Date.parse(point.date) / 86_400_000);
    let longest = 0;
    for (let i = 1; i < days.length; i++) longest = Math.max(longest, (days[i] as number) - (days[i - 1] as number));
    expect(longest).toBeGreaterThan(3 * 365);
  });

  test('one segment far above the 20 items/100 m threshold and one far below (last four surveys)', () => {
    // Threshold value 20 items/100 m: Van Loon et al. 2020, JRC.
    const lastFour = (id: string) => median(values(litter(id).slice(-4)));
    expect(lastFour('quarrow-harbour')).toBeGreaterThan(5 * 20);
    expect(lastFour('tharra-island-west')).toBeLessThan(20 / 2);
  });

  test('beach-litter magnitudes stay within tens to hundreds of items/100 m (Van Loon et al. 2020 baseline means 40–274)', () => {
    const all = beach.map((row) => (Number(row['items']) * 100) / Number(row['surveyed_length_m'])).filter((v) => v >= 0);
    expect(median(all)).toBeGreaterThan(20);
    expect(median(all)).toBeLessThan(274);
    expect(Math.max(...all)).toBeLessThan(1000);
  });
});

describe('demo values below detection and other indicators', () => {
  test('values below detection appear in water and shellfish tables', () => {
    const censoredWater = water.filter((row) => row['particles_per_m3']?.startsWith('<'));
    const censoredShellfish = shellfish.filter((row) => row['particles_per_g_ww']?.startsWith('<'));
    expect(censoredWater.length).toBeGreaterThan(10);
    expect(censoredShellfish.length).toBeGreaterThan(10);
    // morrin-bay-north: most shellfish samples below detection.
    const morrin = series(shellfish, 'morrin-bay-north', 'particles_per_g_ww');
    expect(morrin.filter((point) => point.censored).length / morrin.length).toBeGreaterThan(0.5);
  });

  test('shellfish mostly below 1 particle/g wet weight (Danopoulos et al. 2020; Van Cauwenberghe & Janssen 2014)', () => {
    const numbers = shellfish.map((row) => Number((row['particles_per_g_ww'] ?? '').replace('<', '')));
    expect(numbers.filter((v) => v < 1).length / numbers.length).toBeGreaterThan(0.9);
  });

  test('shellfish rise (ithmere-bay-north) and fall (ithmere-bay-south)', () => {
    const rise = mannKendallSimple(values(series(shellfish, 'ithmere-bay-north', 'particles_per_g_ww').filter((p) => p.date <= '2026-11-30')));
    const fall = mannKendallSimple(values(series(shellfish, 'ithmere-bay-south', 'particles_per_g_ww')));
    expect(rise.S).toBeGreaterThan(0);
    expect(rise.p).toBeLessThan(0.001);
    expect(fall.S).toBeLessThan(0);
    expect(fall.p).toBeLessThan(0.001);
  });

  test('surface water rises at the estuary', () => {
    const mk = mannKendallSimple(values(series(water, 'aldwen-estuary', 'particles_per_m3')));
    expect(mk.S).toBeGreaterThan(0);
    expect(mk.p).toBeLessThan(0.001);
  });

  test('wildlife reports at vellan-head rise (animals per year)', () => {
    const perYear = new Map<number, number>();
    for (let year = 2017; year <= 2026; year++) perYear.set(year, 0);
    for (const row of wildlife.filter((r) => r['segment_id'] === 'vellan-head')) {
      const date = row['date'] ?? '';
      const year = Number(date.slice(0, 4)) + (date.slice(5, 7) === '12' ? 1 : 0);
      perYear.set(year, (perYear.get(year) ?? 0) + Number(row['animals']));
    }
    const mk = mannKendallSimple([...perYear.values()]);
    expect(mk.S).toBeGreaterThan(0);
    expect(mk.p).toBeLessThan(0.05);
  });
});

describe('demo bad rows', () => {
  test('the three deliberate bad rows are present', () => {
    expect(beach.filter((row) => Number(row['items']) < 0).map((row) => row['segment_id'])).toEqual(['ostry-beach']);
    expect(water.filter((row) => row['segment_id'] === 'north-spit')).toHaveLength(1);
    expect(shellfish.filter((row) => (row['date'] ?? '') > '2026-11-30').map((row) => row['date'])).toEqual(['2027-02-14']);
  });
});

describe('the project trend engine agrees where it is present', () => {
  const mkPath = new URL('../../generator/stats/mann-kendall.ts', import.meta.url);
  test.skipIf(!existsSync(mkPath))('mannKendall gives the same S as the small independent test', async () => {
    const module = (await import(mkPath.href)) as { mannKendall?: (t: Float64Array, y: Float64Array) => { S: number; p: number | null } };
    if (typeof module.mannKendall !== 'function') throw new Error('generator/stats/mann-kendall.ts exports no mannKendall');
    for (const id of ['corrab-sands', 'ostry-beach', 'pellow-strand']) {
      const points = litter(id);
      const engine = module.mannKendall(
        Float64Array.from(points, (_, i) => i),
        Float64Array.from(values(points)),
      );
      const simple = mannKendallSimple(values(points));
      expect(engine.S, id).toBe(simple.S);
      expect(Math.abs((engine.p ?? NaN) - simple.p), id).toBeLessThan(1e-4);
    }
  });
});
