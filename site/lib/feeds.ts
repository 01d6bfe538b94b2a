/**
 * Atom feeds (RFC 4287): the site-wide feed of every bulletin and one feed per segment, built
 * from the bulletin listings only (`segmentFeedPath`, `feedForBulletins`), and on a national coast
 * shown by areas one feed per area, an entry per published season with the area's headline and
 * highest level, from the region summaries (`areaFeedPath`, `feedForArea`).
 *
 * - Entry ids are tag URIs (RFC 4151) from the region, season and segment ids (area entries:
 *   "areas/<area>/<season>"): the same entry has the same id in every feed it appears in, and
 *   never changes (RFC 4287 §4.2.6).
 * - Every date comes from the scenario (publication and correction dates), never the clock:
 *   an entry's `updated` is its correction date when later than its publication (§4.2.15),
 *   the feed's `updated` the latest of its entries'.
 * - The feed and entry titles carry the publisher's name (the author, §4.2.1).
 */
import type { BulletinListing } from '../../generator/model/listing.ts';
import type { AreaSummary } from '../../generator/model/types.ts';
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

export function areaFeedPath(areaId: string): string {
  return `/feeds/areas/${areaId}.xml`;
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

interface FeedHead {
  id: string;
  title: string;
  selfHref: string;
  alternateHref: string;
}

/** The feed element around its entries; `updated` is the latest of the entries' (§4.2.15). */
function feedXml(context: FeedContext, feed: FeedHead, updated: string, entries: readonly string[]): string {
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
    ...entries,
    '</feed>',
    '',
  ].join('\n');
}

/** A whole feed of the given bulletins, newest season first (then as given). */
export function feedForBulletins(context: FeedContext, feed: FeedHead, bulletins: readonly BulletinListing[]): string {
  const ordered = [...bulletins].sort((a, b) => (a.season.start < b.season.start ? 1 : a.season.start > b.season.start ? -1 : 0));
  const updated = ordered.reduce((latest, b) => (entryUpdated(b) > latest ? entryUpdated(b) : latest), '');
  return feedXml(
    context,
    feed,
    updated,
    ordered.map((b) => entryXml(context, b)),
  );
}

/** One season of an area: the season (with its publication date), the area's summary of it, and the page the entry links to. */
export interface AreaFeedEntry {
  season: { id: string; label: string; start: string; published: string };
  area: Pick<AreaSummary, 'id' | 'name' | 'headline' | 'level'>;
  href: string;
}

function areaEntryXml(context: FeedContext, e: AreaFeedEntry, invented: boolean): string {
  const level = e.area.level.rank > 0 ? `highest level ${e.area.level.label} (level ${e.area.level.rank} of 4)` : e.area.level.label;
  return [
    '  <entry>',
    `    <id>${escapeXml(tagUri(context, `areas/${e.area.id}/${e.season.id}`))}</id>`,
    `    <title>${escapeXml(`${e.area.name}, ${e.season.label}: ${level}`)}</title>`,
    `    <link rel="alternate" type="text/html" href="${escapeXml(e.href)}"/>`,
    `    <published>${stamp(e.season.published)}</published>`,
    `    <updated>${stamp(e.season.published)}</updated>`,
    `    <summary>${escapeXml(`${invented ? 'Invented data for demonstration. ' : ''}${e.area.headline}`)}</summary>`,
    '  </entry>',
  ].join('\n');
}

/** The feed of one area: an entry per season it has a summary in, newest first, dated by the season's publication. */
export function feedForArea(context: FeedContext, feed: FeedHead, entries: readonly AreaFeedEntry[]): string {
  const ordered = [...entries].sort((a, b) => (a.season.start < b.season.start ? 1 : a.season.start > b.season.start ? -1 : 0));
  const updated = ordered.reduce((latest, e) => (stamp(e.season.published) > latest ? stamp(e.season.published) : latest), '');
  return feedXml(
    context,
    feed,
    updated,
    ordered.map((e) => areaEntryXml(context, e, context.invented)),
  );
}
