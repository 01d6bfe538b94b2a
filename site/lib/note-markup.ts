/**
 * The publisher's notes (model `notes`) as HTML: a safe subset of Markdown, rendered with
 * markdown-it with raw HTML off and only these rules on: paragraphs, line breaks, links,
 * emphasis (and strong) and lists. Everything else — headings, code, images, tables, raw HTML,
 * entities — stays as the plain text it was typed as, escaped. Links may only go to http(s),
 * mailto or a path on this site; any other scheme (javascript:, data:, vbscript:, …) stays text.
 */
import MarkdownIt from 'markdown-it';

/** Link targets allowed in a note: web pages, e-mail, and paths of this site (not "//host"). */
export function allowedNoteLink(url: string): boolean {
  const trimmed = url.trim();
  if (/^(https?:\/\/|mailto:)/i.test(trimmed)) return true;
  return trimmed.startsWith('/') && !trimmed.startsWith('//') && !trimmed.startsWith('/\\');
}

const markdown = new MarkdownIt('zero', { html: false, linkify: false, typographer: false, breaks: false }).enable(['link', 'emphasis', 'list', 'newline']);
markdown.validateLink = allowedNoteLink;
// Links leave the site without passing on where the reader came from.
const defaultLinkOpen = markdown.renderer.rules['link_open'];
markdown.renderer.rules['link_open'] = (tokens, idx, options, env, self) => {
  const token = tokens[idx];
  if (token && /^https?:/i.test(token.attrGet('href') ?? '')) token.attrSet('rel', 'noopener noreferrer');
  return defaultLinkOpen ? defaultLinkOpen(tokens, idx, options, env, self) : self.renderToken(tokens, idx, options);
};

export function noteHtml(text: string): string {
  return markdown.render(text);
}
