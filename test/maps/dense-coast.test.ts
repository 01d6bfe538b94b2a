/**
 * The dense test coast (60 segments along 300 km of a ragged shore with two islands, invented,
 * test/maps/dense-coast.ts) and the demo-sized maps: every badge placed, no two badge or label
 * boxes overlapping, none covering a segment line, leaders where moved. Snapshots of the drawn
 * maps go to test/output/ (coordinates rounded to 0.1 px by the renderer).
 */
import { describe, expect, it } from 'vitest';
import { geoDistance } from 'd3-geo';
import { overlappingPairs, LineIndex } from '../../site/lib/label-placement.ts';
import { prepareLand, prepareSegments, renderMapWithLayout } from '../../site/lib/map.ts';
import { denseCoast, denseLand } from './dense-coast.ts';

describe('dense test coast', () => {
  const segments = denseCoast();
  const places = [
    { name: 'Northport', lon: 8.62, lat: 64.2 },
    { name: 'Skerry Sound', lon: 8.3, lat: 63.35 },
    { name: 'Southvik', lon: 8.7, lat: 61.9 },
  ];

  it('is what it says: 60 segments along about 300 km', () => {
    expect(segments).toHaveLength(60);
    const lats = segments.flatMap((s) => (s.geometry as GeoJSON.LineString).coordinates.map((c) => c[1]!));
    const km = geoDistance([8.5, Math.min(...lats)], [8.5, Math.max(...lats)]) * 6371.0088;
    expect(km).toBeGreaterThan(280);
    expect(km).toBeLessThan(320);
  });

  for (const width of [560, 340]) {
    it(`places every badge and place name without overlap at ${width} px`, async () => {
      const { svg, layout } = renderMapWithLayout({
        idPrefix: 'dense',
        title: 'Dense coast',
        description: 'test',
        segments: prepareSegments(segments),
        land: prepareLand(denseLand()),
        places,
        width,
      });
      const badges = layout.labels.filter((l) => l.id.startsWith('segment:'));
      expect(layout.left).toEqual([]);
      expect(badges).toHaveLength(60);
      expect(layout.labels.filter((l) => l.id.startsWith('place:'))).toHaveLength(3);
      expect(overlappingPairs(layout.labels.map((l) => l.box))).toEqual([]);
      expect((svg.match(/<g class="badge">/g) ?? []).length).toBe(60);
      expect(layout.labels.filter((l) => l.leader !== null).length).toBeGreaterThan(0);
      if (width === 560) await expect(svg).toMatchFileSnapshot('../output/dense-coast-map.svg');
    });
  }

  it('no badge covers a segment line', () => {
    const prepared = prepareSegments(segments);
    const { svg, layout } = renderMapWithLayout({ idPrefix: 'dense', title: 'Dense coast', description: 'test', segments: prepared, width: 560 });
    // the drawn lines, read back from the SVG paths of the segments (M/L commands of d3-geo)
    const lines = [...svg.matchAll(/<path d="(M[^"]+)" fill="none" stroke="#(?!fff)[0-9a-f]{6}" stroke-width="[4-7]"/g)].flatMap((m) =>
      m[1]!
        .split('M')
        .filter(Boolean)
        .map((part) => part.split('L').map((xy) => xy.split(',').map(Number) as [number, number])),
    );
    expect(lines.length).toBeGreaterThanOrEqual(60);
    const index = new LineIndex(lines);
    for (const label of layout.labels) expect(index.hits(label.box)).toBe(false);
  });
});

describe('area badges', () => {
  it('each area badge links to its page, and its accessible name begins with the number shown (WCAG 2.1 SC 2.5.3)', () => {
    const segments = denseCoast();
    const areas = [0, 1, 2].map((k) => ({
      id: `area-${k + 1}`,
      number: k + 1,
      name: `Reach ${String.fromCharCode(65 + k)}`,
      level: 'marked' as const,
      levelLabel: 'Marked',
      segmentIds: segments.slice(k * 20, (k + 1) * 20).map((s) => s.id),
      href: `/areas/area-${k + 1}/`,
    }));
    const { svg, layout } = renderMapWithLayout({ idPrefix: 'areas', title: 't', description: 'd', segments: prepareSegments(segments), areas, width: 560 });
    expect(layout.labels.filter((l) => l.id.startsWith('area:'))).toHaveLength(3);
    for (const area of areas) {
      const link = new RegExp(
        `<a href="${area.href}" tabindex="-1" aria-label="${area.number}\\. ${area.name}: highest level Marked, 3 of 4"><g class="badge">.*?>${area.number}</text></g></a>`,
      );
      expect(svg).toMatch(link);
    }
  });
});
