/**
 * Beach litter: items larger than 2.5 cm counted along a surveyed stretch of beach, normalised to
 * items per 100 m of beach length: items × 100 / surveyed length in m (normalisation as used for
 * the European beach-litter baseline; Van Loon et al. 2020, JRC).
 *
 * Threshold: the EU threshold value for macro litter on coastlines, 20 items per 100 m, compared
 * with the median of the assessment period (Van Loon et al. 2020, A European Threshold Value and
 * Assessment Method for Macro Litter on Coastlines, JRC).
 */
import { cleanCoastIndex } from './clean-coast-index.ts';
import type { IndicatorDefinition, TypedRow } from './types.ts';
import { numberAt, optionalNumberAt } from './types.ts';

/** Items per 100 m of beach: items × 100 / surveyed length (m). */
export function itemsPer100m(items: number, surveyedLengthM: number): number {
  return (items * 100) / surveyedLengthM;
}

export const beachLitter = {
  id: 'beach-litter',
  label: 'Beach litter',
  unit: 'items per 100 m of beach',
  unitShort: 'items/100 m',
  source: 'monitoring-table',
  keyColumn: 'survey_id',
  columns: [
    { name: 'survey_id', type: 'string', required: true },
    { name: 'segment_id', type: 'string', required: true },
    { name: 'date', type: 'date', required: true },
    { name: 'surveyed_length_m', type: 'number', required: true, unit: 'm', exclusiveMinimum: 0 },
    { name: 'items', type: 'integer', required: true, minimum: 0 },
    { name: 'plastic_items', type: 'integer', required: false, minimum: 0 },
    { name: 'area_m2', type: 'number', required: false, unit: 'm2', exclusiveMinimum: 0 },
  ],
  aggregation: 'per-sample',
  threshold: {
    value: 20,
    label: 'EU threshold value for beach litter (20 items per 100 m)',
    source: 'Van Loon et al. 2020, JRC: European threshold value for macro litter on coastlines',
  },
  normalise(row: TypedRow) {
    const items = numberAt(row, 'items');
    const length = numberAt(row, 'surveyed_length_m');
    const plastic = optionalNumberAt(row, 'plastic_items');
    const area = optionalNumberAt(row, 'area_m2');
    const cci = plastic !== null && area !== null ? cleanCoastIndex(plastic, area) : null;
    return {
      value: itemsPer100m(items, length),
      censored: false,
      extra: { items, surveyedLengthM: length, plasticItems: plastic, areaM2: area, cleanCoastIndex: cci },
    };
  },
} as const satisfies IndicatorDefinition;
