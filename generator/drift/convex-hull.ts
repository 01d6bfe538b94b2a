/**
 * Convex hull of planar points by Andrew's monotone chain.
 *
 * Andrew, A. M. (1979). Another efficient algorithm for convex hulls in two dimensions.
 * Information Processing Letters 9(5), 216–219. O(n log n). Used on lon/lat of small
 * accumulation zones, where the plane is a fair stand-in for the sphere.
 */

/** Cross product of OA × OB: > 0 for a counter-clockwise turn. */
function cross(o: [number, number], a: [number, number], b: [number, number]): number {
  return (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
}

/** Hull vertices counter-clockwise, first vertex not repeated; fewer than 3 points come back as given (deduplicated). */
export function convexHull(points: readonly [number, number][]): [number, number][] {
  const sorted = [...points].sort((p, q) => p[0] - q[0] || p[1] - q[1]);
  const unique: [number, number][] = [];
  for (const p of sorted) {
    const last = unique[unique.length - 1];
    if (!last || last[0] !== p[0] || last[1] !== p[1]) unique.push(p);
  }
  if (unique.length < 3) return unique;
  const lower: [number, number][] = [];
  for (const p of unique) {
    while (lower.length >= 2 && cross(lower[lower.length - 2] as [number, number], lower[lower.length - 1] as [number, number], p) <= 0) lower.pop();
    lower.push(p);
  }
  const upper: [number, number][] = [];
  for (let i = unique.length - 1; i >= 0; i--) {
    const p = unique[i] as [number, number];
    while (upper.length >= 2 && cross(upper[upper.length - 2] as [number, number], upper[upper.length - 1] as [number, number], p) <= 0) upper.pop();
    upper.push(p);
  }
  lower.pop();
  upper.pop();
  return lower.concat(upper);
}
