/** buildModel with the real trend engine of generator/stats on the small invented scenario. */
import { describe, expect, test } from 'vitest';
import { likelihoodWord } from '../../generator/bulletin/likelihood.ts';
import { chanceWords } from '../../generator/bulletin/phrase-trend.ts';
import { buildModel, generatorVersion } from '../../generator/model/build-model.ts';
import { fixtureScenario } from './fixture.ts';

function scenarioWithBootstrap() {
  const scenario = fixtureScenario();
  scenario.settings.trend.bootstrapResamples = 200;
  return scenario;
}

const set = buildModel(scenarioWithBootstrap());
const find = (season: string, segment: string) => set.bulletins.find((b) => b.season.id === season && b.segment.id === segment)!;

describe('buildModel with the trend engine', () => {
  test('the rising bay: seasonal test, bootstrap chance, likelihood words from the same probability', () => {
    const litter = find('2026-autumn', 'east-bay').indicators.find((i) => i.indicator === 'beach-litter')!;
    expect(litter.trend?.seasonalKendall).toBeTruthy();
    expect(litter.direction).toBe('rising');
    expect(litter.probabilityUp).not.toBeNull();
    expect(litter.likelihoodWords).toBe(likelihoodWord(litter.probabilityUp));
    expect(litter.sentences[1]).toBe(`A rise is ${litter.likelihoodWords}: the chance is ${chanceWords(litter.probabilityUp!)}.`);
    expect(litter.trend?.band?.resamples).toBe(200);
  });

  test('the flat beach is not called rising or falling', () => {
    const litter = find('2026-autumn', 'north-beach').indicators.find((i) => i.indicator === 'beach-litter')!;
    expect(['no-clear-direction', 'too-little-data']).toContain(litter.direction);
    expect(litter.sentences.join(' ')).not.toMatch(/is going (up|down)\./);
  });

  test('same scenario, same model, bootstrap included (seeds derive from segment, indicator and season)', () => {
    expect(JSON.stringify(buildModel(scenarioWithBootstrap()))).toBe(JSON.stringify(set));
    const summerSeed = find('2026-summer', 'east-bay').indicators[0]?.trend?.band?.seed;
    const autumnSeed = find('2026-autumn', 'east-bay').indicators[0]?.trend?.band?.seed;
    expect(summerSeed).not.toBe(autumnSeed);
  });

  test('site: version from package.json, manifest, digest of the default rules', () => {
    expect(set.site.generator).toEqual({ name: 'wrackline', version: generatorVersion });
    expect(generatorVersion).toMatch(/^\d+\.\d+\.\d+/);
    expect(set.site.manifest).toEqual([{ file: 'datapackage.json', sha256: 'a'.repeat(64), bytes: 10 }]);
    expect(set.site.settingsDigest.riskRules[0]?.id).toBe('litter-at-eu-threshold');
    expect(set.site.settingsDigest.falseDiscoveryRate).toBe(0.05);
  });

  test('region: Regional Kendall per indicator with a sentence', () => {
    const region = set.regions.find((r) => r.season.id === '2026-autumn')!;
    const litter = region.regionalTrends.find((t) => t.indicator === 'beach-litter')!;
    expect(litter.S).not.toBeNull();
    expect(litter.sentence).toMatch(/^Across 3 places, /);
  });

  test('region page carries the shellfish cautions when any segment has shellfish', () => {
    const region = set.regions[0]!;
    expect(region.cautions?.shellfish.map((c) => c.id)).toContain('not-a-closure');
    expect(region.cautions?.shellfish.map((c) => c.text).join(' ')).toContain('Brin Shellfish Board');
    expect(region.authorities?.map((a) => a.role)).toEqual(['shellfish-sanitation', 'debris-report']);
  });
});
