/**
 * Microplastics in shellfish tissue: particles per gram of wet weight, with the species sampled.
 * No health-based limit exists for microplastics in food (EFSA CONTAM Panel 2016, EFSA Journal
 * 14(6):4501), so there is no threshold here.
 */
import type { IndicatorDefinition, TypedRow } from './types.ts';
import { numberAt, textAt } from './types.ts';

export const shellfishTissue = {
  id: 'shellfish-tissue',
  label: 'Microplastics in shellfish',
  unit: 'particles per gram of shellfish (wet weight)',
  unitShort: 'particles/g ww',
  source: 'monitoring-table',
  keyColumn: 'sample_id',
  columns: [
    { name: 'sample_id', type: 'string', required: true },
    { name: 'segment_id', type: 'string', required: true },
    { name: 'date', type: 'date', required: true },
    { name: 'species', type: 'string', required: true },
    { name: 'particles_per_g_ww', type: 'number', required: true, unit: 'particles/g ww', unitAlternatives: ['particles/g'], minimum: 0, censorable: true },
  ],
  aggregation: 'per-sample',
  threshold: null,
  normalise(row: TypedRow) {
    const species = textAt(row, 'species');
    return {
      value: numberAt(row, 'particles_per_g_ww'),
      censored: row.censored['particles_per_g_ww'] === true,
      extra: { species },
      ...(species ? { note: species } : {}),
    };
  },
} as const satisfies IndicatorDefinition;
