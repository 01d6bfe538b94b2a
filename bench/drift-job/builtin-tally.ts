/**
 * The built-in drift reader on a scenario's drift files, written as the drift job writes its
 * tables (drift-arrivals.csv, drift-end-positions.csv) into OUT, so the two can be compared:
 *   npx tsx bench/drift-job/builtin-tally.ts SCENARIO OUT
 * Prints one JSON line: { seconds, peakMegabytes, positions, issues }.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { builtinTally } from '../../test/drift/builtin-tally.ts';

const [scenario, out] = process.argv.slice(2);
if (!scenario || !out) throw new Error('usage: builtin-tally.ts SCENARIO OUT');
const started = performance.now();
const result = await builtinTally(scenario);
const seconds = (performance.now() - started) / 1000;
mkdirSync(out, { recursive: true });
writeFileSync(join(out, 'drift-arrivals.csv'), `segment_id,season,arrivals\n${result.tables.arrivals.map((a) => `${a.segmentId},${a.season},${a.arrivals}`).join('\n')}\n`);
writeFileSync(join(out, 'drift-end-positions.csv'), `season,lon,lat\n${result.tables.endPositions.map((e) => `${e.season},${e.lon},${e.lat}`).join('\n')}\n`);
const usage = process.resourceUsage();
console.log(JSON.stringify({ seconds, peakMegabytes: usage.maxRSS / 1024, positions: result.positions, issues: result.messages.length }));
