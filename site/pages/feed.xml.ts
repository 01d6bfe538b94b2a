// Atom feed (RFC 4287) of every published bulletin, newest season first. Ids are tag URIs
// (RFC 4151) built from the region, season and segment ids, so they never change.
import type { APIRoute } from 'astro';
import { bulletinsOf, loadModel, seasonsNewestFirst } from '../lib/model.ts';
import { escapeXml } from '../lib/format.ts';
import { permalinkOf } from '../lib/bulletin-view.ts';

export const GET: APIRoute = async () => {
  const model = await loadModel();
  const region = model.site.region;
  const seasons = seasonsNewestFirst(model);
  const year = (seasons[seasons.length - 1]?.published ?? '2000-01-01').slice(0, 4);
  const tag = (rest: string) => `tag:wrackline,${year}:${encodeURIComponent(region.id)}/${rest}`;
  const stamp = (date: string) => `${date.slice(0, 10)}T00:00:00Z`;
  const entries: string[] = [];
  let updated = '';
  for (const s of seasons) {
    for (const b of bulletinsOf(model, s.id)) {
      const when = stamp(b.correction && b.correction.date > b.published ? b.correction.date : b.published);
      if (when > updated) updated = when;
      const summary = [b.invented ? 'Invented data for demonstration. ' : '', b.headline, b.correction ? ` Corrected on ${b.correction.date}: ${b.correction.reason}` : ''].join('');
      entries.push([
        '  <entry>',
        `    <id>${escapeXml(tag(`${s.id}/${b.segment.id}`))}</id>`,
        `    <title>${escapeXml(`${b.segment.name}, ${b.season.label}: ${b.level.rank > 0 ? `${b.level.label} (level ${b.level.rank} of 4)` : b.level.label}`)}</title>`,
        `    <link rel="alternate" type="text/html" href="${escapeXml(permalinkOf(b))}"/>`,
        `    <link rel="enclosure" type="application/json" href="${escapeXml(`${permalinkOf(b)}bulletin.json`)}"/>`,
        `    <published>${stamp(b.published)}</published>`,
        `    <updated>${when}</updated>`,
        `    <summary>${escapeXml(summary)}</summary>`,
        '  </entry>',
      ].join('\n'));
    }
  }
  const publisher = model.regions.get(seasons[0]?.id ?? '')?.publisher.name ?? region.name;
  const xml = [
    '<?xml version="1.0" encoding="utf-8"?>',
    '<feed xmlns="http://www.w3.org/2005/Atom">',
    `  <id>${escapeXml(tag('bulletins'))}</id>`,
    `  <title>${escapeXml(`${region.name}: seasonal coastal litter bulletins${model.site.invented ? ' (invented data)' : ''}`)}</title>`,
    `  <updated>${updated || '2000-01-01T00:00:00Z'}</updated>`,
    `  <author><name>${escapeXml(publisher)}</name></author>`,
    '  <link rel="self" type="application/atom+xml" href="/feed.xml"/>',
    '  <link rel="alternate" type="text/html" href="/"/>',
    `  <generator version="${escapeXml(model.site.generator.version)}">Wrackline</generator>`,
    ...entries,
    '</feed>',
    '',
  ].join('\n');
  return new Response(xml, { headers: { 'Content-Type': 'application/atom+xml; charset=utf-8' } });
};
