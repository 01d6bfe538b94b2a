/**
 * One measured step of the ingest benchmark, run in a child process by run.ts so that its peak
 * memory is its own. Prints one JSON line: { peakMegabytes, output }.
 *   assign DIR   read DIR/segments.geojson and stream DIR/positions.csv through the drift tally
 *   read FILE    stream a positions CSV through the reader only (bounded-memory check)
 */
import { join } from 'node:path';
import { summariseTally } from '../../generator/drift/drift-model.ts';
import { DriftTally } from '../../generator/drift/drift-tally.ts';
import { readPositionsCsv } from '../../generator/drift/positions-csv.ts';
import { IssueLog } from '../../generator/read/issue-log.ts';
import { readSegments } from '../../generator/read/read-segments.ts';
import { settingsSchema } from '../../generator/scenario/settings.ts';

const [mode, target] = process.argv.slice(2);
const log = new IssueLog();
let output = '';
if (mode === 'assign' && target) {
  const settings = settingsSchema.parse({
    region: { id: 'bench', name: 'Bench coast (synthetic)' },
    publisher: { role: 'publisher', name: 'Bench' },
    authorities: [{ role: 'publisher', name: 'Bench' }],
    publications: [{ season: '2026-spring', date: '2026-06-01' }],
  });
  const started = performance.now();
  const segments = await readSegments(join(target, 'segments.geojson'), 'segments.geojson', log);
  const tally = new DriftTally(segments, settings.seasons, settings.drift.arrivalDistanceKm);
  await readPositionsCsv({
    absolutePath: join(target, 'positions.csv'),
    file: 'positions.csv',
    compression: null,
    log,
    onPosition: (particle, timeMs, lon, lat, ashore) => tally.add(particle, timeMs, lon, lat, ashore),
  });
  const readSeconds = (performance.now() - started) / 1000;
  const result = summariseTally(tally, segments, settings);
  const totalSeconds = (performance.now() - started) / 1000;
  const arrivals = result.arrivals.reduce((n, a) => n + a.arrivals, 0);
  const zones = result.zones.reduce((n, z) => n + z.zones.length, 0);
  const counts = log.countsFor('positions.csv');
  output = `${segments.length} segments, ${counts.read.toLocaleString('en-GB')} positions read, ${counts.kept.toLocaleString('en-GB')} kept, ${arrivals.toLocaleString('en-GB')} arrivals over ${result.zones.length} seasons, ${zones} zones; read+assign ${readSeconds.toFixed(1)} s, with zones ${totalSeconds.toFixed(1)} s; ${log.issues.length} issues`;
} else if (mode === 'read' && target) {
  let kept = 0;
  const started = performance.now();
  await readPositionsCsv({ absolutePath: target, file: 'big.csv', compression: null, log, onPosition: () => (kept++, true) });
  const seconds = (performance.now() - started) / 1000;
  output = `${kept.toLocaleString('en-GB')} positions in ${seconds.toFixed(1)} s (${(kept / seconds / 1e6).toFixed(2)} million/s); ${log.issues.length} issues`;
} else {
  throw new Error('usage: step.ts assign DIR | read FILE');
}
const usage = process.resourceUsage();
const peakMegabytes = usage.maxRSS / 1024;
// CPU time of this process (user + system): less sensitive than wall time to other load on the machine.
const cpuSeconds = (usage.userCPUTime + usage.systemCPUTime) / 1e6;
console.log(JSON.stringify({ peakMegabytes, cpuSeconds, output }));
