/**
 * The indicator registry: labels, units, required columns, normalisation, seasonal aggregation and
 * thresholds of every indicator Wrackline knows. Readers, the model builder and the bulletin
 * wording all take these from here.
 */
import type { IndicatorId } from '../model/types.ts';
import { beachLitter } from './beach-litter.ts';
import { driftArrivals } from './drift-arrivals.ts';
import { shellfishTissue } from './shellfish-tissue.ts';
import type { IndicatorDefinition } from './types.ts';
import { waterMicroplastics } from './water-microplastics.ts';
import { wildlifeReports } from './wildlife-reports.ts';

export type { IndicatorDefinition, ColumnRequirement, ColumnType, TypedRow, NormalisedValue, IndicatorThreshold } from './types.ts';
export { itemsPer100m } from './beach-litter.ts';
export { cleanCoastIndex, cleanCoastClass, cleanCoastIndexK } from './clean-coast-index.ts';

/** Every indicator, keyed by id, in display order. */
export const indicatorDefinitions: { readonly [K in IndicatorId]: IndicatorDefinition } = {
  'beach-litter': beachLitter,
  'water-microplastics': waterMicroplastics,
  'shellfish-tissue': shellfishTissue,
  'wildlife-reports': wildlifeReports,
  'drift-arrivals': driftArrivals,
};

/** Indicator ids in display order. */
export const indicatorIds = Object.keys(indicatorDefinitions) as IndicatorId[];

export function isIndicatorId(value: unknown): value is IndicatorId {
  return typeof value === 'string' && Object.hasOwn(indicatorDefinitions, value);
}

export function getIndicator(id: IndicatorId): IndicatorDefinition {
  return indicatorDefinitions[id];
}
