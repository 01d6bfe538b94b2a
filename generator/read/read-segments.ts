/**
 * Reads the coastline segments: a GeoJSON FeatureCollection (RFC 7946, WGS84 lon/lat) or a
 * TopoJSON Topology (first object). Each feature needs properties id (URL-safe slug, unique),
 * name, kind and shellfish, and a LineString, MultiLineString, Polygon or MultiPolygon geometry
 * with valid, non-empty coordinates. A closed line (first position = last, the whole shore of an
 * island) is valid. A line that crosses itself (a digitising flaw) is a warning naming the segment
 * and the point: the segment is kept, measured and drawn as given. Only a geometry that cannot be
 * used at all leaves the segment out.
 *
 * Length: d3-geo geoLength (great-circle length in radians on the unit sphere; for polygons the
 * perimeter) × the mean Earth radius 6371.0088 km.
 *
 * Winding: d3-geo treats the exterior ring of a polygon as clockwise, the opposite of RFC 7946; a
 * ring wound the other way encloses the rest of the globe. Polygons are kept in the winding under
 * which d3-geo sees the small area (geoArea ≤ 2π), so maps drawn from them fill correctly.
 */
import { readUtf8Logged } from './utf8-text.ts';
import { geoArea, geoLength } from 'd3-geo';
import { feature as topologyFeature } from 'topojson-client';
import type { Topology } from 'topojson-specification';
import {
  BidiControlInText,
  CoordinateOutOfRange,
  GeometryInvalid,
  GeometrySelfIntersects,
  JsonTooDeep,
  MarkupInText,
  SegmentIdDuplicate,
  SegmentPropertyInvalid,
  SegmentsUnreadable,
} from '../errors.ts';
import type { ErrorData } from '../errors.ts';
import type { SegmentKind, ShellfishUse } from '../model/types.ts';
import type { Segment } from '../scenario/types.ts';
import { earthRadiusKm } from '../drift/geodesy.ts';
import type { IssueLog } from './issue-log.ts';
import { boundingBox, findSelfCrossing, isClosedLine } from './line-crossings.ts';
import type { Position } from './line-crossings.ts';
import { containsMarkup } from './markup.ts';
import { logForbiddenKeys, parseBoundedJson } from './json-input.ts';
import { bidiControls, isolateBidi } from './bidi-controls.ts';
import { didYouMean, matchCategory, segmentCategoryWords } from './category-words.ts';

export const segmentKinds: readonly SegmentKind[] = ['beach', 'bay', 'harbour', 'estuary', 'island-shore', 'rocky-shore', 'lagoon'];
export const shellfishUses: readonly ShellfishUse[] = ['farmed', 'gathered', 'farmed-and-gathered', 'none'];
export const segmentIdPattern = /^[a-z0-9][a-z0-9-]{0,62}$/;

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
  /** Every out-of-range position would be in range with longitude and latitude swapped. */
  swapped: boolean;
}

function collectLines(geometry: { [key: string]: unknown }): GeometryCheck {
  const type = geometry['type'];
  const coordinates = geometry['coordinates'];
  const result: GeometryCheck = { lines: [], rings: false, problem: null, badPosition: null, swapped: false };
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
        result.swapped = Math.abs(position[1]) <= 180 && Math.abs(position[0]) <= 90;
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
export function checkSegments(rawFeatures: readonly unknown[], file: string, log: IssueLog, leftOut: Set<string> = new Set()): Segment[] {
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
      exclude(
        SegmentPropertyInvalid,
        SegmentPropertyInvalid.message(file, row, 'id', id, 'a lower-case URL slug: letters a–z, digits and hyphens, at most 63 characters'),
        'id',
        id,
        'a URL-safe slug',
      );
      ok = false;
    } else if (firstUse.has(id)) {
      const first = firstUse.get(id) ?? 0;
      exclude(SegmentIdDuplicate, SegmentIdDuplicate.message(file, row, id, first), 'id', id, 'a unique id');
      ok = false;
    }
    const name = properties['name'];
    if (typeof name !== 'string' || name.trim() === '') {
      exclude(
        SegmentPropertyInvalid,
        SegmentPropertyInvalid.message(file, row, 'name', JSON.stringify(name ?? null), 'a non-empty name'),
        'name',
        name === undefined ? null : String(name),
        'a non-empty name',
      );
      ok = false;
    }
    // Category words are matched after trimming, case and space/hyphen/underscore folding and
    // through the documented synonyms (category-words.ts).
    const category = (column: 'kind' | 'shellfish', allowed: readonly string[]): string | null => {
      const value = properties[column];
      const text = typeof value === 'string' ? value : typeof value === 'boolean' ? String(value) : null;
      const match = text === null ? { ok: false as const, suggestion: null } : matchCategory(text, allowed, segmentCategoryWords[column]);
      if (match.ok) return match.value;
      const expected = `one of ${allowed.join(', ')}`;
      log.add(SegmentPropertyInvalid, `${SegmentPropertyInvalid.message(file, row, column, String(value ?? ''), expected)}${didYouMean(match.suggestion)}`, {
        file,
        row,
        column,
        value: value === undefined ? null : String(value),
        expected,
        severity: 'error',
        excluded: true,
        ...(match.suggestion === null ? { hint: `Write one of ${allowed.join(', ')}; case, spaces and underscores do not matter` } : { hint: `Write "${match.suggestion}"` }),
      });
      return null;
    };
    const kind = category('kind', segmentKinds);
    const shellfish = category('shellfish', shellfishUses);
    if (kind === null || shellfish === null) ok = false;
    const placeValue = properties['place'];
    const place = typeof placeValue === 'string' && placeValue.trim() !== '' ? placeValue : null;
    const areaValue = properties['area']; // optional: the segment's area on a national coast (generator/model/areas.ts)
    for (const [column, text] of [
      ['name', name],
      ['place', place],
    ] as const) {
      if (typeof text === 'string' && containsMarkup(text)) {
        log.add(MarkupInText, MarkupInText.message(file, row, column, text), { file, row, column, value: text, expected: 'plain text', severity: 'warning', excluded: false });
      }
      const controls = typeof text === 'string' ? bidiControls(text) : [];
      if (typeof text === 'string' && controls.length > 0) {
        log.add(BidiControlInText, BidiControlInText.message(file, row, column, text, controls.join(', ')), {
          file,
          row,
          column,
          value: text,
          expected: 'text without direction controls',
          severity: 'warning',
          excluded: false,
        });
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
        const swapHint = checked.swapped ? 'Did you swap longitude and latitude? GeoJSON writes each position as [longitude, latitude]' : undefined;
        log.add(CoordinateOutOfRange, CoordinateOutOfRange.message(file, row, checked.badPosition), {
          file,
          row,
          column: 'geometry',
          value: checked.badPosition,
          expected: 'longitude −180..180, latitude −90..90',
          severity: 'error',
          excluded: true,
          ...(swapHint ? { hint: swapHint } : {}),
        });
        ok = false;
      } else if (checked.problem) {
        exclude(GeometryInvalid, GeometryInvalid.message(file, row, checked.problem), 'geometry', null, 'a non-empty LineString, MultiLineString or Polygon');
        ok = false;
      } else {
        for (const [part, line] of checked.lines.entries()) {
          const crossing = findSelfCrossing(line, checked.rings || isClosedLine(line));
          if (crossing) {
            const where = `[${crossing.at[0]}, ${crossing.at[1]}]`;
            const partName = checked.lines.length > 1 ? `${checked.rings ? 'ring' : 'line'} ${part + 1}, ` : '';
            const detail = `${partName}edges starting at positions ${crossing.firstEdge} and ${crossing.secondEdge}`;
            log.add(GeometrySelfIntersects, GeometrySelfIntersects.message(file, row, id, where, detail), {
              file,
              row,
              column: 'geometry',
              value: where,
              expected: 'a line that does not cross itself',
              severity: 'warning',
              excluded: false,
            });
            break;
          }
        }
      }
    }
    if (!ok || !checked || !isRecord(geometry)) {
      counts.excluded++;
      if (segmentIdPattern.test(id) && !firstUse.has(id)) {
        firstUse.set(id, row);
        leftOut.add(id);
      }
      return;
    }
    firstUse.set(id, row);
    let shape = { type: geometry['type'], coordinates: geometry['coordinates'] } as GeoJSON.Geometry;
    // d3-geo streams a polygon ring without its closing edge, so rings are measured as lines.
    const lengthKm = geoLength(checked.rings ? { type: 'MultiLineString', coordinates: checked.lines } : shape) * earthRadiusKm;
    if (!(lengthKm > 0)) {
      exclude(GeometryInvalid, GeometryInvalid.message(file, row, 'the line has zero length (all its positions are the same point)'), 'geometry', null, 'a line longer than zero');
      counts.excluded++;
      leftOut.add(id);
      return;
    }
    if (checked.rings && geoArea(shape) > 2 * Math.PI) shape = reverseRings(shape);
    const bbox = boundingBox(checked.lines);
    segments.push({
      id,
      name: isolateBidi(String(name)),
      kind: kind as SegmentKind,
      shellfish: shellfish as ShellfishUse,
      place: place === null ? null : isolateBidi(place),
      ...(typeof areaValue === 'string' && areaValue.trim() !== '' ? { area: isolateBidi(areaValue.trim()) } : {}),
      lengthKm,
      geometry: shape,
      bbox,
    });
    counts.kept++;
  });
  return segments;
}

/**
 * Reads a GeoJSON or TopoJSON file within the JSON bounds (json-input.ts): its features, or null
 * with every problem in the log (unreadable, nested too deep, a forbidden key, not a feature
 * collection). `unreadable` names the file's own error; `what` what the file should hold.
 */
export async function readFeatureFile(
  absolutePath: string,
  file: string,
  log: IssueLog,
  unreadable: ErrorData & { message: (file: string, reason: string) => string },
  what: string,
): Promise<unknown[] | null> {
  let outcome;
  try {
    const text = await readUtf8Logged(absolutePath, file, log, `${what} saved as UTF-8`);
    if (text === null) return null;
    outcome = parseBoundedJson(text);
  } catch (error) {
    outcome = { ok: false as const, kind: 'syntax' as const, reason: error instanceof Error ? error.message : String(error) };
  }
  if (!outcome.ok && outcome.kind === 'syntax') {
    log.add(unreadable, unreadable.message(file, outcome.reason), { file, row: 1, column: null, value: null, expected: what, severity: 'error', excluded: true });
    return null;
  }
  if (!outcome.ok) {
    log.add(JsonTooDeep, JsonTooDeep.message(file, outcome.reason), {
      file,
      row: null,
      column: null,
      value: null,
      expected: `${what} nested at most a few levels deep`,
      severity: 'error',
      excluded: true,
    });
    return null;
  }
  if (outcome.forbidden.length > 0) {
    logForbiddenKeys(log, file, outcome.forbidden);
    return null;
  }
  const features = toFeatures(outcome.value);
  if ('reason' in features) {
    log.add(unreadable, unreadable.message(file, features.reason), {
      file,
      row: 1,
      column: null,
      value: null,
      expected: 'GeoJSON FeatureCollection or TopoJSON Topology',
      severity: 'error',
      excluded: true,
    });
    return null;
  }
  return features.features;
}

/** `leftOut` receives the ids of segments left out, so that rows naming them are summed up, not listed. */
export async function readSegments(absolutePath: string, file: string, log: IssueLog, leftOut: Set<string> = new Set()): Promise<Segment[]> {
  const features = await readFeatureFile(absolutePath, file, log, SegmentsUnreadable, 'GeoJSON or TopoJSON');
  if (features === null) {
    log.countsFor(file);
    return [];
  }
  return checkSegments(features, file, log, leftOut);
}
