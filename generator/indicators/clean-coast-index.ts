/**
 * Clean Coast Index (CCI).
 *
 * CCI = (plastic items on the transect / transect area in m²) × K, with K = 20.
 * Classes: 0–2 very clean, 2–5 clean, 5–10 moderate, 10–20 dirty, above 20 extremely dirty.
 *
 * References:
 * - Alkalay, R., Pasternak, G. & Zask, A. (2007). Clean-coast index — a new approach for beach
 *   cleanliness assessment. Ocean & Coastal Management 50(5–6), 352–362. (Equation of the CCI, K = 20.)
 * Which side of each class boundary is inclusive is not settled in the sources we have; here a
 * value on a boundary falls in the cleaner class.
 */

/** K in Alkalay et al. (2007): scales items/m² to a readable number. */
export const cleanCoastIndexK = 20;

export function cleanCoastIndex(plasticItems: number, areaSquareMetres: number): number | null {
  if (!(areaSquareMetres > 0) || !(plasticItems >= 0)) return null;
  return (plasticItems / areaSquareMetres) * cleanCoastIndexK;
}

export type CleanCoastClass = 'very-clean' | 'clean' | 'moderate' | 'dirty' | 'extremely-dirty';

export function cleanCoastClass(index: number): CleanCoastClass {
  if (index <= 2) return 'very-clean';
  if (index <= 5) return 'clean';
  if (index <= 10) return 'moderate';
  if (index <= 20) return 'dirty';
  return 'extremely-dirty';
}
