/**
 * Areas of a national coast: which segment belongs to which area, and the names and places the
 * overview map prints. Pure functions of the segments.
 *
 * - A segment whose segments-file row carries `area` belongs to that area (areas are kept in the
 *   order they first appear; one larger than `areaSize` is split like the rest).
 * - Segments without one are grouped by proximity with recursive coordinate bisection (Berger &
 *   Bokhari 1987, "A partitioning strategy for nonuniform problems on multiprocessors", IEEE
 *   Transactions on Computers C-36(5)): the segments' centres, in kilometres on a local plane, are
 *   cut across their longer side, in proportion to how many areas each half needs, until every
 *   group holds at most `areaSize` segments. The groups come out in order along the coast's long
 *   axis, which numbers them.
 * - Above `areasAbove` segments the overview shows areas instead of every segment.
 */
import type { Segment } from '../scenario/types.ts';
import { extent } from 'd3-array';

export const areaSize = 60;
export const areasAbove = 150;

export interface AreaPlan {
  id: string;
  number: number;
  name: string;
  segmentIds: string[];
}

type AreaInput = Pick<Segment, 'id' | 'place' | 'bbox'> & { area?: string };

/** Longitude of b seen from a, within −180…180 (regions across the 180° meridian). */
function lonDelta(a: number, b: number): number {
  return ((((b - a) % 360) + 540) % 360) - 180;
}

/** Centres of the segments in km on a plane around the first segment's centre (equirectangular, common practice). */
function localCentres(segments: readonly AreaInput[]): [number, number][] {
  const first = segments[0];
  if (!first) return [];
  const lon0 = (first.bbox[0] + first.bbox[2]) / 2;
  const lats = segments.map((s) => (s.bbox[1] + s.bbox[3]) / 2);
  const lat0 = lats.reduce((a, b) => a + b, 0) / lats.length;
  const kx = 111.32 * Math.cos((lat0 * Math.PI) / 180);
  return segments.map((s, i) => {
    const west = s.bbox[0];
    const east = west + ((((s.bbox[2] - west) % 360) + 360) % 360);
    return [lonDelta(lon0, (west + east) / 2) * kx, lats[i]! * 110.574];
  });
}

/** Recursive coordinate bisection into groups of at most `size`, in order along the cuts. */
export function bisect(points: readonly [number, number][], size: number): number[][] {
  const out: number[][] = [];
  const cut = (indices: number[]): void => {
    if (indices.length <= size) {
      if (indices.length > 0) out.push(indices);
      return;
    }
    const [x0, x1] = extent(indices, (i) => points[i]![0]) as [number, number];
    const [y0, y1] = extent(indices, (i) => points[i]![1]) as [number, number];
    const spanX = x1 - x0;
    const spanY = y1 - y0;
    // north to south (y falling), or west to east
    const sorted = [...indices].sort(spanY >= spanX ? (a, b) => points[b]![1] - points[a]![1] || a - b : (a, b) => points[a]![0] - points[b]![0] || a - b);
    const parts = Math.ceil(indices.length / size);
    const leftParts = Math.floor(parts / 2);
    const leftSize = Math.round((indices.length * leftParts) / parts);
    cut(sorted.slice(0, leftSize));
    cut(sorted.slice(leftSize));
  };
  cut(points.map((_, i) => i));
  return out;
}

/** Name of a group of segments from their places: the one place, or the first and last along the coast. */
export function areaName(places: readonly (string | null)[], number: number): string {
  const named = places.filter((p): p is string => p !== null);
  const first = named[0];
  const last = named[named.length - 1];
  if (!first || !last) return `Area ${number}`;
  return first === last ? first : `${first} to ${last}`;
}

function slug(text: string): string {
  return text
    .toLowerCase()
    .normalize('NFKD')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 48);
}

/** The areas of a coast (every segment in exactly one). */
export function planAreas(segments: readonly AreaInput[], size = areaSize): AreaPlan[] {
  const groups: { given: string | null; members: AreaInput[] }[] = [];
  const givenIndex = new Map<string, number>();
  const ungrouped: AreaInput[] = [];
  for (const segment of segments) {
    if (segment.area) {
      let at = givenIndex.get(segment.area);
      if (at === undefined) {
        at = groups.length;
        givenIndex.set(segment.area, at);
        groups.push({ given: segment.area, members: [] });
      }
      groups[at]!.members.push(segment);
    } else ungrouped.push(segment);
  }
  const split = (given: string | null, members: AreaInput[]): { given: string | null; members: AreaInput[] }[] =>
    bisect(localCentres(members), size).map((indices) => ({ given, members: indices.map((i) => members[i]!) }));
  const all = [...groups.flatMap((g) => split(g.given, g.members)), ...split(null, ungrouped)];
  const used = new Set<string>();
  return all.map((group, i) => {
    const number = i + 1;
    const parts = all.filter((g) => g.given !== null && g.given === group.given).length;
    const part = all.slice(0, i + 1).filter((g) => g.given !== null && g.given === group.given).length;
    const name =
      group.given !== null
        ? parts > 1
          ? `${group.given} (part ${part} of ${parts})`
          : group.given
        : areaName(
            group.members.map((s) => s.place),
            number,
          );
    let id = `area-${slug(name) || String(number)}`;
    if (used.has(id)) id = `${id}-${number}`;
    used.add(id);
    return { id, number, name, segmentIds: group.members.map((s) => s.id) };
  });
}

/** Whether the overview shows areas rather than every segment. */
export function usesAreas(segmentCount: number): boolean {
  return segmentCount > areasAbove;
}

export interface MapPlace {
  name: string;
  lon: number;
  lat: number;
  segments: number;
}

/**
 * Place names for the overview map: the places (segments-file property `place`) with the most
 * segments, at most `count`, ties by name; each at the middle of its segments' centres.
 */
export function mapPlaces(segments: readonly AreaInput[], count = 6): MapPlace[] {
  const byPlace = new Map<string, AreaInput[]>();
  for (const s of segments) {
    if (!s.place) continue;
    const list = byPlace.get(s.place) ?? [];
    list.push(s);
    byPlace.set(s.place, list);
  }
  return [...byPlace.entries()]
    .sort((a, b) => b[1].length - a[1].length || a[0].localeCompare(b[0], 'en'))
    .slice(0, count)
    .map(([name, list]) => {
      const lon0 = (list[0]!.bbox[0] + list[0]!.bbox[2]) / 2;
      const dLon = list.reduce((sum, s) => sum + lonDelta(lon0, (s.bbox[0] + s.bbox[2]) / 2), 0) / list.length;
      let lon = lon0 + dLon;
      if (lon > 180) lon -= 360;
      if (lon < -180) lon += 360;
      const lat = list.reduce((sum, s) => sum + (s.bbox[1] + s.bbox[3]) / 2, 0) / list.length;
      return { name, lon: Math.round(lon * 1e5) / 1e5, lat: Math.round(lat * 1e5) / 1e5, segments: list.length };
    });
}

/** The Regional Kendall runs each area needs: per area and indicator, its segments among `regionalSites`. */
export function areaRegionalSites(
  areas: readonly AreaPlan[],
  regionalSites: readonly { indicator: string; sites: readonly string[] }[],
): { area: string; indicator: string; sites: string[] }[] {
  const out: { area: string; indicator: string; sites: string[] }[] = [];
  for (const area of areas) {
    const members = new Set(area.segmentIds);
    for (const { indicator, sites } of regionalSites) {
      const own = sites.filter((s) => members.has(s));
      if (own.length > 0) out.push({ area: area.id, indicator, sites: own });
    }
  }
  return out;
}

const planCache = new WeakMap<readonly AreaInput[], AreaPlan[]>();
/** planAreas of a scenario's segments (sorted by id), once per segment list; null below `areasAbove`. */
export function scenarioAreas(segments: readonly AreaInput[]): AreaPlan[] | null {
  if (!usesAreas(segments.length)) return null;
  let plan = planCache.get(segments);
  if (!plan) {
    plan = planAreas([...segments].sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0)));
    planCache.set(segments, plan);
  }
  return plan;
}
