/**
 * Finds the invisible bidirectional control characters in a text value: the embeddings,
 * overrides and isolates of Unicode Standard Annex #9 (table 4: LRE U+202A, RLE U+202B, PDF
 * U+202C, LRO U+202D, RLO U+202E, LRI U+2066, RLI U+2067, FSI U+2068, PDI U+2069) and the marks
 * LRM U+200E, RLM U+200F, ALM U+061C. Unicode Technical Report #36 §2.1 describes how they make
 * text display in another order than it is stored. The text is kept; pages show user text
 * isolated (`dir="auto"`), and the report names the characters.
 */
const bidiPattern = /[\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069]/g;

/** The distinct controls found, as "U+202E" codes in order of first appearance (empty when none). */
export function bidiControls(text: string): string[] {
  const found = text.match(bidiPattern);
  if (!found) return [];
  return [...new Set(found)].map((c) => `U+${(c.codePointAt(0) ?? 0).toString(16).toUpperCase().padStart(4, '0')}`);
}

/**
 * The text as an isolate when it holds direction controls: wrapped in FIRST STRONG ISOLATE
 * (U+2068) and POP DIRECTIONAL ISOLATE (U+2069), the plain-text form of HTML's <bdi> (UAX #9,
 * rule X6a: a PDI ends every embedding and override opened inside the isolate). Wherever the
 * text is then shown — a heading, a sentence, a page title, the feed — an override inside it
 * cannot reorder the words around it. Text without controls is returned unchanged.
 */
export function isolateBidi(text: string): string {
  return bidiControls(text).length === 0 ? text : `\u2068${text}\u2069`;
}
