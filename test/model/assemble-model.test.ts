import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';
import { assembleModel } from '../../generator/model/assemble-model.ts';
import { readModel } from '../../generator/model/read-model.ts';
import { writeModel } from '../../generator/model/write-model.ts';
import { fixtureScenario, testEngine } from './fixture.ts';

const set = assembleModel(fixtureScenario(), testEngine);
const bulletin = (season: string, segment: string) => {
  const found = set.bulletins.find((b) => b.season.id === season && b.segment.id === segment);
  if (!found) throw new Error(`no bulletin ${season}/${segment}`);
  return found;
};

describe('assembleModel on a small invented scenario', () => {
  test('one bulletin per segment per published season, ordered by season then segment', () => {
    expect(set.bulletins.map((b) => `${b.season.id}/${b.segment.id}`)).toEqual([
      '2026-summer/east-bay',
      '2026-summer/north-beach',
      '2026-summer/west-cove',
      '2026-autumn/east-bay',
      '2026-autumn/north-beach',
      '2026-autumn/west-cove',
    ]);
    expect(set.regions.map((r) => r.season.id)).toEqual(['2026-summer', '2026-autumn']);
    expect(set.site.seasons.map((s) => [s.id, s.published, s.current])).toEqual([
      ['2026-summer', '2026-09-01', false],
      ['2026-autumn', '2026-12-01', true],
    ]);
  });

  test('a season uses only data up to its end', () => {
    const summer = bulletin('2026-summer', 'east-bay').indicators.find((i) => i.indicator === 'beach-litter')!;
    expect(summer.observations.every((o) => o.date <= '2026-08-31')).toBe(true);
    expect(summer.observations.at(-1)?.date).toBe('2026-07-15');
  });

  test('rising only where the q-value is below the false-discovery rate; uncertain and too-little-data otherwise', () => {
    const east = bulletin('2026-autumn', 'east-bay').indicators.find((i) => i.indicator === 'beach-litter')!;
    expect(east.qValue).not.toBeNull();
    expect(east.qValue!).toBeLessThan(0.05);
    expect(east.direction).toBe('rising');
    expect(east.sentences[0]).toBe('Beach litter is going up.');
    const north = bulletin('2026-autumn', 'north-beach').indicators.find((i) => i.indicator === 'beach-litter')!;
    expect(north.direction).toBe('no-clear-direction');
    expect(north.sentences[0]).toBe('We cannot tell if beach litter is going up or down.');
    const west = bulletin('2026-autumn', 'west-cove').indicators.find((i) => i.indicator === 'beach-litter')!;
    expect(west.direction).toBe('too-little-data');
    expect(west.sentences.slice(0, 2)).toEqual(['Too little data to say if beach litter is changing.', 'Only 4 seasons have samples so far, and we need at least 8.']);
  });

  test('every claim of a rise or fall in any sentence has q below the rate', () => {
    for (const b of set.bulletins) {
      for (const ind of b.indicators) {
        const claims = ind.sentences.some((s) => /is going (up|down)\./.test(s));
        if (claims) expect(ind.qValue ?? 1).toBeLessThan(set.site.settingsDigest.falseDiscoveryRate);
      }
    }
  });

  test('level from the default rules, with why, and level now and last season', () => {
    const east = bulletin('2026-autumn', 'east-bay');
    expect(east.level.id).not.toBe('scant');
    expect(east.level.hits.length).toBeGreaterThan(0);
    const now = `The level this season is ${east.level.label} (level ${east.level.rank} of 4)`;
    const before = `${east.previousLevel!.label} (level ${east.previousLevel!.rank} of 4)`;
    expect(east.summary[0]).toBe(
      east.previousLevel!.rank === east.level.rank
        ? `${now}, the same as last season.`
        : `${now}, ${east.level.rank > east.previousLevel!.rank ? 'up' : 'down'} from ${before} last season.`,
    );
    expect(east.previousSeason?.id).toBe('2026-summer');
    expect(east.previousLevel).not.toBeNull();
    expect(bulletin('2026-summer', 'east-bay').previousSeason?.id).toBe('2026-spring');
  });

  test('the previous season is marked published only when it has a bulletin of its own', () => {
    // 2026-spring comes before the first published season (2026-summer): there is no bulletin to link.
    expect(bulletin('2026-summer', 'east-bay').previousSeasonPublished).toBe(false);
    expect(bulletin('2026-autumn', 'east-bay').previousSeasonPublished).toBe(true);
    for (const b of set.bulletins) {
      expect(b.previousSeasonPublished).toBe(set.site.seasons.some((s) => s.id === b.previousSeason?.id));
    }
  });

  test('shellfish bulletins carry the cautions and the authority contact; others have no shellfish cautions', () => {
    const east = bulletin('2026-autumn', 'east-bay');
    expect(east.sections.growers?.title).toBe('For shellfish growers and gatherers');
    expect(east.cautions.shellfish.map((c) => c.id)).toContain('not-a-closure');
    expect(east.cautions.shellfish.map((c) => c.text).join(' ')).toContain('Brin Shellfish Board. Phone +00 555 0101.');
    expect(east.authorities.some((a) => a.role === 'shellfish-sanitation')).toBe(true);
    const north = bulletin('2026-autumn', 'north-beach');
    expect(north.sections.growers).toBeNull();
    expect(north.cautions.shellfish).toEqual([]);
    expect(north.cautions.debris.length).toBeGreaterThan(0);
  });

  test('censored shellfish values are said', () => {
    const tissue = bulletin('2026-autumn', 'east-bay').indicators.find((i) => i.indicator === 'shellfish-tissue')!;
    expect(tissue.trend?.nCensored).toBe(8);
    expect(tissue.sentences).toContain(`In 8 of ${tissue.trend?.n} seasons, the plastic was too little for the lab to measure.`);
    expect(tissue.trend?.n).toBe(32);
  });

  test('permalink, correction and citation', () => {
    const summer = bulletin('2026-summer', 'east-bay');
    expect(summer.permalink).toBe('/seasons/2026-summer/east-bay/');
    expect(summer.correction).toEqual({ date: '2026-09-20', reason: 'A survey was entered twice.' });
    expect(bulletin('2026-autumn', 'east-bay').correction).toBeNull();
    expect(summer.sections.reporters.citation).toBe(
      'Brin Coast Watch (2026). East Bay: coastal plastic bulletin, Summer 2026. Published 2026-09-01. /seasons/2026-summer/east-bay/',
    );
  });

  test('deterministic: the same scenario gives the same model', () => {
    expect(JSON.stringify(assembleModel(fixtureScenario(), testEngine))).toBe(JSON.stringify(set));
  });

  test('writeModel and readModel round-trip, with stable key order and a trailing newline', async () => {
    const dir = await mkdtemp(join(tmpdir(), 'wrackline-model-'));
    try {
      await writeModel(dir, set);
      const back = await readModel(dir);
      expect(back).toEqual(JSON.parse(JSON.stringify(set)));
      const text = await readFile(join(dir, 'bulletins', '2026-autumn', 'east-bay.json'), 'utf8');
      expect(text.endsWith('}\n')).toBe(true);
      expect(text.split('\n')[1]).toBe('  "authorities": [');
    } finally {
      await rm(dir, { recursive: true, force: true });
    }
  });

  test('writeModel refuses a segment id that is not a safe file name', async () => {
    const dir = await mkdtemp(join(tmpdir(), 'wrackline-model-'));
    try {
      const first = set.bulletins[0]!;
      const bad = { ...set, bulletins: [{ ...first, segment: { ...first.segment, id: '../escape' } }] };
      await expect(writeModel(dir, bad)).rejects.toThrow('writeModel: segment "../escape" is not a safe file name');
    } finally {
      await rm(dir, { recursive: true, force: true });
    }
  });
});
