/**
 * Convex hull of planar points: d3-polygon's `polygonHull` (Andrew's monotone chain), returned
 * counter-clockwise from the lowest-x (then lowest-y) vertex, the order the zones have always had.
 *
 * Andrew, A. M. (1979). Another efficient algorithm for convex hulls in two dimensions.
 * Information Processing Letters 9(5), 216–219. O(n log n). Used on lon/lat of small
 * accumulation zones, where the plane is a fair stand-in for the sphere.
 */
import { polygonHull } from 'd3-polygon';

type Point = [number, number];

const byXThenY = (p: Point, q: Point): number => p[0] - q[0] || p[1] - q[1];

/** Points sorted by x then y, duplicates dropped. */
function distinctSorted(points: readonly Point[]): Point[] {
  const unique: Point[] = [];
  for (const p of [...points].sort(byXThenY)) {
    const last = unique[unique.length - 1];
    if (!last || last[0] !== p[0] || last[1] !== p[1]) unique.push(p);
  }
  return unique;
}

/**
 * Hull vertices counter-clockwise, first vertex not repeated; fewer than 3 distinct points come
 * back as given (sorted, deduplicated), points on one line as their two ends.
 */
export function convexHull(points: readonly Point[]): Point[] {
  const unique = distinctSorted(points);
  if (unique.length < 3) return unique;
  // polygonHull winds the hull clockwise in a y-up plane (counter-clockwise on a y-down screen)
  const hull = polygonHull(unique);
  // all on one line: polygonHull gives the ends (and may repeat one)
  if (hull === null || distinctSorted(hull).length < 3) return [unique[0] as Point, unique[unique.length - 1] as Point];
  const counterClockwise = [...hull].reverse();
  let start = 0;
  counterClockwise.forEach((p, i) => {
    if (byXThenY(p, counterClockwise[start] as Point) < 0) start = i;
  });
  return [...counterClockwise.slice(start), ...counterClockwise.slice(0, start)];
}
