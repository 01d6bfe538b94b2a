/**
 * Label placement (site/lib/label-placement.ts): greedy candidate placement (Christensen, Marks
 * & Shieber 1995) checked by properties that must hold whatever the input: placed boxes never
 * overlap each other or a reserved box, never touch an obstacle line, stay in the frame, and a
 * leader always ends on its box.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { LineIndex, boxesOverlap, overlappingPairs, placeLabels, type Point } from '../../site/lib/label-placement.ts';

describe('placeLabels', () => {
  it('never overlaps, never covers a line, stays inside the frame (random anchors and lines)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.tuple(fc.integer({ min: 0, max: 400 }), fc.integer({ min: 0, max: 300 })), { minLength: 1, maxLength: 60 }),
        fc.array(fc.array(fc.tuple(fc.integer({ min: 0, max: 400 }), fc.integer({ min: 0, max: 300 })), { minLength: 2, maxLength: 6 }), { maxLength: 8 }),
        (anchors, lines) => {
          const requests = anchors.map((a, i) => ({ id: `l${i}`, anchor: a as Point, w: i % 3 === 0 ? 40 : 16, h: 16 }));
          const reserved = [{ x: 0, y: 270, w: 120, h: 30 }];
          const { placed, left } = placeLabels(requests, { width: 400, height: 300, lines: lines as Point[][], reserved });
          expect(placed.length + left.length).toBe(requests.length);
          expect(overlappingPairs(placed.map((p) => p.box))).toEqual([]);
          const index = new LineIndex(lines as Point[][]);
          for (const p of placed) {
            expect(boxesOverlap(p.box, reserved[0]!)).toBe(false);
            expect(index.hits(p.box)).toBe(false);
            expect(p.box.x).toBeGreaterThanOrEqual(0);
            expect(p.box.y + p.box.h).toBeLessThanOrEqual(300);
            if (p.leader) {
              const [, end] = p.leader;
              const onEdge =
                Math.abs(end[0] - p.box.x) < 1e-9 ||
                Math.abs(end[0] - p.box.x - p.box.w) < 1e-9 ||
                Math.abs(end[1] - p.box.y) < 1e-9 ||
                Math.abs(end[1] - p.box.y - p.box.h) < 1e-9;
              expect(onEdge).toBe(true);
            }
          }
        },
      ),
      { numRuns: 150, seed: 16 },
    );
  });

  it('puts a lone label right beside its anchor, and the next one clear of it', () => {
    const { placed } = placeLabels(
      [
        { id: 'a', anchor: [100, 100], w: 16, h: 16 },
        { id: 'b', anchor: [100, 100], w: 16, h: 16 },
      ],
      { width: 300, height: 200 },
    );
    expect(placed[0]!.box).toEqual({ x: 100 + 14, y: 92, w: 16, h: 16 });
    expect(boxesOverlap(placed[0]!.box, placed[1]!.box)).toBe(false);
  });

  it('a line through the first spot pushes the label to the next free one', () => {
    const line: Point[] = [
      [120, 0],
      [120, 200],
    ];
    const { placed } = placeLabels([{ id: 'a', anchor: [100, 100], w: 16, h: 16 }], { width: 300, height: 200, lines: [line] });
    expect(new LineIndex([line]).hits(placed[0]!.box)).toBe(false);
    expect(placed[0]!.box.x + placed[0]!.box.w).toBeLessThan(120);
  });

  it('lists a label that finds no room instead of piling it on another', () => {
    const { placed, left } = placeLabels(
      [
        { id: 'a', anchor: [10, 10], w: 16, h: 16 },
        { id: 'b', anchor: [10, 10], w: 16, h: 16 },
      ],
      { width: 40, height: 40, radii: [2] },
    );
    expect(placed.map((p) => p.id)).toEqual(['a']);
    expect(left).toEqual(['b']);
  });
});
