/**
 * Where badges and labels go on a map, in pixels (pure; no words chosen here).
 *
 * Greedy candidate placement, the usual approach of point-feature label placement (Christensen,
 * Marks & Shieber 1995, "An empirical study of algorithms for point-feature label placement",
 * ACM Transactions on Graphics 14(3): greedy placement over a fixed set of candidate positions is
 * their baseline): labels are taken in priority order (the caller sorts them, e.g. highest level
 * first); each tries candidate positions on rings of growing radius around its anchor, eight
 * directions a ring, and takes the first one that
 *   - lies inside the frame,
 *   - overlaps no label already placed and no reserved box (scale bar, inset), with `gap` pixels
 *     to spare, and
 *   - crosses no obstacle line (the drawn segments, widened by `lineClearance`), so a badge never
 *     hides a segment.
 * A label that finds no such spot is listed in `left` (the table beside the map has every row).
 * A label placed away from its anchor gets a leader line from the anchor to its nearest edge.
 * Line pieces are indexed with Flatbush (a static R-tree) so a dense coast stays quick.
 */
import Flatbush from 'flatbush';

export type Point = [number, number];

/** Axis-aligned box, top-left corner and size, pixels. */
export interface Box {
  x: number;
  y: number;
  w: number;
  h: number;
}

export interface LabelRequest {
  id: string;
  anchor: Point;
  w: number;
  h: number;
}

export interface PlacedLabel {
  id: string;
  anchor: Point;
  box: Box;
  /** leader from the anchor to the box edge, or null when the box sits at the anchor */
  leader: [Point, Point] | null;
}

export interface PlacementOptions {
  width: number;
  height: number;
  /** drawn lines (polylines in pixels) a label must not cover */
  lines?: readonly (readonly Point[])[];
  /** boxes kept free (scale bar, inset, labels placed earlier on the same map) */
  reserved?: readonly Box[];
  gap?: number;
  lineClearance?: number;
  /** ring radii tried around an anchor, pixels (the first is the closest spot) */
  radii?: readonly number[];
  /** allow a label centred on its anchor (zone names inside their zone) */
  allowCentre?: boolean;
}

const defaultRadii = [14, 20, 28, 38, 50, 64, 80, 100, 124, 150];
const directions = [0, 180, 90, 270, 45, 135, 225, 315].map((d) => (d * Math.PI) / 180);

export function boxesOverlap(a: Box, b: Box, gap = 0): boolean {
  return a.x < b.x + b.w + gap && b.x < a.x + a.w + gap && a.y < b.y + b.h + gap && b.y < a.y + a.h + gap;
}

function segmentHitsBox(p: Point, q: Point, box: Box): boolean {
  // Liang–Barsky clipping of segment pq against the box
  let t0 = 0;
  let t1 = 1;
  const dx = q[0] - p[0];
  const dy = q[1] - p[1];
  const edges: [number, number][] = [
    [-dx, p[0] - box.x],
    [dx, box.x + box.w - p[0]],
    [-dy, p[1] - box.y],
    [dy, box.y + box.h - p[1]],
  ];
  for (const [pp, qq] of edges) {
    if (pp === 0) {
      if (qq < 0) return false;
    } else {
      const r = qq / pp;
      if (pp < 0) {
        if (r > t1) return false;
        if (r > t0) t0 = r;
      } else {
        if (r < t0) return false;
        if (r < t1) t1 = r;
      }
    }
  }
  return true;
}

/** Index of line pieces, queried with a box. */
export class LineIndex {
  private readonly pieces: [Point, Point][] = [];
  private readonly index: Flatbush | null;

  constructor(lines: readonly (readonly Point[])[]) {
    for (const line of lines) {
      for (let i = 1; i < line.length; i++) {
        const p = line[i - 1]!;
        const q = line[i]!;
        if ([p[0], p[1], q[0], q[1]].every(Number.isFinite)) this.pieces.push([p, q]);
      }
    }
    if (this.pieces.length === 0) {
      this.index = null;
      return;
    }
    const index = new Flatbush(this.pieces.length);
    for (const [p, q] of this.pieces) index.add(Math.min(p[0], q[0]), Math.min(p[1], q[1]), Math.max(p[0], q[0]), Math.max(p[1], q[1]));
    index.finish();
    this.index = index;
  }

  hits(box: Box): boolean {
    if (!this.index) return false;
    return this.index.search(box.x, box.y, box.x + box.w, box.y + box.h).some((i) => {
      const [p, q] = this.pieces[i]!;
      return segmentHitsBox(p, q, box);
    });
  }
}

function inflate(box: Box, by: number): Box {
  return { x: box.x - by, y: box.y - by, w: box.w + 2 * by, h: box.h + 2 * by };
}

/** The point of the box's outline nearest to p (p outside the box). */
function nearestOnBox(box: Box, p: Point): Point {
  return [Math.min(Math.max(p[0], box.x), box.x + box.w), Math.min(Math.max(p[1], box.y), box.y + box.h)];
}

export function placeLabels(requests: readonly LabelRequest[], options: PlacementOptions): { placed: PlacedLabel[]; left: string[] } {
  const gap = options.gap ?? 2;
  const clearance = options.lineClearance ?? 4;
  const lines = new LineIndex(options.lines ?? []);
  const taken: Box[] = [...(options.reserved ?? [])];
  const placed: PlacedLabel[] = [];
  const left: string[] = [];
  const radii = options.radii ?? defaultRadii;
  for (const request of requests) {
    const [ax, ay] = request.anchor;
    if (!Number.isFinite(ax) || !Number.isFinite(ay)) {
      left.push(request.id);
      continue;
    }
    const candidates: Point[] = options.allowCentre ? [[ax, ay]] : [];
    for (const r of radii) {
      // a ring's radius counts from the label's edge, so wide labels keep the same clearance
      for (const angle of directions) {
        const dx = Math.cos(angle);
        const dy = Math.sin(angle);
        candidates.push([ax + dx * (r + (Math.abs(dx) * request.w) / 2), ay + dy * (r + (Math.abs(dy) * request.h) / 2)]);
      }
    }
    let found: Box | null = null;
    for (const [cx, cy] of candidates) {
      const box = { x: cx - request.w / 2, y: cy - request.h / 2, w: request.w, h: request.h };
      if (box.x < 1 || box.y < 1 || box.x + box.w > options.width - 1 || box.y + box.h > options.height - 1) continue;
      if (taken.some((t) => boxesOverlap(t, box, gap))) continue;
      if (lines.hits(inflate(box, clearance))) continue;
      found = box;
      break;
    }
    if (!found) {
      left.push(request.id);
      continue;
    }
    taken.push(found);
    const edge = nearestOnBox(found, request.anchor);
    const far = Math.hypot(edge[0] - ax, edge[1] - ay) > 3;
    placed.push({ id: request.id, anchor: request.anchor, box: found, leader: far ? [request.anchor, edge] : null });
  }
  return { placed, left };
}

/** Pairs of placed boxes that overlap (for tests and checks; should be empty). */
export function overlappingPairs(boxes: readonly Box[]): [number, number][] {
  const out: [number, number][] = [];
  for (let i = 0; i < boxes.length; i++) for (let j = i + 1; j < boxes.length; j++) if (boxesOverlap(boxes[i]!, boxes[j]!)) out.push([i, j]);
  return out;
}
