/**
 * Distances on a spherical Earth for segment lengths and particle-to-coast distances.
 *
 * Radius: the mean Earth radius R₁ = 6371.0088 km of the WGS84 ellipsoid (IUGG mean radius,
 * Moritz 1980, Geodetic Reference System 1980). A sphere is within about 0.5 % of the ellipsoid
 * for the few-kilometre distances used here.
 *
 * - Great-circle distance by the haversine formula (Sinnott 1984, "Virtues of the Haversine",
 *   Sky and Telescope 68(2):159).
 * - Point-to-arc distance: cross-track distance to the great circle through the segment's ends,
 *   used when the foot of the perpendicular falls inside the arc, else the distance to the nearer
 *   end (spherical trigonometry on unit vectors; common practice).
 * Sines, cosines and arcsines come from portable-math.ts, so that the drift job in Python
 * (generator/drift/scaleout/) computes the same bits and takes the same decisions.
 */
import { portableAsin, portableCos, portableSin } from './portable-math.ts';

export const earthRadiusKm = 6371.0088;

const toRadians = Math.PI / 180;

/** Great-circle distance in km between two lon/lat points (haversine). */
export function haversineKm(lon1: number, lat1: number, lon2: number, lat2: number): number {
  const phi1 = lat1 * toRadians;
  const phi2 = lat2 * toRadians;
  const dPhi = phi2 - phi1;
  const dLambda = (lon2 - lon1) * toRadians;
  const sinHalfPhi = portableSin(dPhi / 2);
  const sinHalfLambda = portableSin(dLambda / 2);
  const a = sinHalfPhi * sinHalfPhi + portableCos(phi1) * portableCos(phi2) * (sinHalfLambda * sinHalfLambda);
  return 2 * earthRadiusKm * portableAsin(Math.min(1, Math.sqrt(a)));
}

/** Unit vector of a lon/lat point. */
function toVector(lon: number, lat: number): [number, number, number] {
  const lambda = lon * toRadians;
  const phi = lat * toRadians;
  const cosPhi = portableCos(phi);
  return [cosPhi * portableCos(lambda), cosPhi * portableSin(lambda), portableSin(phi)];
}

/**
 * Shortest great-circle distance in km from point P to the arc A–B (the minor arc between them).
 */
export function pointToArcKm(pLon: number, pLat: number, aLon: number, aLat: number, bLon: number, bLat: number): number {
  const p = toVector(pLon, pLat);
  const a = toVector(aLon, aLat);
  const b = toVector(bLon, bLat);
  // Normal of the great circle through A and B.
  let nx = a[1] * b[2] - a[2] * b[1];
  let ny = a[2] * b[0] - a[0] * b[2];
  let nz = a[0] * b[1] - a[1] * b[0];
  const norm = Math.hypot(nx, ny, nz);
  const toEnds = Math.min(haversineKm(pLon, pLat, aLon, aLat), haversineKm(pLon, pLat, bLon, bLat));
  if (norm < 1e-15) return toEnds; // A and B coincide (or are antipodal)
  nx /= norm;
  ny /= norm;
  nz /= norm;
  const sinCross = p[0] * nx + p[1] * ny + p[2] * nz;
  // Foot of the perpendicular: P minus its normal component, projected back to the sphere.
  const fx = p[0] - sinCross * nx;
  const fy = p[1] - sinCross * ny;
  const fz = p[2] - sinCross * nz;
  // The foot lies on the arc when it is between A and B: (A×F)·n ≥ 0 and (F×B)·n ≥ 0.
  const afx = a[1] * fz - a[2] * fy;
  const afy = a[2] * fx - a[0] * fz;
  const afz = a[0] * fy - a[1] * fx;
  const fbx = fy * b[2] - fz * b[1];
  const fby = fz * b[0] - fx * b[2];
  const fbz = fx * b[1] - fy * b[0];
  const inside = afx * nx + afy * ny + afz * nz >= 0 && fbx * nx + fby * ny + fbz * nz >= 0;
  if (!inside) return toEnds;
  return Math.abs(portableAsin(Math.max(-1, Math.min(1, sinCross)))) * earthRadiusKm;
}

/** Degrees of latitude and of longitude (at a latitude) spanned by a distance in km. */
export function degreesForKm(km: number, lat: number): { dLat: number; dLon: number } {
  const dLat = km / earthRadiusKm / toRadians;
  const cos = Math.cos(Math.min(89.9, Math.abs(lat)) * toRadians);
  return { dLat, dLon: Math.min(360, dLat / Math.max(cos, 1e-6)) };
}
