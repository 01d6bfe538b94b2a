/**
 * Parses one CSV cell by the Frictionless Table Schema field it belongs to: missing values,
 * integer, number (decimal point or a declared decimal comma, below-detection values "<x"), date,
 * string. Returns the typed value or a problem description; never throws.
 *
 * Dates are ISO 8601 (YYYY-MM-DD) unless the field declares another form through the Table
 * Schema's date `format` pattern (Frictionless Table Schema: "%d/%m/%Y" and the like; %d, %m, %Y
 * and literal characters are understood). Words of a field with an `enum` are matched after
 * trimming, case and space/hyphen/underscore folding; a near miss gets "did you mean".
 * Each problem carries a hint fitting that very problem.
 */
import type { ErrorData } from '../errors.ts';
import { CensoredNotAllowed, DecimalCommaFound, ValueAboveMaximum, ValueBelowMinimum, ValueMissing, ValueNotAllowed, ValueNotFinite, ValueWrongType } from '../errors.ts';
import { parseIsoDate } from './season-calendar.ts';
import { didYouMean, matchCategory } from './category-words.ts';

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
  /** Table Schema date `format` pattern ("%d/%m/%Y"), or null/absent for ISO 8601. */
  dateFormat?: string | null;
}

export interface CellProblem {
  entry: ErrorData;
  message: string;
  expected: string;
  /** A hint fitting this problem, in place of the catalogue entry's general one. */
  hint?: string;
}

export type CellResult = { ok: true; value: string | number | null; censored: boolean } | { ok: false; problem: CellProblem };

const plainNumber = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;
const plainInteger = /^[+-]?\d+$/;
const notFinite = /^[+-]?(nan|inf|infinity)$/i;

function fail(entry: ErrorData, message: string, expected: string, hint?: string): CellResult {
  return { ok: false, problem: { entry, message, expected, ...(hint === undefined ? {} : { hint }) } };
}

/** Reads a date written by a Table Schema date pattern; null when the text does not fit it. */
export function parsePatternDate(text: string, pattern: string): string | null {
  let day = '';
  let month = '';
  let year = '';
  let at = 0;
  for (let i = 0; i < pattern.length; i++) {
    const ch = pattern[i];
    if (ch === '%' && i + 1 < pattern.length) {
      const directive = pattern[++i];
      const digits = /^\d+/.exec(text.slice(at))?.[0] ?? '';
      if (directive === 'd' || directive === 'm') {
        const part = digits.slice(0, 2);
        if (part.length === 0) return null;
        if (directive === 'd') day = part.padStart(2, '0');
        else month = part.padStart(2, '0');
        at += part.length;
      } else if (directive === 'Y') {
        if (digits.length < 4) return null;
        year = digits.slice(0, 4);
        at += 4;
      } else return null;
    } else {
      if (text[at] !== ch) return null;
      at++;
    }
  }
  if (at !== text.length || !day || !month || !year) return null;
  const iso = `${year}-${month}-${day}`;
  return parseIsoDate(iso) ? iso : null;
}

/** Whether a pattern uses only the directives parsePatternDate understands. */
export function dateFormatUnderstood(pattern: string): boolean {
  return /%[dmY]/.test(pattern) && !/%[^dmY]/.test(pattern);
}

/** The hint for a date that is not in the declared form: how to declare the form it is in. */
export function dateHint(raw: string, declared: string | null): string {
  const text = raw.trim();
  const parts = /^(\d{1,2})([./-])(\d{1,2})\2(\d{4})$/.exec(text);
  if (parts) {
    const [, first, sep, second] = parts;
    const dayFirst = `%d${sep}%m${sep}%Y`;
    const monthFirst = `%m${sep}%d${sep}%Y`;
    const pattern = Number(first) > 12 ? dayFirst : Number(second) > 12 ? monthFirst : `${dayFirst}" (or "${monthFirst}" for month first`;
    return `${declared === null ? 'Dates are read as YYYY-MM-DD' : `This field declares dates as "${declared}"`}. If the table writes dates like ${text}, declare it on the field in datapackage.json: "format": "${pattern}" (Table Schema date format)`;
  }
  if (declared !== null) return `This field declares dates as "${declared}" (Table Schema date format); write them that way or change the format`;
  return 'Dates are written YYYY-MM-DD (ISO 8601); a table written otherwise declares its form on the field, e.g. "format": "%d/%m/%Y"';
}

function numberHint(rule: CellRule, text: string, decimalChar: string): string {
  if (decimalChar !== '.' && /^[+-]?\d*\.\d+$/.test(text)) {
    return `The dialect declares "decimalChar": "${decimalChar}" but this value uses a decimal point; a table mixing both needs its numbers written one way`;
  }
  if (rule.type === 'integer') return 'Write a whole number with no decimal places, thousands separator or unit';
  return `Write a number with ${decimalChar === '.' ? 'a decimal point' : `"${decimalChar}" as decimal mark`}, and no unit or thousands separator`;
}

/** What the value must look like, in words, for the report's `expected`. */
export function describeRule(rule: CellRule): string {
  const bounds: string[] = [];
  if (rule.minimum !== null) bounds.push(`≥ ${rule.minimum}`);
  if (rule.exclusiveMinimum !== null) bounds.push(`> ${rule.exclusiveMinimum}`);
  if (rule.maximum !== null) bounds.push(`≤ ${rule.maximum}`);
  const base =
    rule.type === 'integer'
      ? 'a whole number'
      : rule.type === 'number'
        ? 'a number'
        : rule.type === 'date'
          ? 'a date YYYY-MM-DD'
          : rule.type === 'datetime'
            ? 'a date-time YYYY-MM-DDThh:mm:ssZ'
            : 'text';
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
        return fail(ValueWrongType, ValueWrongType.message(file, row, rule.name, raw, expected), expected, numberHint(rule, text, decimalChar));
      }
      if (!Number.isFinite(value)) return fail(ValueNotFinite, ValueNotFinite.message(file, row, rule.name, raw), expected);
      if (rule.type === 'integer' && (!plainInteger.test(text) || !Number.isSafeInteger(value))) {
        return fail(ValueWrongType, ValueWrongType.message(file, row, rule.name, raw, expected), expected, numberHint(rule, text, decimalChar));
      }
      const outOfBounds = checkBounds(rule, value, raw, file, row);
      if (outOfBounds) return outOfBounds;
      return { ok: true, value, censored };
    }
    case 'date': {
      const text = raw.trim();
      const pattern = rule.dateFormat ?? null;
      const iso = pattern === null ? (parseIsoDate(text) ? text : null) : parsePatternDate(text, pattern);
      if (iso === null) {
        const want = pattern === null ? expected : `a date written ${pattern}`;
        return fail(ValueWrongType, ValueWrongType.message(file, row, rule.name, raw, want), want, dateHint(raw, pattern));
      }
      return { ok: true, value: iso, censored: false };
    }
    case 'datetime': {
      const text = raw.trim();
      const ms = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:?\d{2})$/.test(text) ? Date.parse(text) : Number.NaN;
      if (!Number.isFinite(ms) || !parseIsoDate(text.slice(0, 10))) {
        return fail(
          ValueWrongType,
          ValueWrongType.message(file, row, rule.name, raw, expected),
          expected,
          'Date-times are written YYYY-MM-DDThh:mm:ssZ (ISO 8601, with a time zone)',
        );
      }
      return { ok: true, value: text, censored: false };
    }
    default: {
      if (rule.enum !== null) {
        const match = matchCategory(raw, rule.enum);
        if (!match.ok) {
          const hint = match.suggestion === null ? `Write one of ${rule.enum.join(', ')}; case, spaces and underscores do not matter` : `Write "${match.suggestion}"`;
          return fail(ValueNotAllowed, `${ValueNotAllowed.message(file, row, rule.name, raw, rule.enum)}${didYouMean(match.suggestion)}`, `one of ${rule.enum.join(', ')}`, hint);
        }
        return { ok: true, value: match.value, censored: false };
      }
      return { ok: true, value: raw, censored: false };
    }
  }
}
