// Snapshot of every kind of map the site draws (site/lib/map.ts), one named scenario each:
// test/output/<scenario>.svg. See test/snapshot.ts for the normalisation and the review workflow.
// New map work (land, badge placement, areas) adds its own scenarios here.
import { describe } from 'vitest';
import { prepareSegments, renderMap } from '../../site/lib/map.ts';
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
