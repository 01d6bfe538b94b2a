// The convex hull (generator/drift/convex-hull.ts, d3-polygon's polygonHull in the zones' order)
// against its definition, checked by brute force on random point sets: every input point lies in
// the hull or on its edge, every hull vertex is an input point, the turn at every vertex is
// strictly counter-clockwise, and the first vertex is the lowest-x (then lowest-y) point.
// (Convexity and containment as in de Berg et al. 2008, Computational Geometry, ch. 1.)
import fc from 'fast-check';
import { expect, test } from 'vitest';
import { convexHull } from '../../generator/drift/convex-hull.ts';

type Point = [number, number];
const cross = (o: Point, a: Point, b: Point): number => (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);

// small integer grids make duplicates and collinear points common
const point = fc.tuple(fc.integer({ min: -6, max: 6 }), fc.integer({ min: -6, max: 6 })) as fc.Arbitrary<Point>;

test('hull of random points: convex, counter-clockwise, made of input points, containing them all', () => {
  fc.assert(
    fc.property(fc.array(point, { minLength: 0, maxLength: 40 }), (points) => {
      const hull = convexHull(points);
      const distinct = new Set(points.map((p) => p.join(',')));
      for (const vertex of hull) expect(distinct.has(vertex.join(','))).toBe(true);
      if (hull.length < 3) {
        // fewer than three distinct points, or all on one line: the ends
        expect(hull.length).toBe(Math.min(distinct.size, 2));
        for (const p of points) expect(cross(hull[0] as Point, hull[hull.length - 1] as Point, p)).toBe(0);
        return;
      }
      const lowest = [...points].sort((p, q) => p[0] - q[0] || p[1] - q[1])[0];
      expect(hull[0]).toEqual(lowest);
      hull.forEach((vertex, i) => {
        const next = hull[(i + 1) % hull.length] as Point;
        const after = hull[(i + 2) % hull.length] as Point;
        expect(cross(vertex, next, after)).toBeGreaterThan(0);
        for (const p of points) expect(cross(vertex, next, p)).toBeGreaterThanOrEqual(0);
      });
    }),
    { numRuns: 500, seed: 20261205 },
  );
});
