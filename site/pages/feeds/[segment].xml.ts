// One Atom feed per segment (RFC 4287): each season's bulletin of that stretch of coast, with
// its headline and level, for readers who follow one place (site/lib/feeds.ts).
import type { APIRoute, GetStaticPaths } from 'astro';
import type { BulletinListing } from '../../../generator/model/listing.ts';
import { bulletinsOf, currentSeason, loadModel, seasonsNewestFirst } from '../../lib/model.ts';
import { assertSlug } from '../../lib/bulletin-view.ts';
import { feedContext } from '../../lib/feed-context.ts';
import { feedForBulletins, segmentFeedPath } from '../../lib/feeds.ts';

export const getStaticPaths = (async () => {
  const model = await loadModel();
  const bySegment = new Map<string, BulletinListing[]>();
  for (const season of seasonsNewestFirst(model)) {
    for (const b of bulletinsOf(model, season.id)) bySegment.set(b.segment.id, [...(bySegment.get(b.segment.id) ?? []), b]);
  }
  return [...bySegment].map(([segment, bulletins]) => ({ params: { segment: assertSlug(segment, 'segment id') }, props: { bulletins } }));
}) satisfies GetStaticPaths;

export const GET: APIRoute = async ({ props }) => {
  const model = await loadModel();
  const context = feedContext(model);
  const bulletins = (props as { bulletins: BulletinListing[] }).bulletins;
  const segment = bulletins[0]!.segment;
  const inCurrent = bulletinsOf(model, currentSeason(model).id).some((b) => b.segment.id === segment.id);
  const xml = feedForBulletins(
    context,
    {
      id: `segments/${segment.id}`,
      title: `${context.publisher}: ${segment.name}, seasonal coastal litter bulletins`,
      selfHref: segmentFeedPath(segment.id),
      alternateHref: inCurrent ? `/segments/${segment.id}/` : `/seasons/${bulletins[0]!.season.id}/${segment.id}/`,
    },
    bulletins,
  );
  return new Response(xml, { headers: { 'Content-Type': 'application/atom+xml; charset=utf-8' } });
};
