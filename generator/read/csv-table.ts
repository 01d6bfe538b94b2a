/**
 * Streams one CSV table described by a Frictionless Table Schema and dialect, checking the
 * header, every cell's type and constraints, and the primary key, and hands each good row to a
 * callback. The file is never read whole into memory. Every row left out is reported with its
 * reason; nothing here throws for bad input.
 *
 * Handled: UTF-8 byte-order mark, CR LF line ends, a separator other than the declared one
 * (detected on the header and reported), a declared semicolon separator with decimal commas,
 * missing or extra header columns, a header that is really data, rows with too few or too many
 * cells, a truncated last line, an unclosed quote, an empty file, gzip compression.
 */
import { createReadStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import { Transform } from 'node:stream';
import type { TransformCallback } from 'node:stream';
import { createGunzip } from 'node:zlib';
import { parse } from 'csv-parse';
import {
  BidiControlInText,
  ByteOrderMark,
  CsvUnreadable,
  DelimiterMismatch,
  DuplicateKey,
  FileEmpty,
  HeaderDuplicateColumn,
  HeaderLooksLikeData,
  HeaderMissingColumn,
  HeaderUnknownColumn,
  InputTooLarge,
  InvalidUtf8,
  LineTooLong,
  MarkupInText,
  NoDataRows,
  NulInText,
  QuoteNotClosed,
  RowTruncated,
  RowWrongLength,
  WindowsLineEnds,
} from '../errors.ts';
import { bidiControls, isolateBidi } from './bidi-controls.ts';
import { ExpansionGuard, InputBoundExceeded, maxRecordChars, maxRecordLabel } from './input-bounds.ts';
import type { IssueLog } from './issue-log.ts';
import { containsMarkup } from './markup.ts';
import type { Dialect } from './package-descriptor.ts';
import type { CellRule } from './table-cells.ts';
import { parseCell } from './table-cells.ts';

export interface TableRow {
  /** Line of the file where the record starts (the header is line 1). */
  line: number;
  values: { [column: string]: string | number | null };
  censored: { [column: string]: boolean };
}

export interface CsvTableOptions {
  absolutePath: string;
  /** Path shown in messages, relative to the scenario folder. */
  file: string;
  dialect: Dialect;
  compression: string | null;
  /** Rules of every schema field, in schema order. */
  rules: readonly CellRule[];
  missingValues: readonly string[];
  /** Columns that must be in the header for the table to be read at all. */
  essentialColumns: readonly string[];
  /** Primary key columns; duplicates are reported and the later row left out. */
  primaryKey: readonly string[];
  log: IssueLog;
  onProgress?: (bytesRead: number, bytesTotal: number) => void;
  /** Called for each row whose cells passed; returns whether the row was kept. It logs its own reasons. */
  onRow: (row: TableRow) => 'kept' | 'excluded';
  /** Told of each row left out here (bad cells, duplicate id), with the cells that did parse. */
  onLeftOut?: (row: TableRow) => void;
}

const candidateDelimiters = [',', ';', '\t', '|'];

/** Counts each candidate separator in a line, outside double quotes. */
function countDelimiters(line: string): Map<string, number> {
  const counts = new Map<string, number>(candidateDelimiters.map((d) => [d, 0]));
  let quoted = false;
  for (const ch of line) {
    if (ch === '"') quoted = !quoted;
    else if (!quoted && counts.has(ch)) counts.set(ch, (counts.get(ch) ?? 0) + 1);
  }
  return counts;
}

function openStream(path: string, compression: string | null, onBytes: (n: number) => void): NodeJS.ReadableStream {
  const raw = createReadStream(path, { highWaterMark: 256 * 1024 });
  let compressed = 0;
  raw.on('data', (chunk: Buffer | string) => {
    const n = typeof chunk === 'string' ? Buffer.byteLength(chunk) : chunk.length;
    compressed += n;
    onBytes(n);
  });
  if (compression === 'gz' || compression === 'gzip') {
    const gunzip = createGunzip();
    const guard = new ExpansionGuard(() => compressed);
    raw.on('error', (error) => gunzip.destroy(error));
    gunzip.on('error', (error) => guard.destroy(error));
    guard.on('error', () => raw.destroy());
    return raw.pipe(gunzip).pipe(guard);
  }
  const guard = new ExpansionGuard(null);
  raw.on('error', (error) => guard.destroy(error));
  guard.on('error', () => raw.destroy());
  return raw.pipe(guard);
}

/** Reads the first bytes (decompressed) to look at the header line. */
async function peek(path: string, compression: string | null, bytes = 65_536): Promise<Buffer> {
  const stream = openStream(path, compression, () => {});
  const chunks: Buffer[] = [];
  let total = 0;
  try {
    for await (const chunk of stream as AsyncIterable<Buffer>) {
      chunks.push(chunk);
      total += chunk.length;
      if (total >= bytes) break;
    }
  } catch {
    // a broken stream is reported by the full read
  }
  (stream as unknown as { destroy?: () => void }).destroy?.();
  return Buffer.concat(chunks).subarray(0, bytes);
}

/** Counts non-empty lines after the header, for tables left out whole. */
export async function countDataLines(path: string, compression: string | null, header: boolean): Promise<number> {
  let lines = 0;
  let current = 0;
  try {
    for await (const chunk of openStream(path, compression, () => {}) as AsyncIterable<Buffer>) {
      for (const byte of chunk) {
        if (byte === 10) {
          if (current > 0) lines++;
          current = 0;
        } else if (byte !== 13) current++;
      }
    }
  } catch {
    // partial count is the best we can do for a broken file
  }
  if (current > 0) lines++;
  return Math.max(0, lines - (header ? 1 : 0));
}

/** Tracks the last byte seen so the reader can tell whether the file ends with a line end. */
class LastByte extends Transform {
  last = -1;
  override _transform(chunk: Buffer, _encoding: BufferEncoding, callback: TransformCallback): void {
    if (chunk.length > 0) this.last = chunk[chunk.length - 1] ?? -1;
    callback(null, chunk);
  }
}

/** Marks every row of a table left out whole: read = excluded = the data lines counted. */
async function excludeWholeTable(options: CsvTableOptions): Promise<void> {
  const lines = await countDataLines(options.absolutePath, options.compression, options.dialect.header);
  const counts = options.log.countsFor(options.file);
  counts.read += lines;
  counts.excluded += lines;
}

export async function readCsvTable(options: CsvTableOptions): Promise<void> {
  const { file, log, dialect, rules } = options;
  const counts = log.countsFor(file);
  let size = 0;
  try {
    size = (await stat(options.absolutePath)).size;
  } catch {
    size = 0;
  }

  // Look at the start of the file: empty, byte-order mark, line ends, separator.
  const head = await peek(options.absolutePath, options.compression);
  const hasBom = head[0] === 0xef && head[1] === 0xbb && head[2] === 0xbf;
  const headText = head.subarray(hasBom ? 3 : 0).toString('utf8');
  if (headText.trim().length === 0) {
    log.add(FileEmpty, FileEmpty.message(file), { file, row: 1, column: null, value: null, expected: 'a header row and data rows', severity: 'error', excluded: true });
    return;
  }
  if (hasBom) {
    log.add(ByteOrderMark, ByteOrderMark.message(file), { file, row: 1, column: null, value: null, expected: 'UTF-8 text', severity: 'warning', excluded: false });
  }
  const firstLineEnd = headText.indexOf('\n');
  const firstLine = (firstLineEnd === -1 ? headText : headText.slice(0, firstLineEnd)).replace(/\r$/, '');
  if (firstLineEnd > 0 && headText[firstLineEnd - 1] === '\r') {
    log.add(WindowsLineEnds, WindowsLineEnds.message(file), {
      file,
      row: 1,
      column: null,
      value: null,
      expected: 'lines ending in LF or CR LF',
      severity: 'warning',
      excluded: false,
    });
  }
  const delimiterCounts = countDelimiters(firstLine);
  if (rules.length > 1 && (delimiterCounts.get(dialect.delimiter) ?? 0) === 0) {
    const found = candidateDelimiters.find((d) => d !== dialect.delimiter && (delimiterCounts.get(d) ?? 0) > 0);
    if (found !== undefined) {
      log.add(DelimiterMismatch, DelimiterMismatch.message(file, found, dialect.delimiter), {
        file,
        row: 1,
        column: null,
        value: found,
        expected: `columns separated by ${JSON.stringify(dialect.delimiter)}`,
        severity: 'error',
        excluded: true,
      });
      await excludeWholeTable(options);
      return;
    }
  }

  let bytesRead = 0;
  let lastReport = 0;
  const lastByte = new LastByte();
  const source = openStream(options.absolutePath, options.compression, (n) => {
    bytesRead += n;
    if (options.onProgress && bytesRead - lastReport > 1_048_576) {
      lastReport = bytesRead;
      options.onProgress(bytesRead, size);
    }
  });
  source.on('error', (error: Error) => lastByte.destroy(error));
  const parser = source.pipe(lastByte).pipe(
    parse({
      delimiter: dialect.delimiter,
      quote: dialect.quoteChar,
      bom: true,
      relax_column_count: true,
      relax_quotes: true,
      skip_empty_lines: true,
      info: true,
      max_record_size: maxRecordChars,
    }),
  );
  lastByte.on('error', (error: Error) => parser.destroy(error));

  let columnIndex: Map<string, number> | null = dialect.header ? null : new Map(rules.map((r, i) => [r.name, i]));
  let headerLength = rules.length;
  const seenKeys = new Map<string, number>();
  let held: { cells: string[]; line: number } | null = null;
  let tableRejected = false;

  const handleHeader = (cells: string[]): boolean => {
    const names = cells.map((c) => c.trim());
    const known = new Set(rules.map((r) => r.name));
    const matched = names.filter((n) => known.has(n));
    if (matched.length === 0) {
      log.add(HeaderLooksLikeData, HeaderLooksLikeData.message(file, cells.join(dialect.delimiter)), {
        file,
        row: 1,
        column: null,
        value: cells.join(dialect.delimiter),
        expected: `a header naming ${rules.map((r) => r.name).join(', ')}`,
        severity: 'error',
        excluded: true,
      });
      return false;
    }
    columnIndex = new Map();
    let usable = true;
    const firstAt = new Map<string, number>();
    names.forEach((n, i) => {
      const first = firstAt.get(n);
      if (first === undefined) {
        firstAt.set(n, i);
        return;
      }
      const isKnown = known.has(n);
      log.add(HeaderDuplicateColumn, HeaderDuplicateColumn.message(file, n, first + 1, i + 1), {
        file,
        row: 1,
        column: n,
        value: n,
        expected: 'each column named once',
        severity: isKnown ? 'error' : 'warning',
        excluded: isKnown,
      });
      if (isKnown) usable = false;
    });
    names.forEach((n, i) => {
      if (known.has(n) && !columnIndex?.has(n)) columnIndex?.set(n, i);
      else if (!known.has(n)) {
        log.add(HeaderUnknownColumn, HeaderUnknownColumn.message(file, n), {
          file,
          row: 1,
          column: n,
          value: n,
          expected: 'a field of the table schema',
          severity: 'warning',
          excluded: false,
        });
      }
    });
    headerLength = cells.length;
    for (const rule of rules) {
      if (columnIndex.has(rule.name)) continue;
      const essential = options.essentialColumns.includes(rule.name) || rule.required;
      log.add(HeaderMissingColumn, HeaderMissingColumn.message(file, rule.name, names.join(dialect.delimiter)), {
        file,
        row: 1,
        column: rule.name,
        value: names.join(dialect.delimiter),
        expected: `a column named ${rule.name}`,
        severity: essential ? 'error' : 'warning',
        excluded: essential,
      });
      if (essential) usable = false;
    }
    return usable;
  };

  const handleRecord = (cells: string[], line: number, isLast: boolean): void => {
    counts.read++;
    if (cells.length !== headerLength) {
      const truncated = isLast && cells.length < headerLength && lastByte.last !== 10 && lastByte.last !== 13;
      const entry = truncated ? RowTruncated : RowWrongLength;
      log.add(entry, entry.message(file, line, cells.length, headerLength), {
        file,
        row: line,
        column: null,
        value: cells.join(dialect.delimiter),
        expected: `${headerLength} cells`,
        severity: 'warning',
        excluded: true,
      });
      counts.excluded++;
      return;
    }
    const row: TableRow = { line, values: {}, censored: {} };
    let bad = false;
    for (const rule of rules) {
      const index = columnIndex?.get(rule.name);
      const raw = index === undefined ? '' : (cells[index] ?? '');
      const hidden = raw.includes('\ufffd') ? InvalidUtf8 : raw.includes('\0') ? NulInText : null;
      if (hidden !== null) {
        bad = true;
        log.add(hidden, hidden.message(file, line, rule.name, raw), {
          file,
          row: line,
          column: rule.name,
          value: raw,
          expected: 'UTF-8 text without control bytes',
          severity: 'warning',
          excluded: true,
        });
        continue;
      }
      const result = parseCell(raw, rule, options.missingValues, dialect.decimalChar, file, line);
      if (!result.ok) {
        bad = true;
        log.add(result.problem.entry, result.problem.message, {
          file,
          row: line,
          column: rule.name,
          value: raw,
          expected: result.problem.expected,
          severity: 'warning',
          excluded: true,
          ...(result.problem.hint === undefined ? {} : { hint: result.problem.hint }),
        });
        continue;
      }
      const controls = typeof result.value === 'string' ? bidiControls(result.value) : [];
      row.values[rule.name] = typeof result.value === 'string' && controls.length > 0 ? isolateBidi(result.value) : result.value;
      row.censored[rule.name] = result.censored;
      if (rule.type !== 'integer' && rule.type !== 'number' && typeof result.value === 'string' && containsMarkup(result.value)) {
        log.add(MarkupInText, MarkupInText.message(file, line, rule.name, result.value), {
          file,
          row: line,
          column: rule.name,
          value: result.value,
          expected: 'plain text',
          severity: 'warning',
          excluded: false,
        });
      }
      if (typeof result.value === 'string' && controls.length > 0) {
        log.add(BidiControlInText, BidiControlInText.message(file, line, rule.name, result.value, controls.join(', ')), {
          file,
          row: line,
          column: rule.name,
          value: result.value,
          expected: 'text without direction controls',
          severity: 'warning',
          excluded: false,
        });
      }
    }
    if (bad) {
      counts.excluded++;
      options.onLeftOut?.(row);
      return;
    }
    if (options.primaryKey.length > 0) {
      const key = JSON.stringify(options.primaryKey.map((k) => row.values[k] ?? null));
      const first = seenKeys.get(key);
      if (first !== undefined) {
        const column = options.primaryKey.join('+');
        const value = options.primaryKey.map((k) => String(row.values[k] ?? '')).join('+');
        log.add(DuplicateKey, DuplicateKey.message(file, line, column, value, first), {
          file,
          row: line,
          column,
          value,
          expected: 'a unique id',
          severity: 'warning',
          excluded: true,
        });
        counts.excluded++;
        options.onLeftOut?.(row);
        return;
      }
      seenKeys.set(key, line);
    }
    if (options.onRow(row) === 'kept') counts.kept++;
    else counts.excluded++;
  };

  // Line where the last complete record ended: a record that cannot be finished starts after it.
  let lastEnd = 0;
  try {
    for await (const item of parser as AsyncIterable<{ record: string[]; info: { lines: number } }>) {
      const cells = item.record;
      lastEnd = item.info.lines;
      // The record's first line: its end line minus line breaks inside quoted cells.
      const inner = cells.reduce((n, c) => n + (c.match(/\n/g)?.length ?? 0), 0);
      const line = item.info.lines - inner;
      if (tableRejected) {
        counts.read++;
        counts.excluded++;
        continue;
      }
      if (columnIndex === null) {
        if (!handleHeader(cells)) {
          tableRejected = true;
        }
        continue;
      }
      if (held) handleRecord(held.cells, held.line, false);
      held = { cells, line };
    }
    if (held) handleRecord(held.cells, held.line, true);
  } catch (error) {
    if (held) handleRecord(held.cells, held.line, false);
    const code = (error as { code?: string }).code;
    const reason = error instanceof Error ? error.message : String(error);
    const place = { file, row: lastEnd + 1, column: null, value: null, severity: 'error', excluded: true } as const;
    if (error instanceof InputBoundExceeded) {
      log.add(InputTooLarge, InputTooLarge.message(file, lastEnd + 1, reason), { ...place, expected: 'a table of ordinary size' });
    } else if (code === 'CSV_MAX_RECORD_SIZE') {
      log.add(LineTooLong, LineTooLong.message(file, lastEnd + 1, maxRecordLabel), { ...place, expected: `rows shorter than ${maxRecordLabel}` });
    } else if (code === 'CSV_QUOTE_NOT_CLOSED') {
      // Reported where the quoted cell opens, not where the file ends.
      log.add(QuoteNotClosed, QuoteNotClosed.message(file, lastEnd + 1, reason), { ...place, expected: 'well-formed CSV to the end of the file' });
    } else {
      const errorLine = (error as { lines?: number }).lines ?? counts.read + 1;
      log.add(CsvUnreadable, CsvUnreadable.message(file, errorLine, reason), { ...place, row: errorLine, expected: 'well-formed CSV to the end of the file' });
    }
  }
  if (counts.read === 0 && !tableRejected && columnIndex !== null) {
    log.add(NoDataRows, NoDataRows.message(file), { file, row: 2, column: null, value: null, expected: 'at least one data row', severity: 'warning', excluded: false });
  }
  if (options.onProgress) options.onProgress(bytesRead, size);
}
