/**
 * The publisher's logo (setting `publisherLogo`): a small raster image inside the scenario folder,
 * shown beside the publisher's name in every page header.
 *
 * The path goes through the same resolver as every resource (inside-folder.ts: realpath, and the
 * real place must lie inside the scenario folder). The file's kind is told by its first bytes
 * (image-header.ts), never by its name: PNG, JPEG and WebP are accepted whatever the file is
 * called (a PNG named logo.jpg is used as the PNG it is); SVG is refused because an SVG drawing
 * can carry script and links, and everything else is refused naming what was found. Size and
 * pixel dimensions are bounded so a logo cannot weigh down every page or break the header.
 *
 * `logoVerdict` is the pure decision; `readPublisherLogo` does the file work and reports.
 */
import { createHash } from 'node:crypto';
import { lstat, readFile, stat } from 'node:fs/promises';
import path from 'node:path';
import { PublisherLogoRefused } from '../errors.ts';
import type { PublisherLogo } from '../scenario/types.ts';
import { type ImageHeader, mediaTypes, readImageHeader } from './image-header.ts';
import { placeInFolder } from './inside-folder.ts';
import type { IssueLog } from './issue-log.ts';

/** At most 256 KB: a header logo needs a few kilobytes (common practice for web page logos). */
export const logoMaxBytes = 256 * 1024;
/** At most 2,000 pixels a side: several times the largest size the header shows. */
export const logoMaxSide = 2000;

export type LogoVerdict = { ok: true; header: Extract<ImageHeader, { kind: 'raster' }> } | { ok: false; found: string; expected: string; hint?: string };

const rasterExpected = 'a PNG, JPEG or WebP image (told by its first bytes, not its name)';

function kilobytes(bytes: number): string {
  return `${(bytes / 1024).toLocaleString('en', { maximumFractionDigits: 1 })} KB`;
}

/** Whether `bytes` (the whole file) can be the logo: kind, size and pixel dimensions. */
export function logoVerdict(bytes: Uint8Array): LogoVerdict {
  if (bytes.length > logoMaxBytes) {
    return { ok: false, found: `${kilobytes(bytes.length)} (${bytes.length} bytes)`, expected: `at most ${kilobytes(logoMaxBytes)} (${logoMaxBytes} bytes)` };
  }
  const header = readImageHeader(bytes);
  if (header.kind === 'other') {
    if (header.svg) {
      return {
        ok: false,
        found: header.found,
        expected: rasterExpected,
        hint: 'SVG is refused because an SVG drawing can carry script and links that would be part of every page; export the logo as a PNG (about 400 pixels wide) and name that file instead',
      };
    }
    return { ok: false, found: header.found, expected: rasterExpected };
  }
  if (header.kind === 'broken') return { ok: false, found: `a damaged ${header.type.toUpperCase()} file (${header.reason})`, expected: rasterExpected };
  if (header.width < 1 || header.height < 1 || header.width > logoMaxSide || header.height > logoMaxSide) {
    return {
      ok: false,
      found: `a ${header.type.toUpperCase()} image of ${header.width} × ${header.height} pixels`,
      expected: `an image of 1 to ${logoMaxSide} pixels a side`,
    };
  }
  return { ok: true, header };
}

/**
 * Reads and checks the logo named at `jsonPath` of the settings file. Every refusal is an error
 * in the report naming the settings file, the setting, the logo file, what was found and what is
 * expected; returns null then.
 */
export async function readPublisherLogo(realFolder: string, relative: string, settingsFile: string, log: IssueLog, jsonPath = '$.publisherLogo'): Promise<PublisherLogo | null> {
  const refuse = (found: string, expected: string, hint?: string): null => {
    log.add(PublisherLogoRefused, PublisherLogoRefused.message(settingsFile, jsonPath, relative, found, expected), {
      file: settingsFile,
      row: null,
      column: jsonPath,
      value: relative,
      expected,
      severity: 'error',
      excluded: true,
      ...(hint === undefined ? {} : { hint }),
    });
    return null;
  };
  let bytes: Uint8Array;
  try {
    const placement = await placeInFolder(realFolder, relative);
    if (!placement.inside) {
      const through = (await lstat(path.join(realFolder, relative)).catch(() => null))?.isSymbolicLink() ? 'a symbolic link to ' : '';
      return refuse(
        `${through}${placement.real}, outside the scenario folder`,
        'a file inside the scenario folder',
        'Copy the logo into the scenario folder; links may only point to places inside it',
      );
    }
    const info = await stat(placement.real);
    if (!info.isFile()) return refuse('not a file', 'an image file inside the scenario folder');
    // Refused before reading it whole: a huge file is never loaded.
    if (info.size > logoMaxBytes) return refuse(`${kilobytes(info.size)} (${info.size} bytes)`, `at most ${kilobytes(logoMaxBytes)} (${logoMaxBytes} bytes)`);
    bytes = new Uint8Array(await readFile(placement.real));
  } catch (error) {
    return refuse(`missing or unreadable (${error instanceof Error ? error.message : String(error)})`, 'an image file inside the scenario folder; the path is relative to it');
  }
  const verdict = logoVerdict(bytes);
  if (!verdict.ok) return refuse(verdict.found, verdict.expected, verdict.hint);
  return {
    file: relative,
    sha256: createHash('sha256').update(bytes).digest('hex'),
    bytes,
    type: verdict.header.type,
    mediaType: mediaTypes[verdict.header.type],
    width: verdict.header.width,
    height: verdict.header.height,
  };
}
