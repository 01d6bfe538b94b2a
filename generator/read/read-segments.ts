/**
 * Reads the coastline segments: a GeoJSON FeatureCollection (RFC 7946, WGS84 lon/lat) or a
 * TopoJSON Topology (first object). Each feature needs properties id (URL-safe slug, unique),
 * name, kind and shellfish, and a LineString, MultiLineString, Polygon or MultiPolygon geometry
 * with valid, non-empty coordinates that do not cross themselves.
 *
 * Length: d3-geo geoLength (great-circle length in radians on the unit sphere; for polygons the
 * perimeter) × the mean Earth radius 6371.0088 km.
 *
 * Winding: d3-geo treats the exterior ring of a polygon as clockwise, the opposite of RFC 7946; a
 * ring wound the other way encloses the rest of the globe. Polygons are kept in the winding under
 * which d3-geo sees the small area (geoArea ≤ 2π), so maps drawn from them fill correctly.
 */
import { readFile } from 'node:fs/promises';
import { geoArea, geoLength } from 'd3-geo';
import { feature as topologyFeature } from 'topojson-client';
import type { Topology } from 'topojson-specification';
import {
  CoordinateOutOfRange,
  GeometryInvalid,
  GeometrySelfIntersects,
  MarkupInText,
  SegmentIdDuplicate,
  SegmentPropertyInvalid,
  SegmentsUnreadable,
} from '../errors.ts';
import type { SegmentKind, ShellfishUse } from '../model/types.ts';
import type { Segment } from '../scenario/types.ts';
import { earthRadiusKm } from '../drift/geodesy.ts';
import type { IssueLog } from './issue-log.ts';
import { containsMarkup } from './markup.ts';

export const segmentKinds: readonly SegmentKind[] = ['beach', 'bay', 'harbour', 'estuary', 'island-shore', 'rocky-shore', 'lagoon'];
export const shellfishUses: readonly ShellfishUse[] = ['farmed', 'gathered', 'farmed-and-gathered', 'none'];
export const segmentIdPattern = /^[a-z0-9][a-z0-9-]{0,62}$/;

type Position = [number, number];

function isRecord(value: unknown): value is { [key: string]: unknown } {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

/** Parses a GeoJSON position; returns null when it is not two finite numbers. */
function asPosition(value: unknown): Position | null {
  if (!Array.isArray(value) || value.length < 2) return null;
  const [lon, lat] = value as unknown[];
  if (typeof lon !== 'number' || typeof lat !== 'number' || !Number.isFinite(lon) || !Number.isFinite(lat)) return null;
  return [lon, lat];
}

interface GeometryCheck {
  /** Lines to measure and test (line strings, or polygon rings). */
  lines: Position[][];
  rings: boolean;
  problem: string | null;
  badPosition: string | null;
}

function collectLines(geometry: { [key: string]: unknown }): GeometryCheck {
  const type = geometry['type'];
  const coordinates = geometry['coordinates'];
  const result: GeometryCheck = { lines: [], rings: false, problem: null, badPosition: null };
  const readLine = (value: unknown, minimum: number, what: string): Position[] | null => {
    if (!Array.isArray(value)) {
      result.problem = `a ${what} is not an array of positions`;
      return null;
    }
    const line: Position[] = [];
    for (const raw of value) {
      const position = asPosition(raw);
      if (!position) {
        result.problem = `position ${JSON.stringify(raw)?.slice(0, 40) ?? 'undefined'} is not a pair of numbers`;
        return null;
      }
      if (position[0] < -180 || position[0] > 180 || position[1] < -90 || position[1] > 90) {
        result.badPosition = `[${position[0]}, ${position[1]}]`;
        return null;
      }
      line.push(position);
    }
    if (line.length < minimum) {
      result.problem = `a ${what} has ${line.length} position(s); expected at least ${minimum}`;
      return null;
    }
    return line;
  };
  const readPolygon = (value: unknown): boolean => {
    if (!Array.isArray(value) || value.length === 0) {
      result.problem = 'a polygon has no rings';
      return false;
    }
    for (const ring of value) {
      const line = readLine(ring, 4, 'polygon ring');
      if (!line) return false;
      const first = line[0];
      const last = line[line.length - 1];
      if (!first || !last || first[0] !== last[0] || first[1] !== last[1]) {
        result.problem = 'a polygon ring is not closed (first and last positions differ)';
        return false;
      }
      result.lines.push(line);
    }
    return true;
  };
  result.rings = type === 'Polygon' || type === 'MultiPolygon';
  switch (type) {
    case 'LineString': {
      const line = readLine(coordinates, 2, 'line');
      if (line) result.lines.push(line);
      break;
    }
    case 'MultiLineString': {
      if (!Array.isArray(coordinates) || coordinates.length === 0) {
        result.problem = 'the MultiLineString has no lines';
        break;
      }
      for (const part of coordinates) {
        const line = readLine(part, 2, 'line');
        if (!line) break;
        result.lines.push(line);
      }
      break;
    }
    case 'Polygon':
      readPolygon(coordinates);
      break;
    case 'MultiPolygon': {
      if (!Array.isArray(coordinates) || coordinates.length === 0) {
        result.problem = 'the MultiPolygon has no polygons';
        break;
      }
      for (const polygon of coordinates) if (!readPolygon(polygon)) break;
      break;
    }
    default:
      result.problem = `geometry type ${JSON.stringify(type ?? null)} is not allowed; expected LineString, MultiLineString, Polygon or MultiPolygon`;
  }
  if (!result.problem && !result.badPosition && result.lines.length === 0) result.problem = 'the geometry is empty';
  return result;
}

/** Orientation of the triangle p, q, r in the lon/lat plane: >0 counter-clockwise, <0 clockwise. */
function orientation(p: Position, q: Position, r: Position): number {
  return (q[0] - p[0]) * (r[1] - p[1]) - (q[1] - p[1]) * (r[0] - p[0]);
}

function onSegment(p: Position, q: Position, r: Position): boolean {
  return Math.min(p[0], r[0]) <= q[0] && q[0] <= Math.max(p[0], r[0]) && Math.min(p[1], r[1]) <= q[1] && q[1] <= Math.max(p[1], r[1]);
}

/** Whether segments p1–p2 and q1–q2 touch or cross (planar test in lon/lat; common practice). */
export function segmentsIntersect(p1: Position, p2: Position, q1: Position, q2: Position): boolean {
  const o1 = orientation(p1, p2, q1);
  const o2 = orientation(p1, p2, q2);
  const o3 = orientation(q1, q2, p1);
  const o4 = orientation(q1, q2, p2);
  if (((o1 > 0 && o2 < 0) || (o1 < 0 && o2 > 0)) && ((o3 > 0 && o4 < 0) || (o3 < 0 && o4 > 0))) return true;
  if (o1 === 0 && onSegment(p1, q1, p2)) return true;
  if (o2 === 0 && onSegment(p1, q2, p2)) return true;
  if (o3 === 0 && onSegment(q1, p1, q2)) return true;
  if (o4 === 0 && onSegment(q1, p2, q2)) return true;
  return false;
}

/**
 * First place where a line (or closed ring) crosses or touches itself, skipping neighbouring edges
 * (and, for rings, the closing pair). Returns "[lon, lat]" of the first edge's start, or null.
 * Sweeps edges sorted by west edge so that only edges overlapping in longitude are compared.
 */
export function findSelfIntersection(line: readonly Position[], closed: boolean): string | null {
  const edges: { i: number; a: Position; b: Position; west: number; east: number }[] = [];
  for (let i = 0; i + 1 < line.length; i++) {
    const a = line[i];
    const b = line[i + 1];
    if (!a || !b) continue;
    if (a[0] === b[0] && a[1] === b[1]) continue; // repeated point: not a crossing
    edges.push({ i, a, b, west: Math.min(a[0], b[0]), east: Math.max(a[0], b[0]) });
  }
  const count = line.length - 1;
  edges.sort((x, y) => x.west - y.west);
  for (let m = 0; m < edges.length; m++) {
    const e = edges[m];
    if (!e) continue;
    for (let n = m + 1; n < edges.length; n++) {
      const f = edges[n];
      if (!f) continue;
      if (f.west > e.east) break;
      const gap = Math.abs(e.i - f.i);
      if (gap <= 1) continue;
      if (closed && gap === count - 1) continue;
      if (segmentsIntersect(e.a, e.b, f.a, f.b)) {
        const at = e.i < f.i ? f.a : e.a;
        return `[${at[0]}, ${at[1]}]`;
      }
    }
  }
  return null;
}

function reverseRings(geometry: GeoJSON.Geometry): GeoJSON.Geometry {
  if (geometry.type === 'Polygon') return { type: 'Polygon', coordinates: geometry.coordinates.map((ring) => [...ring].reverse()) };
  if (geometry.type === 'MultiPolygon') {
    return { type: 'MultiPolygon', coordinates: geometry.coordinates.map((polygon) => polygon.map((ring) => [...ring].reverse())) };
  }
  return geometry;
}

/** Converts parsed JSON (GeoJSON or TopoJSON) into a list of raw features, or a reason it cannot. */
export function toFeatures(json: unknown): { features: unknown[] } | { reason: string } {
  if (!isRecord(json)) return { reason: 'the file is not a JSON object' };
  if (json['type'] === 'FeatureCollection') {
    if (!Array.isArray(json['features'])) return { reason: 'the FeatureCollection has no "features" array' };
    return { features: json['features'] };
  }
  if (json['type'] === 'Topology') {
    const objects = json['objects'];
    if (!isRecord(objects) || Object.keys(objects).length === 0) return { reason: 'the Topology has no objects' };
    const name = Object.keys(objects)[0] ?? '';
    try {
      const converted = topologyFeature(json as unknown as Topology, name) as unknown;
      if (isRecord(converted) && converted['type'] === 'FeatureCollection' && Array.isArray(converted['features'])) return { features: converted['features'] };
      return { features: [converted] };
    } catch (error) {
      return { reason: `the Topology cannot be decoded (${error instanceof Error ? error.message : String(error)})` };
    }
  }
  return { reason: `type ${JSON.stringify(json['type'] ?? null)}; expected FeatureCollection or Topology` };
}

/** Checks raw features and returns the usable segments; every problem goes into the log. */
export function checkSegments(rawFeatures: readonly unknown[], file: string, log: IssueLog): Segment[] {
  const counts = log.countsFor(file);
  const segments: Segment[] = [];
  const firstUse = new Map<string, number>();
  rawFeatures.forEach((raw, index) => {
    const row = index + 1;
    counts.read++;
    const exclude = (entry: Parameters<IssueLog['add']>[0], message: string, column: string, value: string | null, expected: string): void => {
      log.add(entry, message, { file, row, column, value, expected, severity: 'error', excluded: true });
    };
    if (!isRecord(raw) || raw['type'] !== 'Feature') {
      exclude(GeometryInvalid, GeometryInvalid.message(file, row, 'the item is not a GeoJSON Feature'), 'geometry', null, 'a GeoJSON Feature');
      counts.excluded++;
      return;
    }
    const properties = isRecord(raw['properties']) ? raw['properties'] : {};
    let ok = true;
    const idValue = properties['id'] ?? raw['id'];
    const id = typeof idValue === 'string' ? idValue : typeof idValue === 'number' ? String(idValue) : '';
    if (!segmentIdPattern.test(id)) {
      exclude(SegmentPropertyInvalid, SegmentPropertyInvalid.message(file, row, 'id', id, 'a lower-case URL slug: letters a–z, digits and hyphens, at most 63 characters'), 'id', id, 'a URL-safe slug');
      ok = false;
    } else if (firstUse.has(id)) {
      const first = firstUse.get(id) ?? 0;
      exclude(SegmentIdDuplicate, SegmentIdDuplicate.message(file, row, id, first), 'id', id, 'a unique id');
      ok = false;
    }
    const name = properties['name'];
    if (typeof name !== 'string' || name.trim() === '') {
      exclude(SegmentPropertyInvalid, SegmentPropertyInvalid.message(file, row, 'name', JSON.stringify(name ?? null), 'a non-empty name'), 'name', name === undefined ? null : String(name), 'a non-empty name');
      ok = false;
    }
    const kind = properties['kind'];
    if (typeof kind !== 'string' || !(segmentKinds as readonly string[]).includes(kind)) {
      exclude(SegmentPropertyInvalid, SegmentPropertyInvalid.message(file, row, 'kind', String(kind ?? ''), `one of ${segmentKinds.join(', ')}`), 'kind', kind === undefined ? null : String(kind), `one of ${segmentKinds.join(', ')}`);
      ok = false;
    }
    const shellfish = properties['shellfish'];
    if (typeof shellfish !== 'string' || !(shellfishUses as readonly string[]).includes(shellfish)) {
      exclude(SegmentPropertyInvalid, SegmentPropertyInvalid.message(file, row, 'shellfish', String(shellfish ?? ''), `one of ${shellfishUses.join(', ')}`), 'shellfish', shellfish === undefined ? null : String(shellfish), `one of ${shellfishUses.join(', ')}`);
      ok = false;
    }
    const placeValue = properties['place'];
    const place = typeof placeValue === 'string' && placeValue.trim() !== '' ? placeValue : null;
    const areaValue = properties['area']; // optional: the segment's area on a national coast (generator/model/areas.ts)
    for (const [column, text] of [['name', name], ['place', place]] as const) {
      if (typeof text === 'string' && containsMarkup(text)) {
        log.add(MarkupInText, MarkupInText.message(file, row, column, text), { file, row, column, value: text, expected: 'plain text', severity: 'warning', excluded: false });
      }
    }
    const geometry = raw['geometry'];
    let checked: GeometryCheck | null = null;
    if (!isRecord(geometry)) {
      exclude(GeometryInvalid, GeometryInvalid.message(file, row, 'the feature has no geometry'), 'geometry', null, 'a LineString, MultiLineString or Polygon');
      ok = false;
    } else {
      checked = collectLines(geometry);
      if (checked.badPosition) {
        exclude(CoordinateOutOfRange, CoordinateOutOfRange.message(file, row, checked.badPosition), 'geometry', checked.badPosition, 'longitude −180..180, latitude −90..90');
        ok = false;
      } else if (checked.problem) {
        exclude(GeometryInvalid, GeometryInvalid.message(file, row, checked.problem), 'geometry', null, 'a non-empty LineString, MultiLineString or Polygon');
        ok = false;
      } else {
        for (const line of checked.lines) {
          const where = findSelfIntersection(line, checked.rings);
          if (where) {
            exclude(GeometrySelfIntersects, GeometrySelfIntersects.message(file, row, where), 'geometry', where, 'a line that does not cross itself');
            ok = false;
            break;
          }
        }
      }
    }
    if (!ok || !checked || !isRecord(geometry)) {
      counts.excluded++;
      if (segmentIdPattern.test(id) && !firstUse.has(id)) firstUse.set(id, row);
      return;
    }
    firstUse.set(id, row);
    let shape = { type: geometry['type'], coordinates: geometry['coordinates'] } as GeoJSON.Geometry;
    // d3-geo streams a polygon ring without its closing edge, so rings are measured as lines.
    const lengthKm = geoLength(checked.rings ? { type: 'MultiLineString', coordinates: checked.lines } : shape) * earthRadiusKm;
    if (!(lengthKm > 0)) {
      exclude(GeometryInvalid, GeometryInvalid.message(file, row, 'the line has zero length (all its positions are the same point)'), 'geometry', null, 'a line longer than zero');
      counts.excluded++;
      return;
    }
    if (checked.rings && geoArea(shape) > 2 * Math.PI) shape = reverseRings(shape);
    let west = Infinity;
    let south = Infinity;
    let east = -Infinity;
    let north = -Infinity;
    for (const line of checked.lines) {
      for (const [lon, lat] of line) {
        if (lon < west) west = lon;
        if (lon > east) east = lon;
        if (lat < south) south = lat;
        if (lat > north) north = lat;
      }
    }
    segments.push({
      id,
      name: String(name),
      kind: kind as SegmentKind,
      shellfish: shellfish as ShellfishUse,
      place,
      ...(typeof areaValue === 'string' && areaValue.trim() !== '' ? { area: areaValue.trim() } : {}),
      lengthKm,
      geometry: shape,
      bbox: [west, south, east, north],
    });
    counts.kept++;
  });
  return segments;
}

export async function readSegments(absolutePath: string, file: string, log: IssueLog): Promise<Segment[]> {
  let json: unknown;
  try {
    json = JSON.parse((await readFile(absolutePath, 'utf8')).replace(/^\ufeff/, ''));
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    log.add(SegmentsUnreadable, SegmentsUnreadable.message(file, reason), { file, row: 1, column: null, value: null, expected: 'GeoJSON or TopoJSON', severity: 'error', excluded: true });
    log.countsFor(file);
    return [];
  }
  const features = toFeatures(json);
  if ('reason' in features) {
    log.add(SegmentsUnreadable, SegmentsUnreadable.message(file, features.reason), { file, row: 1, column: null, value: null, expected: 'GeoJSON FeatureCollection or TopoJSON Topology', severity: 'error', excluded: true });
    log.countsFor(file);
    return [];
  }
  return checkSegments(features.features, file, log);
}
