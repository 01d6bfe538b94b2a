/**
 * Spatial index of coastline segment lines for "which segment is this particle near?". Every
 * straight piece (edge) of every segment line goes into a Flatbush packed R-tree (Agafonkin,
 * flatbush; Hilbert-sorted static R-tree); a query looks up the edges whose boxes overlap a box
 * around the point widened by the search distance, then measures the great-circle distance to
 * each candidate edge. The nearest edge within the distance wins; between segments exactly as near,
 * the one listed first in the segments file.
 */
import Flatbush from 'flatbush';
import type { Segment } from '../scenario/types.ts';
import { degreesForKm, earthRadiusKm, pointToArcKm } from './geodesy.ts';

/** Kilometres per degree of latitude on the sphere of radius 6371.0088 km (2πR/360). */
const kmPerDegreeLat = (2 * Math.PI * earthRadiusKm) / 360;

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
  /** Edges of segment s are firstEdge[s] .. firstEdge[s + 1] − 1. */
  private readonly firstEdge: Int32Array;
  /**
   * Coarse occupancy grid (a bitmap of cells near any edge) so that points far from every segment
   * are turned away without an R-tree search; built for one search distance.
   */
  private grid: { west: number; south: number; cell: number; columns: number; rows: number; bits: Uint8Array; km: number } | null = null;

  constructor(segments: readonly Segment[], prefilterKm?: number) {
    const owners: number[] = [];
    const coordinates: number[] = [];
    const starts: number[] = [];
    segments.forEach((segment, s) => {
      starts.push(owners.length);
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
    // Edges were added segment by segment: each segment owns one contiguous run of edges.
    this.firstEdge = Int32Array.from([...starts, owners.length]);
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
    if (prefilterKm !== undefined && prefilterKm > 0 && this.edgeCount > 0) this.buildGrid(prefilterKm);
  }

  private buildGrid(km: number): void {
    const reach = degreesForKm(km, Math.max(Math.abs(this.bounds[1]), Math.abs(this.bounds[3])) + degreesForKm(km, 0).dLat);
    const west = this.bounds[0] - reach.dLon;
    const south = this.bounds[1] - reach.dLat;
    const width = this.bounds[2] + reach.dLon - west;
    const height = this.bounds[3] + reach.dLat - south;
    // Cells a quarter of the search distance, at most ~16 million cells.
    let cell = Math.max(reach.dLat / 4, 1e-5);
    while ((width / cell) * (height / cell) > 16e6) cell *= 2;
    const columns = Math.max(1, Math.ceil(width / cell));
    const rows = Math.max(1, Math.ceil(height / cell));
    const bits = new Uint8Array(columns * rows);
    const c = this.edgeCoordinates;
    for (let e = 0; e < this.edgeCount; e++) {
      const x1 = Math.min(c[4 * e] ?? 0, c[4 * e + 2] ?? 0) - reach.dLon;
      const x2 = Math.max(c[4 * e] ?? 0, c[4 * e + 2] ?? 0) + reach.dLon;
      const y1 = Math.min(c[4 * e + 1] ?? 0, c[4 * e + 3] ?? 0) - reach.dLat;
      const y2 = Math.max(c[4 * e + 1] ?? 0, c[4 * e + 3] ?? 0) + reach.dLat;
      const i1 = Math.max(0, Math.floor((x1 - west) / cell));
      const i2 = Math.min(columns - 1, Math.floor((x2 - west) / cell));
      const j1 = Math.max(0, Math.floor((y1 - south) / cell));
      const j2 = Math.min(rows - 1, Math.floor((y2 - south) / cell));
      for (let j = j1; j <= j2; j++) for (let i = i1; i <= i2; i++) bits[j * columns + i] = 1;
    }
    this.grid = { west, south, cell, columns, rows, bits, km };
  }

  /** The nearest segment within `maxKm` of the point, or null when none is that close. */
  // State of the running query, read by one filter function made once (no closure per query).
  private queryLon = 0;
  private queryLat = 0;
  private queryMaxKm = 0;
  private queryKmPerDegreeLon = 0;
  private bestSegment = -1;
  private bestKm = Infinity;
  private readonly visitEdge = (e: number): boolean => {
    const c = this.edgeCoordinates;
    const lon = this.queryLon;
    const lat = this.queryLat;
    const x1 = c[4 * e] ?? 0;
    const y1 = c[4 * e + 1] ?? 0;
    const x2 = c[4 * e + 2] ?? 0;
    const y2 = c[4 * e + 3] ?? 0;
    // Local flat-Earth estimate first (within a few per cent over a few km); the exact
    // great-circle distance only for edges that may be within reach.
    const ax = (x1 - lon) * this.queryKmPerDegreeLon;
    const ay = (y1 - lat) * kmPerDegreeLat;
    const dx = (x2 - lon) * this.queryKmPerDegreeLon - ax;
    const dy = (y2 - lat) * kmPerDegreeLat - ay;
    const length2 = dx * dx + dy * dy;
    const t = length2 > 0 ? Math.max(0, Math.min(1, -(ax * dx + ay * dy) / length2)) : 0;
    const px = ax + t * dx;
    const py = ay + t * dy;
    const planarKm = Math.sqrt(px * px + py * py);
    if (planarKm > this.queryMaxKm * 1.05 + 0.05 || planarKm > this.bestKm * 1.05 + 0.05) return false;
    const km = pointToArcKm(lon, lat, x1, y1, x2, y2);
    const segment = this.edgeSegment[e] ?? -1;
    // Two segments exactly as near (a vertex they share): the one listed first, whatever order
    // the R-tree visits them in, so that every reader of the same files decides alike.
    if (km <= this.queryMaxKm && (km < this.bestKm || (km === this.bestKm && segment < this.bestSegment))) {
      this.bestKm = km;
      this.bestSegment = segment;
    }
    return false;
  };

  /** The nearest segment within `maxKm` of the point, or null when none is that close. */
  nearestWithin(lon: number, lat: number, maxKm: number): NearestSegment | null {
    if (!this.index) return null;
    const grid = this.grid;
    if (grid !== null && maxKm <= grid.km) {
      const i = Math.floor((lon - grid.west) / grid.cell);
      const j = Math.floor((lat - grid.south) / grid.cell);
      if (i < 0 || j < 0 || i >= grid.columns || j >= grid.rows || grid.bits[j * grid.columns + i] === 0) return null;
    }
    const dLat = maxKm / kmPerDegreeLat;
    const cos = Math.cos((Math.min(89.9, Math.abs(lat) + dLat) * Math.PI) / 180);
    const dLon = Math.min(360, dLat / Math.max(cos, 1e-6));
    if (lon + dLon < this.bounds[0] || lon - dLon > this.bounds[2] || lat + dLat < this.bounds[1] || lat - dLat > this.bounds[3]) return null;
    this.queryLon = lon;
    this.queryLat = lat;
    this.queryMaxKm = maxKm;
    this.queryKmPerDegreeLon = kmPerDegreeLat * Math.cos((lat * Math.PI) / 180);
    this.bestSegment = -1;
    this.bestKm = Infinity;
    this.index.search(lon - dLon, lat - dLat, lon + dLon, lat + dLat, this.visitEdge);
    return this.bestSegment < 0 ? null : { segment: this.bestSegment, distanceKm: this.bestKm };
  }

  /** Distance from a point to one segment's line (all its edges), in km. */
  distanceToSegmentKm(lon: number, lat: number, segment: number): number {
    let best = Infinity;
    const end = this.firstEdge[segment + 1] ?? 0;
    for (let e = this.firstEdge[segment] ?? 0; e < end; e++) {
      const c = this.edgeCoordinates;
      const km = pointToArcKm(lon, lat, c[4 * e] ?? 0, c[4 * e + 1] ?? 0, c[4 * e + 2] ?? 0, c[4 * e + 3] ?? 0);
      if (km < best) best = km;
    }
    return best;
  }
}
