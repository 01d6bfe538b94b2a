/**
 * Small formatting and escaping helpers used by the pages. No wording decisions beyond
 * labels for table headings: sentences come from the bulletin model.
 */
import type { Direction, LevelId } from '../../generator/model/types.ts';

const months = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];

/** "2026-12-01" → "1 December 2026" (no locale or clock involved). */
export function formatDate(iso: string): string {
  const match = /^(\d{4})-(\d{2})-(\d{2})/.exec(iso);
  if (!match) return iso;
  const month = months[Number(match[2]) - 1];
  return month ? `${Number(match[3])} ${month} ${match[1]}` : iso;
}

/** Number for tables: up to `digits` significant decimals, no trailing zeros, "–" for null. */
export function formatNumber(value: number | null | undefined, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '–';
  const abs = Math.abs(value);
  const decimals = abs >= 100 ? 0 : abs >= 10 ? 1 : abs >= 1 ? 2 : digits;
  return String(Number(value.toFixed(decimals)));
}

export function formatP(p: number | null | undefined): string {
  if (p === null || p === undefined || !Number.isFinite(p)) return '–';
  if (p < 0.001) return '< 0.001';
  return p.toFixed(3);
}

/** Number with a true minus sign (U+2212) instead of a hyphen. */
export function withMinus(text: string): string {
  return text.replace(/^-/, '\u2212');
}

/** p-value rounded for a reader: two decimals, three below 0.01, "< 0.001" below that. */
export function formatPShort(p: number | null | undefined): string {
  if (p === null || p === undefined || !Number.isFinite(p)) return '–';
  if (p < 0.001) return '< 0.001';
  return p < 0.01 ? p.toFixed(3) : p.toFixed(2);
}

/** The secondary line of a regional trend: test statistic, p and the median yearly change. */
export function regionalFigures(t: { S: number | null; p: number | null; slope: number | null; unitShort: string }): string {
  const test =
    t.S === null
      ? 'Regional Kendall test: too little data'
      : `Regional Kendall test: S = ${withMinus(String(Math.round(t.S)))}, p ${t.p !== null && t.p < 0.001 ? '' : '= '}${formatPShort(t.p)}`;
  const slope = t.slope === null ? '' : `; median change ${withMinus(t.slope === 0 ? '0' : formatNumber(t.slope))} ${t.unitShort} a year (Sen's slope)`;
  return `${test}${slope}.`;
}

/** A zone id as a reader says it: "zone-2" → "Zone 2". */
export function zoneName(id: string): string {
  const text = id.replace(/[-_]+/g, ' ').trim();
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** Whole-number ordinal: 51.7 → "52nd". */
export function ordinal(value: number): string {
  const n = Math.round(value);
  const tens = n % 100;
  const suffix = tens >= 11 && tens <= 13 ? 'th' : n % 10 === 1 ? 'st' : n % 10 === 2 ? 'nd' : n % 10 === 3 ? 'rd' : 'th';
  return `${n}${suffix}`;
}

/** Escape text for XML/HTML text and attribute positions (used inside generated SVG strings). */
export function escapeXml(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

/** A link target from input data is used only when it is an absolute http(s) URL. */
export function safeHttpUrl(url: string | null | undefined): string | null {
  if (!url) return null;
  try {
    const parsed = new URL(url);
    return parsed.protocol === 'http:' || parsed.protocol === 'https:' ? parsed.href : null;
  } catch {
    return null;
  }
}

export function safeMailto(email: string | null | undefined): string | null {
  if (!email || !/^[^\s@<>"'()\\,;:]+@[A-Za-z0-9.-]+\.[A-Za-z]{2,}$/.test(email)) return null;
  return `mailto:${email}`;
}

export function safeTel(phone: string | null | undefined): string | null {
  if (!phone) return null;
  const digits = phone.replace(/[\s().-]/g, '');
  return /^\+?[0-9]{3,20}$/.test(digits) ? `tel:${digits}` : null;
}

/** JSON for a <script type="application/ld+json"> block: <, > and & become \u escapes, so the
 * text can never close the element or open a comment, and the JSON value is unchanged. */
export function jsonLdText(value: unknown): string {
  return JSON.stringify(value).replace(/</g, '\\u003c').replace(/>/g, '\\u003e').replace(/&/g, '\\u0026');
}

export const directionWords: Record<Direction, string> = {
  rising: 'Rising',
  falling: 'Falling',
  'no-clear-direction': 'No clear direction',
  'too-little-data': 'Too little data',
};

/** Arrow-like glyph beside the direction words (text is always there too). */
export const directionGlyph: Record<Direction, string> = {
  rising: '↗',
  falling: '↘',
  'no-clear-direction': '→',
  'too-little-data': '·',
};

export const contactRoleWords: Record<string, string> = {
  'shellfish-sanitation': 'Shellfish sanitation authority',
  'public-health': 'Public health authority',
  'debris-report': 'Report hazardous debris',
  publisher: 'Publisher of this bulletin',
  'wildlife-rescue': 'Injured or entangled wildlife',
};

export const kindWords: Record<string, string> = {
  beach: 'Beach',
  bay: 'Bay',
  harbour: 'Harbour',
  estuary: 'Estuary',
  'island-shore': 'Island shore',
  'rocky-shore': 'Rocky shore',
  lagoon: 'Lagoon',
};

export const shellfishWords: Record<string, string> = {
  farmed: 'Shellfish farmed here',
  gathered: 'Shellfish gathered here',
  'farmed-and-gathered': 'Shellfish farmed and gathered here',
  none: 'No shellfish harvesting recorded',
};

export type { LevelId };
