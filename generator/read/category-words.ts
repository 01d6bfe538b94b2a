/**
 * Matching a category value as agencies type it against the words Wrackline uses: after trimming,
 * case folding and treating spaces, hyphens and underscores alike ("Island shore", "island_shore"
 * and "island-shore" are one value), and through a short list of documented synonyms. A value that
 * still does not match gets the nearest allowed word as a suggestion (Levenshtein edit distance,
 * fastest-levenshtein), when one is close.
 */
import { closest, distance } from 'fastest-levenshtein';

/** Synonyms per allowed word: folded spelling → the word it means. */
export type Synonyms = { readonly [folded: string]: string };

/** Trimmed, lower case, runs of spaces, hyphens and underscores made one hyphen. */
export function foldCategory(value: string): string {
  return value
    .trim()
    .toLowerCase()
    .replace(/[\s_-]+/g, '-');
}

/**
 * Synonyms accepted in segment properties, with what they mean. Shellfish use "yes" says shellfish
 * are taken but not how: it is read as farmed-and-gathered, so that both the growers' and the
 * gatherers' cautions are shown (the careful reading); "no" means none.
 */
export const segmentCategoryWords: { kind: Synonyms; shellfish: Synonyms } = {
  kind: { harbor: 'harbour', island: 'island-shore', 'island-coast': 'island-shore', rocky: 'rocky-shore', 'rocky-coast': 'rocky-shore', 'sandy-beach': 'beach' },
  shellfish: {
    yes: 'farmed-and-gathered',
    y: 'farmed-and-gathered',
    true: 'farmed-and-gathered',
    both: 'farmed-and-gathered',
    no: 'none',
    n: 'none',
    false: 'none',
    farm: 'farmed',
    farming: 'farmed',
    aquaculture: 'farmed',
    gathering: 'gathered',
    harvested: 'gathered',
  },
};

/** The nearest allowed word when it is close enough to be a likely typing slip, else null. */
export function nearestWord(value: string, allowed: readonly string[]): string | null {
  if (allowed.length === 0 || value.trim() === '') return null;
  const folded = foldCategory(value);
  const candidate = closest(folded, [...allowed]);
  const cost = distance(folded, candidate);
  // Common practice: one slip per four characters, at least one and at most three.
  const limit = Math.min(3, Math.max(1, Math.floor(candidate.length / 4)));
  return cost <= limit ? candidate : null;
}

export type CategoryMatch = { ok: true; value: string } | { ok: false; suggestion: string | null };

/** The allowed word a value stands for, or the nearest word to suggest. */
export function matchCategory(value: string, allowed: readonly string[], synonyms: Synonyms = {}): CategoryMatch {
  if (allowed.includes(value)) return { ok: true, value };
  const folded = foldCategory(value);
  const direct = allowed.find((word) => foldCategory(word) === folded);
  if (direct !== undefined) return { ok: true, value: direct };
  const meant = synonyms[folded];
  if (meant !== undefined && allowed.includes(meant)) return { ok: true, value: meant };
  return { ok: false, suggestion: nearestWord(value, allowed) };
}

/** " Did you mean "x"?" or nothing. */
export function didYouMean(suggestion: string | null): string {
  return suggestion === null ? '' : `; did you mean "${suggestion}"?`;
}
