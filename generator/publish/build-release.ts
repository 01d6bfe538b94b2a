/**
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
import { readFileSync } from 'node:fs';
import { writeFile } from 'node:fs/promises';
import path from 'node:path';
import type { BuildSteps, ModelSet } from './build-steps.ts';
import type { LoadedScenario } from '../scenario/types.ts';
import type { ArchiveLedger } from './archive-ledger.ts';
import { assertArchiveIntact, ledgerFileName, ledgerFromModel, readLedger } from './archive-ledger.ts';
import type { Correction } from './archive-ledger.ts';
import { safetyRulesVersion, siteProblems, siteProblemsInParallel } from './html-safety.ts';
import { collectGarbageNow } from './free-memory.ts';
import { PublishError } from './publish-error.ts';
import { openPublishSession } from './release-swap.ts';
import type { PublishSession } from './release-swap.ts';
import { assertSlug } from './safe-path.ts';
import { compareCodeUnits, hashFile, hashFilesIn, listFiles, readManifest, treeDigest, writeManifest } from './tree-hash.ts';
import type { FileHash } from './tree-hash.ts';
import type { Progress } from '../progress/progress.ts';
import { computeRenderKeys, missingAfterReuse, placeStaged, planRender, readRenderKeys, stageReused, writeRenderKeys } from './page-reuse.ts';
import type { RenderKeys, RenderPlan } from './page-reuse.ts';
import type { ValidationReport } from '../model/types.ts';
import { giveTurn } from '../event-loop.ts';

export interface BuildReleaseOptions {
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
  /** Test hook: runs after rendering, before any check or swap. */
  afterRender?: (siteDir: string) => Promise<void>;
}

export type BuildOutcome =
  | { kind: 'invalid'; report: ValidationReport }
  | {
      kind: 'published';
      release: string;
      unchanged: boolean;
      pages: number;
      files: number;
      digest: string;
      report: ValidationReport;
    };

/**
 * The pages that ask to be in the search index (marked with data-pagefind-body), as one glob
 * for pagefind; null when no page asks. Pagefind leaves unmarked pages out whenever any page is
 * marked, so naming only the folders of the marked pages gives the same index without making it
 * read every other page.
 */
export async function searchGlob(siteDir: string, files: readonly string[]): Promise<string | null> {
  const folders = new Set<string>();
  const single: string[] = [];
  for (const [i, file] of files.entries()) {
    if (!file.endsWith('.html')) continue;
    if (i % 64 === 63) await giveTurn();
    if (!readFileSync(path.join(siteDir, file)).includes('data-pagefind-body')) continue;
    const slash = file.indexOf('/');
    if (slash === -1) single.push(file);
    else folders.add(file.slice(0, slash));
  }
  const parts = [...[...folders].sort().map((folder) => `${folder}/**/*.html`), ...single.sort()];
  if (parts.length === 0) return null;
  return parts.length === 1 ? (parts[0] as string) : `{${parts.join(',')}}`;
}

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
  for (const region of set.regions) assertSlug(region.season.id, 'season id');
}

/** Reading, statistics and writing the model: the large objects live only inside this step. */
async function prepareModel(
  options: BuildReleaseOptions,
): Promise<
  | { kind: 'invalid'; report: ValidationReport }
  | { kind: 'ready'; session: PublishSession; modelDir: string; corrections: Correction[]; report: ValidationReport }
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
  progress.update(set.bulletins.length, set.bulletins.length);
  progress.end();
  checkIds(set);

  const session = await openPublishSession(options.out, options.log ?? (() => {}));
  try {
    const modelDir = await session.workFolder('model');
    await steps.write(modelDir, set);
    return { kind: 'ready', session, modelDir, corrections: corrections(scenario), report: scenario.report };
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
    const keys: RenderKeys | null = steps.siteFingerprint ? await computeRenderKeys(modelDir, await steps.siteFingerprint()) : null;
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
    const ledgerReady = ledgerFromModel(modelDir).then(
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

    // The search index is built by its own process while this one hashes and checks the pages.
    // Files taken over were hashed (and found unchanged) as they were staged.
    const pageFiles = await listFiles(siteDir);
    const broughtHashes = new Map(brought.map((entry) => [entry.file, entry]));
    const glob = await searchGlob(siteDir, pageFiles);
    progress.start('checks', undefined, 'files');
    if (glob !== null) progress.note('  checks: the search index is built meanwhile');
    const indexed = glob === null ? Promise.resolve() : steps.index(siteDir, glob);
    indexed.catch(() => {});
    const pagesHashed = [...(await hashFilesIn(siteDir, pageFiles.filter((file) => !broughtHashes.has(file)))), ...brought].sort((a, b) =>
      compareCodeUnits(a.file, b.file),
    );
    progress.update(pagesHashed.length);
    // A page byte-identical to one in the release on line passed this same check when that
    // release was published: only new or changed pages are parsed again.
    const sameRules = publishedManifest?.['safetyRules'] === safetyRulesVersion;
    const checkedBefore = new Set((sameRules ? (publishedManifest?.files ?? []) : []).map((entry) => entry.sha256));
    const toCheck = pagesHashed.filter((entry) => entry.file.endsWith('.html') && !checkedBefore.has(entry.sha256)).map((entry) => entry.file);
    const problems = await siteProblemsInParallel(siteDir, toCheck);
    await indexed;
    // What the indexer added (its own folder); pages it might have touched are hashed again.
    const before = new Set(pageFiles);
    const added = (await listFiles(siteDir)).filter((file) => !before.has(file));
    const hashed = [...pagesHashed, ...(await hashFilesIn(siteDir, added))].sort((a, b) => compareCodeUnits(a.file, b.file));
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
    assertArchiveIntact(published ? await readLedger(published) : null, ledger, prepared.corrections);
    await writeLedgerFile(siteDir, ledger);
    const ledgerHash = await hashFile(path.join(siteDir, ledgerFileName));
    const manifest = await writeManifest(siteDir, [...hashed, { file: ledgerFileName, ...ledgerHash }], { safetyRules: safetyRulesVersion });
    progress.end();

    progress.start('publishing');
    const digest = treeDigest(manifest);
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

async function writeLedgerFile(siteDir: string, ledger: ArchiveLedger): Promise<void> {
  await writeFile(path.join(siteDir, ledgerFileName), `${JSON.stringify(ledger, null, 2)}\n`);
}
