import { describe, expect, test } from 'vitest';
import { assessLevel, regionPercentile, type IndicatorMeasures } from '../../generator/risk/assess-level.ts';
import { defaultRiskRules } from '../../generator/risk/default-rules.ts';
import { median } from '../../generator/model/series.ts';
import type { RiskRule } from '../../generator/scenario/settings.ts';

function measures(partial: Partial<IndicatorMeasures>): IndicatorMeasures {
  return { assessmentMedian: null, cleanCoastIndex: null, regionPercentile: null, probabilityUp: null, direction: 'no-clear-direction', ...partial };
}

describe('levels from the default rule table', () => {
  test('no measure matches: scant, with no hits', () => {
    expect(assessLevel(defaultRiskRules, {})).toEqual({ id: 'scant', rank: 1, label: 'Scant', hits: [] });
  });
  test('median beach litter 21.5 is above the EU threshold value of 20 → noticeable', () => {
    // Van Loon et al. 2020: compliance is the median against 20 items/100 m. Surveys [25, 12, 30, 18]
    // → median 21.5 (check value 14).
    const m = median([25, 12, 30, 18]);
    expect(m).toBe(21.5);
    const level = assessLevel(defaultRiskRules, { 'beach-litter': measures({ assessmentMedian: m }) });
    expect(level.id).toBe('noticeable');
    expect(level.hits).toEqual([
      {
        ruleId: 'litter-at-eu-threshold',
        level: 'noticeable',
        text: 'Beach litter in the last four seasons has a median of 22 items per 100 m. That is at or above the EU limit of 20.',
      },
    ]);
  });
  test('Clean Coast Index 3.0 (15 plastic items on 100 m², "clean") sets no level; 24 ("extremely dirty") sets heavy', () => {
    // Alkalay et al. 2007: CCI = items/m² × 20; check value 15.
    expect(assessLevel(defaultRiskRules, { 'beach-litter': measures({ cleanCoastIndex: (15 / 100) * 20 }) }).id).toBe('scant');
    const heavy = assessLevel(defaultRiskRules, { 'beach-litter': measures({ cleanCoastIndex: (120 / 100) * 20 }) });
    expect(heavy.id).toBe('heavy');
    expect(heavy.hits.map((h) => h.ruleId)).toEqual(['clean-coast-extremely-dirty', 'clean-coast-dirty', 'clean-coast-moderate']);
    expect(heavy.hits[0]?.text).toBe('The Clean Coast Index is 24, above 20: the beach is very dirty.');
  });
  test('a likely rise raises the level only when the rise passed the false-discovery check', () => {
    const notClaimed = assessLevel(defaultRiskRules, { 'beach-litter': measures({ probabilityUp: 0.97, direction: 'no-clear-direction' }) });
    expect(notClaimed.id).toBe('scant');
    const claimed = assessLevel(defaultRiskRules, { 'beach-litter': measures({ probabilityUp: 0.97, direction: 'rising' }) });
    expect(claimed.hits).toEqual([
      { ruleId: 'litter-rise-likely', level: 'noticeable', text: 'Beach litter is going up, and the chance of a rise is 97 in 100.' },
    ]);
  });
  test('the highest matching rule wins', () => {
    const level = assessLevel(defaultRiskRules, {
      'beach-litter': measures({ assessmentMedian: 160 }),
      'drift-arrivals': measures({ regionPercentile: 80 }),
    });
    expect(level.id).toBe('marked');
    expect(level.hits.map((h) => h.ruleId)).toEqual(['litter-at-eu-mean', 'litter-at-eu-threshold', 'arrivals-top-quarter']);
  });
  test('a scenario rule table replaces the defaults, with {value} and {threshold} filled in', () => {
    const rules: RiskRule[] = [
      { id: 'water-high', level: 'heavy', indicator: 'water-microplastics', measure: 'assessment-median', op: '>', value: 2, text: 'Water median {value} is over {threshold}.' },
    ];
    expect(assessLevel(rules, { 'water-microplastics': measures({ assessmentMedian: 2.345 }) }).hits[0]?.text).toBe('Water median 2.3 is over 2.');
  });
});

describe('region percentile', () => {
  test('mid-rank: lowest 0, highest 100, ties share', () => {
    expect(regionPercentile(1, [1, 2, 3, 4, 5])).toBe(0);
    expect(regionPercentile(5, [1, 2, 3, 4, 5])).toBe(100);
    expect(regionPercentile(3, [1, 2, 3, 4, 5])).toBe(50);
    expect(regionPercentile(2, [1, 2, 2, 4])).toBe(50);
    expect(regionPercentile(7, [7])).toBe(50);
    expect(regionPercentile(null, [1, 2])).toBeNull();
  });
});
