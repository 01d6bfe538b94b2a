/**
 * Exact wording of every trend template path. The trend results are hand-made (the wording only
 * reads them), so each sentence can be checked character by character.
 */
import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { intervalWords, noneReportedSentences, phraseTrend, printedRate, rateSentences, unitAfter, type TrendPhraseInput } from '../../generator/bulletin/phrase-trend.ts';
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
      'That is about 6 more items per 100 m of beach each year.',
      'The 95% confidence interval runs from 2 to 10 more.',
      'This rests on 24 samples from 2020 to 2026.',
    ]);
  });

  test('falling: the chance is that of a fall, 1 − P(up), and the interval is told as sizes of the fall', () => {
    expect(phraseTrend(input('falling', trendOf(-0.83, -1.24, -0.41, 0.001), { probabilityUp: 0.02 }))).toEqual([
      'Beach litter is going down.',
      'A fall is highly likely: the chance is 98 in 100.',
      'That is about 0.8 fewer items per 100 m of beach each year.',
      'The 95% confidence interval runs from 0.4 to 1.2 fewer.',
      'This rests on 24 samples from 2020 to 2026.',
    ]);
  });

  test('no clear direction: no rise or fall is claimed, and the interval shows it could be no change', () => {
    expect(phraseTrend(input('no-clear-direction', trendOf(2.6, -1.8, 7.2, 0.21), { qValue: 0.42, probabilityUp: 0.81 }))).toEqual([
      'We cannot tell if beach litter is going up or down.',
      'The change we see could be chance.',
      'Our best guess is about 2.6 more items per 100 m of beach each year.',
      'But the 95% confidence interval runs from 1.8 fewer to 7.2 more, so there may be no change at all.',
      'This rests on 24 samples from 2020 to 2026.',
    ]);
  });

  test('a negative best guess is said as "fewer", with a singular unit after 1', () => {
    expect(phraseTrend(input('no-clear-direction', trendOf(-1.2, -4.1, 1.9, 0.5), { qValue: 0.7 })).slice(2, 4)).toEqual([
      'Our best guess is about 1.2 fewer items per 100 m of beach each year.',
      'But the 95% confidence interval runs from 4.1 fewer to 1.9 more, so there may be no change at all.',
    ]);
  });

  test('no clear direction after the false-discovery check: p alone is below the rate, q is not', () => {
    expect(phraseTrend(input('no-clear-direction', trendOf(4.1, 0.9, 7.6, 0.03), { qValue: 0.11 })).slice(0, 4)).toEqual([
      'We cannot tell if beach litter is going up or down.',
      'On its own this place seems to show a change. But we test 12 places at once, and a change this size could be chance.',
      'Our best guess is about 4 more items per 100 m of beach each year.',
      'The 95% confidence interval runs from 1 to 8 more.',
    ]);
  });

  test('q below the rate but a slope of exactly 0 (many tied counts): no direction, said plainly', () => {
    const trend = trendOf(0, 0, 0.23, 0.001);
    expect(
      phraseTrend(
        input('no-clear-direction', trend, {
          subject: 'The number of animals harmed by litter',
          unit: 'animals reported per season',
          qValue: 0.01,
          samples: { count: 39, firstYear: 2017, lastYear: 2026, noun: 'seasons' },
        }),
      ),
    ).toEqual([
      'We cannot tell if the number of animals harmed by litter is going up or down.',
      'The values hint at a change, but our best estimate of the yearly change is zero, so we do not call it a rise or a fall.',
      'Our best guess is close to no change.',
      'The 95% confidence interval runs from no change to 0.2 more animals reported per season each year.',
      'This rests on 39 seasons from 2017 to 2026.',
    ]);
  });

  test('counts that are the same in most seasons get no yearly rate', () => {
    const sentences = phraseTrend(
      input('no-clear-direction', trendOf(0, 0, 0, 0.6), {
        subject: 'The number of animals harmed by litter',
        unit: 'animals reported per season',
        qValue: 0.9,
        samples: { count: 40, firstYear: 2017, lastYear: 2026, noun: 'seasons' },
      }),
    );
    expect(sentences[2]).toBe('Most seasons had the same count, so we cannot give a yearly rate of change.');
    expect(sentences.join(' ')).not.toMatch(/0 to 0/);
  });

  test('too little data, with the reason in everyday words', () => {
    const trend: TrendResult = {
      n: 6,
      nCensored: 0,
      mannKendall: null,
      sen: null,
      insufficient: { rule: 'min-values', reason: 'only 6 seasons have samples, and we need at least 8' },
    };
    expect(phraseTrend(input('too-little-data', trend, { minValues: 8, samples: { count: 6, firstYear: 2025, lastYear: 2026 } }))).toEqual([
      'Too little data to say if beach litter is changing.',
      'Only 6 seasons have samples so far, and we need at least 8.',
      'This rests on 6 samples from 2025 to 2026.',
    ]);
  });

  test('too little data because most values are below what the lab can measure: said once', () => {
    const trend: TrendResult = {
      n: 35,
      nCensored: 27,
      mannKendall: null,
      sen: null,
      insufficient: { rule: 'mostly-censored', reason: 'most values are below the detection limit' },
    };
    expect(
      phraseTrend(
        input('too-little-data', trend, {
          subject: 'Plastic in the sea water',
          unit: 'particles per cubic metre of water',
          samples: { count: 35, firstYear: 2017, lastYear: 2026 },
        }),
      ),
    ).toEqual([
      'Too little data to say if plastic in the sea water is changing.',
      'In 27 of 35 seasons, the plastic was too little for the lab to measure.',
      'This rests on 35 samples from 2017 to 2026.',
    ]);
  });

  test('too little data because the samples cover too few years', () => {
    const trend: TrendResult = { n: 9, nCensored: 0, mannKendall: null, sen: null, insufficient: { rule: 'short-span', reason: 'values span less than 5 years' } };
    expect(phraseTrend(input('too-little-data', trend, { minYears: 5 }))[1]).toBe('The samples so far cover less than 5 years, and we need at least 5.');
  });

  test('no samples at all', () => {
    expect(phraseTrend(input('too-little-data', null, { samples: null }))).toEqual(['There are no samples of beach litter here yet, so we cannot say.']);
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
      'In 9 of 20 seasons, the plastic was too little for the lab to measure.',
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

  test('an uncertain change that rounds to 0 is said as close to no change', () => {
    expect(phraseTrend(input('no-clear-direction', trendOf(0.004, -1.6, 2.1, 0.8), { qValue: 0.9 })).slice(2, 4)).toEqual([
      'Our best guess is close to no change.',
      'The 95% confidence interval runs from 1.6 fewer to 2.1 more items per 100 m of beach each year.',
    ]);
  });

  test('a chance that rounds to 100 or 0 in 100 is not printed as certain', () => {
    expect(phraseTrend(input('rising', trendOf(6.2, 2.3, 10.1, 0.0004), { probabilityUp: 0.999 }))[1]).toBe('A rise is highly likely: the chance is more than 99 in 100.');
    expect(phraseTrend(input('falling', trendOf(-6.2, -10.1, -2.3, 0.0004), { probabilityUp: 0.001 }))[1]).toBe('A fall is highly likely: the chance is more than 99 in 100.');
  });

  test('a claimed rise is never printed as a change of 0', () => {
    const sentences = phraseTrend(input('rising', trendOf(0.04, 0.01, 0.9, 0.001)));
    expect(sentences.slice(2, 4)).toEqual(['That is about 0.04 more items per 100 m of beach each year.', 'The 95% confidence interval runs from 0.01 to 0.9 more.']);
  });
});

describe('interval and unit words', () => {
  test('an interval is told as plain amounts, never signed', () => {
    expect(intervalWords(2, 10, 0)).toBe('2 to 10 more');
    expect(intervalWords(-1.2, -0.4, 1)).toBe('0.4 to 1.2 fewer');
    expect(intervalWords(-2, 7, 0)).toBe('2 fewer to 7 more');
    expect(intervalWords(0, 0.5, 1)).toBe('no change to 0.5 more');
    expect(intervalWords(-0.02, 0, 2)).toBe('0.02 fewer to no change');
  });
  test('the unit after exactly 1 is singular', () => {
    expect(unitAfter('1', 'items per 100 m of beach')).toBe('item per 100 m of beach');
    expect(unitAfter('1', 'animals reported per season')).toBe('animal reported per season');
    expect(unitAfter('1.5', 'items per 100 m of beach')).toBe('items per 100 m of beach');
    expect(unitAfter('0.1', 'particles per cubic metre of water')).toBe('particles per cubic metre of water');
    expect(unitAfter('1', 'items/100 m')).toBe('item/100 m');
    expect(unitAfter('1', 'animals')).toBe('animal');
  });
  test('the interval never uses a word of the Hirsch et al. (2015) likelihood scheme', () => {
    const words = /\b(likely|unlikely|probably|probable|chance)\b/;
    for (const [slope, lower, upper] of [
      [6.2, 2.3, 10.1],
      [-0.83, -1.24, -0.41],
      [2.6, -1.8, 7.2],
      [0.2, -1.6, 2.1],
    ] as const) {
      for (const direction of ['rising', 'falling', 'no-clear-direction'] as const) {
        for (const s of rateSentences(input(direction, trendOf(slope, lower, upper, 0.01)))) expect(s).not.toMatch(words);
      }
    }
  });
});

/** The numbers an interval prints, in reading order (zeros are the words "no change"). */
function intervalNumbers(lower: number, upper: number): number[] {
  if (lower > 0) return [lower, upper];
  if (upper < 0) return [-upper, -lower];
  return [lower, upper].filter((x) => x !== 0).map(Math.abs);
}

describe('numbers in sentences equal the model numbers after the stated rounding', () => {
  test('slope and interval in the sentences are the width-rounded model values, as sizes with more/fewer', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -500, max: 500, noNaN: true }),
        fc.double({ min: 0.001, max: 300, noNaN: true }),
        fc.double({ min: 0.001, max: 300, noNaN: true }),
        (slope, below, above) => {
          const trend = trendOf(slope, slope - below, slope + above, 0.2);
          const phrase = input('no-clear-direction', trend, { qValue: 0.5 });
          const rate = printedRate(phrase);
          if (!rate || rate.lower === null || rate.upper === null) return false;
          const text = rateSentences(phrase).join(' ');
          if (/[+\u2212-]\d/.test(text)) return false; // no signed numbers
          const numbers = [...text.matchAll(/\d[\d,]*(?:\.\d+)?/g)].map((m) => Number(m[0].replace(/,/g, '')));
          if (rate.slope === 0 && rate.lower === 0 && rate.upper === 0) return numbers.length === 0;
          const interval = intervalNumbers(rate.lower, rate.upper);
          if (rate.slope === 0) {
            // "close to no change. The 95% confidence interval runs from <a> to <b> items per 100 m …"
            return JSON.stringify(numbers) === JSON.stringify([95, ...interval, 100]);
          }
          // "about <|slope|> more|fewer items per 100 m … The 95% confidence interval runs from …"
          const sizeFirst = numbers[0] === Math.abs(rate.slope) && text.includes(` ${rate.text.slope.replace('\u2212', '')} ${rate.slope > 0 ? 'more' : 'fewer'} `);
          return sizeFirst && JSON.stringify(numbers.slice(1)) === JSON.stringify([100, 95, ...interval]);
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe('no sentence claims a trend the false-discovery check does not support', () => {
  // Claims: "… is going up." / "… is going down.", the likelihood of a direction, and a claimed
  // rate, which always starts "That is about"; uncertain rates start "Our best guess".
  const claimWords = /going up\.|going down\.|^That is about|A rise is|A fall is/;
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
          const rates = rateSentences(input(direction, trend, { qValue: Math.max(0.05, p), probabilityUp }));
          return sentences.every((s) => !claimWords.test(s)) && rates.every((s) => /^(Our best guess|But the|The 95%|Most )/.test(s));
        },
      ),
      { numRuns: 300 },
    );
  });
  test('a claimed direction always says so in its first sentence', () => {
    expect(phraseTrend(input('rising', trendOf(6.2, 2.3, 10.1, 0.0004)))[0]).toMatch(claimWords);
    expect(phraseTrend(input('falling', trendOf(-6.2, -10.1, -2.3, 0.0004), { probabilityUp: 0.01 }))[0]).toMatch(claimWords);
  });
});

describe('counts with nothing reported', () => {
  test('say that nothing was reported rather than "too little data"', () => {
    expect(noneReportedSentences('animals harmed by litter', 2017, 2026)).toEqual([
      'No animals harmed by litter were reported here from 2017 to 2026, so there is no trend to tell.',
    ]);
  });
});

describe('case 3, rounding that hides a possible fall: a bound is never rounded to zero or across zero', () => {
  test('case 3: the interval −2.4 to +9.5 reads "from 2.4 fewer to 9.5 more", not "no change to 10 more"', () => {
    // Seen on a real-looking scenario: the width rule (width 11.9 → tens) printed −2.4 as "no change".
    expect(rateSentences(input('no-clear-direction', trendOf(3.1, -2.4, 9.5, 0.3)))).toEqual([
      'Our best guess is about 3.1 more items per 100 m of beach each year.',
      'But the 95% confidence interval runs from 2.4 fewer to 9.5 more, so there may be no change at all.',
    ]);
  });

  test('case 3: a sweep of intervals near zero keeps both ends, their signs and their words', () => {
    // Property (our own rule, stated in numbers.ts): for any interval around or near zero the words
    // show a nonzero number for a nonzero bound, "fewer" for a negative one and "more" for a positive one.
    const bound = fc.double({ min: -50, max: 50, noNaN: true, noDefaultInfinity: true }).filter((x) => x !== 0 && Math.abs(x) > 1e-6);
    fc.assert(
      fc.property(bound, bound, fc.double({ min: 0, max: 1, noNaN: true }), (a, b, f) => {
        const lower = Math.min(a, b);
        const upper = Math.max(a, b);
        fc.pre(upper > lower);
        const slope = lower + f * (upper - lower);
        const rate = printedRate(input('no-clear-direction', trendOf(slope, lower, upper, 0.4)));
        if (!rate || rate.lower === null || rate.upper === null) throw new Error('no rate');
        expect(Math.sign(rate.lower)).toBe(Math.sign(lower));
        expect(Math.sign(rate.upper)).toBe(Math.sign(upper));
        const text = rateSentences(input('no-clear-direction', trendOf(slope, lower, upper, 0.4))).join(' ');
        const runs = /runs from (.*?)(?:,| items| each|\.$)/u.exec(text)?.[1] ?? '';
        expect(runs).not.toMatch(/no change/u);
        if (lower < 0 && upper > 0) expect(runs).toMatch(/^[\d.,]+ fewer to [\d.,]+ more$/u);
        if (lower > 0) expect(runs).toMatch(/^[\d.,]+ to [\d.,]+ more$/u);
        if (upper < 0) expect(runs).toMatch(/^[\d.,]+ to [\d.,]+ fewer$/u);
        for (const n of runs.match(/[\d.,]+/gu) ?? []) expect(Number(n.replace(/,/gu, ''))).toBeGreaterThan(0);
      }),
      { numRuns: 2000, seed: 15 },
    );
    // a grid of intervals straddling zero, as a second, deterministic sweep
    for (let lo = -3; lo < 0; lo += 0.137) {
      for (let hi = 0.011; hi < 12; hi += 0.913) {
        const rate = printedRate(input('no-clear-direction', trendOf((lo + hi) / 2, lo, hi, 0.5)));
        expect(rate?.lower).toBeLessThan(0);
        expect(rate?.upper).toBeGreaterThan(0);
      }
    }
  });

  test('case 3: an interval that stays on one side keeps the width rule unless a bound would print as 0', () => {
    expect(rateSentences(input('rising', trendOf(6.2, 2.3, 10.1, 0.0004)))[1]).toBe('The 95% confidence interval runs from 2 to 10 more.');
    expect(rateSentences(input('rising', trendOf(5, 0.3, 12, 0.0004)))[1]).toBe('The 95% confidence interval runs from 0.3 to 12 more.');
  });
});
