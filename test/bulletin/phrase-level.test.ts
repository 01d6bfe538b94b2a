import { describe, expect, test } from 'vitest';
import {
  directionChangeSentence,
  headline,
  levelChangeSentence,
  levelLastSeasonSentence,
  levelNowSentence,
  mainTrendSentence,
  seasonValueSentence,
  whySentence,
} from '../../generator/bulletin/phrase-level.ts';
import { falseAlarmSentences } from '../../generator/bulletin/methods.ts';
import type { LevelResult } from '../../generator/model/types.ts';

const noticeable: LevelResult = { id: 'noticeable', rank: 2, label: 'Noticeable', hits: [] };
const marked: LevelResult = {
  id: 'marked',
  rank: 3,
  label: 'Marked',
  hits: [{ ruleId: 'clean-coast-dirty', level: 'marked', text: 'The Clean Coast Index is 14, above 10: the beach is dirty.' }],
};

describe('level sentences', () => {
  test('headline names the place, the level in words with its rank, and the season', () => {
    expect(headline('Gullhaven Sands', marked, 'Autumn 2026')).toBe('Gullhaven Sands: plastic pollution is Marked (level 3 of 4) in autumn 2026.');
  });
  test('level now and last season', () => {
    expect(levelNowSentence(marked)).toBe('The level this season is Marked (level 3 of 4).');
    expect(levelLastSeasonSentence(noticeable)).toBe('Last season it was Noticeable (level 2 of 4).');
    expect(levelLastSeasonSentence(null)).toBe('We have no level for last season.');
  });
  test('why this level: the rule that set it, or the default', () => {
    expect(whySentence(marked)).toBe('Why this level: The Clean Coast Index is 14, above 10: the beach is dirty.');
    expect(whySentence({ id: 'scant', rank: 1, label: 'Scant', hits: [] })).toBe(
      'No rule for a higher level matched, so the level is the lowest.',
    );
  });
  test('level up', () => {
    expect(levelChangeSentence(marked, noticeable)).toBe('The level went up from Noticeable (level 2 of 4) to Marked (level 3 of 4).');
  });
  test('level down', () => {
    expect(levelChangeSentence(noticeable, marked)).toBe('The level went down from Marked (level 3 of 4) to Noticeable (level 2 of 4).');
  });
  test('level the same, and no last season', () => {
    expect(levelChangeSentence(marked, marked)).toBe('The level stayed at Marked (level 3 of 4).');
    expect(levelChangeSentence(marked, null)).toBeNull();
  });
  test('what changed since last season', () => {
    expect(directionChangeSentence('Beach litter', 'rising', 'no-clear-direction')).toBe(
      'Beach litter: last season no clear direction; now going up.',
    );
    expect(directionChangeSentence('Beach litter', 'rising', 'rising')).toBeNull();
    expect(seasonValueSentence('Beach litter', 'items per 100 m of beach', '44', '30')).toBe(
      'Beach litter this season: 44 items per 100 m of beach, against 30 last season.',
    );
  });
  test('main trend of the summary', () => {
    expect(mainTrendSentence([{ subject: 'Beach litter', direction: 'rising' }, { subject: 'Plastic in shellfish', direction: 'falling' }])).toBe(
      'Beach litter is going up, and plastic in shellfish is going down.',
    );
    expect(mainTrendSentence([{ subject: 'Beach litter', direction: 'no-clear-direction' }])).toBe(
      'No measure here is clearly going up or down.',
    );
  });
  test('the methods page explains the false-discovery check in two sentences', () => {
    const [first, second] = falseAlarmSentences(0.05);
    expect(first).toBe('When we test many stretches of coast at once, a few will seem to change by chance alone.');
    expect(second).toContain('Benjamini–Hochberg');
    expect(second).toContain('about 5% of the changes we report');
  });
});
