/**
 * Where a line (or a closed ring) crosses or touches itself, found with a static R-tree of its
 * edges (Flatbush) so that a national coastline of 10^5–10^6 vertices is checked in O(n log n)
 * rather than by comparing every pair of edges.
 *
 * The test is planar in longitude/latitude (common practice for short edges). Longitudes are first
 * made continuous along the line, so a line that crosses the 180° meridian (179.9 → −179.9) is
 * tested as the short step it is, not as an edge around the world.
 *
 * A line whose first and last positions are the same is a closed line (OGC Simple Features, a
 * "closed" curve; RFC 7946 allows it): its first and last edges meet there by design.
 */
import Flatbush from 'flatbush';

export type Position = [number, number];

export interface SelfCrossing {
  /** The point where the two edges meet, [lon, lat] with the longitude back in −180..180. */
  at: Position;
  /** Positions (counted from 1, as in the file) where the two edges start. */
  firstEdge: number;
  secondEdge: number;
}

/** Longitudes made continuous along the line: a step of more than 180° goes the short way round. */
export function unwrapLongitudes(line: readonly Position[]): Position[] {
  const out: Position[] = [];
  let shift = 0;
  let previous: number | null = null;
  for (const [lon, lat] of line) {
    if (previous !== null) {
      const step = lon + shift - previous;
      if (step > 180) shift -= 360;
      else if (step < -180) shift += 360;
    }
    const unwrapped = lon + shift;
    out.push([unwrapped, lat]);
    previous = unwrapped;
  }
  return out;
}

function wrapLongitude(lon: number): number {
  const wrapped = ((((lon + 180) % 360) + 360) % 360) - 180;
  return wrapped === -180 && lon > 0 ? 180 : wrapped;
}

function cross(ax: number, ay: number, bx: number, by: number): number {
  return ax * by - ay * bx;
}

function orientation(p: Position, q: Position, r: Position): number {
  return cross(q[0] - p[0], q[1] - p[1], r[0] - p[0], r[1] - p[1]);
}

function within(p: Position, q: Position, r: Position): boolean {
  return Math.min(p[0], r[0]) <= q[0] && q[0] <= Math.max(p[0], r[0]) && Math.min(p[1], r[1]) <= q[1] && q[1] <= Math.max(p[1], r[1]);
}

/** The point where edges p1–p2 and q1–q2 cross or touch, or null when they do not meet. */
export function edgeMeeting(p1: Position, p2: Position, q1: Position, q2: Position): Position | null {
  const o1 = orientation(p1, p2, q1);
  const o2 = orientation(p1, p2, q2);
  const o3 = orientation(q1, q2, p1);
  const o4 = orientation(q1, q2, p2);
  if (((o1 > 0 && o2 < 0) || (o1 < 0 && o2 > 0)) && ((o3 > 0 && o4 < 0) || (o3 < 0 && o4 > 0))) {
    const rx = p2[0] - p1[0];
    const ry = p2[1] - p1[1];
    const t = cross(q1[0] - p1[0], q1[1] - p1[1], q2[0] - q1[0], q2[1] - q1[1]) / cross(rx, ry, q2[0] - q1[0], q2[1] - q1[1]);
    return [p1[0] + t * rx, p1[1] + t * ry];
  }
  if (o1 === 0 && within(p1, q1, p2)) return q1;
  if (o2 === 0 && within(p1, q2, p2)) return q2;
  if (o3 === 0 && within(q1, p1, q2)) return p1;
  if (o4 === 0 && within(q1, p2, q2)) return p2;
  return null;
}

export function isClosedLine(line: readonly Position[]): boolean {
  const first = line[0];
  const last = line[line.length - 1];
  return line.length > 3 && first !== undefined && last !== undefined && first[0] === last[0] && first[1] === last[1];
}

function round(value: number): number {
  return Math.round(value * 1e7) / 1e7;
}

/**
 * The first place (in file order of the first edge) where the line crosses or touches itself,
 * or null. Neighbouring edges share a position and are not compared; a repeated position is not a
 * crossing. `closed` says the line is a ring (or a closed line): its last and first edges meet.
 */
export function findSelfCrossing(line: readonly Position[], closed = isClosedLine(line)): SelfCrossing | null {
  const points = unwrapLongitudes(line);
  // Edges between distinct consecutive positions; `from` keeps the position number in the file.
  const edges: { a: Position; b: Position; from: number }[] = [];
  for (let i = 0; i + 1 < points.length; i++) {
    const a = points[i];
    const b = points[i + 1];
    if (!a || !b || (a[0] === b[0] && a[1] === b[1])) continue;
    edges.push({ a, b, from: i + 1 });
  }
  if (edges.length < 3) return null;
  const index = new Flatbush(edges.length);
  for (const { a, b } of edges) index.add(Math.min(a[0], b[0]), Math.min(a[1], b[1]), Math.max(a[0], b[0]), Math.max(a[1], b[1]));
  index.finish();
  const last = edges.length - 1;
  for (let m = 0; m < edges.length; m++) {
    const e = edges[m];
    if (!e) continue;
    const candidates = index.search(Math.min(e.a[0], e.b[0]), Math.min(e.a[1], e.b[1]), Math.max(e.a[0], e.b[0]), Math.max(e.a[1], e.b[1]));
    let best: { n: number; at: Position } | null = null;
    for (const n of candidates) {
      if (n <= m + 1) continue;
      if (closed && m === 0 && n === last) continue;
      const f = edges[n];
      if (!f) continue;
      const at = edgeMeeting(e.a, e.b, f.a, f.b);
      if (at && (best === null || n < best.n)) best = { n, at };
    }
    if (best) {
      const f = edges[best.n];
      return { at: [round(wrapLongitude(best.at[0])), round(best.at[1])], firstEdge: e.from, secondEdge: f?.from ?? 0 };
    }
  }
  return null;
}

/**
 * Bounding box [west, south, east, north] of all positions. When the positions lie across the
 * 180° meridian, west is greater than east (RFC 7946 section 5.2): the box is the smallest span of
 * longitudes that holds them all.
 */
export function boundingBox(lines: readonly (readonly Position[])[]): [number, number, number, number] {
  let south = Infinity;
  let north = -Infinity;
  const lons: number[] = [];
  for (const line of lines) {
    for (const [lon, lat] of line) {
      if (lat < south) south = lat;
      if (lat > north) north = lat;
      lons.push(lon);
    }
  }
  const sorted = Float64Array.from(lons).sort();
  const first = sorted[0] ?? 0;
  const lastLon = sorted[sorted.length - 1] ?? 0;
  // The largest empty span of longitude, counting the wrap from the last back to the first.
  let gap = first + 360 - lastLon;
  let west = first;
  let east = lastLon;
  for (let i = 1; i < sorted.length; i++) {
    const step = (sorted[i] ?? 0) - (sorted[i - 1] ?? 0);
    if (step > gap) {
      gap = step;
      west = sorted[i] ?? 0;
      east = sorted[i - 1] ?? 0;
    }
  }
  return [west, south, east, north];
}
