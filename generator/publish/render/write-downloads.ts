/**
 * Step: render (the downloads).
 * The data downloads of each bulletin, written straight from the model folder (no page is
 * rendered for them):
 *   seasons/<season>/<segment>/bulletin.json     the bulletin's model file, byte for byte (a hard
 *                                                link to it where the file system allows)
 *   seasons/<season>/<segment>/observations.csv  every observation behind it
 *   seasons/<season>/<segment>/results.csv       the trend results per indicator
 */
import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { observationsCsv, resultsCsv } from '../../model/download-tables.ts';
import type { Bulletin } from '../../model/types.ts';
import { linkOrCopy } from '../move-files.ts';
import { assertSlug } from '../check/safe-path.ts';
import { giveTurn } from '../../event-loop.ts';

const downloadFiles = ['bulletin.json', 'observations.csv', 'results.csv'] as const;

/** Writes the downloads of the "season/segment" bulletins `ids` under `siteDir`; returns the number of files. */
export async function writeDownloads(modelDir: string, siteDir: string, ids: readonly string[]): Promise<number> {
  let files = 0;
  for (const [i, id] of ids.entries()) {
    // Synchronous file calls (far quicker for many small files); other work gets a turn now and then.
    if (i % 16 === 15) await giveTurn();
    const [season = '', segment = ''] = id.split('/');
    assertSlug(season, 'season id');
    assertSlug(segment, 'segment id');
    const modelFile = path.join(modelDir, 'bulletins', season, `${segment}.json`);
    const text = readFileSync(modelFile, 'utf8');
    const bulletin = JSON.parse(text) as Bulletin;
    const dir = path.join(siteDir, 'seasons', season, segment);
    mkdirSync(dir, { recursive: true });
    linkOrCopy(modelFile, path.join(dir, 'bulletin.json'));
    writeFileSync(path.join(dir, 'observations.csv'), observationsCsv(bulletin));
    writeFileSync(path.join(dir, 'results.csv'), resultsCsv(bulletin));
    files += downloadFiles.length;
  }
  return files;
}
