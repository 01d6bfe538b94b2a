/**
 * Checks an Atom feed against RFC 4287 (Nottingham & Sayre 2005), section by section, with
 * vitest's expect, and returns what a test checks further (ids, dates, links). Shared by the
 * per-segment feeds (review-approve.test.ts) and the per-area feeds (national-coast-site.test.ts).
 */
import { expect } from 'vitest';

export interface AtomEntry {
  id: string;
  title: string;
  updated: string;
  published: string | null;
  alternate: string;
  summary: string;
}

export interface AtomFeed {
  id: string;
  title: string;
  updated: string;
  author: string;
  self: string[];
  alternate: string | null;
  entries: AtomEntry[];
}

// RFC 4287 §3.3: dates are RFC 3339 date-times, upper-case T and Z
export const rfc3339 = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(\.\d+)?(Z|[+-]\d{2}:\d{2})$/;

export async function checkAtomFeed(xml: string, label: string): Promise<AtomFeed> {
  const { parseDocument, DomUtils } = await import('htmlparser2');
  const doc = parseDocument(xml, { xmlMode: true });
  const feeds = DomUtils.getElementsByTagName('feed', doc, true);
  expect(feeds.length, label).toBe(1);
  const feed = feeds[0]!;
  expect(feed.attribs['xmlns'], label).toBe('http://www.w3.org/2005/Atom'); // §2: the Atom namespace
  const child = (parent: typeof feed, name: string) => DomUtils.getChildren(parent).filter((n): n is typeof feed => DomUtils.isTag(n) && n.name === name);
  const text = (parent: typeof feed, name: string): string => DomUtils.textContent(child(parent, name)[0]!);
  // §4.1.1: exactly one id, title, updated; an author (no entry has its own); a self link (SHOULD)
  for (const name of ['id', 'title', 'updated']) expect(child(feed, name).length, `${label} feed ${name}`).toBe(1);
  expect(child(feed, 'author').length, label).toBe(1);
  expect(child(child(feed, 'author')[0]!, 'name').length, `${label}: §3.2 author name`).toBe(1);
  const links = child(feed, 'link');
  const alternates = links.filter((l) => l.attribs['rel'] === 'alternate');
  expect(alternates.length, label).toBeLessThanOrEqual(1); // §4.1.1: at most one alternate per type/hreflang
  const feedId = text(feed, 'id');
  expect(feedId).toMatch(/^tag:[^,]+,\d{4}:/); // §4.2.6: an IRI; here a tag URI (RFC 4151 §2.1)
  const feedUpdated = text(feed, 'updated');
  expect(feedUpdated).toMatch(rfc3339);
  const entries: AtomEntry[] = [];
  const ids = new Set<string>();
  let latest = '';
  for (const entry of child(feed, 'entry')) {
    // §4.1.2: exactly one id, title, updated; no content, so an alternate link (MUST)
    for (const name of ['id', 'title', 'updated']) expect(child(entry, name).length, `${label} entry ${name}`).toBe(1);
    const alternate = child(entry, 'link').filter((l) => l.attribs['rel'] === 'alternate');
    expect(alternate.length, label).toBe(1);
    const id = text(entry, 'id');
    expect(id).toMatch(/^tag:[^,]+,\d{4}:/);
    expect(ids.has(id), `${label}: §4.2.6 ids unique within the feed (${id})`).toBe(false);
    ids.add(id);
    const updated = text(entry, 'updated');
    expect(updated).toMatch(rfc3339);
    if (updated > latest) latest = updated;
    const published = child(entry, 'published').length > 0 ? text(entry, 'published') : null;
    if (published !== null) expect(published).toMatch(rfc3339);
    entries.push({
      id,
      title: text(entry, 'title'),
      updated,
      published,
      alternate: alternate[0]!.attribs['href']!,
      summary: child(entry, 'summary').length > 0 ? text(entry, 'summary') : '',
    });
  }
  // §4.2.15: the feed's updated is the latest significant change, its entries'
  if (entries.length > 0) expect(feedUpdated, label).toBe(latest);
  return {
    id: feedId,
    title: text(feed, 'title'),
    updated: feedUpdated,
    author: DomUtils.textContent(child(child(feed, 'author')[0]!, 'name')[0]!),
    self: links.filter((l) => l.attribs['rel'] === 'self').map((l) => l.attribs['href']!),
    alternate: alternates[0]?.attribs['href'] ?? null,
    entries,
  };
}
