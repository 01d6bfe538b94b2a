/**
 * `wrackline trend FILE.csv [--seasonal] [--confidence C] [--json]`: the trend statistics of one
 * series, for an analyst. The CSV header is `time,value` or `time,season,value`:
 * - time: a number used as is, or an ISO 8601 date or date-time (converted to a decimal year; a
 *   date counts from the middle of its day, a date-time from its instant, UTC unless an offset is
 *   given), so slopes are per unit of time, per year for dates;
 * - value: a number; empty = missing; `<x` = below the detection limit x;
 * - season: any label (needed with --seasonal).
 * Exit codes: 0 done, 2 bad usage, unreadable file or bad CSV (the message names line and column).
 * With --json one JSON object is printed; undefined quantities are null, never NaN.
 */
import { readFile } from 'node:fs/promises';
import { commandWriters, parseCommandOptions } from './command-io.ts';
import { analyzeTrend } from '../stats/analyze-trend.ts';
import type { SeriesPoint, TrendResult } from '../stats/types.ts';

export interface TrendIo {
  stdout?: (text: string) => void;
  stderr?: (text: string) => void;
}

export const trendHelp = [
  'Usage: wrackline trend FILE.csv [--seasonal] [--confidence C] [--json]',
  '',
  "Mann–Kendall test and Sen's slope with its confidence interval for one series.",
  'FILE.csv has the header time,value or time,season,value. time is a number or an ISO 8601 date',
  '(slopes are then per year); value is a number, empty when missing, or <x when below the',
  'detection limit x.',
  '',
  'Options:',
  '  --seasonal       also run the Seasonal Kendall test on the season column',
  '  --confidence C   confidence level of the slope interval, between 0 and 1 (default 0.95)',
  '  --json           print one JSON object instead of a summary',
  '  -h, --help       show this help',
].join('\n');

class CsvProblem extends Error {}

const DATE = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2}(?:\.\d+)?))?(Z|[+-]\d{2}:?\d{2})?)?$/;
const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/** Decimal year of an ISO 8601 date or date-time; null when the text is not one. */
export function isoToDecimalYear(text: string): number | null {
  const match = DATE.exec(text);
  if (!match) return null;
  const year = Number(match[1]);
  const month = Number(match[2]);
  const day = Number(match[3]);
  if (month < 1 || month > 12 || day < 1) return null;
  const start = Date.UTC(year, 0, 1);
  const length = Date.UTC(year + 1, 0, 1) - start;
  const dayStart = Date.UTC(year, month - 1, day);
  if (new Date(dayStart).getUTCDate() !== day) return null; // e.g. 2026-02-30
  if (match[4] === undefined) return year + (dayStart - start + 43_200_000) / length;
  const hours = Number(match[4]);
  const minutes = Number(match[5]);
  const seconds = match[6] === undefined ? 0 : Number(match[6]);
  if (hours > 23 || minutes > 59 || seconds >= 61) return null;
  let offset = 0;
  const zone = match[7];
  if (zone && zone !== 'Z') {
    const sign = zone.startsWith('-') ? -1 : 1;
    const digits = zone.slice(1).replace(':', '');
    offset = sign * (Number(digits.slice(0, 2)) * 60 + Number(digits.slice(2, 4))) * 60_000;
  }
  const instant = dayStart + ((hours * 60 + minutes) * 60 + seconds) * 1000 - offset;
  const instantYear = new Date(instant).getUTCFullYear();
  const yearStart = Date.UTC(instantYear, 0, 1);
  return instantYear + (instant - yearStart) / (Date.UTC(instantYear + 1, 0, 1) - yearStart);
}

/** Split one CSV line into fields (RFC 4180 quotes; no line breaks inside quotes). */
function splitCsvLine(line: string, lineNumber: number): string[] {
  const fields: string[] = [];
  let field = '';
  let quoted = false;
  let i = 0;
  while (i < line.length) {
    const c = line[i] as string;
    if (quoted) {
      if (c === '"') {
        if (line[i + 1] === '"') {
          field += '"';
          i += 2;
          continue;
        }
        quoted = false;
      } else field += c;
    } else if (c === '"' && field.trim() === '') {
      quoted = true;
      field = '';
    } else if (c === ',') {
      fields.push(field.trim());
      field = '';
    } else field += c;
    i++;
  }
  if (quoted) throw new CsvProblem(`line ${lineNumber}: a quoted field is not closed`);
  fields.push(field.trim());
  return fields;
}

export interface ParsedSeries {
  points: SeriesPoint[];
  /** true when every time was an ISO date */
  datedTimes: boolean;
}

/**
 * Parse the CSV text of a series.
 * @throws CsvProblem naming the file, line and column of the first problem
 */
export function parseSeriesCsv(text: string, file: string): ParsedSeries {
  const lines = text.replace(/^\uFEFF/, '').split(/\r?\n/);
  let headerIndex = lines.findIndex((line) => line.trim() !== '');
  if (headerIndex < 0) throw new CsvProblem(`${file}: the file is empty; expected the header time,value or time,season,value`);
  const header = splitCsvLine(lines[headerIndex] as string, headerIndex + 1).map((name) => name.toLowerCase());
  const layout = header.join(',');
  if (layout !== 'time,value' && layout !== 'time,season,value') {
    throw new CsvProblem(`${file} line ${headerIndex + 1}: header is ${JSON.stringify(layout)}; expected time,value or time,season,value`);
  }
  const seasonal = header.length === 3;
  const points: SeriesPoint[] = [];
  let kind: 'number' | 'date' | null = null;
  for (let index = headerIndex + 1; index < lines.length; index++) {
    const raw = lines[index] as string;
    if (raw.trim() === '') continue;
    const lineNumber = index + 1;
    const fields = splitCsvLine(raw, lineNumber);
    if (fields.length !== header.length) {
      throw new CsvProblem(`${file} line ${lineNumber}: ${fields.length} fields; expected ${header.length} (${header.join(',')})`);
    }
    const timeText = fields[0] as string;
    let t: number | null = null;
    let thisKind: 'number' | 'date';
    if (NUMBER.test(timeText)) {
      t = Number(timeText);
      thisKind = 'number';
    } else {
      t = isoToDecimalYear(timeText);
      thisKind = 'date';
    }
    if (t === null || !Number.isFinite(t)) {
      throw new CsvProblem(`${file} line ${lineNumber}, column time: ${JSON.stringify(timeText)} is not a number or an ISO 8601 date (e.g. 2026-03-15)`);
    }
    if (kind !== null && kind !== thisKind) {
      throw new CsvProblem(`${file} line ${lineNumber}, column time: ${JSON.stringify(timeText)} mixes numbers and dates; use one kind for the whole column`);
    }
    kind = thisKind;
    const valueText = fields[header.length - 1] as string;
    const point: SeriesPoint = { t, value: null };
    if (seasonal) {
      const season = fields[1] as string;
      if (season === '') throw new CsvProblem(`${file} line ${lineNumber}, column season: empty; expected a season label`);
      point.season = season;
    }
    if (valueText !== '') {
      const censored = valueText.startsWith('<');
      const numberText = censored ? valueText.slice(1).trim() : valueText;
      if (!NUMBER.test(numberText)) {
        throw new CsvProblem(`${file} line ${lineNumber}, column value: ${JSON.stringify(valueText)} is not a number, an empty cell or <x`);
      }
      point.value = Number(numberText);
      if (!Number.isFinite(point.value)) {
        throw new CsvProblem(`${file} line ${lineNumber}, column value: ${JSON.stringify(valueText)} is too large a number`);
      }
      if (censored) point.censored = true;
    }
    points.push(point);
  }
  return { points, datedTimes: kind === 'date' };
}

/** Replace NaN and ±Infinity by null everywhere (JSON has no such numbers). */
function finiteOrNull(value: unknown): unknown {
  if (typeof value === 'number') return Number.isFinite(value) ? value : null;
  if (Array.isArray(value)) return value.map(finiteOrNull);
  if (value && typeof value === 'object') {
    const out: { [key: string]: unknown } = {};
    for (const [key, inner] of Object.entries(value)) out[key] = finiteOrNull(inner);
    return out;
  }
  return value;
}

/** The JSON object `wrackline trend --json` prints. */
export function trendJson(result: TrendResult, seasonal: boolean): unknown {
  const out: { [key: string]: unknown } = {
    n: result.n,
    nCensored: result.nCensored,
    mannKendall: result.mannKendall,
    sen: result.sen,
  };
  if (seasonal) out['seasonalKendall'] = result.seasonalKendall ?? null;
  out['serialCorrection'] = result.serialCorrection ?? null;
  out['insufficient'] = result.insufficient;
  return finiteOrNull(out);
}

function show(value: number | null | undefined, digits = 4): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return 'not defined';
  if (value !== 0 && (Math.abs(value) < 1e-3 || Math.abs(value) >= 1e6)) return value.toExponential(digits - 1);
  return String(Number(value.toPrecision(digits)));
}

/** The readable summary printed without --json. */
export function trendSummary(result: TrendResult, file: string, perUnit: string): string {
  const lines: string[] = [];
  lines.push(`${file}: ${result.n} values used${result.nCensored > 0 ? `, ${result.nCensored} below a detection limit` : ''}`);
  if (result.insufficient) lines.push(`Too little data for a trend claim: ${result.insufficient.reason}.`);
  const mk = result.mannKendall;
  if (mk) {
    lines.push(`Mann–Kendall: S = ${mk.S}, Var(S) = ${show(mk.varS, 6)}, z = ${show(mk.z)}, two-sided p = ${show(mk.p, 3)}` +
      (mk.pExact !== null && mk.pExact !== undefined ? ` (exact p = ${show(mk.pExact, 3)})` : '') + `, Kendall's tau-b = ${show(mk.tau, 3)}`);
  } else lines.push('Mann–Kendall: needs at least 2 values');
  const sen = result.sen;
  if (sen) {
    if (sen.notEstimable) lines.push(`Sen's slope: not estimable, ${sen.notEstimable}`);
    else {
      const percent = `${Number((sen.confidence * 100).toPrecision(6))}%`;
      lines.push(`Sen's slope: ${show(sen.slope)} ${perUnit} (${percent} interval ${show(sen.lower)} to ${show(sen.upper)}), intercept ${show(sen.intercept, 6)}`);
    }
  }
  const sk = result.seasonalKendall;
  if (sk) {
    lines.push(`Seasonal Kendall (${sk.seasons.length} seasons): S = ${sk.S}, z = ${show(sk.z)}, p = ${show(sk.p, 3)}; slope ${show(sk.slope)} ${perUnit} (${show(sk.lower)} to ${show(sk.upper)})`);
    lines.push(`  with the covariance between seasons: p = ${show(sk.pCovariance, 3)}`);
    if (sk.heterogeneity) {
      lines.push(`  seasons ${sk.heterogeneity.p < 0.05 ? 'disagree' : 'agree'}: heterogeneity chi-square = ${show(sk.heterogeneity.chi2)}, df = ${sk.heterogeneity.df}, p = ${show(sk.heterogeneity.p, 3)}`);
    }
  }
  const serial = result.serialCorrection;
  if (serial) lines.push(`Serial correlation (Hamed & Rao 1998): variance factor ${show(serial.factor)}, corrected p = ${show(serial.p, 3)}`);
  return lines.join('\n');
}

export async function runTrend(argv: string[], io: TrendIo = {}): Promise<number> {
  const { stdout, stderr } = commandWriters(io);
  const parsed = parseCommandOptions(
    'trend',
    {
      args: argv,
      allowPositionals: true,
      options: {
        seasonal: { type: 'boolean', default: false },
        confidence: { type: 'string', default: '0.95' },
        json: { type: 'boolean', default: false },
        help: { type: 'boolean', short: 'h', default: false },
      },
    },
    stderr,
    `\n${trendHelp}`,
  );
  if (parsed === null) return 2;
  const { values, positionals } = parsed;
  if (values.help) {
    stdout(trendHelp);
    return 0;
  }
  if (positionals.length !== 1) {
    stderr(`wrackline trend: expected one CSV file; got ${positionals.length}\n\n${trendHelp}`);
    return 2;
  }
  const confidence = Number(values.confidence);
  if (!(confidence > 0 && confidence < 1)) {
    stderr(`wrackline trend: --confidence ${JSON.stringify(values.confidence)} is not a number between 0 and 1 (e.g. 0.95)`);
    return 2;
  }
  const file = positionals[0] as string;
  let text: string;
  try {
    text = await readFile(file, 'utf8');
  } catch (error) {
    stderr(`wrackline trend: cannot read ${file} (${error instanceof Error ? error.message : String(error)})`);
    return 2;
  }
  let series: ParsedSeries;
  try {
    series = parseSeriesCsv(text, file);
  } catch (error) {
    if (error instanceof CsvProblem) {
      stderr(`wrackline trend: ${error.message}`);
      return 2;
    }
    throw error;
  }
  if (values.seasonal && !series.points.some((p) => p.season !== undefined)) {
    stderr(`wrackline trend: --seasonal needs the header time,season,value in ${file}`);
    return 2;
  }
  const result = analyzeTrend(series.points, { confidence, seasonal: values.seasonal, minYears: series.datedTimes ? 5 : 0 });
  if (values.json) stdout(JSON.stringify(trendJson(result, values.seasonal)));
  else stdout(trendSummary(result, file, series.datedTimes ? 'per year' : 'per unit of time'));
  return 0;
}
