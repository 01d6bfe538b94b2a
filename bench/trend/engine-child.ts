/**
 * One benchmark run of the trend engine in its own process (so peak RSS is per size):
 *   tsx bench/trend/engine-child.ts trend FILE.bin      Mann–Kendall + Sen's slope with its 95% interval
 *   tsx bench/trend/engine-child.ts band N RESAMPLES    bootstrap band of a series of N values
 * FILE.bin holds n times then n values as little-endian float64. Prints one JSON line.
 */
import { readFileSync } from 'node:fs';
import { mannKendall } from '../../generator/stats/mann-kendall.ts';
import { sensSlope } from '../../generator/stats/sens-slope.ts';
import { trendBand } from '../../generator/stats/trend-band.ts';

const [mode, first, second] = process.argv.slice(2);
if (mode === 'trend') {
  const bytes = readFileSync(first as string);
  const all = new Float64Array(bytes.buffer, bytes.byteOffset, bytes.byteLength / 8);
  const n = all.length / 2;
  const t = all.slice(0, n);
  const y = all.slice(n);
  const cpuStart = process.cpuUsage();
  const start = performance.now();
  const mk = mannKendall(t, y);
  const mkDone = performance.now();
  const sen = sensSlope(t, y, { varS: mk.varS });
  const end = performance.now();
  const cpu = process.cpuUsage(cpuStart);
  console.log(
    JSON.stringify({
      n,
      mkMs: mkDone - start,
      senMs: end - mkDone,
      totalMs: end - start,
      cpuMs: (cpu.user + cpu.system) / 1000,
      peakRssMB: process.resourceUsage().maxRSS / 1024,
      S: mk.S,
      tau: mk.tau,
      slope: sen.slope,
      lower: sen.lower,
      upper: sen.upper,
    }),
  );
} else if (mode === 'band') {
  const n = Number(first);
  const resamples = Number(second);
  const t = Float64Array.from({ length: n }, (_, i) => 2000 + i / 12);
  const y = t.map((v, i) => 0.05 * (v - 2000) + Math.sin(i * 0.7) + 0.3 * Math.cos(i * 2.3));
  const cpuStart = process.cpuUsage();
  const start = performance.now();
  const band = trendBand(t, y, { resamples, seed: 42 });
  const end = performance.now();
  const cpu = process.cpuUsage(cpuStart);
  console.log(
    JSON.stringify({
      n,
      resamples,
      ms: end - start,
      cpuMs: (cpu.user + cpu.system) / 1000,
      peakRssMB: process.resourceUsage().maxRSS / 1024,
      probabilityUp: band?.probabilityUp,
      blockLength: band?.band.blockLength,
    }),
  );
} else {
  console.error('usage: engine-child.ts trend FILE.bin | band N RESAMPLES');
  process.exit(2);
}
