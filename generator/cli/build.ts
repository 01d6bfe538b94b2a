/**
 * `wrackline build`: read, check, compute, render and publish a scenario's site.
 *
 *   wrackline build [--scenario DIR] [--out DIR] [--cache DIR] [--no-cache] [--site DIR] [--render-all] [--strict] [--candidate] [--quiet]
 *
 * Exit codes: 0 published (or already up to date), 1 invalid data or a refused publication
 * (archive, safety), 2 bad usage, an unreadable scenario folder, or an output we must not replace.
 */
import path from 'node:path';
import { commandWriters, parseCommandOptions, usageError } from './command-io.ts';
import type { ValidationReport } from '../model/types.ts';
import { createProgress, formatCount, formatDuration } from '../progress/progress.ts';
import type { Progress } from '../progress/progress.ts';
import { packageRoot } from '../publish/render/astro-render.ts';
import { indexSearchParts } from '../publish/render/search-index.ts';
import { renderSite } from '../publish/render/render-site.ts';
import { openTrendCache, statisticsFingerprint } from '../publish/cache/trend-results.ts';
import { openDriftCache, readingFingerprint } from '../publish/cache/drift-figures.ts';
import { modelFingerprint, openModelMemo } from '../publish/cache/model-memo.ts';
import { buildRelease } from '../publish/build-release.ts';
import type { BuildSteps } from '../publish/build-steps.ts';
import { errorCode, PublishError } from '../publish/publish-error.ts';
import { placeFor } from '../publish/swap/release-swap.ts';
import { outputPlaceProblem, plainWriteFailure } from '../publish/swap/output-place.ts';
import { siteFingerprint } from '../publish/render/page-reuse.ts';

export const buildHelp = `Usage: wrackline build [options]

Validates a scenario, computes every bulletin and publishes the static site.
The output folder changes only when the whole build succeeds (it is swapped in
at once); a past season's published bulletin never changes unless the scenario
records a correction.

Options:
  --scenario DIR   scenario folder holding datapackage.json (default: .)
  --out DIR        output folder for the site (default: dist)
  --cache DIR      where results reusable by the next build are kept: trend
                   results per series, drift figures, bulletin models (default:
                   <out>.wrackline/cache; safe to delete)
  --no-cache       compute everything afresh
  --site DIR       Astro project that renders the model (default: the built-in site)
  --render-all     render every page, even those whose inputs did not change
                   (by default they are taken over from the published release)
  --strict         treat every warning as an error: publish only a scenario
                   with no record left out
  --candidate      stage the finished release for review instead of publishing
                   it (in <out>.wrackline/candidate/); nothing on line changes.
                   Then \`wrackline review\` and \`wrackline approve\`
  --quiet          print only errors (also when the CI variable is set)
  -h, --help       show this help

Exit codes: 0 published, 1 invalid data or refused publication, 2 bad usage or unreadable input`;

/** A word for a shell command line: quoted when it holds anything but safe characters. */
function shellWord(text: string): string {
  return /^[\w./-]+$/.test(text) ? text : `'${text.replace(/'/g, `'\\''`)}'`;
}

/** Warnings grouped by cause, most frequent first, with the command that lists each one. */
export function formatWarningGroups(report: ValidationReport, checkCommand: string): string {
  const groups = new Map<string, { count: number; leftOut: number; example: string }>();
  for (const item of report.issues) {
    if (item.severity !== 'warning') continue;
    const code = item.code ?? 'other';
    const group = groups.get(code) ?? { count: 0, leftOut: 0, example: item.message };
    group.count++;
    if (item.excluded) group.leftOut++;
    groups.set(code, group);
  }
  const lines = ['  Warnings by cause:'];
  for (const [code, group] of [...groups.entries()].sort((a, b) => b[1].count - a[1].count)) {
    lines.push(`    ${formatCount(group.count).padStart(6)}  ${code}${group.leftOut > 0 ? ` (${formatCount(group.leftOut)} left out)` : ''}, e.g. ${group.example}`);
  }
  lines.push(`  See every one: ${checkCommand}`);
  return lines.join('\n');
}

/** A readable summary of a validation report with errors (at most `limit` issues shown). */
export function formatReport(report: ValidationReport, limit = 20, checkCommand = 'npx wrackline check'): string {
  const errors = report.issues.filter((item) => item.severity === 'error');
  const warnings = report.issues.length - errors.length;
  const lines = [`The scenario has ${errors.length} error(s) and ${warnings} warning(s); nothing was built or published.`];
  for (const item of errors.slice(0, limit)) {
    const where = [item.file, item.row === null ? null : `row ${item.row}`, item.column === null ? null : `column ${item.column}`].filter((part) => part !== null).join(', ');
    // Reader messages usually start with their own place ("file row 3, column x: …"); keep them whole.
    if (item.message.startsWith(item.file)) {
      lines.push(`  - ${item.message} (expected ${item.expected})`);
    } else {
      const value = item.value === null ? '' : ` value ${JSON.stringify(item.value)};`;
      lines.push(`  - ${where}:${value} ${item.message} (expected ${item.expected})`);
    }
    if (item.code === 'TableLoss' || item.code === 'SeriesLoss') lines.push(`      hint: ${item.hint}`);
  }
  if (errors.length > limit) lines.push(`  … and ${errors.length - limit} more errors`);
  if (errors.length > 0) lines.push(`See every problem: ${checkCommand}`);
  return lines.join('\n');
}

/** The real steps: scenario reader, model builder (with the trend cache), model writer, Astro, pagefind. */
export async function realSteps(siteRoot: string | undefined, strict = false): Promise<BuildSteps> {
  const { loadScenario } = await import('../read/load-scenario.ts');
  const { buildModel, generatorVersion } = await import('../model/build-model.ts');
  const { assembleModelWithMemo } = await import('../model/assemble-with-memo.ts');
  const { statsTrendEngine } = await import('../model/trend-engine.ts');
  const { writeModel } = await import('../model/write-model.ts');
  return {
    load: async (dir, onProgress, cacheDir) => {
      if (cacheDir === null) return loadScenario(dir, { onProgress, strict });
      const driftMemo = await openDriftCache(cacheDir, await readingFingerprint(packageRoot, generatorVersion));
      const scenario = await loadScenario(dir, { onProgress, driftMemo, strict });
      // Remembered only for a scenario that passed: an invalid one leaves nothing beside the output.
      if (scenario.report.ok) await driftMemo.save();
      return scenario;
    },
    model: async (scenario, options) => {
      const onProgress = (_phase: string, done: number, total?: number): void => options.onProgress(done, total);
      if (options.cacheDir === null) return buildModel(scenario, { onProgress });
      const fingerprint = await statisticsFingerprint(packageRoot, generatorVersion);
      const cache = await openTrendCache(options.cacheDir, fingerprint, statsTrendEngine);
      const memo = await openModelMemo(options.cacheDir, await modelFingerprint(packageRoot, generatorVersion));
      const made = assembleModelWithMemo(scenario, cache.engine, memo.memo, { onProgress });
      await Promise.all([cache.save(), memo.save()]);
      const { hits, misses } = cache.stats();
      const { seriesReused, seriesEvaluated, bulletinsReused, bulletinsComposed } = made.counts;
      options.log(
        `reused from earlier builds: ${formatCount(bulletinsReused)} of ${formatCount(bulletinsReused + bulletinsComposed)} bulletins, ` +
          `${formatCount(seriesReused)} of ${formatCount(seriesReused + seriesEvaluated)} series; trend cache: ${formatCount(hits)} series reused, ${formatCount(misses)} computed`,
      );
      return { site: made.site, regions: made.regions, bulletins: [], written: made.bulletins, ...(made.publisherLogo ? { publisherLogo: made.publisherLogo } : {}) };
    },
    write: (dir, set) => writeModel(dir, set),
    render: ({ modelDir, outDir, onPage, only }) =>
      renderSite({ modelDir, outDir, onPage, ...(siteRoot === undefined ? {} : { siteRoot }), ...(only === undefined ? {} : { only }) }),
    index: (siteDir, parts, scratchDir) => indexSearchParts(siteDir, parts, scratchDir),
    // Only the built-in site is known to honour the list of bulletins to render.
    ...(siteRoot === undefined ? { siteFingerprint: () => siteFingerprint(packageRoot, generatorVersion) } : {}),
  };
}

export interface RunBuildOptions {
  /** Replaces the real steps (tests). */
  steps?: BuildSteps;
  progress?: Progress;
  stdout?: (text: string) => void;
  stderr?: (text: string) => void;
}

export async function runBuild(argv: string[], options: RunBuildOptions = {}): Promise<number> {
  const { stdout, stderr } = commandWriters(options);
  const parsed = parseCommandOptions(
    'build',
    {
      args: argv,
      strict: true,
      allowPositionals: false,
      options: {
        scenario: { type: 'string' },
        out: { type: 'string' },
        cache: { type: 'string' },
        'no-cache': { type: 'boolean' },
        site: { type: 'string' },
        'render-all': { type: 'boolean' },
        strict: { type: 'boolean' },
        candidate: { type: 'boolean' },
        quiet: { type: 'boolean' },
        help: { type: 'boolean', short: 'h' },
      },
    },
    stderr,
  );
  if (parsed === null) return 2;
  const { values } = parsed;
  if (values.help) {
    stdout(buildHelp);
    return 0;
  }
  if (values.cache !== undefined && values['no-cache']) {
    return usageError(stderr, 'build', new Error('--cache and --no-cache cannot be used together'));
  }
  const scenario = path.resolve(values.scenario ?? '.');
  const out = path.resolve(values.out ?? 'dist');
  if (out === path.parse(out).root || scenario === out || scenario.startsWith(`${out}${path.sep}`)) {
    return usageError(stderr, 'build', new Error(`--out ${out} would replace the scenario or the file system root; choose a folder of its own`));
  }
  // Before anything is created (the cache lives beside the output): refuse a place we must not use.
  const placeProblem = await outputPlaceProblem(out);
  if (placeProblem !== null) {
    stderr(`wrackline build: ${placeProblem}`);
    return 2;
  }
  const cache = values['no-cache'] ? null : path.resolve(values.cache ?? path.join(placeFor(out).state, 'cache'));
  const progress = options.progress ?? createProgress({ quiet: values.quiet === true });
  const started = performance.now();
  try {
    const steps = options.steps ?? (await realSteps(values.site === undefined ? undefined : path.resolve(values.site), values.strict === true));
    const outcome = await buildRelease({
      scenario,
      out,
      cache,
      progress,
      steps,
      renderAll: values['render-all'] === true,
      candidate: values.candidate === true,
      log: (line) => progress.note(`  ${line}`),
    });
    const checkCommand = `npx wrackline check --scenario ${shellWord(path.relative(process.cwd(), scenario) || '.')}`;
    if (outcome.kind === 'invalid') {
      stderr(formatReport(outcome.report, 20, checkCommand));
      return 1;
    }
    const warnings = outcome.report.issues.filter((item) => item.severity === 'warning').length;
    if (outcome.kind === 'staged') {
      progress.note(
        `Staged a candidate of ${formatCount(outcome.pages)} pages (${formatCount(outcome.files)} files) in ${outcome.folder}; nothing on line changed` +
          `${warnings > 0 ? `; ${warnings} warning(s), see \`wrackline check\`` : ''} in ${formatDuration(performance.now() - started)}\n` +
          `  next: wrackline review --out ${values.out ?? 'dist'}   (preview: wrackline serve --dir ${outcome.folder})`,
      );
      return 0;
    }
    progress.note(
      `Published ${formatCount(outcome.pages)} pages (${formatCount(outcome.files)} files) to ${out}` +
        `${outcome.unchanged ? ' (unchanged: same content as the published site)' : ''}` +
        `${warnings > 0 ? `; ${warnings} warning(s)` : ''} in ${formatDuration(performance.now() - started)}`,
    );
    if (warnings > 0) progress.note(formatWarningGroups(outcome.report, checkCommand));
    return 0;
  } catch (error) {
    progress.end();
    if (error instanceof PublishError) {
      stderr(`wrackline build: ${error.message}`);
      return error.exitCode;
    }
    if (error instanceof Error && error.name === 'ScenarioError') {
      stderr(`wrackline build: ${error.message}`);
      return 2;
    }
    const writeFailure = plainWriteFailure(error, out);
    if (writeFailure !== null) {
      stderr(`wrackline build: ${writeFailure}`);
      return 2;
    }
    if (errorCode(error) === 'ENOENT' || errorCode(error) === 'EACCES') {
      stderr(`wrackline build: ${error instanceof Error ? error.message : String(error)}`);
      return 2;
    }
    stderr(`wrackline build failed; nothing was published.\n${error instanceof Error ? (error.stack ?? error.message) : String(error)}`);
    return 1;
  }
}
