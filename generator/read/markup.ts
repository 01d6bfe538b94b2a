/**
 * Spots HTML or script markup in a text value. Such text is kept exactly as written and always
 * shown as plain text (escaped on output); the report only points it out.
 */
const markupPattern = /<\s*\/?\s*[a-z!][^>]*>|javascript:|&#?[a-z0-9]+;|\bon[a-z]+\s*=/i;

export function containsMarkup(text: string): boolean {
  return markupPattern.test(text);
}
