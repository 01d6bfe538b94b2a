/**
 * Modelled drift arrivals: particles of a drift-model run that come within the arrival distance of
 * a segment during a season, per km of coast. Read either from particle positions (CSV or CF
 * trajectory NetCDF, see generator/drift/) or from a table already aggregated upstream with
 * columns segment_id, season, arrivals.
 */
import type { IndicatorDefinition, TypedRow } from './types.ts';
import { numberAt } from './types.ts';

export const driftArrivals = {
  id: 'drift-arrivals',
  label: 'Modelled drift arrivals',
  unit: 'modelled particles arriving per km of coast',
  unitShort: 'particles/km',
  source: 'drift-model',
  keyColumn: 'segment_id',
  columns: [
    { name: 'segment_id', type: 'string', required: true },
    { name: 'season', type: 'string', required: true },
    { name: 'arrivals', type: 'number', required: true, minimum: 0 },
  ],
  aggregation: 'season-total',
  threshold: null,
  /** Raw arrivals; the per-km figure needs the segment length and is computed in generator/drift. */
  normalise(row: TypedRow) {
    return { value: numberAt(row, 'arrivals'), censored: false, extra: {} };
  },
} as const satisfies IndicatorDefinition;
