/**
 * Exact wording of the visitors' and growers' sections where numbers meet benchmarks: the beach-litter
 * threshold value used in the European Union (20 items per 100 m; Van Loon et al. 2020, JRC — a
 * benchmark for EU coasts, not a legal limit) and modelled drift arrivals (particles of a model,
 * not counted litter).
 */
import { describe, expect, test } from 'vitest';
import { driftSentences, thresholdSentence, visitorsSection } from '../../generator/bulletin/sections.ts';
import { formatPlain } from '../../generator/bulletin/numbers.ts';

describe('the beach-litter threshold value', () => {
  test('above, equal (on the printed number) and below, never called a limit', () => {
    expect(thresholdSentence(83, 20)).toBe(
      'That is above the threshold value used in the European Union (20 items per 100 m). It is a yardstick for judging beaches, not a legal limit.',
    );
    // 20.3 prints as "20", so the words say "the same as", not "above".
    expect(thresholdSentence(20.3, 20)).toBe(
      'That is the same as the threshold value used in the European Union (20 items per 100 m). It is a yardstick for judging beaches, not a legal limit.',
    );
    expect(thresholdSentence(12, 20)).toBe(
      'That is below the threshold value used in the European Union (20 items per 100 m). It is a yardstick for judging beaches, not a legal limit.',
    );
  });
});

describe('modelled drift arrivals', () => {
  test('said as modelled particles, with what they show and do not show', () => {
    expect(driftSentences(3.6)).toEqual([
      'In the drift model, about 3.6 modelled particles per km of shore reached this stretch this season.',
      'This shows where floating litter tends to go, not how much there is.',
    ]);
    expect(driftSentences(0)[0]).toBe('In the drift model, no modelled particles reached this stretch this season.');
    expect(driftSentences(1.04)[0]).toBe('In the drift model, about 1 modelled particle per km of shore reached this stretch this season.');
  });
  test('the visitors section uses the plain number and a singular unit after 1', () => {
    const section = visitorsSection({ litter: { seasonValue: 1, unit: 'items per 100 m of beach', threshold: { value: 20 }, trendSentences: [] }, drift: null });
    expect(section.sentences[0]).toBe('Beach surveys this season found a median of 1 item per 100 m of beach.');
  });
});

describe('plain numbers', () => {
  test('the same rounded number as two significant figures, trailing zeros dropped', () => {
    expect(formatPlain(0.08)).toBe('0.08');
    expect(formatPlain(3)).toBe('3');
    expect(formatPlain(0.0996)).toBe('0.1');
    expect(formatPlain((37 * 100) / 85)).toBe('44'); // Galgani et al. 2013 normalisation (check value 14)
    expect(formatPlain(1234)).toBe('1,200');
    expect(formatPlain(0.4712)).toBe('0.47');
  });
});
