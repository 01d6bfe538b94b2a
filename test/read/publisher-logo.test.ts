// The publisher's logo (setting publisherLogo) at `check` level: the file's kind told by its first
// bytes, its pixel size read from its header, and every refusal an error naming the settings file,
// the setting, the logo file, what was found and what is expected.
//
// Reference images: test/fixtures/images/, written by Pillow 9.4 (test/reference/make-logo-images.py);
// the format and size of each below is what Pillow read back from the file (the script prints it),
// and agrees with file(1) (libmagic) for the PNG, JPEG and lossy WebP files.
import { mkdtempSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, test } from 'vitest';
import { readImageHeader } from '../../generator/read/image-header.ts';
import { loadScenario } from '../../generator/read/load-scenario.ts';
import { logoMaxBytes } from '../../generator/read/publisher-logo.ts';
import { publisherLogoFileName } from '../../generator/model/publisher-logo.ts';
import { baseScenario, expectIssue, scenarioCopy } from './fixture-scenario.ts';

const images = path.join(import.meta.dirname, '..', 'fixtures', 'images');
const image = (name: string): Buffer => readFileSync(path.join(images, name));
const made: string[] = [];
afterAll(() => {
  for (const dir of made) rmSync(dir, { recursive: true, force: true });
});

/** The base test coast with publisherLogo set and the given files added. */
function withLogo(logoPath: string, files: { [path: string]: string | Uint8Array } = {}): string {
  const settings = JSON.parse(readFileSync(path.join(baseScenario, 'scenario.json'), 'utf8')) as { [key: string]: unknown };
  const dir = scenarioCopy({ files: { ...files, 'scenario.json': JSON.stringify({ ...settings, publisherLogo: logoPath }, null, 2) } });
  made.push(dir);
  return dir;
}

async function refusal(dir: string) {
  const scenario = await loadScenario(dir);
  expect(scenario.report.ok).toBe(false);
  expect(scenario.publisherLogo ?? null).toBeNull();
  return expectIssue(scenario.report.issues, { code: 'PublisherLogoRefused', file: 'scenario.json', column: '$.publisherLogo', severity: 'error' });
}

describe('image headers (magic bytes and pixel size)', () => {
  test.each([
    // Pillow: PNG 120 x 48 (PNG signature and IHDR, ISO/IEC 15948 §5.2, §11.2.2)
    ['logo-120x48.png', 'png', 120, 48],
    // Pillow: JPEG 120 x 48, baseline SOF0 and progressive SOF2 (ITU-T T.81 §B.2.2)
    ['logo-120x48.jpg', 'jpeg', 120, 48],
    ['logo-120x48-progressive.jpg', 'jpeg', 120, 48],
    // Pillow: WEBP 120 x 48 as "VP8 " (lossy) and "VP8L" (lossless), 96 x 40 as "VP8X" (with alpha): WebP container specification
    ['logo-120x48-lossy.webp', 'webp', 120, 48],
    ['logo-120x48-lossless.webp', 'webp', 120, 48],
    ['logo-96x40-alpha.webp', 'webp', 96, 40],
    // Pillow: PNG 2400 x 12
    ['wide-2400x12.png', 'png', 2400, 12],
  ])('%s is %s, %i × %i', (name, type, width, height) => {
    expect(readImageHeader(image(name))).toEqual({ kind: 'raster', type, width, height });
  });

  test('a PNG signature cut short is a damaged PNG, not a crash', () => {
    expect(readImageHeader(image('logo-120x48.png').subarray(0, 12))).toMatchObject({ kind: 'broken', type: 'png' });
    expect(readImageHeader(image('logo-120x48.jpg').subarray(0, 40))).toMatchObject({ kind: 'broken', type: 'jpeg' });
  });
});

describe('publisherLogo at check', () => {
  test('a valid PNG is read: kind, size, digest, and listed among the inputs', async () => {
    const scenario = await loadScenario(withLogo('logo.png', { 'logo.png': image('logo-120x48.png') }));
    expect(scenario.report.issues.filter((i) => i.severity === 'error')).toEqual([]);
    expect(scenario.publisherLogo).toMatchObject({ file: 'logo.png', type: 'png', mediaType: 'image/png', width: 120, height: 48 });
    expect(scenario.inputs.find((i) => i.file === 'logo.png')?.bytes).toBe(image('logo-120x48.png').length);
  });

  test('an SVG is refused, saying it can carry script and asking for a PNG', async () => {
    const svg = '<?xml version="1.0"?>\n<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"><script>alert(1)</script></svg>\n';
    const found = await refusal(withLogo('logo.svg', { 'logo.svg': svg }));
    expect(found.message).toBe(
      'scenario.json, at $.publisherLogo: the logo file "logo.svg" is an SVG drawing; expected a PNG, JPEG or WebP image (told by its first bytes, not its name)',
    );
    expect(found.hint).toContain('can carry script');
    expect(found.hint).toContain('export the logo as a PNG');
  });

  test('a file over the size limit is refused with the size found', async () => {
    const big = new Uint8Array(300_000);
    big.set(image('logo-120x48.png'));
    const found = await refusal(withLogo('logo.png', { 'logo.png': big }));
    expect(logoMaxBytes).toBe(262_144);
    expect(found.message).toContain('the logo file "logo.png" is 293 KB (300000 bytes); expected at most 256 KB (262144 bytes)');
  });

  test('an image over 2,000 pixels a side is refused with its size', async () => {
    const found = await refusal(withLogo('logo.png', { 'logo.png': image('wide-2400x12.png') }));
    expect(found.message).toContain('is a PNG image of 2400 × 12 pixels; expected an image of 1 to 2000 pixels a side');
  });

  test('a PNG named .jpg is accepted as the PNG it is (kind from the bytes, served as .png)', async () => {
    const scenario = await loadScenario(withLogo('logo.jpg', { 'logo.jpg': image('logo-120x48.png') }));
    expect(scenario.report.issues.filter((i) => i.severity === 'error')).toEqual([]);
    expect(scenario.publisherLogo).toMatchObject({ file: 'logo.jpg', type: 'png', mediaType: 'image/png' });
    expect(publisherLogoFileName(scenario.publisherLogo!)).toMatch(/^[0-9a-f]{32}\.png$/);
  });

  test('a text file named logo.png is refused as plain text', async () => {
    const found = await refusal(withLogo('logo.png', { 'logo.png': 'Coastal Monitoring Office\n' }));
    expect(found.message).toBe(
      'scenario.json, at $.publisherLogo: the logo file "logo.png" is plain text; expected a PNG, JPEG or WebP image (told by its first bytes, not its name)',
    );
  });

  test('a symbolic link to a file outside the scenario folder is refused', async () => {
    const outside = mkdtempSync(path.join(tmpdir(), 'wrackline-outside-'));
    made.push(outside);
    writeFileSync(path.join(outside, 'logo.png'), image('logo-120x48.png'));
    const dir = withLogo('logo.png');
    symlinkSync(path.join(outside, 'logo.png'), path.join(dir, 'logo.png'));
    const found = await refusal(dir);
    expect(found.message).toContain('the logo file "logo.png" is a symbolic link to ');
    expect(found.message).toContain('outside the scenario folder; expected a file inside the scenario folder');
  });

  test('a missing file is refused, saying the path is relative to the scenario folder', async () => {
    const found = await refusal(withLogo('brand/logo.png'));
    expect(found.message).toContain('the logo file "brand/logo.png" is missing or unreadable');
    expect(found.message).toContain('the path is relative to it');
  });
});
