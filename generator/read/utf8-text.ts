/**
 * Text files (segments, land, settings, datapackage.json) read as strict UTF-8. Node's `readFile(…,
 * 'utf8')` replaces every byte that is not UTF-8 with U+FFFD without a word, so a place name saved
 * in another encoding would be published garbled. Here such a file is refused, naming the first
 * line that holds such bytes. Lines are split at the byte 0x0A, which is never part of a longer
 * UTF-8 sequence (RFC 3629 §3), so each line can be checked on its own.
 */
import { isUtf8 } from 'node:buffer';
import { readFile } from 'node:fs/promises';
import { FileNotUtf8 } from '../errors.ts';
import type { IssueLog } from './issue-log.ts';

export type Utf8Outcome = { ok: true; text: string } | { ok: false; line: number; sample: string };

/** The bytes as text, or the first line (from 1) holding bytes that are not UTF-8, with up to 80 characters of it. */
export function decodeUtf8(bytes: Uint8Array): Utf8Outcome {
  const buffer = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (isUtf8(buffer)) return { ok: true, text: buffer.toString('utf8') };
  let start = 0;
  let line = 1;
  for (;;) {
    const newline = buffer.indexOf(0x0a, start);
    const end = newline === -1 ? buffer.length : newline;
    const slice = buffer.subarray(start, end);
    if (!isUtf8(slice) || newline === -1) return { ok: false, line, sample: slice.toString('utf8').trim().slice(0, 80) };
    start = end + 1;
    line++;
  }
}

/** Reads a file as strict UTF-8 (see decodeUtf8); a byte-order mark at the start is dropped. */
export async function readUtf8File(absolutePath: string): Promise<Utf8Outcome> {
  const outcome = decodeUtf8(await readFile(absolutePath));
  return outcome.ok ? { ok: true, text: outcome.text.replace(/^\ufeff/, '') } : outcome;
}

/** The file's text, or null after logging FileNotUtf8 (an error that leaves the file out) naming its first bad row. */
export async function readUtf8Logged(absolutePath: string, file: string, log: IssueLog, expected: string): Promise<string | null> {
  const read = await readUtf8File(absolutePath);
  if (read.ok) return read.text;
  log.add(FileNotUtf8, FileNotUtf8.message(file, read.line, read.sample), { file, row: read.line, column: null, value: read.sample, expected, severity: 'error', excluded: true });
  return null;
}
