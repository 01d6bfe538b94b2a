/**
 * Maps as inline SVG strings, drawn at build time: segment lines (and zone hulls) go through
 * TopoJSON (topojson-server `topology` quantises shared coordinates, topojson-client `feature`
 * turns them back into GeoJSON), then d3-geo `geoPath` with a Mercator projection fitted to
 * the frame writes short path strings (1 decimal). Rendering only: levels and zones come
 * from the bulletin model.
 */
import { geoArea, geoBounds, geoDistance, geoMercator, geoPath } from 'd3-geo';
import type { GeoPermissibleObjects } from 'd3-geo';
import { topology } from 'topojson-server';
import { feature } from 'topojson-client';
import type { Feature, FeatureCollection, Geometry, Polygon } from 'geojson';
import type { AccumulationZone, LevelId } from '../../generator/model/types.ts';
import { escapeXml, formatNumber, zoneName } from './format.ts';
import { levelPatternDefs, levelStyles } from './levels.ts';

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
  idPrefix: string;                 // makes <title>/<desc> ids unique on the page
  title: string;
  description: string;
  segments: PreparedSegments;
  zones?: AccumulationZone[];
  highlight?: string | null;        // segment id for a locator map
  width?: number;                   // defaults to 640
  badges?: boolean;                 // numbered level badges; defaults to true under 80 segments
  /**
   * Where each segment's bulletin is (region maps): its line and badge become links, so a tap on
   * a phone opens the bulletin. Left out of the tab order: the table of all segments below the
   * map has the same links for the keyboard. Not used above `linkLimit` segments (page size).
   */
  linkOf?: (segmentId: string) => string;
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
 * Numbered level badges beside the lines (so the line style stays visible), placed greedily,
 * highest level first, with a thin leader to the segment's centre; a badge that would overlap
 * another is left out (the table lists every segment and level).
 */
function placeBadges(items: { centre: [number, number]; level: LevelId; open: (inner: string) => string }[], width: number): string[] {
  const placed: [number, number][] = [];
  const out: string[] = [];
  const order = [...items].sort((a, b) => levelStyles[b.level].rank - levelStyles[a.level].rank);
  const free = (x: number, y: number) => x > badgeRadius && x < width - badgeRadius && placed.every(([px, py]) => Math.hypot(px - x, py - y) >= 2 * badgeRadius + 2);
  for (const { centre, level, open } of order) {
    if (!Number.isFinite(centre[0]) || !Number.isFinite(centre[1])) continue;
    const spot = [24, -24, 44, -44].map((dx) => [centre[0] + dx, centre[1]] as [number, number]).find(([x, y]) => free(x, y));
    if (!spot) continue;
    placed.push(spot);
    const style = levelStyles[level];
    const [x, y] = [spot[0].toFixed(1), spot[1].toFixed(1)];
    const leader = `<path d="M${centre[0].toFixed(1)} ${centre[1].toFixed(1)}H${(spot[0] + (spot[0] > centre[0] ? -badgeRadius : badgeRadius)).toFixed(1)}" stroke="#1f2a33" stroke-width="0.8"/>`;
    out.push(open(`<g class="badge">${leader}<circle cx="${x}" cy="${y}" r="${badgeRadius}" fill="${style.fill}" stroke="#1f2a33" stroke-width="1.2"${style.rank === 0 ? ' stroke-dasharray="3 2"' : ''}/><text x="${x}" y="${y}" dy="0.35em" text-anchor="middle" font-size="10" font-weight="700" fill="${style.rank >= 3 ? '#fff' : '#1f2a33'}">${style.rank > 0 ? style.rank : '?'}</text></g>`));
  }
  return out;
}

/** Above this many segments the locator's overview inset is left out (page size). */
const insetLimit = 400;

/** Top-right inset of a locator map: the whole coast in grey, the locator's window as a box. */
function renderInset(all: Feature<Geometry, Props>[], highlight: string, win: readonly [number, number, number, number], width: number): string {
  const size = 110;
  const x0 = width - size - 8;
  const y0 = 8;
  const collection = { type: 'FeatureCollection', features: all } as FeatureCollection;
  const projection = geoMercator().fitExtent([[x0 + 6, y0 + 6], [x0 + size - 6, y0 + size - 6]], collection);
  const path = geoPath(projection).digits(0);
  const coast = all.map((f) => path(f) ?? '').join('');
  const a = projection([win[0], win[3]]);
  const b = projection([win[2], win[1]]);
  const target = all.find((f) => f.properties.id === highlight);
  const c = target ? path.centroid(target) : null;
  const box = a && b ? `<rect x="${Math.min(a[0], b[0]).toFixed(1)}" y="${Math.min(a[1], b[1]).toFixed(1)}" width="${Math.max(Math.abs(b[0] - a[0]), 3).toFixed(1)}" height="${Math.max(Math.abs(b[1] - a[1]), 3).toFixed(1)}" fill="none" stroke="#1f2a33" stroke-width="1.5"/>` : '';
  const dot = c && Number.isFinite(c[0]) ? `<circle cx="${c[0].toFixed(1)}" cy="${c[1].toFixed(1)}" r="2.5" fill="#1f2a33"/>` : '';
  return `<g class="inset"><rect x="${x0}" y="${y0}" width="${size}" height="${size}" fill="#fff" fill-opacity="0.92" stroke="#8c9aa3"/><path d="${coast}" fill="none" stroke="#8c9aa3" stroke-width="1.2"/>${box}${dot}</g>`;
}

const niceKm = [0.5, 1, 2, 5, 10, 20, 50, 100, 200, 500];

export function renderMap(options: MapOptions): string {
  const width = options.width ?? 640;
  const pad = 16;
  const highlight = options.highlight ?? null;
  const allFeatures = options.segments.features;
  let features = allFeatures;
  let windowBox: readonly [number, number, number, number] | null = null;
  const zones = (options.zones ?? []).filter((z) => z.hull.length >= 4).map((z) => ({
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
      const spanLon = Math.max(e - w, 0.08) * 1.6;
      const spanLat = Math.max(n - s, 0.05) * 1.6;
      const cx = (w + e) / 2;
      const cy = (s + n) / 2;
      const win = [cx - spanLon, cy - spanLat, cx + spanLon, cy + spanLat] as const;
      windowBox = win;
      frame = { type: 'MultiPoint', coordinates: [[win[0], win[1]], [win[2], win[3]]] };
      features = features.filter((_, i) => {
        const [[fw, fs], [fe, fn]] = options.segments.bounds[i]!;
        return fe >= win[0] && fw <= win[2] && fn >= win[1] && fs <= win[3];
      });
    }
  }

  const projection = geoMercator().fitWidth(width - 2 * pad, frame);
  const probe = geoPath(projection).bounds(frame);
  const height = Math.round(Math.min(Math.max(probe[1][1] - probe[0][1] + 2 * pad, 220), highlight ? 360 : 560));
  projection.fitExtent([[pad, pad], [width - pad, height - pad]], frame).clipExtent([[0, 0], [width, height]]);
  const path = geoPath(projection).digits(1);

  const parts: string[] = [];
  const tid = `${options.idPrefix}-title`;
  const did = `${options.idPrefix}-desc`;
  const linkOf = options.linkOf && !highlight && allFeatures.length <= linkLimit ? options.linkOf : null;
  // A map with links is a group of them (an image's parts are hidden from assistive technology).
  parts.push(`<svg class="map" viewBox="0 0 ${width} ${height}" role="${linkOf ? 'group' : 'img'}" aria-labelledby="${tid} ${did}" preserveAspectRatio="xMidYMid meet">`);
  parts.push(`<title id="${tid}">${escapeXml(options.title)}</title><desc id="${did}">${escapeXml(options.description)}</desc>`);
  const pat = `${options.idPrefix}-zone`;
  parts.push(`<defs><pattern id="${pat}" width="7" height="7" patternUnits="userSpaceOnUse" patternTransform="rotate(45)"><rect width="7" height="7" fill="#dfe8ec"/><path d="M0 0V7" stroke="#5d7482" stroke-width="1.4"/></pattern>${features.some((f) => isArea(f.geometry)) ? levelPatternDefs().replace(/wl-pat-/g, `${options.idPrefix}-pat-`) : ''}</defs>`);
  parts.push(`<rect class="sea" x="0" y="0" width="${width}" height="${height}" fill="#f1f0eb"/>`);

  for (const { zone, feature: f } of zones) {
    const d = path(f);
    if (!d) continue;
    const label = `Offshore accumulation ${zoneName(zone.id).toLowerCase()}: about ${formatNumber(zone.particles)} modelled particles within ${formatNumber(zone.radiusKm)} km`;
    parts.push(`<path d="${d}" fill="url(#${pat})" fill-opacity="${highlight ? 0.5 : 0.9}" stroke="#3d5563" stroke-width="1" stroke-dasharray="3 2"><title>${escapeXml(label)}</title></path>`);
    const c = projection([zone.lon, zone.lat]);
    if (c && !highlight) {
      parts.push(`<text x="${c[0].toFixed(1)}" y="${c[1].toFixed(1)}" class="zone-label" text-anchor="middle" dy="0.35em" font-size="11" font-weight="600" fill="#1f2a33" stroke="#f1f0eb" stroke-width="3" paint-order="stroke">${escapeXml(zoneName(zone.id))}</text>`);
    }
  }

  // Wraps a segment's drawing in a link to its bulletin (region maps with `linkOf`).
  const linkFor = (id: string, name: string) => (inner: string): string =>
    linkOf ? `<a href="${escapeXml(linkOf(id))}" tabindex="-1" aria-label="${escapeXml(name)}">${inner}</a>` : inner;
  const ordered = [...features].sort((a, b) => {
    if (highlight) return (a.properties.id === highlight ? 1 : 0) - (b.properties.id === highlight ? 1 : 0);
    return levelStyles[a.properties.level].rank - levelStyles[b.properties.level].rank;
  });
  for (const f of ordered) {
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
      parts.push(open(`<path d="${d}" fill="none" stroke="${isTarget ? '#1f2a33' : style.stroke}" stroke-width="${w}" stroke-linecap="round" stroke-linejoin="round"${dash}>${title}</path>`));
    }
  }

  const badges = options.badges ?? (!highlight && features.length < 80);
  if (highlight) {
    const target = ordered.find((f) => f.properties.id === highlight);
    const c = target ? path.centroid(target) : null;
    if (target && c && Number.isFinite(c[0])) {
      const [[x0, y0], [x1, y1]] = path.bounds(target);
      const ring = Math.min(Math.max(Math.hypot(x1 - x0, y1 - y0) / 2 + 10, 16), 120);
      parts.push(`<circle cx="${c[0].toFixed(1)}" cy="${c[1].toFixed(1)}" r="${ring.toFixed(1)}" fill="none" stroke="#1f2a33" stroke-width="2" stroke-dasharray="4 3"/>`);
    }
  } else if (badges) {
    parts.push(
      ...placeBadges(
        ordered.map((f) => ({
          centre: path.centroid(f),
          level: f.properties.level,
          open: linkFor(f.properties.id, `${f.properties.name}: ${f.properties.levelLabel}${levelStyles[f.properties.level].rank > 0 ? `, level ${levelStyles[f.properties.level].rank} of 4` : ''}`),
        })),
        width,
      ),
    );
  }

  // Scale bar, bottom left: distance of 100 px at mid-height, rounded to a nice length.
  const y = height / 2;
  const a = projection.invert?.([width / 2 - 50, y]);
  const b = projection.invert?.([width / 2 + 50, y]);
  if (a && b) {
    const kmPer100 = geoDistance(a, b) * 6371.0088;
    const km = [...niceKm].reverse().find((k) => (k / kmPer100) * 100 <= 140) ?? niceKm[0]!;
    const px = (km / kmPer100) * 100;
    const by = height - 12;
    parts.push(`<g class="scale"><rect x="8" y="${by - 16}" width="${(px + 16).toFixed(1)}" height="22" fill="#fff" fill-opacity="0.85"/><path d="M16 ${by - 4}V${by}H${(16 + px).toFixed(1)}V${by - 4}" fill="none" stroke="#1f2a33" stroke-width="1.5"/><text x="${(16 + px / 2).toFixed(1)}" y="${by - 6}" text-anchor="middle" font-size="10" fill="#1f2a33">${km} km</text></g>`);
  }
  if (highlight && windowBox && allFeatures.length <= insetLimit) parts.push(renderInset(allFeatures, highlight, windowBox, width));
  parts.push('</svg>');
  return parts.join('');
}
