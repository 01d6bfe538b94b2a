/**
 * The invented coast of the demo: a procedurally drawn mainland shore and one offshore island,
 * placed in open South Pacific water far from any real land, cut into named segments.
 *
 * Coordinates are worked out on a local plane in kilometres (x east, y north) around an origin
 * and converted to WGS84 longitude/latitude with an equirectangular approximation (common
 * practice over a few tens of kilometres). Land lies east of the mainland line x = coastX(y).
 */

/** Origin of the local plane: open ocean, about 1,300 km from the nearest island (see README). */
export const ORIGIN = { lon: -127.5, lat: -37.5 };
const KM_PER_DEG_LAT = 110.574;
const KM_PER_DEG_LON = 111.32 * Math.cos((ORIGIN.lat * Math.PI) / 180);

export function toLonLat(x: number, y: number): [number, number] {
  return [ORIGIN.lon + x / KM_PER_DEG_LON, ORIGIN.lat + y / KM_PER_DEG_LAT];
}

export function toLocal(lon: number, lat: number): [number, number] {
  return [(lon - ORIGIN.lon) * KM_PER_DEG_LON, (lat - ORIGIN.lat) * KM_PER_DEG_LAT];
}

/** An indentation of the mainland (bay, harbour basin, estuary notch): Gaussian in y. */
interface Indentation {
  centreY: number;
  halfWidthKm: number;
  depthKm: number;
}

const INDENTATIONS: Indentation[] = [
  { centreY: 30, halfWidthKm: 3.6, depthKm: 5.5 }, // Ithmere Bay
  { centreY: 13, halfWidthKm: 1.4, depthKm: 2.8 }, // Quarrow Harbour basin
  { centreY: -5, halfWidthKm: 0.8, depthKm: 4.5 }, // Aldwen Estuary
  { centreY: -23, halfWidthKm: 3.2, depthKm: 4.8 }, // Morrin Bay
  { centreY: -41, halfWidthKm: 2.2, depthKm: 3.2 }, // Osselin Bay
];

/** x (km east of the origin) of the mainland shore at northing y; land is to the east. */
export function coastX(y: number): number {
  let x = 2.2 * Math.sin(y / 17) + 1.1 * Math.sin(y / 6.3 + 1.0) + 0.35 * Math.sin(y / 1.9 + 0.4);
  for (const bay of INDENTATIONS) {
    const u = (y - bay.centreY) / bay.halfWidthKm;
    x += bay.depthKm * Math.exp(-u * u);
  }
  return x;
}

export const COAST_NORTH_Y = 56;
export const COAST_SOUTH_Y = -65;

/** The island: a wobbly ring around its centre, listed anticlockwise in the local plane. */
export const ISLAND = { centreX: -27, centreY: 2, radiusKm: 3.2 };

export function islandRadius(angle: number): number {
  return ISLAND.radiusKm * (1 + 0.16 * Math.sin(3 * angle + 0.7) + 0.08 * Math.sin(5 * angle + 2.1));
}

export function islandPoint(angle: number): [number, number] {
  const r = islandRadius(angle);
  return [ISLAND.centreX + r * Math.cos(angle), ISLAND.centreY + r * Math.sin(angle)];
}

/** True when a local point lies on the island. */
export function onIsland(x: number, y: number): boolean {
  const dx = x - ISLAND.centreX;
  const dy = y - ISLAND.centreY;
  const r = Math.hypot(dx, dy);
  return r <= islandRadius(Math.atan2(dy, dx));
}

export type SegmentKind = 'beach' | 'bay' | 'harbour' | 'estuary' | 'island-shore' | 'rocky-shore';
export type ShellfishUse = 'farmed' | 'gathered' | 'farmed-and-gathered' | 'none';

export interface SegmentPlan {
  id: string;
  name: string;
  kind: SegmentKind;
  shellfish: ShellfishUse;
  place: string | null;
  /** Mainland: northing range [from, to] (from > to, drawn north to south). Island: angle range in degrees. */
  mainland?: [number, number];
  island?: [number, number];
}

/** The thirty segments, north to south, then the island. Names are invented. */
export const SEGMENT_PLANS: SegmentPlan[] = [
  { id: 'vellan-head', name: 'Vellan Head', kind: 'rocky-shore', shellfish: 'none', place: 'Vellan', mainland: [56, 52.5] },
  { id: 'corrab-sands', name: 'Corrab Sands', kind: 'beach', shellfish: 'none', place: 'Vellan', mainland: [52.5, 48.5] },
  { id: 'ostry-beach', name: 'Ostry Beach', kind: 'beach', shellfish: 'none', place: 'Ostry', mainland: [48.5, 44.5] },
  { id: 'ketterow-rocks', name: 'Ketterow Rocks', kind: 'rocky-shore', shellfish: 'gathered', place: 'Ostry', mainland: [44.5, 37] },
  { id: 'ithmere-bay-north', name: 'Ithmere Bay, north shore', kind: 'bay', shellfish: 'farmed', place: 'Ithmere', mainland: [37, 30] },
  { id: 'ithmere-bay-south', name: 'Ithmere Bay, south shore', kind: 'bay', shellfish: 'farmed-and-gathered', place: 'Ithmere', mainland: [30, 23] },
  { id: 'pellow-strand', name: 'Pellow Strand', kind: 'beach', shellfish: 'none', place: 'Ithmere', mainland: [23, 19] },
  { id: 'garrith-beach', name: 'Garrith Beach', kind: 'beach', shellfish: 'none', place: 'Quarrow', mainland: [19, 16] },
  { id: 'quarrow-harbour', name: 'Quarrow Harbour', kind: 'harbour', shellfish: 'none', place: 'Quarrow', mainland: [16, 10] },
  { id: 'quarrow-town-beach', name: 'Quarrow Town Beach', kind: 'beach', shellfish: 'none', place: 'Quarrow', mainland: [10, 6.5] },
  { id: 'sennick-point', name: 'Sennick Point', kind: 'rocky-shore', shellfish: 'none', place: 'Quarrow', mainland: [6.5, 3] },
  { id: 'brenna-sands', name: 'Brenna Sands', kind: 'beach', shellfish: 'gathered', place: 'Brenna', mainland: [3, -1.5] },
  { id: 'aldwen-estuary', name: 'Aldwen Estuary', kind: 'estuary', shellfish: 'gathered', place: 'Aldwen', mainland: [-1.5, -8] },
  { id: 'tolvar-beach', name: 'Tolvar Beach', kind: 'beach', shellfish: 'none', place: 'Aldwen', mainland: [-8, -11.5] },
  { id: 'fennock-dunes', name: 'Fennock Dunes', kind: 'beach', shellfish: 'none', place: 'Aldwen', mainland: [-11.5, -15] },
  { id: 'crayle-rocks', name: 'Crayle Rocks', kind: 'rocky-shore', shellfish: 'none', place: 'Morrin', mainland: [-15, -18] },
  { id: 'morrin-bay-north', name: 'Morrin Bay, north shore', kind: 'bay', shellfish: 'farmed', place: 'Morrin', mainland: [-18, -23] },
  { id: 'morrin-bay-south', name: 'Morrin Bay, south shore', kind: 'bay', shellfish: 'farmed', place: 'Morrin', mainland: [-23, -28] },
  { id: 'lissow-beach', name: 'Lissow Beach', kind: 'beach', shellfish: 'none', place: 'Lissow', mainland: [-28, -31] },
  { id: 'varrack-sands', name: 'Varrack Sands', kind: 'beach', shellfish: 'none', place: 'Lissow', mainland: [-31, -34] },
  { id: 'druan-cliffs', name: 'Druan Cliffs', kind: 'rocky-shore', shellfish: 'none', place: 'Lissow', mainland: [-34, -37] },
  { id: 'osselin-bay', name: 'Osselin Bay', kind: 'bay', shellfish: 'farmed', place: 'Osselin', mainland: [-37, -45] },
  { id: 'ebbal-cove', name: 'Ebbal Cove', kind: 'beach', shellfish: 'gathered', place: 'Osselin', mainland: [-45, -48.5] },
  { id: 'wendrel-point', name: 'Wendrel Point', kind: 'rocky-shore', shellfish: 'none', place: 'Osselin', mainland: [-48.5, -51.5] },
  { id: 'tamsk-beach', name: 'Tamsk Beach', kind: 'beach', shellfish: 'none', place: 'Naddor', mainland: [-51.5, -55] },
  { id: 'quillet-beach', name: 'Quillet Beach', kind: 'beach', shellfish: 'none', place: 'Naddor', mainland: [-55, -58.5] },
  { id: 'naddor-sands', name: 'Naddor Sands', kind: 'beach', shellfish: 'none', place: 'Naddor', mainland: [-58.5, -62] },
  { id: 'ormsel-head', name: 'Ormsel Head', kind: 'rocky-shore', shellfish: 'none', place: 'Naddor', mainland: [-62, -65] },
  { id: 'tharra-island-west', name: 'Tharra Island, west shore', kind: 'island-shore', shellfish: 'none', place: 'Tharra', island: [90, 270] },
  { id: 'tharra-island-east', name: 'Tharra Island, east shore', kind: 'island-shore', shellfish: 'none', place: 'Tharra', island: [270, 450] },
];

/** Round a coordinate to 5 decimals (about 1 m) so files stay small and stable. */
function round5(value: number): number {
  return Math.round(value * 1e5) / 1e5;
}

/** Local points of a segment line, about every 250 m, ends included. */
export function segmentLocalLine(plan: SegmentPlan): [number, number][] {
  const points: [number, number][] = [];
  if (plan.mainland) {
    const [from, to] = plan.mainland;
    const steps = Math.max(2, Math.ceil(Math.abs(from - to) / 0.1));
    for (let i = 0; i <= steps; i++) {
      const y = from + ((to - from) * i) / steps;
      points.push([coastX(y), y]);
    }
  } else if (plan.island) {
    const [fromDeg, toDeg] = plan.island;
    const steps = Math.ceil(Math.abs(toDeg - fromDeg) / 4);
    for (let i = 0; i <= steps; i++) {
      const angle = ((fromDeg + ((toDeg - fromDeg) * i) / steps) * Math.PI) / 180;
      points.push(islandPoint(angle));
    }
  }
  // Thin to points at least 250 m apart, keeping both ends.
  const thinned: [number, number][] = [];
  for (const point of points) {
    const last = thinned[thinned.length - 1];
    if (!last || Math.hypot(point[0] - last[0], point[1] - last[1]) >= 0.25) thinned.push(point);
  }
  const end = points[points.length - 1];
  const lastKept = thinned[thinned.length - 1];
  if (end && lastKept && lastKept !== end) thinned[thinned.length - 1] = end;
  return thinned;
}

export function segmentLonLatLine(plan: SegmentPlan): [number, number][] {
  return segmentLocalLine(plan).map(([x, y]) => {
    const [lon, lat] = toLonLat(x, y);
    return [round5(lon), round5(lat)];
  });
}

/** Length of a local polyline in km. */
export function localLength(points: readonly [number, number][]): number {
  let total = 0;
  for (let i = 1; i < points.length; i++) {
    const a = points[i - 1] as [number, number];
    const b = points[i] as [number, number];
    total += Math.hypot(b[0] - a[0], b[1] - a[1]);
  }
  return total;
}

/** The segments as an RFC 7946 FeatureCollection (LineStrings, lon/lat). */
export function segmentsFeatureCollection(): object {
  return {
    type: 'FeatureCollection',
    features: SEGMENT_PLANS.map((plan) => ({
      type: 'Feature',
      id: plan.id,
      properties: { id: plan.id, name: plan.name, kind: plan.kind, shellfish: plan.shellfish, place: plan.place },
      geometry: { type: 'LineString', coordinates: segmentLonLatLine(plan) },
    })),
  };
}

/**
 * Invented land polygons for the maps: the mainland east of the shore line (sampled every 250 m,
 * from well south to well north of the segments, closed 80 km inland) and the island's ring.
 * Rings are listed anticlockwise (RFC 7946).
 */
export function landFeatureCollection(): object {
  const round = (p: [number, number]): [number, number] => [Math.round(p[0] * 1e5) / 1e5, Math.round(p[1] * 1e5) / 1e5];
  const south = COAST_SOUTH_Y - 40;
  const north = COAST_NORTH_Y + 40;
  const mainland: [number, number][] = [];
  for (let y = south; y <= north + 1e-9; y += 0.25) mainland.push(round(toLonLat(coastX(y), y))); // south to north along the shore
  mainland.push(round(toLonLat(80, north)), round(toLonLat(80, south))); // inland, then back south
  mainland.push(mainland[0]!);
  // the shore runs south to north with land on the right (east), so the ring goes clockwise: reverse it
  mainland.reverse();
  const island: [number, number][] = [];
  for (let k = 0; k < 180; k++) island.push(round(toLonLat(...islandPoint((k / 180) * 2 * Math.PI))));
  island.push(island[0]!);
  return {
    type: 'FeatureCollection',
    features: [
      { type: 'Feature', properties: { name: 'Tessavar mainland (invented)' }, geometry: { type: 'Polygon', coordinates: [mainland] } },
      { type: 'Feature', properties: { name: 'Island (invented)' }, geometry: { type: 'Polygon', coordinates: [island] } },
    ],
  };
}
