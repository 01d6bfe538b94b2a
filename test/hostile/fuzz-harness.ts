/**
 * Property-based fuzzing of the scenario readers (fast-check), shared by the seeded sample in
 * `npm test` (test/hostile/fuzz-readers.test.ts) and the full bench (bench/fuzz/run.ts).
 *
 * Each trial copies the small invented scenario (test/fixtures/inputs/base), replaces one input —
 * the beach-litter CSV, the segments GeoJSON/TopoJSON, the settings, or the drift positions — by a
 * generated one (mutations of the real file, hostile cells, random JSON, raw bytes, gzip, and
 * sometimes a symbolic link to a file outside the scenario), then reads it as `wrackline check`
 * does and classifies the outcome:
 *
 * - crash: anything thrown other than ScenarioError (which the command turns into exit 2);
 * - escape: the secret held by a file outside the scenario shows up anywhere in what was read
 *   (report, records, segments, settings), or the scenario folder itself changed;
 * - loss: a file's read ≠ kept + excluded, records left out with no issue marked excluded for
 *   their file, or records kept that are not counted as kept.
 */
import { cpSync, lstatSync, mkdtempSync, readdirSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { gzipSync } from 'node:zlib';
import fc from 'fast-check';
import { loadScenario } from '../../generator/read/load-scenario.ts';

export const readerKinds = ['csv', 'geojson', 'settings', 'drift'] as const;
export type ReaderKind = (typeof readerKinds)[number];

const baseScenario = fileURLToPath(new URL('../fixtures/inputs/base', import.meta.url));
const targetOf: { [kind in ReaderKind]: string } = {
  csv: 'tables/beach-litter.csv',
  geojson: 'segments.geojson',
  settings: 'scenario.json',
  drift: 'drift/positions.csv',
};
export const secret = 'OUTSIDE-SECRET-7f3a9c';

/** One generated input: the bytes of the target file, or a link out of the scenario. */
export type FuzzInput = { kind: 'bytes'; content: Uint8Array; gzip: boolean } | { kind: 'escape'; folder: boolean };

const hostileText = fc.constantFrom(
  '',
  '"',
  '""',
  '"unclosed',
  '\u0000',
  '\u202eevil',
  '\u2066x\u2069',
  '\ufffd',
  '\ufeff',
  '\r',
  '\r\n',
  ',',
  ';',
  '\t',
  '<script>alert(1)</script>',
  '__proto__',
  'constructor',
  '../../etc/passwd',
  'NaN',
  '-Infinity',
  '1e309',
  '-0',
  '1826-01-01T00:00:00Z',
  '2999-12-31T00:00:00Z',
  '2026-02-30',
  '2026-13-01',
  '3.14159',
  '-180.0001',
  '90.5',
  'x'.repeat(300),
);
const number = fc.oneof(fc.double().map(String), fc.integer().map(String), fc.constantFrom('0', '100', '2026-01-15', '<0.5', '12,5'));
const cell = fc.oneof(hostileText, fc.string({ maxLength: 10 }), number, fc.constantFrom('north-beach', 'harbour-mouth', 'seal-island', 'BL-1', 'drifting', 'ashore'));
function rowsOf(header: string): fc.Arbitrary<string> {
  const width = header.split(',').length;
  return fc
    .tuple(fc.array(fc.array(cell, { minLength: Math.max(0, width - 2), maxLength: width + 2 }), { maxLength: 12 }), fc.constantFrom('\n', '\r\n'))
    .map(([rows, end]) => [header, ...rows.map((cells) => cells.join(','))].join(end));
}

/** Byte-level mutations of a real file: flips, cuts, repeats, insertions. */
function mutated(original: Uint8Array): fc.Arbitrary<Uint8Array> {
  const edit = fc.oneof(
    fc.record({ op: fc.constant('flip' as const), at: fc.nat(), byte: fc.integer({ min: 0, max: 255 }) }),
    fc.record({ op: fc.constant('cut' as const), at: fc.nat() }),
    fc.record({ op: fc.constant('insert' as const), at: fc.nat(), text: hostileText }),
    fc.record({ op: fc.constant('repeat' as const), at: fc.nat(), length: fc.integer({ min: 1, max: 200 }) }),
  );
  return fc.array(edit, { minLength: 1, maxLength: 6 }).map((edits) => {
    let bytes = Buffer.from(original);
    for (const e of edits) {
      const at = bytes.length === 0 ? 0 : e.at % bytes.length;
      if (e.op === 'flip') {
        if (bytes.length > 0) bytes[at] = e.byte;
      } else if (e.op === 'cut') bytes = bytes.subarray(0, at);
      else if (e.op === 'insert') bytes = Buffer.concat([bytes.subarray(0, at), Buffer.from(e.text), bytes.subarray(at)]);
      else bytes = Buffer.concat([bytes.subarray(0, at + e.length), bytes.subarray(at)]);
    }
    return new Uint8Array(bytes);
  });
}

const text = (s: string): Uint8Array => new Uint8Array(Buffer.from(s));

/** JSON documents: real file edited at random keys, random values, deep or polluting keys. */
function jsonDocuments(original: string): fc.Arbitrary<Uint8Array> {
  const parsed = JSON.parse(original) as unknown;
  const paths: (string | number)[][] = [];
  const walk = (value: unknown, path: (string | number)[]): void => {
    paths.push(path);
    if (Array.isArray(value)) value.forEach((v, i) => walk(v, [...path, i]));
    else if (value !== null && typeof value === 'object') for (const [k, v] of Object.entries(value)) walk(v, [...path, k]);
  };
  walk(parsed, []);
  const replacement = fc.oneof(fc.jsonValue({ maxDepth: 3 }), hostileText, fc.double({ noNaN: true }), fc.constantFrom(null, [], {}));
  const edited = fc.array(fc.tuple(fc.constantFrom(...paths), replacement, fc.boolean()), { minLength: 1, maxLength: 4 }).map((edits) => {
    const copy = JSON.parse(original) as unknown;
    for (const [path, value, asForbidden] of edits) {
      if (path.length === 0) continue;
      let parent: unknown = copy;
      for (const part of path.slice(0, -1)) parent = parent !== null && typeof parent === 'object' ? (parent as { [key: string]: unknown })[part as string] : undefined;
      if (parent === null || typeof parent !== 'object') continue;
      const key = path[path.length - 1] as string;
      // A copy: fast-check hands out the same constant objects again, which would make cycles.
      const fresh: unknown = structuredClone(value);
      if (asForbidden && !Array.isArray(parent))
        Object.defineProperty(parent as object, fc.sample(fc.constantFrom('__proto__', 'constructor', 'prototype'), 1)[0] as string, {
          value: fresh,
          enumerable: true,
          configurable: true,
          writable: true,
        });
      else (parent as { [key: string]: unknown })[key] = fresh;
    }
    return text(JSON.stringify(copy));
  });
  const deep = fc.integer({ min: 50, max: 5000 }).map((n) => text(`{"a":${'['.repeat(n)}${']'.repeat(n)}}`));
  return fc.oneof(
    { weight: 5, arbitrary: edited },
    { weight: 2, arbitrary: fc.jsonValue({ maxDepth: 4 }).map((v) => text(JSON.stringify(v) ?? 'null')) },
    { weight: 1, arbitrary: deep },
    { weight: 2, arbitrary: mutated(text(original)) },
  );
}

export function inputsFor(kind: ReaderKind): fc.Arbitrary<FuzzInput> {
  const original = readFileSync(join(baseScenario, targetOf[kind]), 'utf8');
  const header = original.split('\n')[0] ?? '';
  let body: fc.Arbitrary<Uint8Array>;
  if (kind === 'csv' || kind === 'drift') {
    body = fc.oneof(
      { weight: 4, arbitrary: rowsOf(header).map(text) },
      { weight: 3, arbitrary: mutated(text(original)) },
      { weight: 1, arbitrary: fc.uint8Array({ maxLength: 300 }) },
      {
        weight: 1,
        arbitrary: fc
          .tuple(fc.constantFrom(header, `${header},${header.split(',')[1] ?? 'x'}`), fc.uint8Array({ maxLength: 120 }))
          .map(([h, b]) => new Uint8Array(Buffer.concat([Buffer.from(`${h}\n`), Buffer.from(b)]))),
      },
    );
  } else {
    body = jsonDocuments(original);
  }
  const bytes = fc.tuple(body, kind === 'csv' || kind === 'drift' ? fc.boolean() : fc.constant(false)).map(([content, gzip]): FuzzInput => ({ kind: 'bytes', content, gzip }));
  return fc.oneof({ weight: 19, arbitrary: bytes }, { weight: 1, arbitrary: fc.boolean().map((folder): FuzzInput => ({ kind: 'escape', folder })) });
}

export interface TrialOutcome {
  exit: 0 | 1 | 2 | null;
  crash: string | null;
  escape: string | null;
  loss: string | null;
}

function treeState(dir: string): string {
  const entries: string[] = [];
  const walk = (folder: string): void => {
    for (const name of readdirSync(folder).sort()) {
      const full = join(folder, name);
      // Links are not followed: the folder outside is not part of the scenario.
      const info = lstatSync(full, { throwIfNoEntry: false });
      if (info?.isDirectory()) walk(full);
      else entries.push(`${full}:${info?.size ?? 'link'}:${info?.mtimeMs ?? 0}`);
    }
  };
  walk(dir);
  return entries.join('\n');
}

let outsideFolder: string | null = null;
/** A folder outside every scenario holding valid-looking files with the secret in them. */
function outside(): string {
  if (outsideFolder) return outsideFolder;
  outsideFolder = mkdtempSync(join(tmpdir(), 'wrackline-fuzz-outside-'));
  for (const kind of readerKinds) {
    const original = readFileSync(join(baseScenario, targetOf[kind]), 'utf8');
    const leaked = kind === 'csv' || kind === 'drift' ? original.replace(/\n([^,\n]*),/, `\n${secret},`) : original.replace(/"name": "[^"]*"/, `"name": "${secret}"`);
    writeFileSync(join(outsideFolder, targetOf[kind].replace('/', '-')), leaked);
    // The same file under its own name, for a linked folder (tables/ or drift/ pointing here).
    if (targetOf[kind].includes('/')) writeFileSync(join(outsideFolder, targetOf[kind].split('/')[1] as string), leaked);
  }
  return outsideFolder;
}

/** Runs one generated input through the reader and classifies what happened. */
export async function runTrial(kind: ReaderKind, input: FuzzInput): Promise<TrialOutcome> {
  const dir = mkdtempSync(join(tmpdir(), 'wrackline-fuzz-'));
  const outcome: TrialOutcome = { exit: null, crash: null, escape: null, loss: null };
  try {
    cpSync(baseScenario, dir, { recursive: true });
    // Only the files this reader needs stay listed: the trial is about one reader, and fast.
    const keep = new Set(['scenario.json', 'segments.geojson', targetOf[kind]]);
    const descriptorPath = join(dir, 'datapackage.json');
    const full = JSON.parse(readFileSync(descriptorPath, 'utf8')) as { resources: { path: string }[] };
    full.resources = full.resources.filter((r) => keep.has(r.path));
    writeFileSync(descriptorPath, JSON.stringify(full, null, 2));
    const target = join(dir, targetOf[kind]);
    rmSync(target);
    if (input.kind === 'escape') {
      const leak = join(outside(), targetOf[kind].replace('/', '-'));
      if (input.folder && targetOf[kind].includes('/')) {
        const folder = join(dir, targetOf[kind].split('/')[0] as string);
        rmSync(folder, { recursive: true });
        symlinkSync(outside(), folder, 'dir');
      } else symlinkSync(leak, target);
    } else if (input.gzip) {
      writeFileSync(`${target}.gz`, gzipSync(input.content));
      const descriptor = readFileSync(join(dir, 'datapackage.json'), 'utf8').replace(`"${targetOf[kind]}"`, `"${targetOf[kind]}.gz"`);
      writeFileSync(join(dir, 'datapackage.json'), descriptor);
    } else writeFileSync(target, input.content);
    const before = treeState(dir);

    let scenario;
    try {
      scenario = await loadScenario(dir);
    } catch (error) {
      if (error instanceof Error && error.name === 'ScenarioError') {
        outcome.exit = 2;
        return outcome;
      }
      outcome.crash = error instanceof Error ? (error.stack ?? error.message) : String(error);
      return outcome;
    }
    outcome.exit = scenario.report.ok ? 0 : 1;

    const seen = JSON.stringify({ report: scenario.report, records: scenario.records, segments: scenario.segments, settings: scenario.settings, drift: scenario.drift });
    if (seen.includes(secret)) outcome.escape = 'the secret of a file outside the scenario was read';
    else if (treeState(dir) !== before) outcome.escape = 'the scenario folder changed while it was read';

    for (const counts of scenario.report.files) {
      const named = scenario.report.issues.some((i) => i.file === counts.file && i.excluded);
      const keptRecords = scenario.records.filter((r) => r.source.file === counts.file).length;
      if (counts.read !== counts.kept + counts.excluded) outcome.loss = `${counts.file}: read ${counts.read} ≠ kept ${counts.kept} + excluded ${counts.excluded}`;
      else if (counts.excluded > 0 && !named) outcome.loss = `${counts.file}: ${counts.excluded} record(s) left out with no issue naming them`;
      else if (counts.file.startsWith('tables/') && keptRecords !== counts.kept) outcome.loss = `${counts.file}: ${keptRecords} records kept but ${counts.kept} counted`;
    }
    return outcome;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

export interface FuzzTally {
  kind: ReaderKind;
  tried: number;
  exits: { [code: string]: number };
  crashes: number;
  escapes: number;
  losses: number;
  examples: string[];
}

/**
 * Runs `runs` generated inputs of one reader from a seed and counts the outcomes. Reading a small
 * scenario mostly waits on the file system, so `concurrency` trials run at once (each in its own
 * folder).
 */
export async function fuzzReader(kind: ReaderKind, runs: number, seed: number, concurrency = 1): Promise<FuzzTally> {
  const tally: FuzzTally = { kind, tried: 0, exits: {}, crashes: 0, escapes: 0, losses: 0, examples: [] };
  const inputs = fc.sample(inputsFor(kind), { numRuns: runs, seed });
  let next = 0;
  const worker = async (): Promise<void> => {
    while (next < inputs.length) {
      const input = inputs[next++] as FuzzInput;
      await trialInto(tally, kind, input);
    }
  };
  await Promise.all(Array.from({ length: Math.max(1, concurrency) }, worker));
  return tally;
}

async function trialInto(tally: FuzzTally, kind: ReaderKind, input: FuzzInput): Promise<void> {
  {
    const outcome = await runTrial(kind, input);
    tally.tried++;
    tally.exits[String(outcome.exit)] = (tally.exits[String(outcome.exit)] ?? 0) + 1;
    if (outcome.crash) tally.crashes++;
    if (outcome.escape) tally.escapes++;
    if (outcome.loss) tally.losses++;
    const problem = outcome.crash ?? outcome.escape ?? outcome.loss;
    if (problem && tally.examples.length < 5) {
      const shown = input.kind === 'escape' ? `link out of the scenario (folder: ${input.folder})` : JSON.stringify(Buffer.from(input.content).toString('utf8').slice(0, 200));
      tally.examples.push(`${problem.split('\n').slice(0, 4).join(' | ')}\n      input: ${shown}${input.kind === 'bytes' && input.gzip ? ' (gzip)' : ''}`);
    }
  }
}
