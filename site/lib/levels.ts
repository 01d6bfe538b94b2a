/**
 * How a risk level looks: a four-step sequential palette that stays ordered for the common
 * colour-vision deficiencies and in greyscale (light sand to deep ink, lightness falling
 * monotonically — a single-hue-family ramp, common practice for ordered data), plus a line
 * dash and a numbered badge on maps, so colour is never the only cue.
 */
import type { LevelId } from '../../generator/model/types.ts';

export interface LevelStyle {
  rank: 0 | 1 | 2 | 3 | 4;
  fill: string; // swatch / polygon fill
  stroke: string; // line colour on maps (darker than fill for contrast on the sea tint)
  dash: string | null; // SVG stroke-dasharray, a second cue besides colour
  width: number; // stroke width on the overview map
  pattern: string; // id of the SVG pattern used for areas and swatches
}

export const levelStyles: Record<LevelId, LevelStyle> = {
  scant: { rank: 1, fill: '#efe6c8', stroke: '#857546', dash: '0.1 6', width: 4, pattern: 'wl-pat-1' },
  noticeable: { rank: 2, fill: '#d9a35f', stroke: '#a8661f', dash: '10 6', width: 4, pattern: 'wl-pat-2' },
  marked: { rank: 3, fill: '#a34d3c', stroke: '#963f30', dash: null, width: 5, pattern: 'wl-pat-3' },
  heavy: { rank: 4, fill: '#3f1f3a', stroke: '#3f1f3a', dash: null, width: 7, pattern: 'wl-pat-4' },
  // No level (no recent survey): white and grey, a thin line of short dashes, an open dashed ring,
  // "?" in the badge: it must not read as any step of the scale, least of all the lowest.
  'not-set': { rank: 0, fill: '#ffffff', stroke: '#5f6d76', dash: '3 3', width: 2.5, pattern: 'wl-pat-0' },
};

/** "level 3 of 4"; for no level, the words the model gives (its label). */
export function rankWords(level: { rank: number; label: string }): string {
  return level.rank === 0 ? level.label : `level ${level.rank} of 4`;
}

export const levelOrder: LevelId[] = ['scant', 'noticeable', 'marked', 'heavy'];

/** SVG <defs> with one pattern per level: dots → sparse hatching → dense hatching → cross-hatching. */
export function levelPatternDefs(): string {
  const p = (id: string, fill: string, ink: string, body: string) =>
    `<pattern id="${id}" width="6" height="6" patternUnits="userSpaceOnUse"><rect width="6" height="6" fill="${fill}"/>${body.replace(/INK/g, ink)}</pattern>`;
  return [
    p('wl-pat-0', '#ffffff', '#5f6d76', '<path d="M1 3H2.5M3.5 3H5" stroke="INK" stroke-width="0.8"/>'),
    p('wl-pat-1', levelStyles.scant.fill, '#7d6d44', '<circle cx="3" cy="3" r="0.8" fill="INK"/>'),
    p('wl-pat-2', levelStyles.noticeable.fill, '#5a3a14', '<path d="M0 6L6 0" stroke="INK" stroke-width="0.9"/>'),
    p(
      'wl-pat-3',
      levelStyles.marked.fill,
      '#fff',
      '<path d="M0 6L6 0M-1 1L1 -1M5 7L7 5" stroke="INK" stroke-width="1.1"/><path d="M0 3L3 0M3 6L6 3" stroke="INK" stroke-width="0.7"/>',
    ),
    p('wl-pat-4', levelStyles.heavy.fill, '#fff', '<path d="M0 6L6 0M0 0L6 6" stroke="INK" stroke-width="1"/>'),
  ].join('');
}

/** Pie glyph for a level: a quarter, half, three quarters or a full disc, so the rank reads by
 * shape alone (in black-and-white print too). Decorative: the words sit beside it. */
const piePaths: Record<number, string> = {
  1: 'M8 8V1.5A6.5 6.5 0 0 1 14.5 8Z',
  2: 'M8 8V1.5A6.5 6.5 0 0 1 8 14.5Z',
  3: 'M8 8V1.5A6.5 6.5 0 1 1 1.5 8Z',
  4: 'M8 1.5A6.5 6.5 0 1 1 7.99 1.5Z',
};
/** The four pie glyphs as SVG symbols, defined once per page (in the layout) and drawn with <use>. */
export function levelGlyphSymbols(): string {
  const symbols = levelOrder.map((id) => {
    const s = levelStyles[id];
    return `<symbol id="wl-lv-${s.rank}" viewBox="0 0 16 16"><circle cx="8" cy="8" r="6.5" fill="#fff" stroke="#1f2a33" stroke-width="1.2"/><path d="${piePaths[s.rank]}" fill="${s.fill}" stroke="#1f2a33" stroke-width="1.2"/></symbol>`;
  });
  // no level: an open ring of dashes with nothing filled
  symbols.push('<symbol id="wl-lv-0" viewBox="0 0 16 16"><circle cx="8" cy="8" r="6.5" fill="#fff" stroke="#5f6d76" stroke-width="1.4" stroke-dasharray="2.5 2"/></symbol>');
  return `<svg class="sprite" width="0" height="0" aria-hidden="true" focusable="false">${symbols.join('')}</svg>`;
}

export function levelGlyph(level: LevelId): string {
  return `<svg class="lv-glyph" width="16" height="16" viewBox="0 0 16 16" aria-hidden="true" focusable="false"><use href="#wl-lv-${levelStyles[level].rank}"/></svg>`;
}

/** Rank and name of each level, for naming the level a rule leads to. */
export const levelScaleWords: Record<string, { rank: number; label: string }> = {
  scant: { rank: 1, label: 'Scant' },
  noticeable: { rank: 2, label: 'Noticeable' },
  marked: { rank: 3, label: 'Marked' },
  heavy: { rank: 4, label: 'Heavy' },
};
