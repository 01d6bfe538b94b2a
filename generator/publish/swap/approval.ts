/**
 * Step: swap (a reviewed candidate swapped in, with its approval).
 * Publishing a reviewed candidate (candidate.ts) with its approval: one atomic swap, like a
 * build's (release-swap.ts), refused when
 * - the release on line is not the one the candidate was staged over (the digest of every file
 *   on line differs from the one recorded at staging: another build published, or a file was
 *   changed by hand);
 * - an input file of the candidate changed since it was staged (the candidate would no longer
 *   show what the scenario says);
 * - the candidate's own files differ from its manifest (changed after review).
 * The approval (who, when, which candidate, which release it replaced) goes into the release's
 * manifest and into the sentence the methods page keeps for it. The time is a fact of the
 * approval, not of the build: the caller passes it (the command line takes `--at` or the clock).
 */
import { readFile, rm, writeFile } from 'node:fs/promises';
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { approvalSentence } from '../../bulletin/approval-words.ts';
import type { Approval } from '../../bulletin/approval-words.ts';
import { candidatePlace, changedInputs, folderDigest, readCandidate } from './candidate.ts';
import { siteProblems } from '../check/html-safety.ts';
import { linkFiles } from '../move-files.ts';
import { PublishError } from '../publish-error.ts';
import { openPublishSession } from './release-swap.ts';
import { differenceFromListing, hashFile, readManifest, treeDigest, writeManifest } from '../tree-hash.ts';

const methodsPage = 'methods/index.html';
const slot = /<p class="approval-record" data-approval="none">[^<]*<\/p>/g;

/** The methods page with its approval sentence filled in (escaped); throws when the page has no single slot. */
function fillApproval(html: string, approval: Approval): string {
  const found = html.match(slot) ?? [];
  if (found.length !== 1) throw new PublishError(`${methodsPage} has ${found.length} approval slots, expected 1; was the candidate built by this version?`);
  const text = approvalSentence(approval).replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c);
  return html.replace(slot, `<p class="approval-record" data-approval="given">${text}</p>`);
}

/** A name fit for the record: one line, printable, 1–120 characters. */
function checkApprover(by: string): string {
  const name = by.trim();
  // biome-ignore lint/suspicious/noControlCharactersInRegex: an approver's name may hold no control character
  if (name.length === 0 || name.length > 120 || /[\u0000-\u001f\u007f]/.test(name)) {
    throw new PublishError(`--by expects the approver's name on one line, 1 to 120 characters, got ${JSON.stringify(by)}`, 2);
  }
  return name;
}

interface ApproveOutcome {
  release: string;
  digest: string;
  approval: Approval;
}

export async function approveCandidate(options: { out: string; by: string; at: Date; log?: (line: string) => void }): Promise<ApproveOutcome> {
  const by = checkApprover(options.by);
  if (Number.isNaN(options.at.getTime())) throw new PublishError('the approval time is not a valid date', 2);
  const session = await openPublishSession(options.out, options.log ?? (() => {}));
  try {
    const record = await readCandidate(options.out);
    const place = candidatePlace(options.out);
    if (record === null) {
      throw new PublishError(`no candidate is staged for ${session.place.out}; stage one with \`wrackline build --candidate --out ${options.out}\``, 2);
    }
    const published = await session.publishedFolder();
    const onLineNow = published === null ? null : await folderDigest(published);
    if (onLineNow !== (record.onLine?.digest ?? null)) {
      const then = record.onLine === null ? 'nothing was published' : `release ${record.onLine.release} (digest ${record.onLine.digest.slice(0, 12)}) was on line`;
      const now = published === null ? 'nothing is on line' : `${path.basename(published)} (digest ${onLineNow?.slice(0, 12)}) is`;
      throw new PublishError(
        `refused: the release on line changed since the candidate was staged (when it was staged ${then}; now ${now}). ` +
          'Nothing was published. Stage the candidate again (wrackline build --candidate) and review it against what is on line now.',
      );
    }
    const changed = await changedInputs(record);
    if (changed.length > 0) {
      throw new PublishError(
        `refused: the candidate's inputs changed since it was staged (${changed.join(', ')} in ${record.scenario}). ` +
          'Nothing was published. Stage it again (wrackline build --candidate) and review it.',
      );
    }
    const manifest = await readManifest(place.site);
    if (manifest === null || treeDigest(manifest.files) !== record.digest) {
      throw new PublishError(`refused: the candidate in ${place.site} is not the one staged (its manifest differs); stage it again`);
    }
    const altered = await differenceFromListing(place.site, manifest.files);
    if (altered !== null) throw new PublishError(`refused: ${altered} of the candidate changed after it was staged; stage it again`);

    const approval: Approval = { by, at: options.at.toISOString().replace(/\.\d{3}Z$/, 'Z'), candidate: record.digest, replaced: record.onLine?.release ?? null };
    // The approved release: the candidate's files linked (never written to), its methods page and
    // manifest written afresh.
    const tree = await session.workFolder('approved');
    linkFiles(
      place.site,
      tree,
      manifest.files.map((entry) => entry.file).filter((file) => file !== methodsPage),
    );
    const methods = manifest.files.some((entry) => entry.file === methodsPage) ? await readFile(path.join(place.site, methodsPage), 'utf8') : null;
    if (methods === null) throw new PublishError(`the candidate has no ${methodsPage} to show the approval on`);
    mkdirSync(path.join(tree, path.dirname(methodsPage)), { recursive: true });
    await writeFile(path.join(tree, methodsPage), fillApproval(methods, approval));
    const problems = await siteProblems(tree, [methodsPage]);
    if (problems.length > 0) throw new PublishError(`the approved methods page fails the safety check: ${problems[0]?.problem}`);
    const methodsHash = await hashFile(path.join(tree, methodsPage));
    const files = manifest.files.map((entry) => (entry.file === methodsPage ? { file: entry.file, ...methodsHash } : entry));
    const { files: _files, generator: _generator, ...extra } = manifest;
    await writeManifest(tree, files, { ...extra, approval });
    const digest = treeDigest(files);
    const outcome = await session.publish(tree, `r-${digest.slice(0, 20)}`);
    await rm(place.folder, { recursive: true, force: true });
    return { release: outcome.release, digest, approval };
  } finally {
    await session.close();
  }
}
