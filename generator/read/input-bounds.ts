/**
 * Bounds on how much a single input file may make Wrackline read, so a hostile or broken file
 * ends quickly with a clear report entry instead of exhausting memory or time:
 *
 * - decompressed size: a gzip file may expand at most `maxExpansionRatio` times its compressed
 *   size once past `expansionAllowance` bytes (ordinary CSV compresses 5 to 20 times; a gzip bomb
 *   of repeated bytes expands about 1,000 times, the DEFLATE maximum, RFC 1951 §3.2.5 lengths);
 * - total size: at most `maxTotalBytes` decompressed bytes from one file;
 * - line length: a record may span at most `maxRecordChars` characters (a row of a monitoring
 *   table is a few hundred), so a file without line ends cannot be held whole.
 */
import { Transform } from 'node:stream';
import type { TransformCallback } from 'node:stream';

export const maxExpansionRatio = 200;
export const expansionAllowance = 64 * 1024 * 1024;
export const maxTotalBytes = 16 * 1024 * 1024 * 1024;
export const maxRecordChars = 1024 * 1024;
export const maxRecordLabel = '1 MB';

/** The error a bounded stream ends with; readers turn it into an InputTooLarge entry. */
export class InputBoundExceeded extends Error {
  constructor(reason: string) {
    super(reason);
    this.name = 'InputBoundExceeded';
  }
}

function megabytes(bytes: number): string {
  return `${Math.round(bytes / 1024 / 1024).toLocaleString('en-GB')} MB`;
}

/**
 * Passes bytes through, failing once more than the allowed bytes came out of a file whose
 * compressed size so far is given by `compressedBytes()` (null for a plain file).
 */
export class ExpansionGuard extends Transform {
  private total = 0;
  constructor(private readonly compressedBytes: (() => number) | null) {
    super();
  }
  override _transform(chunk: Buffer, _encoding: BufferEncoding, callback: TransformCallback): void {
    this.total += chunk.length;
    if (this.total > maxTotalBytes) {
      callback(new InputBoundExceeded(`the file holds more than ${megabytes(maxTotalBytes)}`));
      return;
    }
    const compressed = this.compressedBytes?.();
    if (compressed !== undefined && this.total > expansionAllowance && this.total > compressed * maxExpansionRatio) {
      callback(
        new InputBoundExceeded(`the compressed file expands more than ${maxExpansionRatio} times (${megabytes(compressed)} to over ${megabytes(this.total)}), as a gzip bomb does`),
      );
      return;
    }
    callback(null, chunk);
  }
}
