// Snapshot of every kind of map the site draws (site/lib/map.ts), one named scenario each:
// test/output/<scenario>.svg. See test/snapshot.ts for the normalisation and the review workflow.
// New map work (land, badge placement, areas) adds its own scenarios here.
import { describe, expect, it } from 'vitest';
import { mostVerticesDrawnAsGiven, prepareSegments, renderMap } from '../../site/lib/map.ts';
import { svgSnapshot } from '../snapshot.ts';
import { region, regionSegments } from './fixture-pictures.ts';

describe('map pictures', () => {
  svgSnapshot(function overviewMap() {
    return renderMap({
      idPrefix: 'region-map',
      title: 'Saltmere Coast: coastline segments by level',
      description: `${regionSegments.length} segments; ${region.zones.length} offshore accumulation zones.`,
      segments: prepareSegments(regionSegments),
      zones: region.zones,
      width: 560,
      linkOf: (id) => `/segments/${id}/`,
    });
  });

  svgSnapshot(function locatorMapWithInset() {
    return renderMap({
      idPrefix: 'locator',
      title: 'Where Tamsey Estuary is',
      description: 'Tamsey Estuary among its neighbours.',
      segments: prepareSegments(regionSegments),
      zones: region.zones,
      highlight: 'tamsey-estuary',
      width: 420,
    });
  });

  svgSnapshot(function overviewMapAreaSegments() {
    // the same coast with one segment given as an area (a bay drawn as a polygon)
    const withArea = regionSegments.map((segment, i) => {
      if (i !== 0 || segment.geometry.type !== 'LineString') return segment;
      const line = segment.geometry.coordinates as [number, number][];
      const [first] = line;
      if (!first) return segment;
      const ring: [number, number][] = [...line, ...[...line].reverse().map(([lon, lat]): [number, number] => [lon, lat - 0.03]), first];
      return { ...segment, geometry: { type: 'Polygon' as const, coordinates: [ring] } };
    });
    return renderMap({ idPrefix: 'area-map', title: 'Segments as lines and areas', description: 'One segment is an area.', segments: prepareSegments(withArea), width: 560 });
  });
});

describe('maps of finely digitised coasts', () => {
  it('draws a 200,000-vertex segment in a locator map of ordinary page size', () => {
    // A segment digitised at 1:10 000 made a bulletin page of 1.4–5.9 MB; thinned to half a square
    // pixel (Visvalingam and Whyatt, 1993, effective area) the map stays small.
    const [first, ...rest] = regionSegments;
    if (!first || first.geometry.type !== 'LineString') throw new Error('the fixture has no line segment first');
    const line = first.geometry.coordinates as [number, number][];
    const [a, b] = [line[0]!, line[line.length - 1]!];
    const coordinates: [number, number][] = [];
    for (let i = 0; i < 200_000; i++) {
      const f = i / 199_999;
      // wiggles of a few metres, too small to see at the map's scale
      coordinates.push([a[0] + (b[0] - a[0]) * f + 0.00003 * Math.sin(i / 3), a[1] + (b[1] - a[1]) * f]);
    }
    const segments = [{ ...first, geometry: { type: 'LineString' as const, coordinates } }, ...rest];
    expect(coordinates.length).toBeGreaterThan(mostVerticesDrawnAsGiven);
    const svg = renderMap({ idPrefix: 'locator', title: 'Where it is', description: 'A fine coast.', segments: prepareSegments(segments), highlight: first.id, width: 420 });
    expect(svg.length).toBeLessThan(100_000);
    expect(svg).toContain(`${first.name}:`);
  });
});
