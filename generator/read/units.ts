/**
 * Compares unit labels written in different but equivalent ways ("m³" and "m3", "µm" and "um",
 * "metres" and "m"). Anything else counts as a different unit.
 */
const words: [RegExp, string][] = [
  [/\bmicrometres?\b|\bmicrometers?\b|\bmicrons?\b/g, 'um'],
  [/\bmetres?\b|\bmeters?\b/g, 'm'],
  [/\bsquare m\b/g, 'm2'],
  [/\bcubic m\b/g, 'm3'],
  [/\bgrams?\b/g, 'g'],
  [/\bper\b/g, '/'],
];

export function canonicalUnit(unit: string): string {
  let text = unit.trim().toLowerCase().replace(/[µμ]/g, 'u').replace(/³/g, '3').replace(/²/g, '2').replace(/\^/g, '');
  for (const [pattern, replacement] of words) text = text.replace(pattern, replacement);
  return text.replace(/wet\s*weight/g, 'ww').replace(/[\s()]+/g, '');
}

export function sameUnit(a: string, b: string): boolean {
  return canonicalUnit(a) === canonicalUnit(b);
}
