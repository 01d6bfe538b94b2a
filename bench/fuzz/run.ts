/**
 * Fuzz bench: at least 10,000 generated inputs per reader (CSV table, GeoJSON/TopoJSON segments,
 * settings, drift positions), each read as `wrackline check` reads a scenario. Prints inputs
 * tried, exit codes, crashes, escapes and losses per reader (definitions in
 * test/hostile/fuzz-harness.ts) and exits 1 when any crash, escape or loss was found.
 *
 * Trials run 16 at a time (FUZZ_CONCURRENCY); reading mostly waits on the file system, so give
 * libuv more threads: UV_THREADPOOL_SIZE=16.
 *
 *   UV_THREADPOOL_SIZE=16 npx tsx bench/fuzz/run.ts [runs per reader, default 10000] [seed, default 20261205] [readers, default csv,geojson,settings,drift]
 */
import { fuzzReader, readerKinds } from '../../test/hostile/fuzz-harness.ts';
import type { ReaderKind } from '../../test/hostile/fuzz-harness.ts';

const runs = Number(process.argv[2] ?? 10_000);
const seed = Number(process.argv[3] ?? 20_261_205);
const concurrency = Number(process.env['FUZZ_CONCURRENCY'] ?? 16);
const kinds = (process.argv[4]?.split(',') ?? [...readerKinds]).filter((k): k is ReaderKind => (readerKinds as readonly string[]).includes(k));
let bad = 0;
const started = performance.now();
console.log(`fuzzing ${kinds.length} readers, ${runs.toLocaleString('en-GB')} inputs each, seed ${seed}`);
for (const kind of kinds) {
  const t0 = performance.now();
  const tally = await fuzzReader(kind, runs, seed, concurrency);
  const exits = Object.entries(tally.exits)
    .map(([code, n]) => `exit ${code}: ${n}`)
    .join(', ');
  console.log(
    `${kind.padEnd(9)} inputs tried ${tally.tried.toLocaleString('en-GB')}  crashes ${tally.crashes}  escapes ${tally.escapes}  losses ${tally.losses}  (${exits}; ${((performance.now() - t0) / 1000).toFixed(0)} s)`,
  );
  for (const example of tally.examples) console.log(`    ${example}`);
  bad += tally.crashes + tally.escapes + tally.losses;
}
console.log(`total ${((performance.now() - started) / 1000).toFixed(0)} s, peak RSS ${(process.resourceUsage().maxRSS / 1024).toFixed(0)} MB`);
process.exitCode = bad > 0 ? 1 : 0;
