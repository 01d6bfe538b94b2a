/**
 * Readability scores of bulletin text.
 *
 * Flesch Reading Ease      FRE  = 206.835 − 1.015 (W/S) − 84.6 (Syl/W)
 * Flesch–Kincaid Grade     FKGL = 0.39 (W/S) + 11.8 (Syl/W) − 15.59
 * where W = words, S = sentences, Syl = syllables.
 * References: Kincaid, Fishburne, Rogers & Chissom (1975), "Derivation of new readability formulas
 * … for Navy enlisted personnel", Research Branch Report 8-75, Naval Technical Training Command,
 * Millington TN (FKGL, and the recalculated Flesch Reading Ease formula).
 *
 * Counting: a word is a run of letters, digits, apostrophes or inner hyphens/dots ("100", "2.5",
 * "shellfish-sanitation" is one word, as a reader sees it); a sentence ends at ".", "!" or "?"
 * followed by a space or the end, or at a line break; a text with words but no end mark counts as
 * one sentence. Syllables come from the `syllable` package (English rules plus exceptions);
 * a word made of digits counts the syllables of the number as read aloud, approximated by
 * its digits (one each, "2026" → 4), which over-counts long numbers slightly: on the safe side.
 */
import { syllable } from 'syllable';

export interface TextCounts {
  sentences: number;
  words: number;
  syllables: number;
}

const wordPattern = /[\p{L}\p{N}]+(?:[''.,-][\p{L}\p{N}]+)*/gu;

export function splitSentences(text: string): string[] {
  return text
    .split(/(?<=[.!?])\s+|\n+/u)
    .map((part) => part.trim())
    .filter((part) => wordsOf(part).length > 0);
}

export function wordsOf(text: string): string[] {
  return text.match(wordPattern) ?? [];
}

export function syllablesOfWord(word: string): number {
  if (/^[\p{N}.,]+$/u.test(word)) return Math.max(1, word.replace(/[^\p{N}]/gu, '').length);
  return Math.max(1, syllable(word));
}

export function countText(text: string): TextCounts {
  const sentences = splitSentences(text);
  const words = sentences.flatMap(wordsOf);
  const syllables = words.reduce((sum, word) => sum + syllablesOfWord(word), 0);
  return { sentences: sentences.length, words: words.length, syllables };
}

/** Flesch Reading Ease from counts (Kincaid et al. 1975). */
export function fleschReadingEase(counts: TextCounts): number | null {
  if (counts.words === 0 || counts.sentences === 0) return null;
  return 206.835 - 1.015 * (counts.words / counts.sentences) - 84.6 * (counts.syllables / counts.words);
}

/** Flesch–Kincaid Grade Level from counts (Kincaid et al. 1975). */
export function fleschKincaidGrade(counts: TextCounts): number | null {
  if (counts.words === 0 || counts.sentences === 0) return null;
  return 0.39 * (counts.words / counts.sentences) + 11.8 * (counts.syllables / counts.words) - 15.59;
}

/**
 * Contact lines ("Phone +00 555 0142." "Email a@b.example." "Web https://…", as written by
 * generator/bulletin/contacts.ts) are not prose: a phone number or a web address is copied, not
 * read. They are removed before scoring, as readability checkers commonly skip addresses.
 */
export function withoutContactLines(text: string): string {
  return text.replace(/\b(?:Phone|Email|Web) \S+(?: \S+)*?(?:\.(?=\s|$)|$)/gmu, ' ').replace(/[ \t]+/g, ' ');
}

/** Both scores of a text (or several texts read as one), contact lines left out. */
export function readability(text: string | readonly string[]): { counts: TextCounts; grade: number | null; ease: number | null } {
  const joined = withoutContactLines(typeof text === 'string' ? text : text.join('\n'));
  const counts = countText(joined);
  return { counts, grade: fleschKincaidGrade(counts), ease: fleschReadingEase(counts) };
}
