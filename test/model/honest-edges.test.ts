/**
 * Thin, stale, censored and mixed evidence must never read as a finding: one test per case, on
 * the small invented scenario of fixture.ts changed just enough to show the case.
 */
import { describe, expect, test } from 'vitest';
import { assembleModel } from '../../generator/model/assemble-model.ts';
import { resultsCsv } from '../../generator/model/download-tables.ts';
import type { LoadedScenario } from '../../generator/scenario/types.ts';
import { fixtureScenario, record, testEngine } from './fixture.ts';

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
    expect(b.changes).toContain(
      "Plastic in shellfish this season: below the lab's detection limit (0.05 particles per gram of shellfish, wet weight), against 0.62 last season.",
    );
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
