/**
 * DBSCAN: density-based clustering of points with noise.
 *
 * Ester, M., Kriegel, H.-P., Sander, J. & Xu, X. (1996). A density-based algorithm for discovering
 * clusters in large spatial databases with noise. Proc. 2nd Int. Conf. on Knowledge Discovery and
 * Data Mining (KDD-96), 226–231. Definitions 1–5: the Eps-neighbourhood N_Eps(p) includes p
 * itself; p is a core point when |N_Eps(p)| ≥ MinPts; a cluster is every point density-reachable
 * from a core point; points in no cluster are noise. A border point reachable from two clusters
 * goes to the one that reaches it first (the paper's order dependence).
 *
 * `dbscan` is metric-free: it asks a `neighbours(i)` function for N_Eps(i). `dbscanGeographic`
 * supplies great-circle neighbourhoods of lon/lat points through a KDBush index (Agafonkin,
 * kdbush): a box query in degrees, then an exact haversine check. Cost O(n log n) for sparse
 * neighbourhoods, O(n²) in the worst case (every point within Eps of every other).
 */
import KDBush from 'kdbush';
import { degreesForKm, haversineKm } from './geodesy.ts';

/** Label of a point in no cluster. */
export const noise = -1;

/**
 * Clusters `count` points. Returns a label per point: 0, 1, 2… for clusters (in order of
 * discovery) or −1 for noise.
 */
export function dbscan(count: number, neighbours: (i: number) => readonly number[], minPoints: number): Int32Array {
  if (!Number.isInteger(minPoints) || minPoints < 1) throw new Error(`invalid minPoints; not a positive integer: ${minPoints}`);
  const unvisited = -2;
  const labels = new Int32Array(count).fill(unvisited);
  let cluster = 0;
  for (let p = 0; p < count; p++) {
    if (labels[p] !== unvisited) continue;
    const seeds = neighbours(p);
    if (seeds.length < minPoints) {
      labels[p] = noise; // may later become a border point of some cluster
      continue;
    }
    labels[p] = cluster;
    const queue: number[] = [];
    for (const q of seeds) if (q !== p) queue.push(q);
    for (let k = 0; k < queue.length; k++) {
      const q = queue[k] ?? -1;
      if (labels[q] === noise) labels[q] = cluster; // border point
      if (labels[q] !== unvisited) continue;
      labels[q] = cluster;
      const reach = neighbours(q);
      if (reach.length >= minPoints) for (const r of reach) if (labels[r] === unvisited || labels[r] === noise) queue.push(r);
    }
    cluster++;
  }
  return labels;
}

/** DBSCAN over lon/lat points with Eps in km (great-circle distance). */
export function dbscanGeographic(lon: ArrayLike<number>, lat: ArrayLike<number>, epsKm: number, minPoints: number): Int32Array {
  const count = lon.length;
  if (count === 0) return new Int32Array(0);
  if (!(epsKm > 0)) throw new Error(`invalid epsKm; not above 0: ${epsKm}`);
  const index = new KDBush(count);
  for (let i = 0; i < count; i++) index.add(lon[i] ?? 0, lat[i] ?? 0);
  index.finish();
  const neighbours = (i: number): number[] => {
    const x = lon[i] ?? 0;
    const y = lat[i] ?? 0;
    const { dLat, dLon } = degreesForKm(epsKm, Math.abs(y) + degreesForKm(epsKm, 0).dLat);
    return index.range(x - dLon, y - dLat, x + dLon, y + dLat).filter((j) => haversineKm(x, y, lon[j] ?? 0, lat[j] ?? 0) <= epsKm);
  };
  return dbscan(count, neighbours, minPoints);
}
