/**
 * What every map of the site draws besides the segments (SiteModel.map): the scenario's land
 * polygons (already simplified by the reader), the place names of the overview map
 * (areas.ts mapPlaces) and the caption's words on land and sea.
 */
import type { LoadedScenario } from '../scenario/types.ts';
import { mapPlaces } from './areas.ts';
import type { SiteMapModel } from './types.ts';

export function seaNote(hasLand: boolean, hasDrift: boolean): string {
  if (hasLand) return 'Land is shaded pale cream and the sea pale blue.';
  return hasDrift
    ? 'No land outline was given for this coast, so land and sea share one background; the hatched offshore zones from the drift model lie at sea.'
    : 'No land outline was given for this coast, so land and sea share one background.';
}

export function siteMap(scenario: Pick<LoadedScenario, 'segments' | 'land' | 'drift'>): SiteMapModel {
  const land = scenario.land?.geometry ?? null;
  return { land, landCoarse: scenario.land?.coarse ?? null, places: mapPlaces(scenario.segments), seaNote: seaNote(land !== null, scenario.drift !== null) };
}
