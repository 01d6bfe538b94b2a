// Atom feed (RFC 4287) of every published bulletin, newest season first (site/lib/feeds.ts).
import type { APIRoute } from 'astro';
import { bulletinsOf, loadModel, seasonsNewestFirst } from '../lib/model.ts';
import { feedContext } from '../lib/feed-context.ts';
import { feedForBulletins } from '../lib/feeds.ts';

export const GET: APIRoute = async () => {
  const model = await loadModel();
  const context = feedContext(model);
  const all = seasonsNewestFirst(model).flatMap((s) => bulletinsOf(model, s.id));
  const xml = feedForBulletins(
    context,
    { id: 'bulletins', title: `${context.publisher}: seasonal coastal litter bulletins, ${model.site.region.name}`, selfHref: '/feed.xml', alternateHref: '/' },
    all,
  );
  return new Response(xml, { headers: { 'Content-Type': 'application/atom+xml; charset=utf-8' } });
};
