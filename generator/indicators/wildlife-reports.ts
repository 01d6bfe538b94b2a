/**
 * Wildlife reports: animals found entangled in, or having swallowed, litter. The seasonal series
 * is the total number of animals reported per season; a season of the monitored period without a
 * report counts as 0.
 */
import type { IndicatorDefinition, TypedRow } from './types.ts';
import { numberAt, textAt } from './types.ts';

export const wildlifeReports = {
  id: 'wildlife-reports',
  label: 'Wildlife harmed by litter',
  unit: 'animals reported per season',
  unitShort: 'animals',
  source: 'monitoring-table',
  keyColumn: 'report_id',
  columns: [
    { name: 'report_id', type: 'string', required: true },
    { name: 'segment_id', type: 'string', required: true },
    { name: 'date', type: 'date', required: true },
    { name: 'kind', type: 'string', required: true, enum: ['entanglement', 'ingestion'] },
    { name: 'animals', type: 'integer', required: true, minimum: 1 },
  ],
  aggregation: 'season-total',
  threshold: null,
  normalise(row: TypedRow) {
    const kind = textAt(row, 'kind');
    return { value: numberAt(row, 'animals'), censored: false, extra: { kind }, ...(kind ? { note: kind } : {}) };
  },
} as const satisfies IndicatorDefinition;
