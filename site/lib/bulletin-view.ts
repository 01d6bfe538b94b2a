/**
 * Rendering helpers shared by the bulletin pages: chart/map strings (current-season ones cached
 * by segment and indicator, so the season page, the segment's permalink and the embeds reuse one
 * render; a past season's chart appears on one page only and is not kept), download paths, and
 * the schema.org Dataset description of the downloads.
 */
import type { Bulletin, Caution, IndicatorBulletin } from '../../generator/model/types.ts';
import { renderIndicatorChart } from './chart.ts';
import { prepareLand, prepareSegments, renderMap } from './map.ts';
import type { PreparedLand, PreparedSegments } from './map.ts';
import type { LoadedModel } from './model.ts';
import { bulletinOf, bulletinsOf, pageBulletins, regionOf } from './model.ts';

/** Is this bulletin of the current season (its drawings then appear on several pages)? */
function shownTwice(model: LoadedModel, bulletin: Bulletin): boolean {
  return model.site.seasons.some((s) => s.current && s.id === bulletin.season.id);
}

export function chartFor(model: LoadedModel, bulletin: Bulletin, indicator: IndicatorBulletin): string {
  const key = `${bulletin.season.id}/${bulletin.segment.id}/${indicator.indicator}`;
  return renderIndicatorChart(indicator, shownTwice(model, bulletin) ? { cacheKey: key } : {});
}

const preparedCache = new Map<string, PreparedSegments>();
/** The season's segments through TopoJSON once, shared by the region map and every locator. */
export function preparedSegmentsOf(model: LoadedModel, seasonId: string): PreparedSegments {
  let prepared = preparedCache.get(seasonId);
  if (!prepared) {
    const region = regionOf(model, seasonId);
    prepared = prepareSegments(region.segments.map((s) => ({ id: s.id, name: s.name, level: s.level.id, levelLabel: s.level.label, geometry: s.geometry })));
    preparedCache.set(seasonId, prepared);
  }
  return prepared;
}

let landCache: { land: PreparedLand | null; coarse: PreparedLand | null } | null = null;
/** The scenario's land for the maps (detailed, and coarse for insets), prepared once per build. */
export function landOf(model: LoadedModel): { land: PreparedLand | null; coarse: PreparedLand | null } {
  landCache ??= { land: prepareLand(model.site.map?.land), coarse: prepareLand(model.site.map?.landCoarse) };
  return landCache;
}

const locatorCache = new Map<string, string>();
export function locatorFor(model: LoadedModel, bulletin: Bulletin): string {
  const key = `${bulletin.season.id}/${bulletin.segment.id}`;
  const hit = locatorCache.get(key);
  if (hit) return hit;
  const region = regionOf(model, bulletin.season.id);
  const svg = renderMap({
    idPrefix: 'locator',
    title: `Where ${bulletin.segment.name} is`,
    description: `Locator map: ${bulletin.segment.name} drawn as a thick dark line inside a dashed ring, with neighbouring segments in grey; the small box at the top right shows where this view lies on the whole coast.`,
    segments: preparedSegmentsOf(model, bulletin.season.id),
    zones: region.zones,
    highlight: bulletin.segment.id,
    width: 420,
    land: landOf(model).land,
    insetLand: landOf(model).coarse,
  });
  if (shownTwice(model, bulletin)) locatorCache.set(key, svg);
  return svg;
}

export function downloadPaths(bulletin: Bulletin): { json: string; observations: string; results: string } {
  const base = `/seasons/${bulletin.season.id}/${bulletin.segment.id}/`;
  return { json: `${base}bulletin.json`, observations: `${base}observations.csv`, results: `${base}results.csv` };
}

/** Cautions for pages about a whole season (overview, season index): the model's own texts,
 * taken from the first bulletin of the season that carries them. */
export function seasonCautions(model: LoadedModel, seasonId: string): { shellfish: Caution[]; debris: Caution[] } {
  const list = bulletinsOf(model, seasonId);
  const withShellfish = list.find((b) => b.cautions.shellfish);
  const withDebris = list.find((b) => b.cautions.debris);
  return {
    shellfish: withShellfish ? bulletinOf(withShellfish).cautions.shellfish : [],
    debris: withDebris ? bulletinOf(withDebris).cautions.debris : [],
  };
}

export function datasetJsonLd(bulletin: Bulletin, publisherName: string | null): Record<string, unknown> {
  const d = downloadPaths(bulletin);
  return {
    '@context': 'https://schema.org',
    '@type': 'Dataset',
    name: `${bulletin.segment.name}, ${bulletin.season.label}: litter and microplastic observations and trend results`,
    description: `${bulletin.invented ? 'Invented data for demonstration only. ' : ''}Observations and nonparametric trend results behind the ${bulletin.season.label} bulletin for ${bulletin.segment.name}.`,
    url: permalinkOf(bulletin),
    datePublished: bulletin.published,
    ...(bulletin.correction ? { dateModified: bulletin.correction.date } : {}),
    temporalCoverage: `${bulletin.indicators.flatMap((i) => i.observations.map((o) => o.date)).sort()[0] ?? bulletin.season.start}/${bulletin.season.end}`,
    spatialCoverage: {
      '@type': 'Place',
      name: bulletin.segment.name,
      geo: { '@type': 'GeoShape', box: `${bulletin.segment.bbox[1]} ${bulletin.segment.bbox[0]} ${bulletin.segment.bbox[3]} ${bulletin.segment.bbox[2]}` },
    },
    variableMeasured: bulletin.indicators.map((i) => ({ '@type': 'PropertyValue', name: i.label, unitText: i.unit })),
    ...(publisherName ? { publisher: { '@type': 'Organization', name: publisherName } } : {}),
    isAccessibleForFree: true,
    distribution: [
      { '@type': 'DataDownload', encodingFormat: 'application/json', contentUrl: d.json, name: 'Bulletin model (JSON)' },
      { '@type': 'DataDownload', encodingFormat: 'text/csv', contentUrl: d.observations, name: 'Observations (CSV)' },
      { '@type': 'DataDownload', encodingFormat: 'text/csv', contentUrl: d.results, name: 'Trend results (CSV)' },
    ],
  };
}

const slug = /^[a-z0-9][a-z0-9_-]*$/i;
/** Path parts come from the model; refuse anything that is not a plain slug, so no output
 * path or link can leave its folder. */
export function assertSlug(value: string, what: string): string {
  if (!slug.test(value)) throw new Error(`bulletin model: ${what} "${value}" is not a plain slug (letters, digits, - and _)`);
  return value;
}

export function permalinkOf(bulletin: { season: { id: string }; segment: { id: string } }): string {
  return `/seasons/${assertSlug(bulletin.season.id, 'season id')}/${assertSlug(bulletin.segment.id, 'segment id')}/`;
}

/** Static paths for every published bulletin: one per season and segment. */
export function everyBulletinPath(model: LoadedModel): { params: { season: string; segment: string }; props: { bulletin: Bulletin } }[] {
  return model.site.seasons.flatMap((s) =>
    pageBulletins(bulletinsOf(model, s.id)).map((bulletin) => ({
      params: { season: assertSlug(s.id, 'season id'), segment: assertSlug(bulletin.segment.id, 'segment id') },
      props: { bulletin },
    })),
  );
}
