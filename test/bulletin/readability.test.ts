import { describe, expect, test } from 'vitest';
import { countText, fleschKincaidGrade, fleschReadingEase, splitSentences, syllablesOfWord, withoutContactLines } from '../../generator/bulletin/readability.ts';
import { assertInDelta } from '../asserts.ts';

describe('Flesch formulas (Kincaid, Fishburne, Rogers & Chissom 1975)', () => {
  // Check values from the READMEs of the npm packages `flesch` and `flesch-kincaid`, which cite
  // Kincaid et al. 1975; the last two recomputed by hand from the formulas.
  test('Reading Ease of 1 sentence, 6 words, 6 syllables is 116.145', () => {
    assertInDelta(fleschReadingEase({ sentences: 1, words: 6, syllables: 6 }), 116.145, 1e-9);
  });
  test('Reading Ease of 1 sentence, 12 words, 23 syllables is 32.505', () => {
    assertInDelta(fleschReadingEase({ sentences: 1, words: 12, syllables: 23 }), 32.505, 1e-9);
  });
  test('1 sentence, 13 words, 26 syllables: ease 24.44, grade 13.08', () => {
    assertInDelta(fleschReadingEase({ sentences: 1, words: 13, syllables: 26 }), 24.44, 1e-9);
    assertInDelta(fleschKincaidGrade({ sentences: 1, words: 13, syllables: 26 }), 13.08, 1e-9);
  });
  test('5 sentences, 100 words, 150 syllables: grade 9.91, ease 59.635', () => {
    assertInDelta(fleschKincaidGrade({ sentences: 5, words: 100, syllables: 150 }), 9.91, 1e-9);
    assertInDelta(fleschReadingEase({ sentences: 5, words: 100, syllables: 150 }), 59.635, 1e-9);
  });
  test('no words gives null, never NaN', () => {
    expect(fleschKincaidGrade({ sentences: 0, words: 0, syllables: 0 })).toBeNull();
    expect(fleschReadingEase({ sentences: 0, words: 0, syllables: 0 })).toBeNull();
  });
});

describe('counting words, sentences and syllables', () => {
  test('the 6-word, 6-syllable sentence of the check value counts as such', () => {
    // "The cat sat on the mat." — one syllable per word (common English dictionary syllabification).
    expect(countText('The cat sat on the mat.')).toEqual({ sentences: 1, words: 6, syllables: 6 });
  });
  test('syllables of common words (dictionary syllabification)', () => {
    expect(syllablesOfWord('litter')).toBe(2);
    expect(syllablesOfWord('shellfish')).toBe(2);
    expect(syllablesOfWord('microplastics')).toBe(4);
    expect(syllablesOfWord('harvest')).toBe(2);
    expect(syllablesOfWord('beach')).toBe(1);
  });
  test('digits count one syllable each, as read aloud digit by digit', () => {
    expect(syllablesOfWord('2026')).toBe(4);
  });
  test('sentences end at . ! ? and at line breaks; decimals do not end a sentence', () => {
    expect(splitSentences('About 2.5 cm. Is it? Yes!\nNext line')).toEqual(['About 2.5 cm.', 'Is it?', 'Yes!', 'Next line']);
  });
});

describe('contact lines are left out of the score', () => {
  test('phone, email and web lines are removed, the prose is kept', () => {
    const text = 'Check with them first: Tessavar Board. Phone +00 555 0142. Email a-b@c.example.org. Web https://c.example.org/x-y';
    expect(withoutContactLines(text).trim()).toBe('Check with them first: Tessavar Board.');
  });
});
