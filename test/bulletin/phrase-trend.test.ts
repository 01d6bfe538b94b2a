/**
 * Exact wording of every trend template path. The trend results are hand-made (the wording only
 * reads them), so each sentence can be checked character by character.
 */
import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { phraseTrend, printedRate, type TrendPhraseInput } from '../../generator/bulletin/phrase-trend.ts';
import type { Direction } from '../../generator/model/types.ts';
import type { TrendResult } from '../../generator/stats/types.ts';

const seasonLabels = { winter: 'Winter', spring: 'Spring', summer: 'Summer', autumn: 'Autumn' };

function trendOf(slope: number, lower: number, upper: number, p: number, extra: Partial<TrendResult> = {}): TrendResult {
  return {
    n: 24,
    nCensored: 0,
    mannKendall: { S: slope >= 0 ? 120 : -120, varS: 1633.33, z: slope >= 0 ? 2.9 : -2.9, p, tau: 0.43 },
    sen: { slope, lower, upper, intercept: 0, confidence: 0.95 },
    insufficient: null,
    ...extra,
  };
}

function input(direction: Direction, trend: TrendResult | null, rest: Partial<TrendPhraseInput> = {}): TrendPhraseInput {
  return {
    subject: 'Beach litter',
    unit: 'items per 100 m of beach',
    trend,
    direction,
    qValue: 0.004,
    probabilityUp: 0.94,
    falseDiscoveryRate: 0.05,
    confidence: 0.95,
    segmentsTested: 12,
    seasonLabels,
    samples: { count: 24, firstYear: 2020, lastYear: 2026 },
    ...rest,
  };
}

describe('trend sentences, one per template path', () => {
  test('rising', () => {
    expect(phraseTrend(input('rising', trendOf(6.2, 2.3, 10.1, 0.0004)))).toEqual([
      'Beach litter is going up.',
      'A rise is very likely: the chance is 94 in 100.',
      'That is about 6 more items per 100 m of beach each year. The 95% range is 2 to 10.',
      'This rests on 24 samples from 2020 to 2026.',
    ]);
  });

  test('falling: the chance is that of a fall, 1 − P(up), and the range is told as sizes of the fall', () => {
    expect(phraseTrend(input('falling', trendOf(-0.83, -1.24, -0.41, 0.001), { probabilityUp: 0.02 }))).toEqual([
      'Beach litter is going down.',
      'A fall is highly likely: the chance is 98 in 100.',
      'That is about 0.8 fewer items per 100 m of beach each year. The 95% range is 0.4 to 1.2 fewer.',
      'This rests on 24 samples from 2020 to 2026.',
    ]);
  });

  test('no clear direction: no rise or fall is claimed, and the range shows it could be no change', () => {
    expect(phraseTrend(input('no-clear-direction', trendOf(2.6, -1.8, 7.2, 0.21), { qValue: 0.42, probabilityUp: 0.81 }))).toEqual([
      'We cannot tell if beach litter is going up or down.',
      'The change we see could be chance.',
      'Our best guess is a change of +3 items per 100 m of beach a year. The 95% range is \u22122 to 7. That range takes in no change at all.',
      'This rests on 24 samples from 2020 to 2026.',
    ]);
  });

  test('no clear direction after the false-discovery check: p alone is below the rate, q is not', () => {
    expect(phraseTrend(input('no-clear-direction', trendOf(4.1, 0.9, 7.6, 0.03), { qValue: 0.11 })).slice(0, 3)).toEqual([
      'We cannot tell if beach litter is going up or down.',
      'On its own this place seems to change. But we test 12 places at once, and a change this size could be chance.',
      'Our best guess is a change of +4 items per 100 m of beach a year. The 95% range is 1 to 8.',
    ]);
  });

  test('too little data, with the reason', () => {
    const trend: TrendResult = {
      n: 6,
      nCensored: 0,
      mannKendall: null,
      sen: null,
      insufficient: { rule: 'min-values', reason: 'only 6 seasons have samples, and we need at least 8' },
    };
    expect(phraseTrend(input('too-little-data', trend, { samples: { count: 6, firstYear: 2025, lastYear: 2026 } }))).toEqual([
      'Too little data to say if beach litter is changing: only 6 seasons have samples, and we need at least 8.',
      'This rests on 6 samples from 2025 to 2026.',
    ]);
  });

  test('no samples at all', () => {
    expect(phraseTrend(input('too-little-data', null, { samples: null }))).toEqual([
      'There are no samples of beach litter here yet, so we cannot say.',
    ]);
  });

  test('censored values, with no rate when the slope cannot be estimated', () => {
    const trend: TrendResult = {
      n: 20,
      nCensored: 9,
      mannKendall: { S: 40, varS: 900, z: 1.3, p: 0.19, tau: 0.2 },
      sen: { slope: null, lower: null, upper: null, intercept: null, confidence: 0.95, notEstimable: 'too many values below detection' },
      insufficient: null,
    };
    expect(
      phraseTrend(
        input('no-clear-direction', trend, {
          subject: 'Plastic in shellfish',
          unit: 'particles per gram of shellfish (wet weight)',
          qValue: 0.4,
          samples: { count: 20, firstYear: 2021, lastYear: 2026 },
        }),
      ),
    ).toEqual([
      'We cannot tell if plastic in shellfish is going up or down.',
      'The change we see could be chance.',
      '9 of 20 values were too low for the lab to measure.',
      'So we give no yearly rate of change.',
      'This rests on 20 samples from 2021 to 2026.',
    ]);
  });

  test('seasons that disagree are said plainly, naming the seasons', () => {
    const trend = trendOf(0.4, -0.2, 1.1, 0.3, {
      seasonalKendall: {
        S: 2,
        varS: 40,
        z: 0.16,
        p: 0.87,
        tau: 0.05,
        slope: 0.4,
        lower: -0.2,
        upper: 1.1,
        varSCovariance: null,
        pCovariance: null,
        heterogeneity: { chi2: 14.2, df: 3, p: 0.0026 },
        seasons: [
          { season: 'winter', n: 6, S: -9, varS: 28.3 },
          { season: 'spring', n: 6, S: 3, varS: 28.3 },
          { season: 'summer', n: 6, S: 11, varS: 28.3 },
          { season: 'autumn', n: 6, S: -3, varS: 28.3 },
        ],
      },
    });
    const sentences = phraseTrend(input('no-clear-direction', trend, { qValue: 0.9 }));
    expect(sentences).toContain('The seasons do not agree: it went up in spring and summer but down in winter and autumn.');
  });

  test('a claimed rise is never printed as a change of 0', () => {
    const sentences = phraseTrend(input('rising', trendOf(0.04, 0.01, 0.9, 0.001)));
    expect(sentences[2]).toBe('That is about 0.04 more items per 100 m of beach each year. The 95% range is 0.01 to 0.90.');
  });
});

describe('numbers in sentences equal the model numbers after the stated rounding', () => {
  test('slope and range in the sentence are the width-rounded model values', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -500, max: 500, noNaN: true }),
        fc.double({ min: 0.001, max: 300, noNaN: true }),
        fc.double({ min: 0.001, max: 300, noNaN: true }),
        (slope, below, above) => {
          const trend = trendOf(slope, slope - below, slope + above, 0.2);
          const phrase = input('no-clear-direction', trend, { qValue: 0.5 });
          const rate = printedRate(phrase);
          if (!rate) return false;
          const sentence = phraseTrend(phrase)[2] ?? '';
          const numbers = [...sentence.matchAll(/[+\u2212]?[\d,]+(?:\.\d+)?/g)].map((m) =>
            Number(m[0].replace(/,/g, '').replace('\u2212', '-')),
          );
          // [slope, 100 (from the unit), 95 (confidence), lower, upper]
          return numbers[0] === rate.slope && numbers[3] === rate.lower && numbers[4] === rate.upper;
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe('no sentence claims a trend the false-discovery check does not support', () => {
  const claimWords = /going up\.|going down\.|more .* each year|fewer .* each year|A rise is|A fall is/;
  test('direction other than rising/falling never yields claim words, whatever the numbers', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -50, max: 50, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        fc.constantFrom<Direction>('no-clear-direction', 'too-little-data'),
        (slope, p, probabilityUp, direction) => {
          const trend = trendOf(slope, slope - 1, slope + 1, p);
          const sentences = phraseTrend(input(direction, trend, { qValue: Math.max(0.05, p), probabilityUp }));
          return sentences.every((s) => !claimWords.test(s));
        },
      ),
      { numRuns: 300 },
    );
  });
});
