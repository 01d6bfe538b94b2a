/**
 * Microplastics in surface water: particles per cubic metre of filtered water from a net tow,
 * with the net's mesh size (a finer mesh catches more particles, so the mesh travels with the value).
 * No published threshold exists.
 */
import type { IndicatorDefinition, TypedRow } from './types.ts';
import { numberAt } from './types.ts';

export const waterMicroplastics = {
  id: 'water-microplastics',
  label: 'Microplastics in surface water',
  unit: 'particles per cubic metre of water',
  unitShort: 'particles/m³',
  source: 'monitoring-table',
  keyColumn: 'sample_id',
  columns: [
    { name: 'sample_id', type: 'string', required: true },
    { name: 'segment_id', type: 'string', required: true },
    { name: 'date', type: 'date', required: true },
    { name: 'particles_per_m3', type: 'number', required: true, unit: 'particles/m3', minimum: 0, censorable: true },
    { name: 'mesh_um', type: 'number', required: true, unit: 'um', exclusiveMinimum: 0 },
  ],
  aggregation: 'per-sample',
  threshold: null,
  normalise(row: TypedRow) {
    const mesh = numberAt(row, 'mesh_um');
    return {
      value: numberAt(row, 'particles_per_m3'),
      censored: row.censored['particles_per_m3'] === true,
      extra: { meshUm: mesh },
      note: `net mesh ${mesh} µm`,
    };
  },
} as const satisfies IndicatorDefinition;
