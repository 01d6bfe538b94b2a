/**
 * Maps as inline SVG strings, drawn at build time: segment lines (and zone hulls) go through
 * TopoJSON (topojson-server `topology` quantises shared coordinates, topojson-client `feature`
 * turns them back into GeoJSON), then d3-geo `geoPath` with a Mercator projection fitted to
 * the frame writes short path strings (1 decimal). The projection fits the place (projection.ts);
 * land polygons, when the scenario has them, are drawn under everything on a sea tint; badges,
 * place names and zone names are placed so none overlaps another or covers a segment
 * (label-placement.ts). Rendering only: levels, zones, places and areas come from the bulletin
 * model.
 */
import { geoArea, geoBounds, geoPath } from 'd3-geo';
import type { GeoPermissibleObjects } from 'd3-geo';
import { topology } from 'topojson-server';
import { presimplify, simplify, sphericalTriangleArea } from 'topojson-simplify';
import type { Objects, Topology } from 'topojson-specification';
import { feature } from 'topojson-client';
import type { Feature, FeatureCollection, Geometry, Polygon } from 'geojson';
import type { AccumulationZone, LevelId } from '../../generator/model/types.ts';
import { escapeXml, formatNumber, zoneName } from './format.ts';
import { levelPatternDefs, levelStyles } from './levels.ts';
import { placeLabels, type Box, type LabelRequest, type PlacedLabel, type Point } from './label-placement.ts';
import { extentOf, projectionFor, scaleBar } from './projection.ts';

/** Map colours: a quiet land fill and a pale sea; every level stroke keeps WCAG 2.1 non-text
 * contrast (SC 1.4.11, 3:1) against both (checked in test/maps/map-colours.test.ts). */
export const mapColours = { sea: '#d7e7ef', land: '#efeadb', coast: '#8a9ba5', plain: '#f1f0eb' } as const;

export interface MapSegment {
  id: string;
  name: string;
  level: LevelId;
  levelLabel: string;
  geometry: Geometry;
}

/** Segments after the TopoJSON round trip, with their lon/lat bounds; prepare once per season. */
export interface PreparedSegments {
  features: Feature<Geometry, Props>[];
  bounds: [[number, number], [number, number]][];
}

export interface MapOptions {
  idPrefix: string; // makes <title>/<desc> ids unique on the page
  title: string;
  description: string;
  segments: PreparedSegments;
  zones?: AccumulationZone[];
  highlight?: string | null; // segment id for a locator map
  width?: number; // defaults to 640
  badges?: boolean; // numbered level badges; defaults to true under 80 segments
  /**
   * Where each segment's bulletin is (region maps): its line and badge become links, so a tap on
   * a phone opens the bulletin. Left out of the tab order: the table of all segments below the
   * map has the same links for the keyboard. Not used above `linkLimit` segments (page size).
   */
  linkOf?: (segmentId: string) => string;
  /** land polygons (prepareLand), drawn under the segments */
  land?: PreparedLand | null;
  /** coarser land for the locator's whole-coast inset (page size) */
  insetLand?: PreparedLand | null;
  /** place names to print (overview), in the order of priority */
  places?: readonly { name: string; lon: number; lat: number }[];
  /**
   * Areas instead of segment badges (national coast): one badge per area, numbered, in the style
   * of its highest level, linking to the area's page; segments are drawn as plain lines.
   */
  areas?: readonly MapArea[];
}

export interface MapArea {
  id: string;
  number: number;
  name: string;
  level: LevelId;
  levelLabel: string;
  segmentIds: readonly string[];
  href: string;
}

/** Land polygons ready for d3-geo (wound clockwise). */
export interface PreparedLand {
  features: Feature<Geometry>[];
}

export function prepareLand(land: Geometry | null | undefined): PreparedLand | null {
  if (!land) return null;
  return { features: [{ type: 'Feature', properties: {}, geometry: rewindGeometry(land) }] };
}

/** What renderMap placed, for tests: badge and label boxes in SVG pixels. */
export interface MapLayout {
  width: number;
  height: number;
  labels: PlacedLabel[];
  left: string[];
}

/** Above this many segments the region map carries no links (each adds to every overview page). */
export const linkLimit = 400;

type Props = { id: string; name: string; level: LevelId; levelLabel: string };

/** d3-geo wants exterior rings clockwise (opposite of RFC 7946): a ring wound the other way
 * covers the whole sphere, so reverse any ring whose area exceeds a hemisphere. */
function rewindForD3(polygon: Polygon): Polygon {
  const f: Feature<Polygon> = { type: 'Feature', properties: {}, geometry: polygon };
  if (geoArea(f) <= 2 * Math.PI) return polygon;
  return { type: 'Polygon', coordinates: polygon.coordinates.map((ring) => [...ring].reverse()) };
}

function rewindGeometry(geometry: Geometry): Geometry {
  if (geometry.type === 'Polygon') return rewindForD3(geometry);
  if (geometry.type === 'MultiPolygon') {
    return { type: 'MultiPolygon', coordinates: geometry.coordinates.map((c) => rewindForD3({ type: 'Polygon', coordinates: c }).coordinates) };
  }
  return geometry;
}

export function prepareSegments(segments: MapSegment[]): PreparedSegments {
  const features = viaTopology(segments);
  return { features, bounds: features.map((f) => geoBounds(f)) };
}

function viaTopology(segments: MapSegment[]): Feature<Geometry, Props>[] {
  const collection: FeatureCollection<Geometry, Props> = {
    type: 'FeatureCollection',
    features: segments.map((s) => ({ type: 'Feature', properties: { id: s.id, name: s.name, level: s.level, levelLabel: s.levelLabel }, geometry: s.geometry })),
  };
  const topo = topology({ segments: collection }, 1e5);
  const back = feature(topo, topo.objects['segments']!) as unknown as FeatureCollection<Geometry, Props>;
  return back.features.map((f) => ({ ...f, geometry: rewindGeometry(f.geometry) }));
}

function isArea(geometry: Geometry): boolean {
  return geometry.type === 'Polygon' || geometry.type === 'MultiPolygon';
}

const badgeRadius = 8;

/**
 * Drops the points too small to see at the map's scale (topojson-simplify, Visvalingam–Whyatt
 * effective area): a point whose triangle covers less than half a square pixel on the ground.
 * Used for land and for the lines of a national overview, where a pixel spans kilometres.
 */
export function simplifiedForScale<F extends Feature<Geometry, P>, P = F['properties']>(features: readonly F[], kmPerPx: number): F[] {
  if (!(kmPerPx > 0) || features.length === 0) return [...features];
  const earthKm = 6371.0088;
  const minWeight = 0.5 * (kmPerPx / earthKm) ** 2;
  const collection = { type: 'FeatureCollection', features: [...features] } as FeatureCollection;
  const topo = presimplify(topology({ f: collection }, 1e6) as unknown as Topology<Objects<{}>>, sphericalTriangleArea);
  const back = feature(simplify(topo, minWeight), topo.objects['f']!) as unknown as FeatureCollection;
  return back.features.map((f, i) => ({ ...features[i]!, geometry: isArea(f.geometry) ? rewindGeometry(f.geometry) : f.geometry }) as F);
}

/** Above this many vertices on one map, lines are simplified to the map's scale (simplifiedForScale). */
export const mostVerticesDrawnAsGiven = 20_000;

/** All positions of the features' lines and rings. */
export function vertexCount(features: readonly Feature<Geometry, unknown>[]): number {
  let count = 0;
  for (const { geometry } of features) {
    if (geometry.type === 'LineString' || geometry.type === 'MultiPoint') count += geometry.coordinates.length;
    else if (geometry.type === 'MultiLineString' || geometry.type === 'Polygon') for (const part of geometry.coordinates) count += part.length;
    else if (geometry.type === 'MultiPolygon') for (const polygon of geometry.coordinates) for (const ring of polygon) count += ring.length;
    else if (geometry.type === 'Point') count += 1;
  }
  return count;
}

/** A line's or ring's vertices in pixels (for placement); NaN-free points only. */
function projectedLines(geometry: Geometry, project: (p: [number, number]) => [number, number] | null): Point[][] {
  const line = (coords: GeoJSON.Position[]): Point[] =>
    coords.map((c) => project([c[0]!, c[1]!])).filter((p): p is Point => p !== null && Number.isFinite(p[0]) && Number.isFinite(p[1]));
  switch (geometry.type) {
    case 'LineString':
      return [line(geometry.coordinates)];
    case 'MultiLineString':
      return geometry.coordinates.map(line);
    case 'Polygon':
      return geometry.coordinates.map(line);
    case 'MultiPolygon':
      return geometry.coordinates.flatMap((p) => p.map(line));
    default:
      return [];
  }
}

/** The vertex of the lines nearest to a point: a badge's leader then ends on the line itself. */
function nearestVertex(lines: Point[][], to: Point): Point | null {
  let best: Point | null = null;
  let distance = Infinity;
  for (const l of lines)
    for (const p of l) {
      const d = Math.hypot(p[0] - to[0], p[1] - to[1]);
      if (d < distance) {
        distance = d;
        best = p;
      }
    }
  return best;
}

function badgeSvg(label: PlacedLabel, level: LevelId, number: number): string {
  const style = levelStyles[level];
  const cx = (label.box.x + label.box.w / 2).toFixed(1);
  const cy = (label.box.y + label.box.h / 2).toFixed(1);
  const leader = label.leader
    ? `<path d="M${label.leader[0][0].toFixed(1)} ${label.leader[0][1].toFixed(1)}L${label.leader[1][0].toFixed(1)} ${label.leader[1][1].toFixed(1)}" stroke="#1f2a33" stroke-width="0.8"/>`
    : '';
  return `<g class="badge">${leader}<circle cx="${cx}" cy="${cy}" r="${badgeRadius}" fill="${style.fill}" stroke="#1f2a33" stroke-width="1.2"${style.rank === 0 ? ' stroke-dasharray="3 2"' : ''}/><text x="${cx}" y="${cy}" dy="0.35em" text-anchor="middle" font-size="10" font-weight="700" fill="${style.rank >= 3 ? '#fff' : '#1f2a33'}">${number > 0 ? number : '?'}</text></g>`;
}

/** Width of a label in pixels at 11 px (an estimate: 0.58 em a character, common practice for sans-serif text). */
function textWidth(text: string, size = 11): number {
  return Math.ceil(text.length * size * 0.58) + 4;
}

function textLabelSvg(label: PlacedLabel, text: string, cls: string, italic: boolean, halo: string): string {
  const x = (label.box.x + label.box.w / 2).toFixed(1);
  const y = (label.box.y + label.box.h / 2).toFixed(1);
  const leader = label.leader
    ? `<path d="M${label.leader[0][0].toFixed(1)} ${label.leader[0][1].toFixed(1)}L${label.leader[1][0].toFixed(1)} ${label.leader[1][1].toFixed(1)}" stroke="#55656f" stroke-width="0.7"/>`
    : '';
  return `${leader}<text class="${cls}" x="${x}" y="${y}" text-anchor="middle" dy="0.35em" font-size="11"${italic ? ' font-style="italic"' : ' font-weight="600"'} fill="#1f2a33" stroke="${halo}" stroke-width="3" paint-order="stroke">${escapeXml(text)}</text>`;
}

/** Above this many segments the locator's overview inset is left out (page size). */
const insetLimit = 400;
const insetSize = 110;

/** Top-right inset of a locator map: the whole coast in grey (on its land), the locator's window as a box. */
function renderInset(all: Feature<Geometry, Props>[], land: PreparedLand | null, highlight: string, windowFrame: GeoPermissibleObjects, width: number): string {
  const size = insetSize;
  const x0 = width - size - 8;
  const y0 = 8;
  const collection = { type: 'FeatureCollection', features: all } as FeatureCollection;
  const projection = projectionFor(extentOf(collection))
    .projection.fitExtent(
      [
        [x0 + 6, y0 + 6],
        [x0 + size - 6, y0 + size - 6],
      ],
      collection,
    )
    .clipExtent([
      [x0, y0],
      [x0 + size, y0 + size],
    ]);
  const path = geoPath(projection).digits(0);
  const bar = scaleBar(projection, [x0 + size / 2 - 20, y0 + size / 2]);
  const drawn = vertexCount(all) > mostVerticesDrawnAsGiven && bar ? simplifiedForScale(all, bar.km / bar.px) : all;
  const coast = drawn.map((f) => path(f) ?? '').join('');
  const landPath = land ? land.features.map((f) => path(f) ?? '').join('') : '';
  const [[bx0, by0], [bx1, by1]] = path.bounds(windowFrame);
  const target = all.find((f) => f.properties.id === highlight);
  const c = target ? path.centroid(target) : null;
  const box = Number.isFinite(bx0)
    ? `<rect x="${bx0.toFixed(1)}" y="${by0.toFixed(1)}" width="${Math.max(bx1 - bx0, 3).toFixed(1)}" height="${Math.max(by1 - by0, 3).toFixed(1)}" fill="none" stroke="#1f2a33" stroke-width="1.5"/>`
    : '';
  const dot = c && Number.isFinite(c[0]) ? `<circle cx="${c[0].toFixed(1)}" cy="${c[1].toFixed(1)}" r="2.5" fill="#1f2a33"/>` : '';
  return `<g class="inset"><rect x="${x0}" y="${y0}" width="${size}" height="${size}" fill="${land ? mapColours.sea : '#fff'}" fill-opacity="0.95" stroke="#8c9aa3"/>${landPath ? `<path d="${landPath}" fill="${mapColours.land}" stroke="${mapColours.coast}" stroke-width="0.6"/>` : ''}<path d="${coast}" fill="none" stroke="#6b7b85" stroke-width="1.2"/>${box}${dot}</g>`;
}

/** Longitude difference b − a in −180…180 (regions across the 180° meridian). */
function lonDelta(a: number, b: number): number {
  return ((((b - a) % 360) + 540) % 360) - 180;
}

/** Order of badges on a map and of places in the map's text: highest level first, then by name. */
export function byLevelThenName(a: { level: LevelId; name: string; id: string }, b: { level: LevelId; name: string; id: string }): number {
  return levelStyles[b.level].rank - levelStyles[a.level].rank || a.name.localeCompare(b.name, 'en') || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);
}

export function renderMap(options: MapOptions): string {
  return renderMapWithLayout(options).svg;
}

export function renderMapWithLayout(options: MapOptions): { svg: string; layout: MapLayout } {
  const width = options.width ?? 640;
  const pad = 16;
  const highlight = options.highlight ?? null;
  const allFeatures = options.segments.features;
  const land = options.land ?? null;
  let features = allFeatures;
  let windowFrame: GeoPermissibleObjects | null = null;
  const zones = (options.zones ?? [])
    .filter((z) => z.hull.length >= 4)
    .map((z) => ({
      zone: z,
      feature: { type: 'Feature', properties: {}, geometry: rewindForD3({ type: 'Polygon', coordinates: [z.hull] }) } as Feature<Polygon>,
    }));

  // Frame: the whole region, or for a locator the highlighted segment with its surroundings.
  let frame: GeoPermissibleObjects = { type: 'FeatureCollection', features: [...features, ...zones.map((z) => z.feature)] } as FeatureCollection;
  if (highlight) {
    const index = features.findIndex((f) => f.properties.id === highlight);
    const target = features[index];
    if (target) {
      const [[w, s], [e, n]] = options.segments.bounds[index]!;
      const spanLon = Math.max(lonDelta(w, e) < 0 ? lonDelta(w, e) + 360 : lonDelta(w, e), 0.08) * 1.6;
      const spanLat = Math.max(n - s, 0.05) * 1.6;
      const cx = w + lonDelta(w, e) / 2;
      const cy = (s + n) / 2;
      windowFrame = {
        type: 'MultiPoint',
        coordinates: [
          [cx - spanLon, cy - spanLat],
          [cx + spanLon, cy + spanLat],
          [cx - spanLon, cy + spanLat],
          [cx + spanLon, cy - spanLat],
        ],
      };
      frame = windowFrame;
      features = features.filter((_, i) => {
        const [[fw, fs], [fe, fn]] = options.segments.bounds[i]!;
        return lonDelta(cx, fe) >= -spanLon && lonDelta(cx, fw) <= spanLon && fn >= cy - spanLat && fs <= cy + spanLat;
      });
    }
  }

  const { projection } = projectionFor(extentOf(frame));
  projection.fitWidth(width - 2 * pad, frame);
  const probe = geoPath(projection).bounds(frame);
  const height = Math.round(Math.min(Math.max(probe[1][1] - probe[0][1] + 2 * pad, 220), highlight ? 360 : 560));
  projection
    .fitExtent(
      [
        [pad, pad],
        [width - pad, height - pad],
      ],
      frame,
    )
    .clipExtent([
      [0, 0],
      [width, height],
    ]);
  const path = geoPath(projection).digits(1);
  const project = (p: [number, number]) => projection(p) as [number, number] | null;

  const parts: string[] = [];
  const tid = `${options.idPrefix}-title`;
  const did = `${options.idPrefix}-desc`;
  const areas = !highlight && options.areas && options.areas.length > 0 ? options.areas : null;
  const linkOf = options.linkOf && !highlight && !areas && allFeatures.length <= linkLimit ? options.linkOf : null;
  const linked = linkOf !== null || areas !== null;
  // A map with links is a group of them (an image's parts are hidden from assistive technology).
  parts.push(`<svg class="map" viewBox="0 0 ${width} ${height}" role="${linked ? 'group' : 'img'}" aria-labelledby="${tid} ${did}" preserveAspectRatio="xMidYMid meet">`);
  parts.push(`<title id="${tid}">${escapeXml(options.title)}</title><desc id="${did}">${escapeXml(options.description)}</desc>`);
  const pat = `${options.idPrefix}-zone`;
  parts.push(
    `<defs><pattern id="${pat}" width="7" height="7" patternUnits="userSpaceOnUse" patternTransform="rotate(45)"><rect width="7" height="7" fill="#dfe8ec"/><path d="M0 0V7" stroke="#5d7482" stroke-width="1.4"/></pattern>${features.some((f) => isArea(f.geometry)) ? levelPatternDefs().replace(/wl-pat-/g, `${options.idPrefix}-pat-`) : ''}</defs>`,
  );
  parts.push(`<rect class="sea" x="0" y="0" width="${width}" height="${height}" fill="${land ? mapColours.sea : mapColours.plain}"/>`);
  // ground distance of one pixel at the middle of the map, for simplifying what is drawn
  const middle = scaleBar(projection, [width / 2 - 50, height / 2]);
  const kmPerPx = middle ? middle.km / middle.px : 0;
  if (land) {
    const drawn = highlight ? land.features : simplifiedForScale(land.features, kmPerPx);
    const d = drawn.map((f) => geoPath(projection).digits(highlight ? 1 : 0)(f) ?? '').join('');
    if (d) parts.push(`<path class="land" d="${d}" fill="${mapColours.land}" stroke="${mapColours.coast}" stroke-width="0.8" stroke-linejoin="round"/>`);
  }

  for (const { zone, feature: f } of zones) {
    const d = path(f);
    if (!d) continue;
    const label = `Offshore accumulation ${zoneName(zone.id).toLowerCase()}: about ${formatNumber(zone.particles)} modelled particles within ${formatNumber(zone.radiusKm)} km`;
    parts.push(
      `<path d="${d}" fill="url(#${pat})" fill-opacity="${highlight ? 0.5 : 0.9}" stroke="#3d5563" stroke-width="1" stroke-dasharray="3 2"><title>${escapeXml(label)}</title></path>`,
    );
  }

  // Wraps a segment's drawing in a link to its bulletin (region maps with `linkOf`).
  const linkFor =
    (id: string, name: string) =>
    (inner: string): string =>
      linkOf ? `<a href="${escapeXml(linkOf(id))}" tabindex="-1" aria-label="${escapeXml(name)}">${inner}</a>` : inner;
  const ordered = [...features].sort((a, b) => {
    if (highlight) return (a.properties.id === highlight ? 1 : 0) - (b.properties.id === highlight ? 1 : 0);
    return levelStyles[a.properties.level].rank - levelStyles[b.properties.level].rank;
  });
  if (areas) {
    // national coast: all segments as one plain path per level (page size), areas carry the badges
    const byLevel = new Map<LevelId, string[]>();
    const coarse = geoPath(projection).digits(0);
    for (const f of simplifiedForScale(ordered, kmPerPx)) {
      const d = coarse(f);
      if (!d) continue;
      const list = byLevel.get(f.properties.level) ?? [];
      list.push(d);
      byLevel.set(f.properties.level, list);
    }
    for (const [level, ds] of byLevel) {
      const style = levelStyles[level];
      parts.push(`<path d="${ds.join('')}" fill="none" stroke="${style.stroke}" stroke-width="${Math.max(style.width - 1, 3)}" stroke-linecap="round" stroke-linejoin="round"/>`);
    }
  } else {
    // Lines digitised at 1:10 000 (10⁵ vertices a segment) are thinned to what the map's pixels
    // can show; ordinary coasts are drawn as given, so their pictures do not move.
    const detailed = vertexCount(ordered) > mostVerticesDrawnAsGiven ? simplifiedForScale(ordered, kmPerPx) : ordered;
    for (const f of detailed) {
      const d = path(f);
      if (!d) continue;
      const style = levelStyles[f.properties.level];
      const name = `${f.properties.name}: ${f.properties.levelLabel}${style.rank > 0 ? `, level ${style.rank} of 4` : ''}`;
      const title = `<title>${escapeXml(name)}</title>`;
      const open = linkFor(f.properties.id, name);
      const area = isArea(f.geometry);
      if (highlight && f.properties.id !== highlight) {
        parts.push(`<path d="${d}" fill="${area ? '#c9d3d8' : 'none'}" stroke="#8c9aa3" stroke-width="2.5" stroke-linecap="round">${title}</path>`);
        continue;
      }
      const isTarget = highlight !== null;
      const w = isTarget ? 8 : style.width;
      const dash = !isTarget && style.dash ? ` stroke-dasharray="${style.dash}"` : '';
      if (area) {
        parts.push(open(`<path d="${d}" fill="url(#${options.idPrefix}-pat-${style.rank})" stroke="${style.stroke}" stroke-width="1.5">${title}</path>`));
      } else {
        // a white casing separates touching segments; left out on crowded maps to keep pages small
        if (features.length <= 150 || isTarget) parts.push(`<path d="${d}" fill="none" stroke="#fff" stroke-width="${w + 3}" stroke-linecap="round" stroke-linejoin="round"/>`);
        parts.push(
          open(
            `<path d="${d}" fill="none" stroke="${isTarget ? '#1f2a33' : style.stroke}" stroke-width="${w}" stroke-linecap="round" stroke-linejoin="round"${dash}>${title}</path>`,
          ),
        );
      }
    }
  }

  // Scale bar, bottom left, measured where it is drawn; its box is kept free of labels.
  const reserved: Box[] = [];
  const by = height - 12;
  const bar = scaleBar(projection, [16, by]);
  let scaleSvg = '';
  if (bar) {
    reserved.push({ x: 8, y: by - 16, w: bar.px + 16, h: 22 });
    scaleSvg = `<g class="scale" data-km="${bar.km}"><rect x="8" y="${by - 16}" width="${(bar.px + 16).toFixed(1)}" height="22" fill="#fff" fill-opacity="0.85"/><path d="M16 ${by - 4}V${by}H${(16 + bar.px).toFixed(1)}V${by - 4}" fill="none" stroke="#1f2a33" stroke-width="1.5"/><text x="${(16 + bar.px / 2).toFixed(1)}" y="${by - 6}" text-anchor="middle" font-size="10" fill="#1f2a33">${formatNumber(bar.km)} km</text></g>`;
  }
  const withInset = highlight !== null && windowFrame !== null && allFeatures.length <= insetLimit;
  if (withInset) reserved.push({ x: width - insetSize - 8, y: 8, w: insetSize, h: insetSize });

  // Badges, then place names, then zone names: placed so none overlaps another or covers a line.
  const lineCache = new Map<string, Point[][]>();
  const linesOf = (f: Feature<Geometry, Props>): Point[][] => {
    let l = lineCache.get(f.properties.id);
    if (!l) {
      l = projectedLines(f.geometry, project);
      lineCache.set(f.properties.id, l);
    }
    return l;
  };
  const obstacleLines = features.flatMap(linesOf);
  const requests: LabelRequest[] = [];
  const drawers = new Map<string, (label: PlacedLabel) => string>();
  const badges = options.badges ?? (!highlight && features.length < 80);
  if (highlight) {
    const target = ordered.find((f) => f.properties.id === highlight);
    const c = target ? path.centroid(target) : null;
    if (target && c && Number.isFinite(c[0])) {
      const [[x0, y0], [x1, y1]] = path.bounds(target);
      const ring = Math.min(Math.max(Math.hypot(x1 - x0, y1 - y0) / 2 + 10, 16), 120);
      parts.push(`<circle cx="${c[0].toFixed(1)}" cy="${c[1].toFixed(1)}" r="${ring.toFixed(1)}" fill="none" stroke="#1f2a33" stroke-width="2" stroke-dasharray="4 3"/>`);
    }
  } else if (areas) {
    const byId = new Map(features.map((f) => [f.properties.id, f] as const));
    for (const area of [...areas].sort((a, b) => levelStyles[b.level].rank - levelStyles[a.level].rank || a.number - b.number)) {
      const members = area.segmentIds.map((id) => byId.get(id)).filter((f): f is Feature<Geometry, Props> => f !== undefined);
      if (members.length === 0) continue;
      const centroid = path.centroid({ type: 'FeatureCollection', features: members } as FeatureCollection);
      const anchor = nearestVertex(members.flatMap(linesOf), centroid as Point) ?? (centroid as Point);
      const key = `area:${area.id}`;
      requests.push({ id: key, anchor, w: 2 * badgeRadius, h: 2 * badgeRadius });
      // the accessible name starts with the badge's visible number (WCAG 2.1 SC 2.5.3, label in name)
      const name = `${area.number}. ${area.name}: highest level ${area.levelLabel}, ${levelStyles[area.level].rank} of 4`;
      drawers.set(key, (label) => `<a href="${escapeXml(area.href)}" tabindex="-1" aria-label="${escapeXml(name)}">${badgeSvg(label, area.level, area.number)}</a>`);
    }
  } else if (badges) {
    for (const f of [...ordered].sort((a, b) => byLevelThenName(a.properties, b.properties))) {
      const lines = linesOf(f);
      const c = path.centroid(f) as Point;
      const anchor = nearestVertex(lines, c) ?? c;
      const key = `segment:${f.properties.id}`;
      requests.push({ id: key, anchor, w: 2 * badgeRadius, h: 2 * badgeRadius });
      const style = levelStyles[f.properties.level];
      const open = linkFor(f.properties.id, `${f.properties.name}: ${f.properties.levelLabel}${style.rank > 0 ? `, level ${style.rank} of 4` : ''}`);
      drawers.set(key, (label) => open(badgeSvg(label, f.properties.level, style.rank)));
    }
  }
  if (!highlight) {
    for (const [i, place] of (options.places ?? []).entries()) {
      const anchor = project([place.lon, place.lat]);
      if (!anchor) continue;
      const key = `place:${i}`;
      requests.push({ id: key, anchor, w: textWidth(place.name), h: 14 });
      drawers.set(key, (label) => textLabelSvg(label, place.name, 'place-label', true, land ? mapColours.land : mapColours.plain));
    }
    for (const { zone } of zones) {
      const anchor = project([zone.lon, zone.lat]);
      if (!anchor) continue;
      const key = `zone:${zone.id}`;
      requests.push({ id: key, anchor, w: textWidth(zoneName(zone.id)), h: 14 });
      drawers.set(key, (label) => textLabelSvg(label, zoneName(zone.id), 'zone-label', false, mapColours.plain));
    }
  }
  const { placed, left } = placeLabels(requests, { width, height, lines: obstacleLines, reserved });
  // leaders first, so no leader crosses a badge drawn earlier
  for (const label of placed) parts.push(drawers.get(label.id)!(label));

  parts.push(scaleSvg);
  if (withInset && highlight && windowFrame) parts.push(renderInset(allFeatures, options.insetLand ?? null, highlight, windowFrame, width));
  parts.push('</svg>');
  return { svg: parts.join(''), layout: { width, height, labels: placed, left } };
}
