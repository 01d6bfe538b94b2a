/**
 * Parses one CSV cell by the Frictionless Table Schema field it belongs to: missing values,
 * integer, number (decimal point or a declared decimal comma, below-detection values "<x"), date,
 * string. Returns the typed value or a problem description; never throws.
 */
import type { ErrorData } from '../errors.ts';
import {
  CensoredNotAllowed,
  DecimalCommaFound,
  ValueAboveMaximum,
  ValueBelowMinimum,
  ValueMissing,
  ValueNotAllowed,
  ValueNotFinite,
  ValueWrongType,
} from '../errors.ts';
import { parseIsoDate } from './season-calendar.ts';

export interface CellRule {
  name: string;
  type: 'string' | 'integer' | 'number' | 'date' | 'datetime' | 'other';
  required: boolean;
  minimum: number | null;
  exclusiveMinimum: number | null;
  maximum: number | null;
  enum: readonly string[] | null;
  /** Prefix marking a below-detection value ("<"), or null when not allowed. */
  detectionLimitPrefix: string | null;
}

export interface CellProblem {
  entry: ErrorData;
  message: string;
  expected: string;
}

export type CellResult =
  | { ok: true; value: string | number | null; censored: boolean }
  | { ok: false; problem: CellProblem };

const plainNumber = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;
const plainInteger = /^[+-]?\d+$/;
const notFinite = /^[+-]?(nan|inf|infinity)$/i;

function fail(entry: ErrorData, message: string, expected: string): CellResult {
  return { ok: false, problem: { entry, message, expected } };
}

/** What the value must look like, in words, for the report's `expected`. */
export function describeRule(rule: CellRule): string {
  const bounds: string[] = [];
  if (rule.minimum !== null) bounds.push(`≥ ${rule.minimum}`);
  if (rule.exclusiveMinimum !== null) bounds.push(`> ${rule.exclusiveMinimum}`);
  if (rule.maximum !== null) bounds.push(`≤ ${rule.maximum}`);
  const base =
    rule.type === 'integer' ? 'a whole number' :
    rule.type === 'number' ? 'a number' :
    rule.type === 'date' ? 'a date YYYY-MM-DD' :
    rule.type === 'datetime' ? 'a date-time YYYY-MM-DDThh:mm:ssZ' :
    'text';
  return bounds.length > 0 ? `${base} ${bounds.join(' and ')}` : base;
}

function checkBounds(rule: CellRule, value: number, raw: string, file: string, row: number): CellResult | null {
  const expected = describeRule(rule);
  if (rule.minimum !== null && value < rule.minimum) return fail(ValueBelowMinimum, ValueBelowMinimum.message(file, row, rule.name, raw, expected), expected);
  if (rule.exclusiveMinimum !== null && value <= rule.exclusiveMinimum) return fail(ValueBelowMinimum, ValueBelowMinimum.message(file, row, rule.name, raw, expected), expected);
  if (rule.maximum !== null && value > rule.maximum) return fail(ValueAboveMaximum, ValueAboveMaximum.message(file, row, rule.name, raw, expected), expected);
  return null;
}

function parseNumberText(text: string, decimalChar: string): number | null {
  let t = text.trim();
  if (decimalChar !== '.') {
    if (t.includes('.')) return null;
    t = t.split(decimalChar).join('.');
  }
  if (!plainNumber.test(t)) return null;
  return Number(t);
}

export function parseCell(raw: string, rule: CellRule, missingValues: readonly string[], decimalChar: string, file: string, row: number): CellResult {
  if (missingValues.includes(raw)) {
    if (rule.required) return fail(ValueMissing, ValueMissing.message(file, row, rule.name), describeRule(rule));
    return { ok: true, value: null, censored: false };
  }
  const expected = describeRule(rule);
  switch (rule.type) {
    case 'integer':
    case 'number': {
      let text = raw.trim();
      let censored = false;
      if (rule.detectionLimitPrefix === null && /^<\s*\d/.test(text)) {
        return fail(CensoredNotAllowed, CensoredNotAllowed.message(file, row, rule.name, raw), expected);
      }
      if (rule.detectionLimitPrefix !== null && text.startsWith(rule.detectionLimitPrefix)) {
        censored = true;
        text = text.slice(rule.detectionLimitPrefix.length).trim();
      }
      if (notFinite.test(text)) return fail(ValueNotFinite, ValueNotFinite.message(file, row, rule.name, raw), expected);
      const value = parseNumberText(text, decimalChar);
      if (value === null) {
        if (decimalChar === '.' && /^[+-]?\d+,\d+$/.test(text)) {
          return fail(DecimalCommaFound, DecimalCommaFound.message(file, row, rule.name, raw), expected);
        }
        return fail(ValueWrongType, ValueWrongType.message(file, row, rule.name, raw, expected), expected);
      }
      if (!Number.isFinite(value)) return fail(ValueNotFinite, ValueNotFinite.message(file, row, rule.name, raw), expected);
      if (rule.type === 'integer' && (!plainInteger.test(text) || !Number.isSafeInteger(value))) {
        return fail(ValueWrongType, ValueWrongType.message(file, row, rule.name, raw, expected), expected);
      }
      const outOfBounds = checkBounds(rule, value, raw, file, row);
      if (outOfBounds) return outOfBounds;
      return { ok: true, value, censored };
    }
    case 'date': {
      const text = raw.trim();
      if (!parseIsoDate(text)) return fail(ValueWrongType, ValueWrongType.message(file, row, rule.name, raw, expected), expected);
      return { ok: true, value: text, censored: false };
    }
    case 'datetime': {
      const text = raw.trim();
      const ms = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:?\d{2})$/.test(text) ? Date.parse(text) : Number.NaN;
      if (!Number.isFinite(ms) || !parseIsoDate(text.slice(0, 10))) {
        return fail(ValueWrongType, ValueWrongType.message(file, row, rule.name, raw, expected), expected);
      }
      return { ok: true, value: text, censored: false };
    }
    default: {
      if (rule.enum !== null && !rule.enum.includes(raw)) {
        return fail(ValueNotAllowed, ValueNotAllowed.message(file, row, rule.name, raw, rule.enum), `one of ${rule.enum.join(', ')}`);
      }
      return { ok: true, value: raw, censored: false };
    }
  }
}
