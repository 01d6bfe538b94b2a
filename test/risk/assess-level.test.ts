import { describe, expect, test } from 'vitest';
import { assessLevel, regionPercentile, type IndicatorMeasures } from '../../generator/risk/assess-level.ts';
import { defaultRiskRules } from '../../generator/risk/default-rules.ts';
import { explainLevelChange } from '../../generator/risk/explain-change.ts';
import { median } from '../../generator/model/series.ts';
import type { RiskRule } from '../../generator/scenario/settings.ts';

function measures(partial: Partial<IndicatorMeasures>): IndicatorMeasures {
  return { assessmentMedian: null, cleanCoastIndex: null, regionPercentile: null, probabilityUp: null, direction: 'no-clear-direction', ...partial };
}

describe('levels from the default rule table', () => {
  test('no measure matches: scant, with no hits', () => {
    expect(assessLevel(defaultRiskRules, {})).toEqual({ id: 'scant', rank: 1, label: 'Scant', hits: [] });
  });
  test('median beach litter 21.5 is above the EU threshold value of 20 → noticeable (called a threshold value, never a limit)', () => {
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
        text: 'Beach litter in the last four seasons has a median of 22 items per 100 m. That is at or above the threshold value used in the European Union (20 items per 100 m), a yardstick and not a legal limit.',
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
    expect(claimed.hits).toEqual([{ ruleId: 'litter-rise-likely', level: 'noticeable', text: 'Beach litter is going up, and the chance of a rise is 97 in 100.' }]);
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

describe('default rule texts', () => {
  test('the EU threshold value is never called an "EU limit", and modelled particles are never called litter counts', () => {
    // Van Loon et al. 2020: 20 items/100 m is a threshold value (a benchmark), not a legal limit.
    for (const rule of defaultRiskRules) {
      expect(rule.text).not.toMatch(/EU limit|legal limit of/i);
      if (rule.indicator === 'drift-arrivals') expect(rule.text).toMatch(/modelled particles/);
    }
  });
});

describe('why the level changed', () => {
  const rules = defaultRiskRules;
  test('level down: names the rule that stopped applying, with the value now and the threshold', () => {
    const before = assessLevel(rules, { 'beach-litter': measures({ assessmentMedian: 160 }) });
    const inputs = { 'beach-litter': measures({ assessmentMedian: 92 }) };
    const now = assessLevel(rules, inputs);
    expect([before.id, now.id]).toEqual(['marked', 'noticeable']);
    expect(explainLevelChange(now, before, rules, inputs)).toEqual({
      ruleId: 'litter-at-eu-mean',
      clause: 'the median beach litter over the last four seasons is now 92 items per 100 m of beach, below 150',
    });
  });
  test('level up: names the rule that started applying', () => {
    const before = assessLevel(rules, {});
    const inputs = { 'drift-arrivals': measures({ regionPercentile: 80 }) };
    const now = assessLevel(rules, inputs);
    expect(explainLevelChange(now, before, rules, inputs)).toEqual({
      ruleId: 'arrivals-top-quarter',
      clause: 'this place is now among the 25% of places on this coast with the most modelled litter coming ashore',
    });
  });
  test('a likely rise that is no longer claimed, and no change at all', () => {
    const before = assessLevel(rules, { 'beach-litter': measures({ probabilityUp: 0.97, direction: 'rising' }) });
    const inputs = { 'beach-litter': measures({ probabilityUp: 0.8, direction: 'no-clear-direction' }) };
    const now = assessLevel(rules, inputs);
    expect(explainLevelChange(now, before, rules, inputs)?.clause).toBe('beach litter is no longer clearly going up');
    expect(explainLevelChange(now, now, rules, inputs)).toBeNull();
    expect(explainLevelChange(now, null, rules, inputs)).toBeNull();
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
