/**
 * Reads the optional land resource (role "land"): Polygon and MultiPolygon features, GeoJSON or
 * TopoJSON, WGS84 longitude/latitude, drawn under the segments on every map. Land only shows
 * the reader where the sea is; it takes part in no statistic and no level.
 *
 * Large inputs are simplified for drawing with topojson-simplify (Visvalingam & Whyatt 1993,
 * "Line generalisation by repeated elimination of points", The Cartographic Journal 30(1): the
 * effective-area weighting it implements): the shapes go into one topology (shared borders stay
 * shared), every vertex gets its spherical effective area, and the smallest are dropped until at
 * most `maxVertices` remain. Islands whose area falls below the same weight are left out of the
 * drawing (filterWeight). Every feature that cannot be used is listed in the validation report.
 */
import type { Feature, FeatureCollection, MultiPolygon, Polygon, Position } from 'geojson';
import { feature as topologyFeature } from 'topojson-client';
import { topology } from 'topojson-server';
import { filter, filterWeight, presimplify, quantile, simplify, sphericalRingArea, sphericalTriangleArea } from 'topojson-simplify';
import type { Objects, Topology } from 'topojson-specification';
import { LandShapeInvalid, LandUnreadable } from '../errors.ts';
import type { IssueLog } from './issue-log.ts';
import type { LandShapes } from '../scenario/types.ts';
import { readFeatureFile } from './read-segments.ts';

/** Land as read and simplified: one MultiPolygon, with vertex counts before and after; `coarse`
 * is a second, smaller simplification for the small whole-coast inset of locator maps. */

/** Vertex budget of the drawn land (every map of every page draws it). */
export const landVertexBudget = 4000;
export const coarseLandVertexBudget = 400;

function isRecord(value: unknown): value is { [key: string]: unknown } {
  return value !== null && typeof value === 'object' && !Array.isArray(value);
}

function ringProblem(ring: unknown): string | null {
  if (!Array.isArray(ring) || ring.length < 4) return 'a ring needs at least four positions';
  for (const position of ring) {
    if (!Array.isArray(position) || position.length < 2) return `position ${JSON.stringify(position)} is not [longitude, latitude]`;
    const [lon, lat] = position as unknown[];
    if (typeof lon !== 'number' || typeof lat !== 'number' || !Number.isFinite(lon) || !Number.isFinite(lat))
      return `position ${JSON.stringify(position)} is not two finite numbers`;
    if (lon < -180 || lon > 180 || lat < -90 || lat > 90) return `position [${lon}, ${lat}] is not a valid longitude/latitude; expected longitude −180..180 and latitude −90..90`;
  }
  const first = ring[0] as number[];
  const last = ring[ring.length - 1] as number[];
  if (first[0] !== last[0] || first[1] !== last[1]) return 'a ring is not closed (its last position differs from its first)';
  return null;
}

/** The polygons of one raw feature, or the reason it cannot be used. */
export function landPolygons(raw: unknown): Position[][][] | { reason: string } {
  if (!isRecord(raw)) return { reason: 'the feature is not a JSON object' };
  const geometry = raw['geometry'];
  if (!isRecord(geometry)) return { reason: 'the feature has no geometry' };
  const type = geometry['type'];
  const coordinates = geometry['coordinates'];
  if (type !== 'Polygon' && type !== 'MultiPolygon') return { reason: `geometry type ${JSON.stringify(type ?? null)}; expected Polygon or MultiPolygon` };
  if (!Array.isArray(coordinates) || coordinates.length === 0) return { reason: 'the geometry has no coordinates' };
  const polygons = (type === 'Polygon' ? [coordinates] : coordinates) as unknown[];
  for (const polygon of polygons) {
    if (!Array.isArray(polygon) || polygon.length === 0) return { reason: 'a polygon has no rings' };
    for (const ring of polygon) {
      const problem = ringProblem(ring);
      if (problem) return { reason: problem };
    }
  }
  return polygons as Position[][][];
}

function countVertices(polygons: readonly Position[][][]): number {
  return polygons.reduce((n, p) => n + p.reduce((m, r) => m + r.length, 0), 0);
}

const round5 = (v: number): number => Math.round(v * 1e5) / 1e5;

/** Simplifies polygons to at most `budget` vertices (topojson-simplify) and returns one MultiPolygon. */
export function simplifyLand(polygons: readonly Position[][][], budget = landVertexBudget): MultiPolygon {
  const collection: FeatureCollection<Polygon> = {
    type: 'FeatureCollection',
    features: polygons.map((coordinates) => ({ type: 'Feature', properties: {}, geometry: { type: 'Polygon', coordinates } })),
  };
  let topo = topology({ land: collection }, 1e6) as unknown as Topology<Objects<{}>>;
  const total = countVertices(polygons);
  if (total > budget) {
    topo = presimplify(topo, sphericalTriangleArea);
    // topojson-simplify sorts weights in descending order: the p-quantile keeps about a share p of the points
    const minWeight = quantile(topo, budget / total);
    topo = simplify(topo, minWeight);
    topo = filter(
      topo,
      filterWeight(topo, minWeight, (ring) => sphericalRingArea(ring, false)),
    ) as Topology<Objects<{}>>;
  }
  const back = topologyFeature(topo, topo.objects['land']!) as unknown as FeatureCollection<Polygon | MultiPolygon | null>;
  const out: Position[][][] = [];
  for (const f of back.features as Feature<Polygon | MultiPolygon | null>[]) {
    if (!f.geometry) continue;
    const list = f.geometry.type === 'Polygon' ? [f.geometry.coordinates] : f.geometry.coordinates;
    for (const p of list) out.push(p.map((ring) => ring.map((pos) => [round5(pos[0]!), round5(pos[1]!)])));
  }
  return { type: 'MultiPolygon', coordinates: out };
}

/** Reads and simplifies the land file; null when nothing in it can be used (all reported). */
export async function readLand(absolutePath: string, file: string, log: IssueLog, budget = landVertexBudget): Promise<LandShapes | null> {
  const counts = log.countsFor(file);
  const features = await readFeatureFile(absolutePath, file, log, LandUnreadable, 'GeoJSON or TopoJSON land polygons');
  if (features === null) return null;
  const polygons: Position[][][] = [];
  features.forEach((raw, i) => {
    counts.read++;
    const found = landPolygons(raw);
    if ('reason' in found) {
      counts.excluded++;
      log.add(LandShapeInvalid, LandShapeInvalid.message(file, i + 1, found.reason), {
        file,
        row: i + 1,
        column: 'geometry',
        value: null,
        expected: 'a Polygon or MultiPolygon in WGS84 longitude/latitude',
        severity: 'warning',
        excluded: true,
      });
      return;
    }
    counts.kept++;
    for (const polygon of found) polygons.push(polygon);
  });
  if (polygons.length === 0) return null;
  const geometry = simplifyLand(polygons, budget);
  const coarse = simplifyLand(polygons, Math.min(coarseLandVertexBudget, budget));
  return { geometry, coarse, verticesRead: countVertices(polygons), verticesKept: countVertices(geometry.coordinates) };
}
