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
  NoDataRows,
  RowTruncated,
  RowWrongLength,
  ValueMissing,
  ValueNotAllowed,
  ValueNotFinite,
  ValueWrongType,
} from '../errors.ts';
import type { IssueLog } from '../read/issue-log.ts';

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
  onPosition: (position: Position) => boolean;
}

const dateTimePattern = /^(\d{4})-(\d{2})-(\d{2})(?:[T ](\d{2}):(\d{2})(?::(\d{2})(\.\d+)?)?)?(Z|[+-]\d{2}:?\d{2})?$/;
const numberPattern = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;

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
  stream.setEncoding('utf8');

  let header: string[] | null = null;
  let col = { particle: -1, time: -1, lon: -1, lat: -1, status: -1 };
  let width = 0;
  let lineNo = 0;
  let usable = true;
  let rest = '';
  let sawBom = false;
  const timeCache = new Map<string, number>();
  const lastTime = new Map<number, number>();

  const reject = (line: number, column: string | null, value: string | null, entry: Parameters<IssueLog['add']>[0], message: string, expected: string): void => {
    log.add(entry, message, { file, row: line, column, value, expected, severity: 'error', excluded: true });
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
          file, row: 1, column: name, value: cells.join(delimiter), expected: `a column named ${name}`, severity: 'error', excluded: true,
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
    for (const [name, text] of [['particle', particleText], ['time', timeText], ['lon', lonText], ['lat', latText]] as const) {
      if (text === '') {
        reject(line, name, text, ValueMissing, ValueMissing.message(file, line, name), 'a value');
        return;
      }
    }
    const particle = Number(particleText);
    if (!/^\d+$/.test(particleText) || !Number.isSafeInteger(particle)) {
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
      reject(line, 'time', timeText, ValueWrongType, ValueWrongType.message(file, line, 'time', timeText, 'an ISO 8601 date-time such as 2026-09-01T00:00:00Z'), 'an ISO 8601 date-time');
      return;
    }
    for (const [name, text, limit] of [['lon', lonText, 180], ['lat', latText, 90]] as const) {
      const value = Number(text);
      if (!numberPattern.test(text)) {
        const entry = /^[+-]?(nan|inf|infinity)$/i.test(text) ? ValueNotFinite : ValueWrongType;
        const message = entry === ValueNotFinite ? ValueNotFinite.message(file, line, name, text) : ValueWrongType.message(file, line, name, text, `a number −${limit}..${limit}`);
        reject(line, name, text, entry, message, `a number −${limit}..${limit}`);
        return;
      }
      if (value < -limit || value > limit) {
        reject(line, name, text, ValueWrongType, ValueWrongType.message(file, line, name, text, `a number −${limit}..${limit}`), `a number −${limit}..${limit}`);
        return;
      }
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
    if (options.onPosition({ particle, timeMs, lon: Number(lonText), lat: Number(latText), ashore })) counts.kept++;
    else counts.excluded++;
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

  let pending: { text: string; line: number } | null = null;
  const takeLine = (text: string): void => {
    lineNo++;
    const clean = text.endsWith('\r') ? text.slice(0, -1) : text;
    if (header === null) {
      let first = clean;
      if (first.charCodeAt(0) === 0xfeff) {
        first = first.slice(1);
        sawBom = true;
      }
      if (first.trim() === '') return;
      handleHeader(split(first));
      return;
    }
    if (clean === '') return;
    if (pending) handleRow(split(pending.text), pending.line, false, true);
    pending = { text: clean, line: lineNo };
  };

  try {
    for await (const chunk of stream as AsyncIterable<string>) {
      const text = rest + chunk;
      let start = 0;
      let nl = text.indexOf('\n', start);
      while (nl !== -1) {
        takeLine(text.slice(start, nl));
        start = nl + 1;
        nl = text.indexOf('\n', start);
      }
      rest = text.slice(start);
    }
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    if (pending) handleRow(split((pending as { text: string }).text), (pending as { line: number }).line, false, true);
    pending = null;
    log.add(CsvUnreadable, CsvUnreadable.message(file, lineNo + 1, reason), {
      file, row: lineNo + 1, column: null, value: null, expected: 'a complete, readable (gzip) CSV file', severity: 'error', excluded: true,
    });
    return;
  }
  const endsWithNewline = rest === '' || rest === '\r';
  if (!endsWithNewline) {
    // The last line has no line end: it is held back and checked as the final row.
    lineNo++;
    if (header === null) {
      const first = rest.replace(/^\ufeff/, '');
      if (first.trim() !== '') handleHeader(split(first.replace(/\r$/, '')));
    } else {
      if (pending) handleRow(split((pending as { text: string }).text), (pending as { line: number }).line, false, true);
      pending = null;
      handleRow(split(rest.replace(/\r$/, '')), lineNo, true, false);
    }
  } else if (pending) {
    handleRow(split((pending as { text: string }).text), (pending as { line: number }).line, true, true);
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
