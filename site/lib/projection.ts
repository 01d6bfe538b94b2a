/**
 * Which map projection fits a place, from its extent (pure; rendering only).
 *
 * - The projection is always rotated so the middle of the region's longitudes lies on its
 *   central meridian: a region crossing the 180° meridian then draws as one piece (d3-geo cuts
 *   along the antimeridian of the rotated projection, far from the region).
 * - Small regions (widest side up to `smallSpanKm`): Mercator, conformal, so shapes are right;
 *   its scale changes little over such a span at any latitude.
 * - Larger regions longer north–south than east–west: transverse Mercator centred on the region
 *   (scale exact along the central meridian, common practice for long north–south coasts).
 * - Larger regions wider than tall: Albers conic equal-area with standard parallels at one sixth
 *   and five sixths of the latitude range (Snyder 1987, "Map Projections — A Working Manual",
 *   USGS PP 1395, ch. 14: the usual choice of standard parallels).
 *
 * The scale bar is measured on the projection itself (projection.invert and the great-circle
 * distance), so it is right for whichever projection is chosen.
 */
import { geoBounds, geoConicEqualArea, geoStream, geoDistance, geoMercator, geoTransverseMercator } from 'd3-geo';
import type { GeoPermissibleObjects, GeoProjection } from 'd3-geo';

export type ProjectionKind = 'mercator' | 'transverse-mercator' | 'conic-equal-area';

export interface Extent {
  west: number;
  south: number;
  east: number;
  north: number;
  /** middle longitude, on the side of the region (across 180° when it crosses it) */
  centreLon: number;
  centreLat: number;
  /** longitude span in degrees (0..360) */
  spanLon: number;
}

/** Regions up to this size (km, the longer side) are drawn in Mercator. */
export const smallSpanKm = 600;

/**
 * The extent of a drawing: latitudes from d3-geo geoBounds; longitudes as the shortest arc that
 * holds every vertex (the complement of the widest empty gap between sorted longitudes), which
 * stays right for data cut at ±180° (Natural Earth splits Fiji there, and geoBounds then spans
 * the whole globe).
 */
export function extentOf(object: GeoPermissibleObjects): Extent {
  const [[, south], [, north]] = geoBounds(object);
  const lons: number[] = [];
  const sink = {
    point: (x: number) => {
      lons.push(((x + 540) % 360) - 180);
    },
    lineStart: () => {},
    lineEnd: () => {},
    polygonStart: () => {},
    polygonEnd: () => {},
    sphere: () => {
      lons.push(-180, 0, 180);
    },
  };
  geoStream(object, sink);
  let west = -180;
  let east = 180;
  if (lons.length > 0) {
    lons.sort((a, b) => a - b);
    // widest gap, the one across ±180° included
    let gap = lons[0]! + 360 - lons[lons.length - 1]!;
    west = lons[0]!;
    east = lons[lons.length - 1]!;
    for (let i = 1; i < lons.length; i++) {
      const g = lons[i]! - lons[i - 1]!;
      if (g > gap) {
        gap = g;
        west = lons[i]!;
        east = lons[i - 1]!;
      }
    }
  }
  const spanLon = east >= west ? east - west : east + 360 - west;
  let centreLon = west + spanLon / 2;
  if (centreLon > 180) centreLon -= 360;
  return { west, south, east, north, centreLon, centreLat: (south + north) / 2, spanLon };
}

const earthRadiusKm = 6371.0088;

/** The extent's east–west width at its middle latitude and north–south height, in km. */
export function extentKm(extent: Extent): { width: number; height: number } {
  const width = geoDistance([extent.centreLon - extent.spanLon / 2, extent.centreLat], [extent.centreLon, extent.centreLat]) * 2 * earthRadiusKm;
  const height = geoDistance([extent.centreLon, extent.south], [extent.centreLon, extent.north]) * earthRadiusKm;
  return { width, height };
}

export function projectionKind(extent: Extent): ProjectionKind {
  const { width, height } = extentKm(extent);
  if (Math.max(width, height) <= smallSpanKm) return 'mercator';
  return height >= width ? 'transverse-mercator' : 'conic-equal-area';
}

/** A projection for the extent, rotated to its centre; fit it to the frame afterwards. */
export function projectionFor(extent: Extent): { kind: ProjectionKind; projection: GeoProjection } {
  const kind = projectionKind(extent);
  if (kind === 'mercator') return { kind, projection: geoMercator().rotate([-extent.centreLon, 0]) };
  if (kind === 'transverse-mercator') return { kind, projection: geoTransverseMercator().rotate([-extent.centreLon, 0]) };
  const range = extent.north - extent.south;
  const parallels: [number, number] = [extent.south + range / 6, extent.south + (5 * range) / 6];
  return { kind, projection: geoConicEqualArea().parallels(parallels).rotate([-extent.centreLon, 0]) };
}

const niceKm = [0.5, 1, 2, 5, 10, 20, 50, 100, 200, 500, 1000];

/**
 * A scale bar drawn rightwards from `start` (pixels): the great-circle distance of the 100 px
 * that follow it, then a round length of at most `maxPx` pixels. Measured where the bar is drawn,
 * so it holds there whatever the projection. Null where the projection cannot invert.
 */
export function scaleBar(projection: GeoProjection, start: [number, number], maxPx = 140): { km: number; px: number } | null {
  const a = projection.invert?.(start);
  const b = projection.invert?.([start[0] + 100, start[1]]);
  if (!a || !b) return null;
  const kmPer100 = geoDistance(a, b) * earthRadiusKm;
  if (!(kmPer100 > 0)) return null;
  const km = [...niceKm].reverse().find((k) => (k / kmPer100) * 100 <= maxPx) ?? niceKm[0]!;
  return { km, px: (km / kmPer100) * 100 };
}
