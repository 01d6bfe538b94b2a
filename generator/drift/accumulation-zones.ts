/**
 * Offshore accumulation zones: clusters of drifting particles at the end of a season, found by
 * DBSCAN (Ester et al. 1996) with Eps = settings.drift.zoneDistanceKm and
 * MinPts = settings.drift.zoneMinParticles. Each zone gets its centroid (mean longitude and
 * latitude of its particles; adequate for zones of a few tens of km away from the antimeridian),
 * particle count, radius (great-circle distance from the centroid to its farthest particle) and
 * convex hull. Zones are numbered by size, largest first.
 */
import type { AccumulationZone } from '../model/types.ts';
import { convexHull } from './convex-hull.ts';
import { dbscanGeographic } from './dbscan.ts';
import { haversineKm } from './geodesy.ts';

export function accumulationZones(lon: ArrayLike<number>, lat: ArrayLike<number>, epsKm: number, minParticles: number): AccumulationZone[] {
  const labels = dbscanGeographic(lon, lat, epsKm, minParticles);
  const members = new Map<number, number[]>();
  labels.forEach((label, i) => {
    if (label < 0) return;
    const list = members.get(label);
    if (list) list.push(i);
    else members.set(label, [i]);
  });
  const zones = [...members.values()].map((indices) => {
    let sumLon = 0;
    let sumLat = 0;
    for (const i of indices) {
      sumLon += lon[i] ?? 0;
      sumLat += lat[i] ?? 0;
    }
    const cLon = sumLon / indices.length;
    const cLat = sumLat / indices.length;
    let radius = 0;
    for (const i of indices) radius = Math.max(radius, haversineKm(cLon, cLat, lon[i] ?? 0, lat[i] ?? 0));
    const hull = convexHull(indices.map((i) => [lon[i] ?? 0, lat[i] ?? 0] as [number, number]));
    return { lon: cLon, lat: cLat, particles: indices.length, radiusKm: radius, hull };
  });
  zones.sort((a, b) => b.particles - a.particles || a.lon - b.lon || a.lat - b.lat);
  return zones.map((zone, k) => ({ id: `zone-${k + 1}`, ...zone }));
}
