/**
 * One season's worth of trend work at the scale of the scale scenario, in process:
 * `npx tsx bench/trend/season-batch.ts [--sites 2000] [--series 2000] [--oracle] [--workers]`.
 *
 * 1. The Regional Kendall test over `--sites` invented sites (ten years of seasonal values with
 *    gaps, ties and values below a detection limit), with its cross-site covariance correction;
 *    with `--oracle` also the previous all-pairs form of that correction (test/stats/oracles.ts)
 *    on the same cycle table, for a before/after figure.
 * 2. analyzeTrend on `--series` series of about 40 values (seasonal test, 500-resample band), one
 *    after the other; with `--workers` also through the worker pool (trend-pool.ts).
 * Prints times and a SHA-256 of the results, so two versions of the engine can be compared for
 * identical output. Figures depend on the machine and its load: printed, never asserted.
 */
import { createHash } from 'node:crypto';
import { createSeededRandom } from '../../generator/random/seeded-random.ts';
import { analyzeTrend } from '../../generator/stats/analyze-trend.ts';
import { analyzeInPool, defaultWorkerCount } from '../../generator/stats/trend-pool.ts';
import { regionalKendall, type RegionalSite } from '../../generator/stats/regional-kendall.ts';
import { totalSeasonCovariance } from '../../generator/stats/season-covariance.ts';
import type { SeriesPoint } from '../../generator/stats/types.ts';
import { totalSeasonCovarianceOracle, type CycleCellOracle } from '../../test/stats/oracles.ts';

function flag(name: string, fallback: number): number {
  const at = process.argv.indexOf(name);
  return at >= 0 ? Number(process.argv[at + 1]) : fallback;
}
const siteCount = flag('--sites', 2000);
const seriesCount = flag('--series', 2000);
const seasons = ['winter', 'spring', 'summer', 'autumn'];

/** Ten years of seasonal values for one invented site: a drift, noise, gaps, ties and "<0.5". */
function inventSeries(seed: number): SeriesPoint[] {
  const random = createSeededRandom(seed);
  const trend = (random.uniform() - 0.5) * 0.4;
  const points: SeriesPoint[] = [];
  for (let year = 2017; year <= 2026; year++) {
    for (let s = 0; s < 4; s++) {
      if (random.uniform() < 0.08) continue; // a missed survey
      const t = year + s / 4 + 0.125;
      const raw = 3 + trend * (year - 2017) + (random.uniform() - 0.5) * 2;
      const value = Math.round(raw * 10) / 10; // one decimal: ties
      const censored = value < 0.5;
      points.push({ t, value: censored ? 0.5 : value, censored, season: seasons[s] as string });
    }
  }
  return points;
}

function digest(value: unknown): string {
  return createHash('sha256').update(JSON.stringify(value)).digest('hex').slice(0, 16);
}

const sites: RegionalSite[] = Array.from({ length: siteCount }, (_, i) => ({ site: `site-${i}`, points: inventSeries(1000 + i) }));
let started = performance.now();
const regional = regionalKendall(sites, { confidence: 0.95 });
const regionalMs = performance.now() - started;
console.log(
  `regional Kendall, ${siteCount} sites: ${(regionalMs / 1000).toFixed(2)} s  (varSCovariance ${regional?.varSCovariance}, pCovariance ${regional?.pCovariance}; digest ${digest(regional)})`,
);

if (process.argv.includes('--oracle')) {
  // the previous all-pairs covariance sum over the same cycle table (sites as seasons, cycles = years)
  const cells: (CycleCellOracle | null)[][] = sites.map(({ points }) => {
    const byYear = new Map<number, { value: number; censored: boolean }[]>();
    for (const p of points) {
      const year = Math.floor(p.t);
      const list = byYear.get(year) ?? [];
      list.push({ value: p.value as number, censored: p.censored === true });
      byYear.set(year, list);
    }
    return Array.from({ length: 10 }, (_, k) => {
      const list = byYear.get(2017 + k);
      if (!list) return null;
      const order = list.map((_c, i) => i).sort((a, b) => (list[a] as CycleCellOracle).value - (list[b] as CycleCellOracle).value);
      return list[order[(order.length - 1) >> 1] as number] as CycleCellOracle;
    });
  });
  started = performance.now();
  const covariance = totalSeasonCovarianceOracle(cells);
  const oracleMs = performance.now() - started;
  started = performance.now();
  const fast = totalSeasonCovariance(cells);
  const fastMs = performance.now() - started;
  console.log(
    `  covariance sum over ${siteCount} sites: all-pairs form (previous) ${(oracleMs / 1000).toFixed(2)} s, precomputed per site ${(fastMs / 1000).toFixed(3)} s; identical: ${fast === covariance} (${covariance})`,
  );
}

const series = Array.from({ length: seriesCount }, (_, i) => inventSeries(5000 + i));
const options = { confidence: 0.95, seasonal: true, minValues: 8, minYears: 5 };
started = performance.now();
const cpuBefore = process.cpuUsage();
const results = series.map((points, i) => analyzeTrend(points, { ...options, bootstrap: { resamples: 500, seed: 77 + i } }));
const serialMs = performance.now() - started;
const serialCpuMs = process.cpuUsage(cpuBefore).user / 1000;
console.log(
  `analyzeTrend, ${seriesCount} series (n ≈ 37, seasonal, 500 resamples): ${(serialMs / 1000).toFixed(2)} s wall, ${(serialCpuMs / 1000).toFixed(2)} s CPU, ` +
    `${(serialCpuMs / Math.max(1, seriesCount)).toFixed(2)} ms CPU each; digest ${digest(results)}`,
);

if (process.argv.includes('--workers')) {
  const requests = series.map((points, i) => ({ points, options: { ...options, bootstrap: { resamples: 500, seed: 77 + i } } }));
  for (const round of [1, 2]) {
    started = performance.now();
    const outcomes = analyzeInPool(requests, { minBatch: 0 });
    const poolMs = performance.now() - started;
    const pooled = outcomes.map((o) => ('result' in o ? o.result : o.error));
    console.log(
      `  same through the pool (calling thread + ${defaultWorkerCount()} worker${defaultWorkerCount() === 1 ? '' : 's'}, round ${round}${round === 1 ? ', includes starting the workers' : ''}): ` +
        `${(poolMs / 1000).toFixed(2)} s wall; digest ${digest(pooled)} (${digest(pooled) === digest(results) ? 'identical' : 'DIFFERENT'})`,
    );
  }
}
