/**
 * Taking archive-ledger entries over from the release on line (archive-ledger.ts, LedgerReuse):
 * an entry depends only on the bytes of a bulletin's model file, so a build may take the entry on
 * line for a bulletin whose model file has the SHA-256 of that release's bulletin.json, and must
 * work it out afresh for any other. The ledger with reuse equals the ledger without.
 */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, beforeEach, expect, test } from 'vitest';
import { assembleModel } from '../../generator/model/assemble-model.ts';
import { writeModel } from '../../generator/model/write-model.ts';
import { ledgerFromModel, type ArchiveLedger } from '../../generator/publish/check/archive-ledger.ts';
import { modelFileHashes } from '../../generator/publish/render/page-reuse.ts';
import { fixtureScenario, testEngine } from '../model/fixture.ts';

let dir: string;
beforeEach(async () => {
  dir = await mkdtemp(path.join(tmpdir(), 'wrackline-ledger-'));
});
afterEach(async () => {
  await rm(dir, { recursive: true, force: true });
});

test('entries are taken over exactly where the model file is the download on line', async () => {
  const modelDir = path.join(dir, 'model');
  await writeModel(modelDir, assembleModel(fixtureScenario(), testEngine));
  const fresh = await ledgerFromModel(modelDir);
  const hashes = await modelFileHashes(modelDir);
  expect(hashes.size).toBeGreaterThan(2);
  for (const [id, sha] of hashes) {
    const [season, segment] = id.split('/') as [string, string];
    expect(sha).toBe(
      createHash('sha256')
        .update(readFileSync(path.join(modelDir, 'bulletins', season, `${segment}.json`)))
        .digest('hex'),
    );
  }
  const downloads = new Map([...hashes].map(([id, sha]) => [`seasons/${id}/bulletin.json`, sha]));

  // Same files on line: every entry taken over, the same ledger.
  expect(await ledgerFromModel(modelDir, { previous: fresh, modelHashes: hashes, publishedHashes: downloads })).toEqual(fresh);

  // Mark the entries on line, so a taken-over entry shows; one download on line differs.
  const marked: ArchiveLedger = structuredClone(fresh);
  for (const season of marked.seasons) for (const entry of season.entries) if (entry.segment !== null) entry.sha256 = `on-line-${entry.segment}`;
  const [changedId] = [...hashes.keys()];
  const changedDownloads = new Map(downloads);
  changedDownloads.set(`seasons/${changedId}/bulletin.json`, 'another file');
  const mixed = await ledgerFromModel(modelDir, { previous: marked, modelHashes: hashes, publishedHashes: changedDownloads });
  for (const season of mixed.seasons) {
    for (const entry of season.entries) {
      if (entry.segment === null) continue;
      const id = `${season.season}/${entry.segment}`;
      const worked = fresh.seasons.find((s) => s.season === season.season)?.entries.find((e) => e.segment === entry.segment);
      expect(entry.sha256).toBe(id === changedId ? worked?.sha256 : `on-line-${entry.segment}`);
    }
  }
});
