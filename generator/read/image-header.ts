/**
 * What kind of image a file is, told by its first bytes (its "magic bytes"), never by its name,
 * and its width and height in pixels read from the header. Pure: bytes in, a description out.
 *
 * Only the three raster formats a publisher's logo may use are measured:
 * - PNG (W3C PNG Specification, 2nd edition = ISO/IEC 15948:2004, §5.2 and §11.2.2): the eight
 *   signature bytes 89 50 4E 47 0D 0A 1A 0A, then the IHDR chunk first (length, "IHDR"), whose data
 *   starts with width and height as 4-byte big-endian integers (bytes 16–19 and 20–23 of the file).
 * - JPEG (ITU-T T.81 = ISO/IEC 10918-1, Annex B; JFIF 1.02 = ITU-T T.871): SOI marker FF D8, then
 *   marker segments (FF, marker code, 2-byte big-endian length counting itself); the frame header
 *   of a start-of-frame marker SOF0–SOF15 other than DHT (C4), JPG (C8) and DAC (CC) holds
 *   precision (1 byte), number of lines = height (2 bytes) and samples per line = width (2 bytes)
 *   (T.81 §B.2.2). Standalone markers (TEM 01, RST0–7 D0–D7) carry no length.
 * - WebP (Google, "WebP Container Specification"): a RIFF container, "RIFF", 4-byte little-endian
 *   size, "WEBP", then the first chunk at byte 12: "VP8 " (lossy; the frame header after a 3-byte
 *   frame tag has the start code 9D 01 2A, then 14-bit little-endian width and height, RFC 6386
 *   §9.1), "VP8L" (lossless; signature byte 2F, then 14-bit width − 1 and 14-bit height − 1
 *   packed little-endian) or "VP8X" (extended; 24-bit little-endian canvas width − 1 and height − 1
 *   at bytes 24–26 and 27–29).
 * Other kinds are only named (SVG, GIF, BMP, TIFF, ICO, PDF, HTML, plain text) so an error can
 * say what was found. Written by hand rather than with a package such as image-size: the three
 * headers are a few lines each, and the project's dependencies are installed once for every
 * engineer (see DEVELOPERS.md, "Written by hand, and why").
 */

export type RasterType = 'png' | 'jpeg' | 'webp';

export type ImageHeader =
  | { kind: 'raster'; type: RasterType; width: number; height: number }
  /** A raster signature whose header is cut short or malformed. */
  | { kind: 'broken'; type: RasterType; reason: string }
  /** Anything else: `found` names it in words ("an SVG drawing", "plain text", …). */
  | { kind: 'other'; found: string; svg: boolean };

export const mediaTypes: { readonly [type in RasterType]: string } = { png: 'image/png', jpeg: 'image/jpeg', webp: 'image/webp' };
export const extensions: { readonly [type in RasterType]: string } = { png: 'png', jpeg: 'jpg', webp: 'webp' };

const pngSignature = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

function startsWith(bytes: Uint8Array, prefix: readonly number[], at = 0): boolean {
  if (bytes.length < at + prefix.length) return false;
  return prefix.every((value, i) => bytes[at + i] === value);
}

function ascii(bytes: Uint8Array, at: number, length: number): string {
  if (bytes.length < at + length) return '';
  return String.fromCharCode(...bytes.subarray(at, at + length));
}

function u16be(bytes: Uint8Array, at: number): number {
  return ((bytes[at] ?? 0) << 8) | (bytes[at + 1] ?? 0);
}

function u32be(bytes: Uint8Array, at: number): number {
  return ((bytes[at] ?? 0) * 0x1000000 + (((bytes[at + 1] ?? 0) << 16) | ((bytes[at + 2] ?? 0) << 8) | (bytes[at + 3] ?? 0))) >>> 0;
}

function u16le(bytes: Uint8Array, at: number): number {
  return (bytes[at] ?? 0) | ((bytes[at + 1] ?? 0) << 8);
}

function u24le(bytes: Uint8Array, at: number): number {
  return (bytes[at] ?? 0) | ((bytes[at + 1] ?? 0) << 8) | ((bytes[at + 2] ?? 0) << 16);
}

function png(bytes: Uint8Array): ImageHeader {
  // §5.3: the first chunk must be IHDR, 13 data bytes.
  if (bytes.length < 24 || ascii(bytes, 12, 4) !== 'IHDR') return { kind: 'broken', type: 'png', reason: 'no IHDR chunk after the PNG signature' };
  return { kind: 'raster', type: 'png', width: u32be(bytes, 16), height: u32be(bytes, 20) };
}

/** Start-of-frame markers of T.81 Table B.1: C0–CF except DHT (C4), JPG (C8) and DAC (CC). */
function isStartOfFrame(marker: number): boolean {
  return marker >= 0xc0 && marker <= 0xcf && marker !== 0xc4 && marker !== 0xc8 && marker !== 0xcc;
}

function jpeg(bytes: Uint8Array): ImageHeader {
  let at = 2;
  while (at < bytes.length) {
    if (bytes[at] !== 0xff) return { kind: 'broken', type: 'jpeg', reason: `no marker at byte ${at}` };
    // Fill bytes: any number of FF before a marker code (T.81 §B.1.1.2).
    while (bytes[at] === 0xff && at < bytes.length) at += 1;
    const marker = bytes[at];
    at += 1;
    if (marker === undefined) break;
    if (marker === 0xd9 || marker === 0xda) return { kind: 'broken', type: 'jpeg', reason: 'no frame header before the image data' };
    if (marker === 0x01 || (marker >= 0xd0 && marker <= 0xd7)) continue;
    if (at + 2 > bytes.length) break;
    const length = u16be(bytes, at);
    if (length < 2) return { kind: 'broken', type: 'jpeg', reason: `a marker segment of length ${length} at byte ${at}` };
    if (isStartOfFrame(marker)) {
      if (at + 7 > bytes.length) break;
      return { kind: 'raster', type: 'jpeg', width: u16be(bytes, at + 5), height: u16be(bytes, at + 3) };
    }
    at += length;
  }
  return { kind: 'broken', type: 'jpeg', reason: 'the file ends before a frame header' };
}

function webp(bytes: Uint8Array): ImageHeader {
  const chunk = ascii(bytes, 12, 4);
  if (chunk === 'VP8 ') {
    if (bytes.length < 30 || !startsWith(bytes, [0x9d, 0x01, 0x2a], 23)) return { kind: 'broken', type: 'webp', reason: 'a lossy chunk without the VP8 start code' };
    return { kind: 'raster', type: 'webp', width: u16le(bytes, 26) & 0x3fff, height: u16le(bytes, 28) & 0x3fff };
  }
  if (chunk === 'VP8L') {
    if (bytes.length < 25 || bytes[20] !== 0x2f) return { kind: 'broken', type: 'webp', reason: 'a lossless chunk without its signature byte' };
    const bits = (bytes[21] ?? 0) | ((bytes[22] ?? 0) << 8) | ((bytes[23] ?? 0) << 16) | ((bytes[24] ?? 0) << 24);
    return { kind: 'raster', type: 'webp', width: (bits & 0x3fff) + 1, height: ((bits >>> 14) & 0x3fff) + 1 };
  }
  if (chunk === 'VP8X') {
    if (bytes.length < 30) return { kind: 'broken', type: 'webp', reason: 'an extended header cut short' };
    return { kind: 'raster', type: 'webp', width: u24le(bytes, 24) + 1, height: u24le(bytes, 27) + 1 };
  }
  return { kind: 'broken', type: 'webp', reason: `an unknown first chunk ${JSON.stringify(chunk)}` };
}

/** The first bytes as text when they look like text (UTF-8 without control characters but tab and line ends). */
function textStart(bytes: Uint8Array): string | null {
  const head = bytes.subarray(0, 1024);
  for (const byte of head) if (byte < 0x20 && byte !== 0x09 && byte !== 0x0a && byte !== 0x0d) return null;
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(head.length < bytes.length ? head.subarray(0, Math.max(0, head.length - 4)) : head);
  } catch {
    return null;
  }
}

function hex(bytes: Uint8Array): string {
  return [...bytes.subarray(0, 8)].map((b) => b.toString(16).padStart(2, '0').toUpperCase()).join(' ');
}

/** The kind of image the bytes are, and for PNG, JPEG and WebP their size in pixels. */
export function readImageHeader(bytes: Uint8Array): ImageHeader {
  if (startsWith(bytes, pngSignature)) return png(bytes);
  if (startsWith(bytes, [0xff, 0xd8, 0xff])) return jpeg(bytes);
  if (ascii(bytes, 0, 4) === 'RIFF' && ascii(bytes, 8, 4) === 'WEBP') return webp(bytes);
  if (bytes.length === 0) return { kind: 'other', found: 'an empty file', svg: false };
  if (ascii(bytes, 0, 4) === 'GIF8') return { kind: 'other', found: 'a GIF image', svg: false };
  if (ascii(bytes, 0, 2) === 'BM') return { kind: 'other', found: 'a BMP image', svg: false };
  if (ascii(bytes, 0, 4) === 'II*\u0000' || ascii(bytes, 0, 4) === 'MM\u0000*') return { kind: 'other', found: 'a TIFF image', svg: false };
  if (startsWith(bytes, [0x00, 0x00, 0x01, 0x00])) return { kind: 'other', found: 'an ICO icon', svg: false };
  if (ascii(bytes, 4, 4) === 'ftyp') return { kind: 'other', found: `an ISO media file (${JSON.stringify(ascii(bytes, 8, 4))}, e.g. AVIF or HEIC)`, svg: false };
  if (ascii(bytes, 0, 5) === '%PDF-') return { kind: 'other', found: 'a PDF document', svg: false };
  const text = textStart(bytes);
  if (text !== null) {
    const lower = text
      .replace(/^\ufeff/, '')
      .trimStart()
      .toLowerCase();
    if (/<svg[\s>]/.test(lower)) return { kind: 'other', found: 'an SVG drawing', svg: true };
    if (lower.startsWith('<!doctype html') || lower.startsWith('<html')) return { kind: 'other', found: 'an HTML page', svg: false };
    return { kind: 'other', found: 'plain text', svg: false };
  }
  return { kind: 'other', found: `bytes of no known image format (starting ${hex(bytes)})`, svg: false };
}
