// One Atom feed per area of a national coast (RFC 4287): each published season's summary of the
// area, its headline and highest level, for readers who follow a stretch of coast larger than
// one place (site/lib/feeds.ts). Only areas of the current season get a feed, as only they have
// a page; an entry of a past season links to that season's overview.
import type { APIRoute, GetStaticPaths } from 'astro';
import { currentSeason, loadModel, regionOf, seasonsNewestFirst } from '../../../lib/model.ts';
import { assertSlug } from '../../../lib/bulletin-view.ts';
import { feedContext } from '../../../lib/feed-context.ts';
import { type AreaFeedEntry, areaFeedPath, feedForArea } from '../../../lib/feeds.ts';

export const getStaticPaths = (async () => {
  const model = await loadModel();
  const current = currentSeason(model);
  const areas = regionOf(model, current.id).areas ?? [];
  return areas.map((area) => {
    const entries: AreaFeedEntry[] = [];
    for (const season of seasonsNewestFirst(model)) {
      const summary = model.regions.get(season.id)?.areas?.find((a) => a.id === area.id);
      if (!summary) continue;
      entries.push({
        season: { id: season.id, label: season.label, start: season.start, published: season.published },
        area: { id: summary.id, name: summary.name, headline: summary.headline, level: summary.level },
        href: season.id === current.id ? `/areas/${area.id}/` : `/seasons/${season.id}/`,
      });
    }
    return { params: { area: assertSlug(area.id, 'area id') }, props: { name: area.name, entries } };
  });
}) satisfies GetStaticPaths;

export const GET: APIRoute = async ({ params, props }) => {
  const model = await loadModel();
  const context = feedContext(model);
  const { name, entries } = props as { name: string; entries: AreaFeedEntry[] };
  const area = String(params['area']);
  const xml = feedForArea(
    context,
    { id: `areas/${area}`, title: `${context.publisher}: ${name}, seasonal summaries of the area`, selfHref: areaFeedPath(area), alternateHref: `/areas/${area}/` },
    entries,
  );
  return new Response(xml, { headers: { 'Content-Type': 'application/atom+xml; charset=utf-8' } });
};
