/**
 * Spatial index of coastline segment lines for "which segment is this particle near?". Every
 * straight piece (edge) of every segment line goes into a Flatbush packed R-tree (Agafonkin,
 * flatbush; Hilbert-sorted static R-tree); a query looks up the edges whose boxes overlap a box
 * around the point widened by the search distance, then measures the great-circle distance to
 * each candidate edge.
 */
import Flatbush from 'flatbush';
import type { Segment } from '../scenario/types.ts';
import { degreesForKm, pointToArcKm } from './geodesy.ts';

export interface NearestSegment {
  /** Index into the segments array given to the constructor. */
  segment: number;
  distanceKm: number;
}

/** Straight pieces of a segment's lines (polygon rings count as lines). */
function linesOf(geometry: GeoJSON.Geometry): GeoJSON.Position[][] {
  switch (geometry.type) {
    case 'LineString':
      return [geometry.coordinates];
    case 'MultiLineString':
      return geometry.coordinates;
    case 'Polygon':
      return geometry.coordinates;
    case 'MultiPolygon':
      return geometry.coordinates.flat();
    default:
      return [];
  }
}

export class SegmentIndex {
  private readonly index: Flatbush | null;
  /** Per edge: segment index, then the two end points (lon, lat, lon, lat). */
  private readonly edgeSegment: Int32Array;
  private readonly edgeCoordinates: Float64Array;
  private readonly bounds: [number, number, number, number];
  readonly edgeCount: number;

  constructor(segments: readonly Segment[]) {
    const owners: number[] = [];
    const coordinates: number[] = [];
    segments.forEach((segment, s) => {
      for (const line of linesOf(segment.geometry)) {
        for (let i = 0; i + 1 < line.length; i++) {
          const a = line[i];
          const b = line[i + 1];
          if (!a || !b) continue;
          owners.push(s);
          coordinates.push(a[0] ?? 0, a[1] ?? 0, b[0] ?? 0, b[1] ?? 0);
        }
      }
    });
    this.edgeCount = owners.length;
    this.edgeSegment = Int32Array.from(owners);
    this.edgeCoordinates = Float64Array.from(coordinates);
    let west = Infinity;
    let south = Infinity;
    let east = -Infinity;
    let north = -Infinity;
    if (this.edgeCount === 0) {
      this.index = null;
    } else {
      const index = new Flatbush(this.edgeCount);
      for (let e = 0; e < this.edgeCount; e++) {
        const x1 = this.edgeCoordinates[4 * e] ?? 0;
        const y1 = this.edgeCoordinates[4 * e + 1] ?? 0;
        const x2 = this.edgeCoordinates[4 * e + 2] ?? 0;
        const y2 = this.edgeCoordinates[4 * e + 3] ?? 0;
        const minX = Math.min(x1, x2);
        const minY = Math.min(y1, y2);
        const maxX = Math.max(x1, x2);
        const maxY = Math.max(y1, y2);
        index.add(minX, minY, maxX, maxY);
        if (minX < west) west = minX;
        if (minY < south) south = minY;
        if (maxX > east) east = maxX;
        if (maxY > north) north = maxY;
      }
      index.finish();
      this.index = index;
    }
    this.bounds = [west, south, east, north];
  }

  /** The nearest segment within `maxKm` of the point, or null when none is that close. */
  nearestWithin(lon: number, lat: number, maxKm: number): NearestSegment | null {
    if (!this.index) return null;
    const { dLat, dLon } = degreesForKm(maxKm, Math.abs(lat) + degreesForKm(maxKm, 0).dLat);
    if (lon + dLon < this.bounds[0] || lon - dLon > this.bounds[2] || lat + dLat < this.bounds[1] || lat - dLat > this.bounds[3]) return null;
    let best = -1;
    let bestKm = Infinity;
    const coordinates = this.edgeCoordinates;
    this.index.search(lon - dLon, lat - dLat, lon + dLon, lat + dLat, (e) => {
      const km = pointToArcKm(lon, lat, coordinates[4 * e] ?? 0, coordinates[4 * e + 1] ?? 0, coordinates[4 * e + 2] ?? 0, coordinates[4 * e + 3] ?? 0);
      if (km <= maxKm && km < bestKm) {
        bestKm = km;
        best = this.edgeSegment[e] ?? -1;
      }
      return false;
    });
    return best < 0 ? null : { segment: best, distanceKm: bestKm };
  }

  /** Distance from a point to one segment's line (all its edges), in km. */
  distanceToSegmentKm(lon: number, lat: number, segment: number): number {
    let best = Infinity;
    for (let e = 0; e < this.edgeCount; e++) {
      if (this.edgeSegment[e] !== segment) continue;
      const c = this.edgeCoordinates;
      const km = pointToArcKm(lon, lat, c[4 * e] ?? 0, c[4 * e + 1] ?? 0, c[4 * e + 2] ?? 0, c[4 * e + 3] ?? 0);
      if (km < best) best = km;
    }
    return best;
  }
}
