/**
 * Map colours against WCAG 2.1 SC 1.4.11 (non-text contrast, at least 3:1), with the relative
 * luminance and contrast ratio as defined in WCAG 2.1 (W3C 2018, "relative luminance" and
 * "contrast ratio" definitions, sRGB with the 0.03928 threshold).
 */
import { describe, expect, it } from 'vitest';
import { mapColours } from '../../site/lib/map.ts';
import { levelOrder, levelStyles } from '../../site/lib/levels.ts';

function luminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255).map((c) => (c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4));
  return 0.2126 * r! + 0.7152 * g! + 0.0722 * b!;
}

function contrast(a: string, b: string): number {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi! + 0.05) / (lo! + 0.05);
}

describe('map colours', () => {
  it('reproduces the WCAG 2.1 contrast of black on white (21:1) and of #767676 on white (4.54:1)', () => {
    // W3C WCAG 2.1: black/white is 21:1; #767676 on white is the well-known 4.54:1 (common practice check value)
    expect(contrast('#000000', '#ffffff')).toBeCloseTo(21, 5);
    expect(contrast('#767676', '#ffffff')).toBeCloseTo(4.54, 2);
  });

  for (const id of levelOrder) {
    for (const ground of ['sea', 'land', 'plain'] as const) {
      it(`level ${id} line keeps 3:1 against the ${ground}`, () => {
        expect(contrast(levelStyles[id].stroke, mapColours[ground])).toBeGreaterThanOrEqual(3);
      });
    }
  }

  it('land and sea are told apart from each other and from the white casing of segment lines', () => {
    expect(contrast(mapColours.land, mapColours.sea)).toBeGreaterThan(1.05);
    expect(contrast(mapColours.land, '#ffffff')).toBeGreaterThan(1.15);
  });
});
