import { describe, expect, test } from 'vitest';
import {
  directionChangeSentence,
  headline,
  levelAndTrendSentence,
  levelChangeSentence,
  levelChangeWithReason,
  levelLastSeasonSentence,
  levelNowSentence,
  levelSummarySentence,
  mainTrendSentence,
  seasonCountSentence,
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
  test('headline: rising or falling first (claimed directions only), then how bad it is now', () => {
    expect(headline('Gullhaven Sands', marked, 'Autumn 2026', [{ subject: 'Beach litter', direction: 'rising' }])).toBe(
      'Beach litter is going up at Gullhaven Sands, where plastic pollution is Marked (level 3 of 4) in autumn 2026.',
    );
    expect(
      headline('Gullhaven Sands', marked, 'Autumn 2026', [
        { subject: 'Plastic in the sea water', direction: 'rising' },
        { subject: 'Plastic in shellfish', direction: 'falling' },
        { subject: 'Beach litter', direction: 'no-clear-direction' },
      ]),
    ).toBe('Plastic in the sea water is going up, and plastic in shellfish is going down at Gullhaven Sands, where plastic pollution is Marked (level 3 of 4) in autumn 2026.');
    expect(headline('Gullhaven Sands', noticeable, 'Autumn 2026', [{ subject: 'Beach litter', direction: 'no-clear-direction' }])).toBe(
      'No clear rise or fall in plastic at Gullhaven Sands, where plastic pollution is Noticeable (level 2 of 4) in autumn 2026.',
    );
    expect(headline('Gullhaven Sands', noticeable, 'Autumn 2026', [{ subject: 'Beach litter', direction: 'too-little-data' }])).toBe(
      'Too soon to tell if plastic is rising or falling at Gullhaven Sands, where plastic pollution is Noticeable (level 2 of 4) in autumn 2026.',
    );
    expect(headline('Gullhaven Sands', marked, 'Autumn 2026')).toBe('Gullhaven Sands: plastic pollution is Marked (level 3 of 4) in autumn 2026.');
    expect(headline('Gullhaven Sands', marked, 'Autumn 2026', [])).toBe(
      'No samples here yet show a rise or fall in plastic at Gullhaven Sands, where plastic pollution is Marked (level 3 of 4) in autumn 2026.',
    );
  });
  test('level now and last season', () => {
    expect(levelNowSentence(marked)).toBe('The level this season is Marked (level 3 of 4).');
    expect(levelLastSeasonSentence(noticeable)).toBe('Last season it was Noticeable (level 2 of 4).');
    expect(levelLastSeasonSentence(null)).toBe('We have no level for last season.');
  });
  test('level now and last season in one summary sentence', () => {
    expect(levelSummarySentence(marked, marked)).toBe('The level this season is Marked (level 3 of 4), the same as last season.');
    expect(levelSummarySentence(noticeable, marked)).toBe('The level this season is Noticeable (level 2 of 4), down from Marked (level 3 of 4) last season.');
    expect(levelSummarySentence(marked, noticeable)).toBe('The level this season is Marked (level 3 of 4), up from Noticeable (level 2 of 4) last season.');
    expect(levelSummarySentence(marked, null)).toBe('The level this season is Marked (level 3 of 4). We have no level for last season.');
  });
  test('why this level: the rule that set it, or the default', () => {
    expect(whySentence(marked)).toBe('Why this level: the Clean Coast Index is 14, above 10: the beach is dirty.');
    expect(whySentence({ ...marked, hits: [{ ruleId: 'x', level: 'marked', text: 'Beach litter in the last four seasons has a median of 160 items per 100 m.' }] })).toBe(
      'Why this level: beach litter in the last four seasons has a median of 160 items per 100 m.',
    );
    expect(whySentence({ id: 'scant', rank: 1, label: 'Scant', hits: [] })).toBe('No rule for a higher level applies here, so the level is the lowest.');
  });
  test('level up', () => {
    expect(levelChangeSentence(marked, noticeable)).toBe('The level went up from Noticeable (level 2 of 4) to Marked (level 3 of 4).');
  });
  test('level down', () => {
    expect(levelChangeSentence(noticeable, marked)).toBe('The level went down from Marked (level 3 of 4) to Noticeable (level 2 of 4).');
  });
  test('level change with the rule that started or stopped applying', () => {
    expect(levelChangeWithReason(noticeable, marked, 'the median beach litter over the last four seasons is now 92 items per 100 m of beach, below 100')).toBe(
      'The level went down from Marked (level 3 of 4) to Noticeable (level 2 of 4) because the median beach litter over the last four seasons is now 92 items per 100 m of beach, below 100.',
    );
    expect(levelChangeWithReason(noticeable, marked, null)).toBe('The level went down from Marked (level 3 of 4) to Noticeable (level 2 of 4).');
    expect(levelChangeWithReason(marked, marked, 'anything')).toBe('The level stayed at Marked (level 3 of 4).');
  });
  test('a level that moved against a trend says why the two can differ', () => {
    const rising = [{ subject: 'Beach litter', direction: 'rising' as const }];
    expect(levelAndTrendSentence(noticeable, marked, rising)).toBe('The level looks at the last four seasons; the trend looks at all the years, so the two can differ.');
    expect(levelAndTrendSentence(marked, noticeable, rising)).toBeNull();
    expect(levelAndTrendSentence(marked, marked, rising)).toBeNull();
  });
  test('level the same, and no last season', () => {
    expect(levelChangeSentence(marked, marked)).toBe('The level stayed at Marked (level 3 of 4).');
    expect(levelChangeSentence(marked, null)).toBeNull();
  });
  test('what changed since last season', () => {
    expect(directionChangeSentence('Beach litter', 'rising', 'no-clear-direction')).toBe('Last season we could not tell if beach litter was going up or down; now it is going up.');
    expect(directionChangeSentence('Beach litter', 'no-clear-direction', 'falling')).toBe('Last season beach litter was going down; now we cannot tell if it is going up or down.');
    expect(directionChangeSentence('Plastic in shellfish', 'falling', 'too-little-data')).toBe(
      'Last season there was too little data to tell if plastic in shellfish was changing; now it is going down.',
    );
    expect(directionChangeSentence('Beach litter', 'rising', 'rising')).toBeNull();
    expect(seasonValueSentence('Beach litter', 'items per 100 m of beach', '44', '30')).toBe('Beach litter this season: 44 items per 100 m of beach, against 30 last season.');
  });
  test('counts of animals: whole numbers, singular and plural, and "no" for zero', () => {
    expect(seasonCountSentence('animals harmed by litter', 0, 0)).toBe('No animals harmed by litter were reported this season or last season.');
    expect(seasonCountSentence('animals harmed by litter', 1, 3)).toBe('1 animal harmed by litter was reported this season, against 3 last season.');
    expect(seasonCountSentence('animals harmed by litter', 4, 0)).toBe('4 animals harmed by litter were reported this season, against none last season.');
    expect(seasonCountSentence('animals harmed by litter', 0, 1)).toBe('No animals harmed by litter were reported this season, against 1 last season.');
    expect(seasonCountSentence('animals harmed by litter', 2, null)).toBe('2 animals harmed by litter were reported this season.');
    expect(seasonCountSentence('animals harmed by litter', 1, 1)).toBe('1 animal harmed by litter was reported this season, the same as last season.');
    expect(seasonCountSentence('animals harmed by litter', null, 2)).toBeNull();
  });
  test('main trend of the summary', () => {
    expect(
      mainTrendSentence([
        { subject: 'Beach litter', direction: 'rising' },
        { subject: 'Plastic in shellfish', direction: 'falling' },
      ]),
    ).toBe('Beach litter is going up, and plastic in shellfish is going down.');
    expect(mainTrendSentence([{ subject: 'Beach litter', direction: 'no-clear-direction' }])).toBe('No measure here is clearly going up or down.');
    expect(mainTrendSentence([{ subject: 'Beach litter', direction: 'too-little-data' }])).toBe('There are too few samples here yet to tell if any measure is going up or down.');
  });
  test('the methods page explains the false-discovery check in two sentences', () => {
    const [first, second] = falseAlarmSentences(0.05);
    expect(first).toBe('When we test many stretches of coast at once, a few will seem to change by chance alone.');
    expect(second).toContain('Benjamini–Hochberg');
    expect(second).toContain('about 5% of the changes we report');
  });
});
