/** What every Atom feed of a site shares (site/lib/feeds.ts), from the loaded model. */
import type { LoadedModel } from './model.ts';
import { seasonsNewestFirst } from './model.ts';
import type { FeedContext } from './feeds.ts';

export function feedContext(model: LoadedModel): FeedContext {
  const seasons = seasonsNewestFirst(model);
  return {
    regionId: model.site.region.id,
    publisher: model.regions.get(seasons[0]?.id ?? '')?.publisher.name ?? model.site.region.name,
    invented: model.site.invented,
    generatorVersion: model.site.generator.version,
    tagYear: (seasons[seasons.length - 1]?.published ?? '2000-01-01').slice(0, 4),
  };
}
