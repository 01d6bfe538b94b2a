/**
 * `wrackline trend FILE.csv [--time NAME] [--value NAME] [--season NAME] [--seasonal]
 * [--confidence C] [--json]`: the trend statistics of one series. The readable output starts with
 * a verdict in the bulletins' words (a direction is claimed where p < 0.05, the bulletins'
 * false-discovery rate, here for one series; how sure, from a seeded bootstrap as in the
 * bulletins), then the figures to three significant digits. Columns are found by name (--time,
 * --value, --season; by default `time`, `value`, `season`), or else the first two columns are
 * taken, with a note. Numbers between 1000 and 3000 are read as years. The CSV columns:
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
import { upperFirst } from '../bulletin/indicator-words.ts';
import { likelihoodWord } from '../bulletin/likelihood.ts';
import { roundRate } from '../bulletin/numbers.ts';
import { amountWords, chanceWords, rateIntervalWords, slopeOf } from '../bulletin/phrase-trend.ts';
import { decideDirection, trendPValue } from '../model/direction.ts';
import { analyzeTrend } from '../stats/analyze-trend.ts';
import type { SeriesPoint, TrendResult } from '../stats/types.ts';

export interface TrendIo {
  stdout?: (text: string) => void;
  stderr?: (text: string) => void;
}

export const trendHelp = [
  'Usage: wrackline trend FILE.csv [--time NAME] [--value NAME] [--seasonal] [--confidence C] [--json]',
  '',
  "Is one series going up or down? Mann–Kendall test and Sen's slope with its confidence interval.",
  'FILE.csv has a header. The time column (named time, or given with --time) holds numbers or ISO',
  '8601 dates; dates and numbers between 1000 and 3000 are years, so slopes are per year. The value',
  'column (named value, or given with --value) holds numbers, empty cells when missing, or <x when',
  'below the detection limit x. Without those names the first two columns are used, with a note.',
  '',
  'Options:',
  '  --time NAME      the column holding the times',
  '  --value NAME     the column holding the values',
  '  --season NAME    the column holding the season labels (default: season)',
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
  /** true when every time is a number between 1000 and 3000 (read as a year) */
  yearTimes?: boolean;
  /** said when the columns were taken by position, not by name */
  note?: string;
}

/** Column names chosen by the user (--time, --value, --season). */
export interface SeriesColumns {
  time?: string;
  value?: string;
  season?: string;
}

/**
 * Parse the CSV text of a series.
 * @throws CsvProblem naming the file, line and column of the first problem
 */
export function parseSeriesCsv(text: string, file: string, columns: SeriesColumns = {}): ParsedSeries {
  const lines = text.replace(/^\uFEFF/, '').split(/\r?\n/);
  const headerIndex = lines.findIndex((line) => line.trim() !== '');
  if (headerIndex < 0) throw new CsvProblem(`${file}: the file is empty; expected a header such as time,value or time,season,value`);
  const header = splitCsvLine(lines[headerIndex] as string, headerIndex + 1).map((name) => name.toLowerCase());
  const layout = header.join(',');
  const at = (name: string | undefined, option: string): number | null => {
    if (name === undefined) return null;
    const index = header.indexOf(name.toLowerCase());
    if (index < 0) throw new CsvProblem(`${file} line ${headerIndex + 1}: header is ${JSON.stringify(layout)}; it has no column ${JSON.stringify(name)} (${option})`);
    return index;
  };
  let timeAt = at(columns.time, '--time') ?? (header.includes('time') ? header.indexOf('time') : null);
  let valueAt = at(columns.value, '--value') ?? (header.includes('value') ? header.indexOf('value') : null);
  const seasonAt = at(columns.season, '--season') ?? (header.includes('season') ? header.indexOf('season') : null);
  let note: string | undefined;
  if (timeAt === null && valueAt === null && columns.time === undefined && columns.value === undefined && header.length >= 2) {
    timeAt = 0;
    valueAt = 1;
    note = `Note: no column is named time or value, so the first two columns are used: ${JSON.stringify(header[0])} as the time and ${JSON.stringify(header[1])} as the value (name them with --time and --value).`;
  }
  if (timeAt === null || valueAt === null) {
    throw new CsvProblem(`${file} line ${headerIndex + 1}: header is ${JSON.stringify(layout)}; expected columns time and value (or name them with --time and --value)`);
  }
  const seasonal = seasonAt !== null;
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
    const timeText = fields[timeAt] as string;
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
    const valueText = fields[valueAt] as string;
    const point: SeriesPoint = { t, value: null };
    if (seasonal) {
      const season = fields[seasonAt] as string;
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
  const yearTimes = kind === 'number' && points.length > 0 && points.every((p) => p.t >= 1000 && p.t <= 3000);
  return { points, datedTimes: kind === 'date', yearTimes, ...(note ? { note } : {}) };
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

/** Every figure to three significant digits (exponent below 0.001 and from a million up). */
function show(value: number | null | undefined, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return 'not defined';
  if (value !== 0 && (Math.abs(value) < 1e-3 || Math.abs(value) >= 1e6)) return value.toExponential(digits - 1).replace('-', '\u2212');
  const text = String(Number(value.toPrecision(digits)));
  return text.startsWith('-') ? `\u2212${text.slice(1)}` : text;
}

/** The rate of change in words: "about 0.57 more per year". */
function amountPer(amount: string, perUnit: string): string {
  return `${amount} ${perUnit}`;
}

/**
 * The verdict in the bulletins' words, for one series: a direction only where p < 0.05 (the
 * bulletins' false-discovery rate; with one series q = p) and the slope agrees (direction.ts);
 * how sure, in the Hirsch et al. (2015) words of the bootstrap chance.
 */
export function trendVerdict(result: TrendResult, perUnit: string): string[] {
  const p = trendPValue(result);
  const direction = decideDirection(result, p, VERDICT_RATE);
  const lines: string[] = [];
  if (direction === 'too-little-data') {
    lines.push(`Too little data to say if the values are changing: ${result.insufficient?.reason ?? 'there are not enough values'}.`);
    return lines;
  }
  if (direction === 'rising' || direction === 'falling') {
    const up = direction === 'rising';
    const chance = result.probabilityUp === null || result.probabilityUp === undefined ? null : up ? result.probabilityUp : 1 - result.probabilityUp;
    const word = chance === null ? null : likelihoodWord(chance);
    lines.push(
      word && chance !== null ? `Going ${up ? 'up' : 'down'}: a ${up ? 'rise' : 'fall'} is ${word}; the chance is ${chanceWords(chance)}.` : `Going ${up ? 'up' : 'down'}.`,
    );
  } else {
    lines.push('No clear direction: we cannot tell if the values are going up or down.');
  }
  const slope = slopeOf(result);
  if (slope && slope.slope !== null) {
    const rate = roundRate(slope.slope, slope.lower, slope.upper);
    const size = rate.slope === 0 ? 'close to no change' : `about ${amountWords(rate.slope, rate.decimals)}`;
    const interval = rateIntervalWords(rate);
    const percent = `${Math.round((result.sen?.confidence ?? 0.95) * 100)}%`;
    lines.push(`${upperFirst(amountPer(size, perUnit))}${interval ? `; the ${percent} confidence interval runs from ${interval}` : ''}.`);
  }
  return lines;
}

/** The false-discovery rate of the bulletins' default settings, for one series. */
const VERDICT_RATE = 0.05;

/** The readable summary printed without --json: the verdict first, then the figures. */
export function trendSummary(result: TrendResult, file: string, perUnit: string, note?: string): string {
  const lines: string[] = [...trendVerdict(result, perUnit), ''];
  if (note) lines.push(note);
  lines.push(`${file}: ${result.n} values used${result.nCensored > 0 ? `, ${result.nCensored} below a detection limit` : ''}`);
  if (result.insufficient) lines.push(`Too little data for a trend claim: ${result.insufficient.reason}.`);
  const mk = result.mannKendall;
  if (mk) {
    lines.push(
      `Mann–Kendall: S = ${show(mk.S)}, Var(S) = ${show(mk.varS)}, z = ${show(mk.z)}, two-sided p = ${show(mk.p)}` +
        (mk.pExact !== null && mk.pExact !== undefined ? ` (exact p = ${show(mk.pExact)})` : '') +
        `, Kendall's tau-b = ${show(mk.tau)}`,
    );
  } else lines.push('Mann–Kendall: needs at least 2 values');
  const sen = result.sen;
  if (sen) {
    if (sen.notEstimable) lines.push(`Sen's slope: not estimable, ${sen.notEstimable}`);
    else {
      const percent = `${Number((sen.confidence * 100).toPrecision(6))}%`;
      lines.push(`Sen's slope: ${show(sen.slope)} ${perUnit} (${percent} interval ${show(sen.lower)} to ${show(sen.upper)}), intercept ${show(sen.intercept)}`);
    }
  }
  const sk = result.seasonalKendall;
  if (sk) {
    lines.push(
      `Seasonal Kendall (${sk.seasons.length} seasons): S = ${show(sk.S)}, z = ${show(sk.z)}, p = ${show(sk.p)}; slope ${show(sk.slope)} ${perUnit} (${show(sk.lower)} to ${show(sk.upper)})`,
    );
    lines.push(`  with the covariance between seasons: p = ${show(sk.pCovariance)}`);
    if (sk.heterogeneity) {
      lines.push(
        `  seasons ${sk.heterogeneity.p < 0.05 ? 'disagree' : 'agree'}: heterogeneity chi-square = ${show(sk.heterogeneity.chi2)}, df = ${sk.heterogeneity.df}, p = ${show(sk.heterogeneity.p)}`,
      );
    }
  }
  const serial = result.serialCorrection;
  if (serial) lines.push(`Serial correlation (Hamed & Rao 1998): variance factor ${show(serial.factor)}, corrected p = ${show(serial.p)}`);
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
        time: { type: 'string' },
        value: { type: 'string' },
        season: { type: 'string' },
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
    series = parseSeriesCsv(text, file, {
      ...(values.time !== undefined ? { time: values.time } : {}),
      ...(values.value !== undefined ? { value: values.value } : {}),
      ...(values.season !== undefined ? { season: values.season } : {}),
    });
  } catch (error) {
    if (error instanceof CsvProblem) {
      stderr(`wrackline trend: ${error.message}`);
      return 2;
    }
    throw error;
  }
  if (values.seasonal && !series.points.some((p) => p.season !== undefined)) {
    stderr(`wrackline trend: --seasonal needs a season column (named season, or given with --season) in ${file}`);
    return 2;
  }
  const options = { confidence, seasonal: values.seasonal, minYears: series.datedTimes ? 5 : 0 };
  if (values.json) {
    stdout(JSON.stringify(trendJson(analyzeTrend(series.points, options), values.seasonal)));
    return 0;
  }
  // The readable verdict says how sure, from the bootstrap chance of a rise (seeded: same file, same words).
  const result = analyzeTrend(series.points, { ...options, bootstrap: { resamples: 500, seed: 1 } });
  stdout(trendSummary(result, file, series.datedTimes || series.yearTimes ? 'per year' : 'per unit of time', series.note));
  return 0;
}
