/**
 * `wrackline review`: what the staged candidate (`wrackline build --candidate`) changes for
 * readers, against the release on line. Prints the change report and writes it as a private
 * HTML page beside the candidate (never part of a release).
 *
 *   wrackline review [--out DIR] [--quiet]
 *
 * Exit codes: 0 report written, 2 bad usage or no candidate staged.
 */
import { writeFile } from 'node:fs/promises';
import path from 'node:path';
import { commandWriters, parseCommandOptions } from './command-io.ts';
import { candidatePlace, readCandidate } from '../publish/swap/candidate.ts';
import { inspectOutput, placeFor } from '../publish/swap/release-swap.ts';
import { compareReleases } from '../review/compare-releases.ts';
import type { ReleaseContent } from '../review/compare-releases.ts';
import { readRelease } from '../review/read-release.ts';
import { reviewPage } from '../review/review-page.ts';
import { reviewText } from '../review/review-text.ts';

export const reviewHelp = `Usage: wrackline review [options]

Compares the staged candidate with the release on line and reports what
changes for readers: levels, trend claims, sentences (old beside new),
records left out or taken back in, pages added and removed. The report is
printed and written as a private page, <out>.wrackline/candidate/review.html,
which is never published.

Options:
  --out DIR    the published output folder (default: dist)
  --quiet      write the page only; print its path
  -h, --help   show this help

Then: wrackline approve --out DIR --by "Your Name"`;

const empty: ReleaseContent = { bulletins: new Map(), pages: [], leftOut: [] };

export async function runReview(argv: string[], io: { stdout?: (text: string) => void; stderr?: (text: string) => void } = {}): Promise<number> {
  const { stdout, stderr } = commandWriters(io);
  const parsed = parseCommandOptions(
    'review',
    { args: argv, strict: true, allowPositionals: false, options: { out: { type: 'string' }, quiet: { type: 'boolean' }, help: { type: 'boolean', short: 'h' } } },
    stderr,
  );
  if (parsed === null) return 2;
  const { values } = parsed;
  if (values.help) {
    stdout(reviewHelp);
    return 0;
  }
  const out = path.resolve(values.out ?? 'dist');
  const record = await readCandidate(out).catch(() => null);
  if (record === null) {
    stderr(`wrackline review: no candidate is staged for ${out}; stage one with \`wrackline build --candidate --out ${values.out ?? 'dist'}\``);
    return 2;
  }
  const place = candidatePlace(out);
  const found = await inspectOutput(placeFor(out));
  const onLineFolder = found.kind === 'link' && found.release ? path.join(placeFor(out).releases, found.release) : found.kind === 'folder' ? out : null;
  try {
    const candidate = await readRelease(place.site);
    const online = onLineFolder === null ? empty : await readRelease(onLineFolder);
    const report = compareReleases(online, candidate);
    const heading = { candidate: record.digest, onLine: onLineFolder === null ? null : path.basename(onLineFolder), candidateFolder: place.site };
    if (onLineFolder !== null && record.onLine?.release !== path.basename(onLineFolder)) {
      stderr(`warning: the candidate was staged over ${record.onLine?.release ?? 'nothing'}, but ${path.basename(onLineFolder)} is on line now; approval will be refused`);
    }
    await writeFile(place.reviewPage, reviewPage(report, heading));
    if (!values.quiet) stdout(reviewText(report, heading));
    stdout(
      `\nReview page (private, not published): ${place.reviewPage}\nPreview the candidate: wrackline serve --dir ${place.site}\nPublish it: wrackline approve --out ${values.out ?? 'dist'} --by "Your Name"`,
    );
    return 0;
  } catch (error) {
    stderr(`wrackline review: ${error instanceof Error ? error.message : String(error)}`);
    return 2;
  }
}
