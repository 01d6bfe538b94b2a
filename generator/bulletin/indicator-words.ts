/**
 * How sentences name each indicator. Labels and units come from the indicator registry
 * (generator/indicators); this adds a short subject that reads as singular ("… is going up").
 */
import type { IndicatorId } from '../model/types.ts';

export const indicatorSubjects: { readonly [K in IndicatorId]: string } = {
  'beach-litter': 'Beach litter',
  'water-microplastics': 'Plastic in the sea water',
  'shellfish-tissue': 'Plastic in shellfish',
  'wildlife-reports': 'The number of animals harmed by litter',
  'drift-arrivals': 'Modelled litter coming ashore',
};

/** "Beach litter" → "beach litter" for use inside a sentence. */
export function lowerFirst(text: string): string {
  return text.length === 0 ? text : text.charAt(0).toLowerCase() + text.slice(1);
}

export function upperFirst(text: string): string {
  return text.length === 0 ? text : text.charAt(0).toUpperCase() + text.slice(1);
}
