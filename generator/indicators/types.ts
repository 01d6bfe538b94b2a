/**
 * What every indicator module declares: the columns its table needs, how a row becomes a value in
 * the indicator's unit, how values combine within a season, and a threshold where one is published.
 * Adding an indicator = one module like beach-litter.ts plus one line in index.ts.
 */
import type { IndicatorId } from '../model/types.ts';

export type ColumnType = 'string' | 'integer' | 'number' | 'date';

export interface ColumnRequirement {
  name: string;
  type: ColumnType;
  /** The column must exist in the table schema and hold a value on every row. */
  required: boolean;
  /** The unit the table schema must declare for this column (custom `unit` field property). */
  unit?: string;
  /** Other spellings accepted for the same unit (e.g. "particles/g" for particles per g wet weight). */
  unitAlternatives?: readonly string[];
  /** Smallest allowed value (inclusive). */
  minimum?: number;
  /** Values must be strictly greater than this. */
  exclusiveMinimum?: number;
  /** Allowed values of a string column. */
  enum?: readonly string[];
  /** Values below detection may be written "<x". */
  censorable?: boolean;
}

/** One table row after type checks: parsed values by column, plus which were "<x". */
export interface TypedRow {
  values: { [column: string]: string | number | null };
  censored: { [column: string]: boolean };
}

export interface NormalisedValue {
  /** Value in the indicator's unit; for a below-detection value, the detection limit. */
  value: number;
  censored: boolean;
  /** Extra numbers or words some rules and pages need (e.g. the Clean Coast Index, species). */
  extra: { [key: string]: number | string | null };
  /** Short note for the observation list (species, mesh size). */
  note?: string;
}

export interface IndicatorThreshold {
  value: number;
  label: string;
  source: string;
}

export interface IndicatorDefinition {
  id: IndicatorId;
  /** Plain-language name: "Beach litter". */
  label: string;
  /** Unit in words: "items per 100 m of beach". */
  unit: string;
  /** Unit in short form: "items/100 m". */
  unitShort: string;
  /** Where the numbers come from: a monitoring table, or a drift model. */
  source: 'monitoring-table' | 'drift-model';
  /** The column holding each record's own identifier (the primary key). */
  keyColumn: string;
  columns: readonly ColumnRequirement[];
  /**
   * How a season's value is formed: 'per-sample' = each sample is one value (the season value is
   * their median); 'season-total' = counts are summed per season, a season without reports is 0.
   */
  aggregation: 'per-sample' | 'season-total';
  threshold: IndicatorThreshold | null;
  /** Row → value in the indicator's unit. The row has already passed the column checks. */
  normalise(row: TypedRow): NormalisedValue;
}

/** Reads a number a column check has already guaranteed; throws only on a programming error. */
export function numberAt(row: TypedRow, column: string): number {
  const value = row.values[column];
  if (typeof value !== 'number') throw new Error(`indicator column ${column} is not a checked number`);
  return value;
}

export function optionalNumberAt(row: TypedRow, column: string): number | null {
  const value = row.values[column];
  return typeof value === 'number' ? value : null;
}

export function textAt(row: TypedRow, column: string): string | null {
  const value = row.values[column];
  return typeof value === 'string' ? value : null;
}
