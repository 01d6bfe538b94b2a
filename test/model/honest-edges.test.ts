/**
 * Thin, stale, censored and mixed evidence must never read as a finding: one test per case, on
 * the small invented scenario of fixture.ts changed just enough to show the case.
 */
import { describe, expect, test } from 'vitest';
import { assembleModel } from '../../generator/model/assemble-model.ts';
import { highestLevelHeadline } from '../../generator/model/compose-region.ts';
import { resultsCsv } from '../../generator/model/download-tables.ts';
import type { LoadedScenario } from '../../generator/scenario/types.ts';
import { regionalTrendSentence } from '../../generator/model/compose-region.ts';
import { levelWithoutRecentSurvey } from '../../generator/model/judge-season.ts';
import { statsTrendEngine } from '../../generator/model/trend-engine.ts';
import { fixtureScenario, record, seasonDates, segment, testEngine } from './fixture.ts';

function withRecords(change: (records: LoadedScenario['records']) => LoadedScenario['records']): LoadedScenario {
  const scenario = fixtureScenario();
  return { ...scenario, records: change(scenario.records) };
}

describe('case 2, below detection printed as a measurement', () => {
  // East Bay shellfish: 0.62 particles/g last season (summer 2026), every sample "<0.05" this season.
  const scenario = withRecords((records) => [
    ...records.filter((r) => !(r.indicator === 'shellfish-tissue' && r.date >= '2026-06-01')),
    record('shellfish-tissue', 'east-bay', '2026-07-15', 0.62, false, { species: 'mussel' }),
    record('shellfish-tissue', 'east-bay', '2026-10-05', 0.05, true, { species: 'mussel' }),
    record('shellfish-tissue', 'east-bay', '2026-10-15', 0.05, true, { species: 'mussel' }),
    record('shellfish-tissue', 'east-bay', '2026-10-25', 0.05, true, { species: 'mussel' }),
  ]);
  const set = assembleModel(scenario, testEngine);
  const b = set.bulletins.find((x) => x.season.id === '2026-autumn' && x.segment.id === 'east-bay')!;
  const tissue = b.indicators.find((i) => i.indicator === 'shellfish-tissue')!;

  test('case 2: the sentence says "below the lab\'s detection limit (0.05)", never "0.05 particles per gram"', () => {
    expect(b.changes).toContain("Plastic in shellfish this season: below the lab's detection limit (0.05 particles per gram of shellfish, wet weight), against 0.62 last season.");
    expect(b.sections.growers?.sentences[0]).toBe(
      "In shellfish samples this season, the plastic was below the lab's detection limit (0.05 particles per gram of shellfish, wet weight).",
    );
    const all = [b.headline, ...b.summary, ...b.changes, ...(b.sections.growers?.sentences ?? []), ...b.sections.visitors.sentences];
    for (const sentence of all) expect(sentence).not.toMatch(/(?<!limit \()0\.05 particles/u);
  });

  test('case 2: the key numbers, the model JSON and the results CSV keep the censoring', () => {
    expect(b.sections.reporters.keyNumbers).toContainEqual({
      label: 'Microplastics in shellfish, this season',
      value: "below the lab's detection limit (0.05 particles/g ww)",
    });
    expect(tissue.seasonValue).toBe(0.05);
    expect(tissue.seasonValueCensored).toBe(true);
    expect(tissue.seasonValueText).toBe("below the lab's detection limit (0.05)");
    const csv = resultsCsv(b).split('\r\n');
    const header = csv[0]!.split(',');
    const row = csv.find((line) => line.includes(',shellfish-tissue,'))!.split(',');
    expect(row[header.indexOf('season_median')]).toBe('0.05');
    expect(row[header.indexOf('season_median_below_detection_limit')]).toBe('true');
  });
});

describe('case 5, the overview headline hides the worst place', () => {
  const places = (n: number) => Array.from({ length: n }, (_, i) => ({ id: `p${i + 1}`, name: `Place ${i + 1}` }));
  test('case 5: the places at the highest level are named, up to five, then "and N more", each linked', () => {
    const text = (n: number) =>
      highestLevelHeadline('Brin Coast, autumn 2026', 'Heavy (level 4 of 4)', places(n), 30)
        .map((p) => p.text)
        .join('');
    expect(text(1)).toBe('Brin Coast, autumn 2026: the highest level is Heavy (level 4 of 4), at 1 of 30 places: Place 1.');
    expect(text(3)).toBe('Brin Coast, autumn 2026: the highest level is Heavy (level 4 of 4), at 3 of 30 places: Place 1, Place 2 and Place 3.');
    expect(text(5)).toBe('Brin Coast, autumn 2026: the highest level is Heavy (level 4 of 4), at 5 of 30 places: Place 1, Place 2, Place 3, Place 4 and Place 5.');
    expect(text(8)).toBe('Brin Coast, autumn 2026: the highest level is Heavy (level 4 of 4), at 8 of 30 places: Place 1, Place 2, Place 3, Place 4, Place 5 and 3 more.');
    const parts = highestLevelHeadline('X', 'Heavy (level 4 of 4)', places(8), 30);
    expect(parts.filter((p) => p.segmentId).map((p) => [p.segmentId, p.text])).toEqual([
      ['p1', 'Place 1'],
      ['p2', 'Place 2'],
      ['p3', 'Place 3'],
      ['p4', 'Place 4'],
      ['p5', 'Place 5'],
    ]);
  });
  test('case 5: the region model names the place at the highest level', () => {
    const set = assembleModel(fixtureScenario(), testEngine);
    const region = set.regions.find((r) => r.season.id === '2026-autumn')!;
    expect(region.headline).toBe('Brin Coast, autumn 2026: the highest level is Marked (level 3 of 4), at 1 of 3 places: East Bay.');
    expect(region.headlineParts?.find((p) => p.segmentId)).toEqual({ text: 'East Bay', segmentId: 'east-bay' });
  });
});

describe('case 4, a region "cannot tell" that hides places going opposite ways', () => {
  // 10 places rising, 8 falling, 3 flat: the Regional Kendall sum of S nearly cancels.
  const base = fixtureScenario();
  const ids = Array.from({ length: 21 }, (_, i) => `place-${String(i + 1).padStart(2, '0')}`);
  const records = ids.flatMap((id, n) =>
    seasonDates().map((date, k) => {
      const value = n < 10 ? 20 + 2 * k + (k % 3) : n < 18 ? 90 - 2 * k + (k % 3) : [14, 9, 17, 11, 15, 8][k % 6]!;
      return record('beach-litter', id, date, value);
    }),
  );
  const scenario: LoadedScenario = { ...base, segments: ids.map((id, n) => segment(id, `Place ${n + 1}`, 'beach', 'none')), records };
  const engine = { ...testEngine, regional: statsTrendEngine.regional };
  const set = assembleModel(scenario, engine);
  const region = set.regions.find((r) => r.season.id === '2026-autumn')!;
  const litter = region.regionalTrends.find((t) => t.indicator === 'beach-litter')!;

  test('case 4: "Beach litter is going up at 10 places and down at 8; there is no single direction across the region."', () => {
    expect(litter.placesUp).toBe(10);
    expect(litter.placesDown).toBe(8);
    expect(litter.homogeneity?.p).toBeLessThan(0.05);
    expect(litter.sentence).toBe('Beach litter is going up at 10 places and down at 8; there is no single direction across the region.');
    expect(region.summary).toContain(litter.sentence);
  });

  test('case 4: homogeneous trends keep the regional sentence; mixed counts without a failed homogeneity test do too', () => {
    const result = { S: 40, z: 2.5, p: 0.01, slope: 1.2, homogeneity: { chi2: 3, df: 20, p: 0.99 } };
    expect(regionalTrendSentence('Beach litter', 'items per 100 m of beach', result, 21, 0.05, { up: 10, down: 1, confidence: 0.95 })).toBe(
      'Across 21 places, beach litter is going up by about 1.2 items per 100 m of beach a year.',
    );
    const mixed = { ...result, homogeneity: { chi2: 80, df: 20, p: 1e-8 } };
    expect(regionalTrendSentence('Beach litter', 'items per 100 m of beach', mixed, 21, 0.05, { up: 1, down: 1, confidence: 0.95 })).toBe(
      'Beach litter is going up at 1 place and down at 1; there is no single direction across the region.',
    );
  });

  test('case 3 (region): a regional fall with a median change of 0 is not called going down', () => {
    const result = { S: -900, z: -3.1, p: 0.002, slope: 0, homogeneity: { chi2: 3, df: 20, p: 0.99 } };
    expect(regionalTrendSentence('Beach litter', 'items per 100 m of beach', result, 2000, 0.05)).toBe(
      'Across 2,000 places, we cannot tell if beach litter is going up or down: the typical yearly change is zero.',
    );
  });
});

describe('case 1, absence read as cleanliness', () => {
  // Old Point: beach surveys 2019–2022 found 50–70 items per 100 m (2.5–3.5 times the EU threshold
  // value of 20), and none since.
  const base = fixtureScenario();
  const old = seasonDates()
    .filter((date) => date < '2023-01-01')
    .map((date, k) => record('beach-litter', 'old-point', date, 50 + ((k * 7) % 21)));
  const scenario: LoadedScenario = {
    ...base,
    segments: [...base.segments, segment('old-point', 'Old Point', 'beach', 'none')],
    records: [...base.records, ...old],
  };
  const set = assembleModel(scenario, testEngine);
  const b = set.bulletins.find((x) => x.season.id === '2026-autumn' && x.segment.id === 'old-point')!;
  const region = set.regions.find((r) => r.season.id === '2026-autumn')!;

  test('case 1: no survey in the last four seasons gives no level, never "Scant (level 1 of 4)"', () => {
    expect(b.level.id).toBe('not-set');
    expect(b.level.rank).toBe(0);
    expect(b.headline).not.toMatch(/Scant/u);
    expect(b.headline).toBe('Level not set at Old Point in autumn 2026: no survey here in the last four seasons; the last, in autumn 2022, found 50 items per 100 m of beach.');
    expect(b.summary.slice(0, 2)).toEqual(['No level is set this season, nor was one last season.', 'Why no level: a level needs a survey from the last four seasons.']);
    expect(b.level.note).toBe('No survey here in the last four seasons; the last, in autumn 2022, found 50 items per 100 m of beach.');
    expect(b.sections.reporters.keyNumbers[0]).toEqual({ label: 'Level', value: 'Level not set' });
  });

  test('case 1: the region summary counts places with no level apart', () => {
    const row = region.segments.find((s) => s.id === 'old-point')!;
    expect(row.level.id).toBe('not-set');
    expect(region.summary[0]).toBe('Levels of the 4 places this season: 1 Marked, 2 Scant. 1 place has no level set, because no survey was made there in the last four seasons.');
  });

  test('case 1: where the drift model still sets a level, the bulletin says so and that no survey was made', () => {
    const driftLevel = {
      id: 'noticeable' as const,
      rank: 2 as const,
      label: 'Noticeable',
      hits: [
        {
          ruleId: 'arrivals-top-quarter',
          level: 'noticeable' as const,
          text: 'In the drift model, more modelled particles per km reach this place than 80% of the places on this coast.',
        },
      ],
    };
    const level = levelWithoutRecentSurvey(driftLevel, [], scenario.settings);
    expect(level.id).toBe('noticeable');
    expect(level.note).toBe('Only the drift model sets this level: no survey has been made here.');
  });
});
