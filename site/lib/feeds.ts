/**
 * Atom feeds (RFC 4287): the site-wide feed of every bulletin and one feed per segment, built
 * from the bulletin listings only. One function writes any feed from a list of bulletins, so a
 * feed per area is one more route that passes that area's bulletins (`segmentFeedPath` and
 * `feedForBulletins`); the model has no areas yet.
 *
 * - Entry ids are tag URIs (RFC 4151) from the region, season and segment ids: the same entry
 *   has the same id in every feed it appears in, and never changes (RFC 4287 §4.2.6).
 * - Every date comes from the scenario (publication and correction dates), never the clock:
 *   an entry's `updated` is its correction date when later than its publication (§4.2.15),
 *   the feed's `updated` the latest of its entries'.
 * - The feed and entry titles carry the publisher's name (the author, §4.2.1).
 */
import type { BulletinListing } from '../../generator/model/listing.ts';
import { escapeXml } from './format.ts';
import { permalinkOf } from './bulletin-view.ts';

export interface FeedContext {
  regionId: string;
  publisher: string;
  invented: boolean;
  generatorVersion: string;
  /** Year of the first publication: the date of the tag URIs (RFC 4151 §2.1). */
  tagYear: string;
}

export function segmentFeedPath(segmentId: string): string {
  return `/feeds/${segmentId}.xml`;
}

export function tagUri(context: FeedContext, rest: string): string {
  return `tag:wrackline,${context.tagYear}:${encodeURIComponent(context.regionId)}/${rest}`;
}

const stamp = (date: string): string => `${date.slice(0, 10)}T00:00:00Z`;

function entryUpdated(b: BulletinListing): string {
  return stamp(b.correction && b.correction.date > b.published ? b.correction.date : b.published);
}

function entryXml(context: FeedContext, b: BulletinListing): string {
  const summary = [b.invented ? 'Invented data for demonstration. ' : '', b.headline, b.correction ? ` Corrected on ${b.correction.date}: ${b.correction.reason}` : ''].join('');
  return [
    '  <entry>',
    `    <id>${escapeXml(tagUri(context, `${b.season.id}/${b.segment.id}`))}</id>`,
    `    <title>${escapeXml(`${b.segment.name}, ${b.season.label}: ${b.level.rank > 0 ? `${b.level.label} (level ${b.level.rank} of 4)` : b.level.label}`)}</title>`,
    `    <link rel="alternate" type="text/html" href="${escapeXml(permalinkOf(b))}"/>`,
    `    <link rel="enclosure" type="application/json" href="${escapeXml(`${permalinkOf(b)}bulletin.json`)}"/>`,
    `    <published>${stamp(b.published)}</published>`,
    `    <updated>${entryUpdated(b)}</updated>`,
    `    <summary>${escapeXml(summary)}</summary>`,
    '  </entry>',
  ].join('\n');
}

/** A whole feed of the given bulletins, newest season first (then as given). */
export function feedForBulletins(
  context: FeedContext,
  feed: { id: string; title: string; selfHref: string; alternateHref: string },
  bulletins: readonly BulletinListing[],
): string {
  const ordered = [...bulletins].sort((a, b) => (a.season.start < b.season.start ? 1 : a.season.start > b.season.start ? -1 : 0));
  const updated = ordered.reduce((latest, b) => (entryUpdated(b) > latest ? entryUpdated(b) : latest), '');
  return [
    '<?xml version="1.0" encoding="utf-8"?>',
    '<feed xmlns="http://www.w3.org/2005/Atom">',
    `  <id>${escapeXml(tagUri(context, feed.id))}</id>`,
    `  <title>${escapeXml(`${feed.title}${context.invented ? ' (invented data)' : ''}`)}</title>`,
    `  <updated>${updated || '2000-01-01T00:00:00Z'}</updated>`,
    `  <author><name>${escapeXml(context.publisher)}</name></author>`,
    `  <link rel="self" type="application/atom+xml" href="${escapeXml(feed.selfHref)}"/>`,
    `  <link rel="alternate" type="text/html" href="${escapeXml(feed.alternateHref)}"/>`,
    `  <generator version="${escapeXml(context.generatorVersion)}">Wrackline</generator>`,
    ...ordered.map((b) => entryXml(context, b)),
    '</feed>',
    '',
  ].join('\n');
}
