/**
 * Step: swap (a checked release staged for review instead of swapped in).
 * A candidate release: a finished, checked release that is staged beside the output instead of
 * published (`wrackline build --candidate`). Nothing on line changes. It waits in
 *
 *   <out>.wrackline/candidate/site/            the release tree, servable with `wrackline serve`
 *   <out>.wrackline/candidate/candidate.json   what it was built from and over (CandidateRecord)
 *   <out>.wrackline/candidate/review.html      the change report of `wrackline review` (private)
 *
 * until `wrackline approve` publishes it (approval.ts). The folder is part of the publishing
 * state, never of a release, so the review page is never on line. One candidate at a time:
 * staging another replaces it.
 */
import { readFile, rename, rm, writeFile } from 'node:fs/promises';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { placeFor } from './release-swap.ts';
import type { PublishSession } from './release-swap.ts';
import { hashFile, hashTree, treeDigest } from '../tree-hash.ts';
import type { FileHash } from '../tree-hash.ts';

interface CandidatePlace {
  folder: string;
  site: string;
  record: string;
  reviewPage: string;
}

export function candidatePlace(out: string): CandidatePlace {
  const folder = path.join(placeFor(out).state, 'candidate');
  return { folder, site: path.join(folder, 'site'), record: path.join(folder, 'candidate.json'), reviewPage: path.join(folder, 'review.html') };
}

interface CandidateRecord {
  kind: 'wrackline-candidate';
  /** Absolute path of the scenario folder it was built from. */
  scenario: string;
  /** Digest of the candidate's files (tree-hash.ts treeDigest over its manifest listing). */
  digest: string;
  /** The release on line when the candidate was staged: its folder name and the digest of every file in it; null when nothing was published. */
  onLine: { release: string; digest: string } | null;
  /** Every input file of the scenario (datapackage.json and each resource) with its SHA-256. */
  inputs: FileHash[];
}

/** Digest of every file of a published folder, its manifest included: any change shows. */
export async function folderDigest(folder: string): Promise<string> {
  return treeDigest(await hashTree(folder));
}

/** The scenario's input files as read now: the listed resources and datapackage.json. */
async function hashInputs(scenario: string, files: readonly string[]): Promise<FileHash[]> {
  const out: FileHash[] = [];
  for (const file of files) {
    const hashed = await hashFile(path.join(scenario, file)).catch(() => null);
    out.push({ file, sha256: hashed?.sha256 ?? 'missing', bytes: hashed?.bytes ?? 0 });
  }
  return out;
}

/** Inputs whose content differs from the record (or that are gone), by file name. */
export async function changedInputs(record: CandidateRecord): Promise<string[]> {
  const now = await hashInputs(
    record.scenario,
    record.inputs.map((entry) => entry.file),
  );
  return record.inputs.filter((entry, i) => now[i]?.sha256 !== entry.sha256).map((entry) => entry.file);
}

export async function readCandidate(out: string): Promise<CandidateRecord | null> {
  const place = candidatePlace(out);
  if (!existsSync(place.record) || !existsSync(place.site)) return null;
  const parsed = JSON.parse(await readFile(place.record, 'utf8')) as CandidateRecord;
  return parsed.kind === 'wrackline-candidate' ? parsed : null;
}

/**
 * Moves a finished, checked tree into the candidate folder (replacing an earlier candidate) and
 * records what it was built from: the input files listed in the model's site.json plus
 * datapackage.json, and the release on line now.
 */
export async function stageCandidate(options: {
  session: PublishSession;
  tree: string;
  digest: string;
  scenario: string;
  modelDir: string;
}): Promise<{ place: CandidatePlace; record: CandidateRecord }> {
  const place = candidatePlace(options.session.place.out);
  const site = JSON.parse(await readFile(path.join(options.modelDir, 'site.json'), 'utf8')) as { manifest?: { file: string }[] };
  const files = ['datapackage.json', ...(site.manifest ?? []).map((entry) => entry.file).filter((file) => file !== 'datapackage.json')];
  const published = await options.session.publishedFolder();
  const record: CandidateRecord = {
    kind: 'wrackline-candidate',
    scenario: path.resolve(options.scenario),
    digest: options.digest,
    onLine: published === null ? null : { release: path.basename(published), digest: await folderDigest(published) },
    inputs: await hashInputs(options.scenario, files),
  };
  // The old candidate leaves in one rename, then goes; the new one comes in whole.
  const staging = await options.session.workFolder('candidate');
  await rename(options.tree, path.join(staging, 'site'));
  await writeFile(path.join(staging, 'candidate.json'), `${JSON.stringify(record, null, 2)}\n`);
  if (existsSync(place.folder)) {
    const old = await options.session.workFolder('old-candidate');
    await rm(old, { recursive: true, force: true });
    await rename(place.folder, old);
  }
  await rename(staging, place.folder);
  return { place, record };
}
