/**
 * Streams a particle-position CSV (plain or gzip) with columns particle, time, lon, lat and an
 * optional status, checking each row and handing good positions to a callback. The file is read
 * in chunks and split into lines here (these files are plain numbers and words, millions of rows
 * long, so a general CSV parser would dominate the run time); a line holding a double quote is
 * passed to csv-parse instead, so quoted cells still read correctly.
 *
 * Checks per row: particle a whole number ≥ 0, time an ISO 8601 date-time (UTC when no offset is
 * given), lon −180..180, lat −90..90, status drifting or ashore; a repeated (particle, time) pair
 * is left out as a duplicate key. Every row left out is reported.
 */
import { createReadStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import { createGunzip } from 'node:zlib';
import { parse as parseSync } from 'csv-parse/sync';
import {
  ByteOrderMark,
  CsvUnreadable,
  DuplicateKey,
  FileEmpty,
  HeaderMissingColumn,
  InputTooLarge,
  LineTooLong,
  NoDataRows,
  RowTruncated,
  RowWrongLength,
  ValueMissing,
  ValueNotAllowed,
  ValueNotFinite,
  ValueWrongType,
} from '../errors.ts';
import type { IssueLog } from '../read/issue-log.ts';
import { ExpansionGuard, InputBoundExceeded, maxRecordChars, maxRecordLabel } from '../read/input-bounds.ts';
import { ParticleTable } from './particle-table.ts';

export const positionStatuses = ['drifting', 'ashore'] as const;

export interface Position {
  particle: number;
  timeMs: number;
  lon: number;
  lat: number;
  ashore: boolean;
}

export interface PositionsCsvOptions {
  absolutePath: string;
  file: string;
  compression: string | null;
  delimiter?: string;
  log: IssueLog;
  onProgress?: (bytesRead: number, bytesTotal: number) => void;
  /** Receives each good position; returns false when the position was not used (counted as excluded). */
  onPosition: (particle: number, timeMs: number, lon: number, lat: number, ashore: boolean) => boolean;
}

const dateTimePattern = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(\.\d+)?)?)?(Z|[+-]\d{2}:?\d{2})?$/;
const numberPattern = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

/** A whole number ≥ 0 written with digits only, or −1. */
export function wholeNumber(text: string): number {
  if (text.length === 0 || text.length > 15) return -1;
  let value = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i) - 48;
    if (c < 0 || c > 9) return -1;
    value = value * 10 + c;
  }
  return value;
}

/** A decimal number (optional sign, digits, point, exponent), or NaN for anything else. */
export function plainNumber(text: string): number {
  const n = text.length;
  if (n === 0) return Number.NaN;
  let digits = 0;
  for (let i = 0; i < n; i++) {
    const c = text.charCodeAt(i);
    if (c >= 48 && c <= 57) digits++;
    else if (c !== 46 && c !== 45 && c !== 43 && c !== 101 && c !== 69) return Number.NaN; // . - + e E
  }
  if (digits === 0 || !numberPattern.test(text)) return Number.NaN;
  return Number(text);
}

const powersOfTen = Array.from({ length: 23 }, (_, k) => 10 ** k);

/**
 * Reads a decimal number written as [sign] digits [. digits] [e [sign] digits] from text[start, end),
 * or NaN when the text is anything else. With at most 15 significant digits and no exponent the
 * value is mantissa / 10^k, which IEEE division rounds exactly as Number() would (both operands are
 * exact doubles; Clinger 1990, "How to read floating point numbers accurately", fast path); other
 * forms go through Number().
 */
export function scanDecimal(text: string, start: number, end: number): number {
  let i = start;
  let negative = false;
  const first = text.charCodeAt(i);
  if (first === 45 || first === 43) {
    negative = first === 45;
    i++;
  }
  let mantissa = 0;
  let digits = 0;
  let fraction = 0;
  let seenPoint = false;
  for (; i < end; i++) {
    const c = text.charCodeAt(i);
    if (c >= 48 && c <= 57) {
      mantissa = mantissa * 10 + (c - 48);
      digits++;
      if (seenPoint) fraction++;
    } else if (c === 46 && !seenPoint) {
      seenPoint = true;
    } else if (c === 101 || c === 69) {
      if (digits === 0) return Number.NaN;
      const value = plainNumber(text.slice(start, end));
      return value;
    } else {
      return Number.NaN;
    }
  }
  if (digits === 0) return Number.NaN;
  if (digits > 15 || fraction > 22) return Number(text.slice(start, end));
  const value = fraction === 0 ? mantissa : mantissa / (powersOfTen[fraction] ?? 1);
  return negative ? -value : value;
}

/** Milliseconds since 1970 of an ISO 8601 date or date-time (UTC when no offset), or NaN. */
export function parseDateTime(text: string): number {
  const m = dateTimePattern.exec(text);
  if (!m) return Number.NaN;
  const year = Number(m[1]);
  const month = Number(m[2]);
  const day = Number(m[3]);
  const hour = Number(m[4] ?? 0);
  const minute = Number(m[5] ?? 0);
  const second = Number(m[6] ?? 0);
  if (month < 1 || month > 12 || day < 1 || day > new Date(Date.UTC(year, month, 0)).getUTCDate() || hour > 23 || minute > 59 || second > 60) return Number.NaN;
  let ms = Date.UTC(year, month - 1, day, hour, minute, second) + (m[7] ? Math.round(Number(m[7]) * 1000) : 0);
  const zone = m[8];
  if (zone && zone !== 'Z') {
    const sign = zone.startsWith('-') ? -1 : 1;
    const digits = zone.slice(1).replace(':', '');
    ms -= sign * (Number(digits.slice(0, 2)) * 60 + Number(digits.slice(2, 4))) * 60_000;
  }
  return ms;
}

export async function readPositionsCsv(options: PositionsCsvOptions): Promise<void> {
  const { file, log } = options;
  const delimiter = options.delimiter ?? ',';
  const counts = log.countsFor(file);
  let total = 0;
  try {
    total = (await stat(options.absolutePath)).size;
  } catch {
    total = 0;
  }
  const raw = createReadStream(options.absolutePath, { highWaterMark: 1 << 20 });
  let bytesRead = 0;
  let lastReport = 0;
  raw.on('data', (chunk: Buffer | string) => {
    bytesRead += typeof chunk === 'string' ? chunk.length : chunk.length;
    if (options.onProgress && bytesRead - lastReport >= 8 << 20) {
      lastReport = bytesRead;
      options.onProgress(bytesRead, total);
    }
  });
  let stream: NodeJS.ReadableStream = raw;
  if (options.compression === 'gz' || options.compression === 'gzip') {
    const gunzip = createGunzip({ chunkSize: 1 << 20 });
    raw.on('error', (error) => gunzip.destroy(error));
    stream = raw.pipe(gunzip);
  }
  // Bounded: decompressed size against compressed size, and total size (input-bounds.ts).
  const guard = new ExpansionGuard(stream === raw ? null : () => bytesRead);
  stream.on('error', (error: Error) => guard.destroy(error));
  guard.on('error', () => raw.destroy());
  stream = stream.pipe(guard);
  stream.setEncoding('utf8');

  let header: string[] | null = null;
  let col = { particle: -1, time: -1, lon: -1, lat: -1, status: -1 };
  let width = 0;
  let lineNo = 0;
  let usable = true;
  let rest = '';
  let sawBom = false;
  const timeCache = new Map<string, number>();
  const lastTime = new ParticleTable();

  const reject = (line: number, column: string | null, value: string | null, entry: Parameters<IssueLog['add']>[0], message: string, expected: string): void => {
    log.add(entry, message, { file, row: line, column, value, expected, severity: 'warning', excluded: true });
    counts.excluded++;
  };

  const handleHeader = (cells: string[]): void => {
    header = cells.map((c) => c.trim());
    const find = (name: string): number => header?.indexOf(name) ?? -1;
    col = { particle: find('particle'), time: find('time'), lon: find('lon'), lat: find('lat'), status: find('status') };
    width = cells.length;
    for (const name of ['particle', 'time', 'lon', 'lat'] as const) {
      if (col[name] < 0) {
        log.add(HeaderMissingColumn, HeaderMissingColumn.message(file, name, cells.join(delimiter)), {
          file,
          row: 1,
          column: name,
          value: cells.join(delimiter),
          expected: `a column named ${name}`,
          severity: 'error',
          excluded: true,
        });
        usable = false;
      }
    }
  };

  const handleRow = (cells: string[], line: number, isLast: boolean, endsWithNewline: boolean): void => {
    counts.read++;
    if (!usable) {
      counts.excluded++;
      return;
    }
    if (cells.length !== width) {
      const truncated = isLast && !endsWithNewline && cells.length < width;
      const entry = truncated ? RowTruncated : RowWrongLength;
      reject(line, null, cells.join(delimiter), entry, entry.message(file, line, cells.length, width), `${width} cells`);
      return;
    }
    const particleText = cells[col.particle] ?? '';
    const timeText = cells[col.time] ?? '';
    const lonText = cells[col.lon] ?? '';
    const latText = cells[col.lat] ?? '';
    if (particleText === '' || timeText === '' || lonText === '' || latText === '') {
      const name = particleText === '' ? 'particle' : timeText === '' ? 'time' : lonText === '' ? 'lon' : 'lat';
      reject(line, name, '', ValueMissing, ValueMissing.message(file, line, name), 'a value');
      return;
    }
    const particle = wholeNumber(particleText);
    if (particle < 0) {
      reject(line, 'particle', particleText, ValueWrongType, ValueWrongType.message(file, line, 'particle', particleText, 'a whole number ≥ 0'), 'a whole number ≥ 0');
      return;
    }
    let timeMs = timeCache.get(timeText);
    if (timeMs === undefined) {
      timeMs = parseDateTime(timeText);
      if (timeCache.size > 50_000) timeCache.clear();
      timeCache.set(timeText, timeMs);
    }
    if (Number.isNaN(timeMs)) {
      reject(
        line,
        'time',
        timeText,
        ValueWrongType,
        ValueWrongType.message(file, line, 'time', timeText, 'an ISO 8601 date-time such as 2026-09-01T00:00:00Z'),
        'an ISO 8601 date-time',
      );
      return;
    }
    const lon = plainNumber(lonText);
    if (!(lon >= -180 && lon <= 180)) {
      rejectCoordinate(line, 'lon', lonText, 180);
      return;
    }
    const lat = plainNumber(latText);
    if (!(lat >= -90 && lat <= 90)) {
      rejectCoordinate(line, 'lat', latText, 90);
      return;
    }
    let ashore = false;
    if (col.status >= 0) {
      const status = cells[col.status] ?? '';
      if (status === 'ashore') ashore = true;
      else if (status !== 'drifting' && status !== '') {
        reject(line, 'status', status, ValueNotAllowed, ValueNotAllowed.message(file, line, 'status', status, positionStatuses), `one of ${positionStatuses.join(', ')}`);
        return;
      }
    }
    const previous = lastTime.get(particle);
    if (previous === timeMs) {
      const value = `${particleText}+${timeText}`;
      reject(line, 'particle+time', value, DuplicateKey, DuplicateKey.message(file, line, 'particle+time', value, line - 1), 'one position per particle and time');
      return;
    }
    lastTime.set(particle, timeMs);
    if (options.onPosition(particle, timeMs, lon, lat, ashore)) counts.kept++;
    else counts.excluded++;
  };

  const rejectCoordinate = (line: number, name: string, text: string, limit: number): void => {
    const expected = `a number −${limit}..${limit}`;
    if (/^[+-]?(nan|inf|infinity)$/i.test(text.trim())) reject(line, name, text, ValueNotFinite, ValueNotFinite.message(file, line, name, text), expected);
    else reject(line, name, text, ValueWrongType, ValueWrongType.message(file, line, name, text, expected), expected);
  };

  const split = (text: string): string[] => {
    if (!text.includes('"')) return text.split(delimiter);
    try {
      const parsed = parseSync(text, { delimiter, relax_quotes: true, relax_column_count: true }) as string[][];
      return parsed[0] ?? [];
    } catch {
      return text.split(delimiter);
    }
  };

  // Fast path for plain lines (no quotes): fields located by index and numbers read straight from
  // the text, so no per-line arrays or strings are made. Any line it cannot take whole goes to
  // the checking path above, which reports exactly what is wrong.
  const fieldStart = new Int32Array(64);
  const fieldEnd = new Int32Array(64);
  const delimiterCode = delimiter.charCodeAt(0);
  let previousTimeText = '';
  let previousTimeMs = Number.NaN;

  const fastRow = (text: string, start: number, end: number): boolean => {
    let n = 0;
    let fieldFrom = start;
    for (let i = start; i < end; i++) {
      const c = text.charCodeAt(i);
      if (c === delimiterCode) {
        if (n >= 63) return false;
        fieldStart[n] = fieldFrom;
        fieldEnd[n] = i;
        n++;
        fieldFrom = i + 1;
      } else if (c === 34) return false; // a quote: let csv-parse read the line
    }
    fieldStart[n] = fieldFrom;
    fieldEnd[n] = end;
    n++;
    if (n !== width) return false;
    const ps = fieldStart[col.particle] ?? 0;
    const pe = fieldEnd[col.particle] ?? 0;
    if (pe - ps < 1 || pe - ps > 15) return false;
    let particle = 0;
    for (let i = ps; i < pe; i++) {
      const d = text.charCodeAt(i) - 48;
      if (d < 0 || d > 9) return false;
      particle = particle * 10 + d;
    }
    const ts = fieldStart[col.time] ?? 0;
    const te = fieldEnd[col.time] ?? 0;
    let timeMs: number;
    if (te - ts === previousTimeText.length && text.startsWith(previousTimeText, ts)) {
      timeMs = previousTimeMs;
    } else {
      const timeText = text.slice(ts, te);
      let cached = timeCache.get(timeText);
      if (cached === undefined) {
        cached = parseDateTime(timeText);
        if (timeCache.size > 50_000) timeCache.clear();
        timeCache.set(timeText, cached);
      }
      timeMs = cached;
      previousTimeText = timeText;
      previousTimeMs = timeMs;
    }
    if (Number.isNaN(timeMs)) return false;
    const lon = scanDecimal(text, fieldStart[col.lon] ?? 0, fieldEnd[col.lon] ?? 0);
    if (!(lon >= -180 && lon <= 180)) return false;
    const lat = scanDecimal(text, fieldStart[col.lat] ?? 0, fieldEnd[col.lat] ?? 0);
    if (!(lat >= -90 && lat <= 90)) return false;
    let ashore = false;
    if (col.status >= 0) {
      const ss = fieldStart[col.status] ?? 0;
      const length = (fieldEnd[col.status] ?? 0) - ss;
      if (length === 6 && text.startsWith('ashore', ss)) ashore = true;
      else if (length !== 0 && !(length === 8 && text.startsWith('drifting', ss))) return false;
    }
    if (lastTime.get(particle) === timeMs) return false;
    lastTime.set(particle, timeMs);
    counts.read++;
    if (options.onPosition(particle, timeMs, lon, lat, ashore)) counts.kept++;
    else counts.excluded++;
    return true;
  };

  const takeLine = (text: string, start: number, end: number): void => {
    lineNo++;
    if (end > start && text.charCodeAt(end - 1) === 13) end--;
    if (header === null) {
      let first = text.slice(start, end);
      if (first.charCodeAt(0) === 0xfeff) {
        first = first.slice(1);
        sawBom = true;
      }
      if (first.trim() === '') return;
      handleHeader(split(first));
      return;
    }
    if (end === start) return;
    if (usable && fastRow(text, start, end)) return;
    handleRow(split(text.slice(start, end)), lineNo, false, true);
  };

  try {
    for await (const chunk of stream as AsyncIterable<string>) {
      const text = rest + chunk;
      let start = 0;
      let nl = text.indexOf('\n', start);
      while (nl !== -1) {
        takeLine(text, start, nl);
        start = nl + 1;
        nl = text.indexOf('\n', start);
      }
      rest = text.slice(start);
      if (rest.length > maxRecordChars) {
        log.add(LineTooLong, LineTooLong.message(file, lineNo + 1, maxRecordLabel), {
          file,
          row: lineNo + 1,
          column: null,
          value: null,
          expected: `rows shorter than ${maxRecordLabel}`,
          severity: 'error',
          excluded: true,
        });
        raw.destroy();
        return;
      }
    }
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    if (error instanceof InputBoundExceeded) {
      log.add(InputTooLarge, InputTooLarge.message(file, lineNo + 1, reason), {
        file,
        row: lineNo + 1,
        column: null,
        value: null,
        expected: 'a file of ordinary size',
        severity: 'error',
        excluded: true,
      });
      return;
    }
    log.add(CsvUnreadable, CsvUnreadable.message(file, lineNo + 1, reason), {
      file,
      row: lineNo + 1,
      column: null,
      value: null,
      expected: 'a complete, readable (gzip) CSV file',
      severity: 'error',
      excluded: true,
    });
    return;
  }
  if (rest !== '' && rest !== '\r') {
    // The last line has no line end: checked as the final row, so a cut-off line is reported.
    lineNo++;
    const last = rest.replace(/\r$/, '');
    if (header === null) {
      const first = last.replace(/^\ufeff/, '');
      if (first !== last) sawBom = true;
      if (first.trim() !== '') handleHeader(split(first));
    } else {
      handleRow(split(last), lineNo, true, false);
    }
  }
  if (header === null) {
    log.add(FileEmpty, FileEmpty.message(file), { file, row: 1, column: null, value: null, expected: 'a header row and data rows', severity: 'error', excluded: true });
  } else if (counts.read === 0) {
    log.add(NoDataRows, NoDataRows.message(file), { file, row: 2, column: null, value: null, expected: 'at least one data row', severity: 'warning', excluded: false });
  }
  if (sawBom) {
    log.add(ByteOrderMark, ByteOrderMark.message(file), { file, row: 1, column: null, value: null, expected: 'UTF-8 text', severity: 'warning', excluded: false });
  }
  if (options.onProgress) options.onProgress(bytesRead, total);
}
