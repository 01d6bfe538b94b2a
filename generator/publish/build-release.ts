/**
 * Step: all of them: the conductor (read → model → render → check → swap).
 * One build, start to finish: read and validate the scenario, build the bulletin model, render
 * it, check the result, and publish it atomically. Each step is a function passed in, so the
 * order and the guarantees here are tested with small stand-ins as well as with the real
 * reader, model builder and Astro site.
 *
 * Guarantees (each has a test under test/publish/):
 * - invalid data: stops after reading; nothing next to or at the output is created or changed;
 * - any exception or a killed process: the published release is never written to (see
 *   release-swap.ts); work folders are removed now or by the next run;
 * - a past-season page that would change without a recorded correction: refused (archive-ledger.ts);
 * - pages without the security policy or with inline script: refused (html-safety.ts);
 * - output paths: every model path and page path is a slug or checked to stay inside its root.
 */
import { writeFile } from 'node:fs/promises';
import path from 'node:path';
import type { BuildSteps, ModelSet } from './build-steps.ts';
import type { LoadedScenario } from '../scenario/types.ts';
import type { ArchiveLedger } from './check/archive-ledger.ts';
import { assertArchiveIntact, ledgerFileName, ledgerFromModel, readLedger } from './check/archive-ledger.ts';
import type { Correction, LedgerReuse } from './check/archive-ledger.ts';
import { safetyRulesVersion, siteProblems, siteProblemsInParallel } from './check/html-safety.ts';
import { collectGarbageNow } from './render/free-memory.ts';
import { PublishError } from './publish-error.ts';
import { stageCandidate } from './swap/candidate.ts';
import { openPublishSession } from './swap/release-swap.ts';
import type { PublishSession } from './swap/release-swap.ts';
import { assertSlug } from './check/safe-path.ts';
import { compareCodeUnits, hashFile, hashFilesIn, listFiles, readManifest, treeDigest, writeManifest } from './tree-hash.ts';
import type { FileHash } from './tree-hash.ts';
import type { Progress } from '../progress/progress.ts';
import { computeRenderKeys, missingAfterReuse, modelFileHashes, placeStaged, planRender, readRenderKeys, stageReused, writeRenderKeys } from './render/page-reuse.ts';
import type { RenderKeys, RenderPlan } from './render/page-reuse.ts';
import type { ValidationReport } from '../model/types.ts';
import { linkParts, pagesToIndex, partsToTakeOver, planSearchParts, readSearchParts, searchIndexFolder, writeSearchParts } from './render/search-index.ts';
import type { SearchPart } from './render/search-index.ts';

interface BuildReleaseOptions {
  scenario: string;
  out: string;
  /** Cache folder for reusable per-series results; null disables reuse. */
  cache: string | null;
  progress: Progress;
  steps: BuildSteps;
  /** Extra lines for the person running the build (stderr). */
  log?: (line: string) => void;
  /** Render every page even when the published release holds pages whose inputs did not change. */
  renderAll?: boolean;
  /** Stage the release as a candidate for review (candidate.ts) instead of publishing it. */
  candidate?: boolean;
  /** Test hook: runs after rendering, before any check or swap. */
  afterRender?: (siteDir: string) => Promise<void>;
}

type BuildOutcome =
  | { kind: 'invalid'; report: ValidationReport }
  | {
      kind: 'published';
      release: string;
      unchanged: boolean;
      pages: number;
      files: number;
      digest: string;
      report: ValidationReport;
    }
  | { kind: 'staged'; folder: string; pages: number; files: number; digest: string; onLine: string | null; report: ValidationReport };

function corrections(scenario: LoadedScenario): Correction[] {
  return scenario.settings.corrections.map((correction) => ({
    season: correction.season,
    segment: correction.segment ?? null,
    date: correction.date,
    reason: correction.reason,
  }));
}

function checkIds(set: ModelSet): void {
  for (const bulletin of set.bulletins) {
    assertSlug(bulletin.segment.id, 'segment id');
    assertSlug(bulletin.season.id, 'season id');
  }
  for (const bulletin of set.written ?? []) {
    assertSlug(bulletin.segmentId, 'segment id');
    assertSlug(bulletin.seasonId, 'season id');
  }
  for (const region of set.regions) assertSlug(region.season.id, 'season id');
}

/** Reading, statistics and writing the model: the large objects live only inside this step. */
async function prepareModel(options: BuildReleaseOptions): Promise<
  | { kind: 'invalid'; report: ValidationReport }
  | {
      kind: 'ready';
      session: PublishSession;
      modelDir: string;
      corrections: Correction[];
      report: ValidationReport;
      /** SHA-256 of the bulletin model files written from text (model memo), by "season/segment" */
      knownHashes: Map<string, string>;
    }
> {
  const { progress, steps } = options;
  progress.start('reading', undefined, 'records');
  const scenario = await steps.load(options.scenario, (phase, done, total) => progress.update(done, total, phase), options.cache);
  progress.update(scenario.records.length, scenario.records.length, '');
  progress.end();
  if (!scenario.report.ok) return { kind: 'invalid', report: scenario.report };

  progress.start('statistics', undefined, 'bulletins');
  const set = await steps.model(scenario, {
    cacheDir: options.cache,
    onProgress: (done, total) => progress.update(done, total),
    log: (line) => progress.note(`  ${line}`),
  });
  const count = set.bulletins.length + (set.written?.length ?? 0);
  progress.update(count, count);
  progress.end();
  checkIds(set);

  const session = await openPublishSession(options.out, options.log ?? (() => {}));
  try {
    const modelDir = await session.workFolder('model');
    await steps.write(modelDir, set);
    const knownHashes = new Map((set.written ?? []).map((b) => [`${b.seasonId}/${b.segmentId}`, b.sha256]));
    return { kind: 'ready', session, modelDir, corrections: corrections(scenario), report: scenario.report, knownHashes };
  } catch (error) {
    await session.close();
    throw error;
  }
}

export async function buildRelease(options: BuildReleaseOptions): Promise<BuildOutcome> {
  const { progress, steps } = options;
  const prepared = await prepareModel(options);
  if (prepared.kind === 'invalid') return prepared;
  // The scenario and the model are on disk now; free their memory before the pages need it.
  collectGarbageNow();
  const { session, modelDir } = prepared;
  try {
    let siteDir = await session.workFolder('site');
    const published = await session.publishedFolder();
    const publishedManifest = published ? await readManifest(published) : null;
    // Which bulletins' pages to render; the others are taken over from the release on line.
    const modelHashes = await modelFileHashes(modelDir, prepared.knownHashes);
    const keys: RenderKeys | null = steps.siteFingerprint ? await computeRenderKeys(modelDir, await steps.siteFingerprint(), modelHashes) : null;
    let plan: RenderPlan = { kind: 'all', reason: 'the renderer cannot render part of the site' };
    if (keys !== null) {
      if (options.renderAll) plan = { kind: 'all', reason: 'asked to render every page' };
      else if (published === null || publishedManifest === null) plan = { kind: 'all', reason: 'nothing is published yet' };
      else plan = planRender(await readRenderKeys(published), keys);
    }
    let only: string | undefined;
    if (plan.kind === 'some') {
      only = path.join(await session.workFolder('plan'), 'render-only.json');
      await writeFile(only, `${JSON.stringify(plan.render)}\n`);
      progress.note(`  pages: ${plan.render.length} bulletin(s) changed, ${plan.reuse.length} taken over from the published release`);
    } else if (keys !== null) {
      progress.note(`  pages: rendering every page (${plan.reason})`);
    }
    progress.start('pages', undefined, 'pages');
    // The archive ledger needs only the model: it is worked out while the pages render.
    const { previous: previousLedger, reuse: ledgerReuse } = await ledgerOnLine(published, publishedManifest?.files ?? null, modelHashes);
    const ledgerReady = ledgerFromModel(modelDir, ledgerReuse).then(
      (ledger) => ({ ledger }),
      (error: unknown) => ({ error }),
    );
    // Files of unchanged bulletins are linked from the release on line into a folder of their
    // own (and checked against its manifest) while the pages render, then moved in.
    const reusing =
      plan.kind === 'some' && published !== null && publishedManifest !== null && keys !== null
        ? { render: plan.render, reuse: plan.reuse, published, files: publishedManifest.files, current: keys.current, stageDir: await session.workFolder('reused') }
        : null;
    const staging = reusing
      ? stageReused(reusing.published, reusing.files, reusing.stageDir, new Set(reusing.reuse), reusing.current)
      : Promise.resolve({ staged: [] as FileHash[], altered: [] as FileHash[] });
    staging.catch(() => {});
    let rendered = await steps.render({ modelDir, outDir: siteDir, onPage: (done) => progress.update(done), ...(only === undefined ? {} : { only }) });
    const { staged, altered } = await staging;
    if (altered.length > 0) {
      throw new PublishError(`page reuse: ${altered.length} file(s) of the published release differ from its manifest (first: ${altered[0]?.file}); run again with --render-all`);
    }
    let brought: FileHash[] = [];
    if (reusing) {
      brought = placeStaged(reusing.stageDir, siteDir, staged);
      const missing = missingAfterReuse(reusing.files, new Set(await listFiles(siteDir)), new Set(reusing.render), reusing.current);
      if (missing.length > 0) {
        // A page of the release on line that neither the render nor the reuse produced: some
        // route is not known here. Render everything rather than guess.
        progress.note(`  pages: ${missing.length} published file(s) not accounted for (first: ${missing[0]}); rendering every page`);
        brought = [];
        siteDir = await session.workFolder('site-full');
        rendered = await steps.render({ modelDir, outDir: siteDir, onPage: (done) => progress.update(done) });
      }
    }
    if (keys !== null) await writeRenderKeys(siteDir, keys);
    progress.end();
    if (options.afterRender) await options.afterRender(siteDir);

    // The search index is built by pagefind processes while this one checks the pages.
    // Files taken over were hashed (and found unchanged) as they were staged.
    const pageFiles = await listFiles(siteDir);
    const broughtHashes = new Map(brought.map((entry) => [entry.file, entry]));
    progress.start('checks', undefined, 'files');
    const pagesHashed = [
      ...(await hashFilesIn(
        siteDir,
        pageFiles.filter((file) => !broughtHashes.has(file)),
      )),
      ...brought,
    ].sort((a, b) => compareCodeUnits(a.file, b.file));
    progress.update(pagesHashed.length);
    const search = await startSearchIndex({
      siteDir,
      pageFiles,
      pagesHashed,
      takenOverPages: new Set(broughtHashes.keys()),
      // --render-all builds everything afresh, the search index too
      onLine: published && publishedManifest && !options.renderAll ? { release: published, files: publishedManifest.files } : null,
      index: async (parts) => steps.index(siteDir, parts, await session.workFolder('search')),
      note: (line) => progress.note(line),
    });
    // A page byte-identical to one in the release on line passed this same check when that
    // release was published: only new or changed pages are parsed again.
    const sameRules = publishedManifest?.['safetyRules'] === safetyRulesVersion;
    const checkedBefore = new Set((sameRules ? (publishedManifest?.files ?? []) : []).map((entry) => entry.sha256));
    const toCheck = pagesHashed.filter((entry) => entry.file.endsWith('.html') && !checkedBefore.has(entry.sha256)).map((entry) => entry.file);
    const problems = await siteProblemsInParallel(siteDir, toCheck);
    await search.done;
    // What the indexer added (its own folder); pages it might have touched are hashed again.
    const before = new Set(pageFiles);
    const added = (await listFiles(siteDir)).filter((file) => !before.has(file));
    const addedHashes = await hashFilesIn(siteDir, added);
    const hashed = [...pagesHashed, ...addedHashes].sort((a, b) => compareCodeUnits(a.file, b.file));
    // Index files taken over must be those of the release on line, like every file taken over.
    const takenPrefixes = search.takenOver.map((part) => `${searchIndexFolder}/${part.name}/`);
    const publishedHashes = new Map((publishedManifest?.files ?? []).map((entry) => [entry.file, entry.sha256]));
    const alteredIndex = addedHashes.find((entry) => takenPrefixes.some((prefix) => entry.file.startsWith(prefix)) && publishedHashes.get(entry.file) !== entry.sha256);
    if (alteredIndex) {
      throw new PublishError(`search index reuse: ${alteredIndex.file} of the published release differs from its manifest; run again with --render-all`);
    }
    problems.push(...(await siteProblems(siteDir, added)));
    progress.update(hashed.length);
    if (problems.length > 0) {
      const shown = problems.slice(0, 12).map((problem) => `  - ${problem.page}: ${problem.problem}`);
      throw new PublishError(
        [
          `${problems.length} safety problem(s) in the built pages; nothing was published:`,
          ...shown,
          ...(problems.length > 12 ? [`  … and ${problems.length - 12} more`] : []),
        ].join('\n'),
      );
    }
    const ledgerOutcome = await ledgerReady;
    if ('error' in ledgerOutcome) throw ledgerOutcome.error;
    const ledger = ledgerOutcome.ledger;
    assertArchiveIntact(previousLedger, ledger, prepared.corrections);
    await writeFile(path.join(siteDir, ledgerFileName), `${JSON.stringify(ledger, null, 2)}\n`);
    const ledgerHash = await hashFile(path.join(siteDir, ledgerFileName));
    const manifest = await writeManifest(siteDir, [...hashed, { file: ledgerFileName, ...ledgerHash }], { safetyRules: safetyRulesVersion });
    progress.end();

    const digest = treeDigest(manifest);
    if (options.candidate) {
      const staged = await stageCandidate({ session, tree: siteDir, digest, scenario: options.scenario, modelDir });
      const pages = rendered.pages + brought.length;
      return { kind: 'staged', folder: staged.place.site, pages, files: manifest.length + 1, digest, onLine: staged.record.onLine?.release ?? null, report: prepared.report };
    }
    progress.start('publishing');
    const outcome = await session.publish(siteDir, `r-${digest.slice(0, 20)}`);
    progress.end();
    return {
      kind: 'published',
      release: outcome.release,
      unchanged: outcome.unchanged,
      // each file taken over is the output of one route, as each file Astro listed
      pages: rendered.pages + brought.length,
      files: manifest.length + 1,
      digest,
      report: prepared.report,
    };
  } finally {
    await session.close();
  }
}

/**
 * The archive ledger of the release on line (null: none), and the entries that may be taken over
 * from it: those of bulletins whose model file is the download on line (archive-ledger.ts,
 * LedgerReuse), and only when that ledger is the file its manifest lists.
 */
async function ledgerOnLine(
  published: string | null,
  files: readonly FileHash[] | null,
  modelHashes: ReadonlyMap<string, string>,
): Promise<{ previous: ArchiveLedger | null; reuse: LedgerReuse | undefined }> {
  const previous = published ? await readLedger(published) : null;
  if (published === null || previous === null || files === null) return { previous, reuse: undefined };
  const listed = files.find((entry) => entry.file === ledgerFileName);
  const actual = await hashFile(path.join(published, ledgerFileName)).catch(() => null);
  if (listed === undefined || actual?.sha256 !== listed.sha256) return { previous, reuse: undefined };
  return { previous, reuse: { previous, modelHashes, publishedHashes: new Map(files.map((entry) => [entry.file, entry.sha256])) } };
}

/**
 * Plans the search index parts (search-index.ts), links the parts that can be taken over from
 * the release on line (`onLine`; null: none) and starts indexing the others. `done` settles when
 * every part is in place and `search-index/parts.json` is written.
 */
async function startSearchIndex(input: {
  siteDir: string;
  pageFiles: readonly string[];
  pagesHashed: readonly FileHash[];
  takenOverPages: ReadonlySet<string>;
  onLine: { release: string; files: readonly FileHash[] } | null;
  index: (parts: readonly SearchPart[]) => Promise<void>;
  note: (line: string) => void;
}): Promise<{ takenOver: SearchPart[]; done: Promise<void> }> {
  const { siteDir, onLine } = input;
  const previous = onLine ? readSearchParts(onLine.release) : null;
  const parts = planSearchParts(await pagesToIndex(siteDir, input.pageFiles, input.takenOverPages, previous));
  const takenOver = onLine
    ? partsToTakeOver(previous, parts, new Map(input.pagesHashed.map((entry) => [entry.file, entry.sha256])), new Map(onLine.files.map((entry) => [entry.file, entry.sha256])))
    : [];
  const toIndex = parts.filter((part) => !takenOver.includes(part));
  if (parts.length > 0 && toIndex.length === parts.length) input.note(`  checks: the search index (${parts.length} parts) is built meanwhile`);
  else if (parts.length > 0) {
    input.note(`  checks: the search index is built meanwhile: ${toIndex.length} of ${parts.length} parts (the others taken over from the published release)`);
  }
  const done =
    parts.length === 0
      ? Promise.resolve()
      : (async () => {
          if (onLine) linkParts(onLine.release, onLine.files, siteDir, takenOver);
          if (toIndex.length > 0) await input.index(toIndex);
          writeSearchParts(siteDir, parts);
        })();
  done.catch(() => {});
  return { takenOver, done };
}
