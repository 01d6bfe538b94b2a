/**
 * The projection fitted to the place, on real geometry: Natural Earth 1:50m country polygons
 * (public domain) as packaged in world-atlas 2.x (countries-50m.json): Fiji (ISO 3166 numeric 242),
 * which crosses the 180° meridian, and Norway (578), a high-latitude coast 1,700 km long.
 * The scale bar is checked against the geodesic (great-circle) distance d3-geo gives for the
 * ground under the bar's ends, and distances across the map against d3-geo geoDistance.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { geoDistance } from 'd3-geo';
import type { Feature, FeatureCollection, Geometry, MultiPolygon, Polygon } from 'geojson';
import { feature } from 'topojson-client';
import type { Topology } from 'topojson-specification';
import { describe, expect, it } from 'vitest';
import { extentKm, extentOf, projectionFor, projectionKind, scaleBar } from '../../site/lib/projection.ts';
import { prepareLand, prepareSegments, renderMapWithLayout, type MapSegment } from '../../site/lib/map.ts';

const require = createRequire(import.meta.url);
const world = JSON.parse(readFileSync(require.resolve('world-atlas/countries-50m.json'), 'utf8')) as Topology;
const countries = feature(world, world.objects['countries']!) as unknown as FeatureCollection<Polygon | MultiPolygon>;
const country = (id: string): Feature<Polygon | MultiPolygon> => {
  const found = countries.features.find((f) => String(f.id) === id);
  if (!found) throw new Error(`world-atlas has no country ${id}`);
  return found;
};
const R = 6371.0088; // mean Earth radius, IUGG (Moritz 2000, Geodetic Reference System 1980)

/** The coast of each polygon of a country as segments (its outer rings cut into pieces). */
function coastSegments(shape: Feature<Polygon | MultiPolygon>, pieces: number): MapSegment[] {
  const polygons = shape.geometry.type === 'Polygon' ? [shape.geometry.coordinates] : shape.geometry.coordinates;
  const rings = polygons
    .map((p) => p[0]!)
    .sort((a, b) => b.length - a.length)
    .slice(0, 6);
  const out: MapSegment[] = [];
  for (const [r, ring] of rings.entries()) {
    const step = Math.max(2, Math.ceil(ring.length / pieces));
    for (let i = 0; i + 1 < ring.length; i += step) {
      const coordinates = ring.slice(i, Math.min(i + step + 1, ring.length));
      if (coordinates.length >= 2)
        out.push({ id: `r${r}-${i}`, name: `Ring ${r} piece ${i}`, level: 'noticeable', levelLabel: 'Noticeable', geometry: { type: 'LineString', coordinates } as Geometry });
    }
  }
  return out;
}

/** Checks the scale bar drawn on the map: its ends, inverted, are `km` apart within 1 %. */
function checkScaleBar(svg: string, projection: ReturnType<typeof projectionFor>['projection']): number {
  const bar = /<g class="scale" data-km="([\d.]+)">.*?<path d="M16 ([\d.]+)V[\d.]+H([\d.]+)V/.exec(svg);
  expect(bar).not.toBeNull();
  const km = Number(bar![1]);
  const y = Number(bar![2]) + 4;
  const x1 = Number(bar![3]);
  const a = projection.invert!([16, y])!;
  const b = projection.invert!([x1, y])!;
  const geodesic = geoDistance(a, b) * R;
  expect(Math.abs(geodesic - km) / km).toBeLessThan(0.01);
  return km;
}

describe('projection fitted to the place', () => {
  it('Fiji, across the 180° meridian: one piece, centred near 180°, scale bar right', async () => {
    const fiji = country('242');
    const extent = extentOf(fiji);
    expect(extent.west).toBeGreaterThan(extent.east); // crossing the antimeridian: west of it in the east
    expect(Math.abs(Math.abs(extent.centreLon) - 180)).toBeLessThan(3);
    const { width, height } = extentKm(extent);
    expect(width).toBeLessThan(800); // one region a few hundred km wide, not the whole globe
    expect(height).toBeLessThan(1200); // Rotuma (12.5° S) to Ono-i-Lau (20.6° S)
    const segments = coastSegments(fiji, 6);
    const { svg, layout } = renderMapWithLayout({
      idPrefix: 'fiji',
      title: 'Fiji',
      description: 'test',
      segments: prepareSegments(segments),
      land: prepareLand(fiji.geometry),
      width: 560,
    });
    // the drawing spans the frame once: the map is not the width of the world
    const { projection } = projectionFor(extentOf({ type: 'FeatureCollection', features: prepareSegments(segments).features } as FeatureCollection));
    projection.fitExtent(
      [
        [16, 16],
        [560 - 16, layout.height - 16],
      ],
      { type: 'FeatureCollection', features: prepareSegments(segments).features } as FeatureCollection,
    );
    const km = checkScaleBar(svg, projection);
    expect(km).toBeLessThanOrEqual(200);
    await expect(svg).toMatchFileSnapshot('../output/fiji-across-180-map.svg');
    // Suva (178.44 E, 18.14 S) to Labasa (179.39 E, 16.43 S), about 215 km apart (geoDistance)
    const suva = projection([178.44, -18.14])!;
    const labasa = projection([179.39, -16.43])!;
    const kmPerPx = (geoDistance(projection.invert!([16, layout.height - 12])!, projection.invert!([116, layout.height - 12])!) * R) / 100;
    const mapKm = Math.hypot(labasa[0] - suva[0], labasa[1] - suva[1]) * kmPerPx;
    const trueKm = geoDistance([178.44, -18.14], [179.39, -16.43]) * R;
    expect(Math.abs(mapKm - trueKm) / trueKm).toBeLessThan(0.03);
  });

  it('Norway, a long high-latitude coast: transverse Mercator; bar and long distances right', async () => {
    const norway = country('578');
    // mainland Norway only (Svalbard and Jan Mayen lie far off): polygons south of 72° N, east of 0°
    const polygons = (norway.geometry as MultiPolygon).coordinates.filter((p) => p[0]!.every(([lon, lat]) => lat! < 72 && lon! > 0));
    const mainland: Feature<MultiPolygon> = { type: 'Feature', properties: {}, geometry: { type: 'MultiPolygon', coordinates: polygons } };
    const extent = extentOf(mainland);
    expect(projectionKind(extent)).toBe('transverse-mercator');
    const segments = coastSegments(mainland, 40);
    const prepared = prepareSegments(segments);
    const { svg, layout } = renderMapWithLayout({ idPrefix: 'no', title: 'Norway', description: 'test', segments: prepared, land: prepareLand(mainland.geometry), width: 560 });
    const frame = { type: 'FeatureCollection', features: prepared.features } as FeatureCollection;
    const { projection } = projectionFor(extentOf(frame));
    projection.fitExtent(
      [
        [16, 16],
        [560 - 16, layout.height - 16],
      ],
      frame,
    );
    checkScaleBar(svg, projection);
    await expect(svg).toMatchFileSnapshot('../output/norway-high-latitude-map.svg');
    // Lindesnes (7.05 E, 57.98 N) to Nordkapp (25.78 E, 71.17 N): about 1,700 km (geoDistance);
    // on the fitted map the bar's scale gives that distance within 3 %.
    const kmPerPx = (geoDistance(projection.invert!([16, layout.height - 12])!, projection.invert!([116, layout.height - 12])!) * R) / 100;
    const a = projection([7.05, 57.98])!;
    const b = projection([25.78, 71.17])!;
    const trueKm = geoDistance([7.05, 57.98], [25.78, 71.17]) * R;
    expect(trueKm).toBeGreaterThan(1600);
    expect(Math.abs(Math.hypot(b[0] - a[0], b[1] - a[1]) * kmPerPx - trueKm) / trueKm).toBeLessThan(0.03);
  });

  it('a small region is drawn in Mercator and a wide one in a conic equal-area projection', () => {
    expect(
      projectionKind(
        extentOf({
          type: 'MultiPoint',
          coordinates: [
            [8, 63],
            [9, 64],
          ],
        }),
      ),
    ).toBe('mercator');
    expect(
      projectionKind(
        extentOf({
          type: 'MultiPoint',
          coordinates: [
            [-10, 50],
            [20, 55],
          ],
        }),
      ),
    ).toBe('conic-equal-area');
  });

  it('the scale bar of plain Mercator at 60° N is half that at the equator per pixel (sec φ, Snyder 1987 eq. 7-4)', () => {
    const equator = projectionFor(
      extentOf({
        type: 'MultiPoint',
        coordinates: [
          [0, -1],
          [1, 1],
        ],
      }),
    )
      .projection.scale(1000)
      .translate([0, 0]);
    const barEq = scaleBar(equator, equator([0, 0])!)!;
    const north = projectionFor(
      extentOf({
        type: 'MultiPoint',
        coordinates: [
          [0, 59],
          [1, 61],
        ],
      }),
    )
      .projection.scale(1000)
      .translate([0, 0]);
    const barN = scaleBar(north, north([0.5, 60])!)!;
    // km per px: equator k, 60° N k·cos 60° = k/2 (Mercator scale factor sec φ)
    expect(barN.km / barN.px / (barEq.km / barEq.px)).toBeCloseTo(0.5, 2);
  });
});
