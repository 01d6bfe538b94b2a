/**
 * A dense invented test coast: 60 segments along about 300 km of a ragged shore at 63° N (a
 * fjord-like mainland with deep inlets and two islands close offshore), levels in a fixed
 * pseudo-random pattern. Invented geometry for tests only; no real place.
 */
import type { MapSegment } from '../../site/lib/map.ts';
import type { LevelId } from '../../generator/model/types.ts';
import type { Geometry } from 'geojson';

const origin = { lon: 8.5, lat: 63 };
const kmLat = 110.574;
const kmLon = 111.32 * Math.cos((origin.lat * Math.PI) / 180);
const toLonLat = (x: number, y: number): [number, number] => [Math.round((origin.lon + x / kmLon) * 1e5) / 1e5, Math.round((origin.lat + y / kmLat) * 1e5) / 1e5];

/** Shore x (km east) at northing y: land to the east; inlets up to 12 km deep. */
export function shoreX(y: number): number {
  return 6 * Math.sin(y / 23) + 3 * Math.sin(y / 7.1 + 1) + 1.5 * Math.sin(y / 2.3) + 12 * Math.max(0, Math.sin(y / 11)) ** 6;
}

const levels: LevelId[] = ['scant', 'noticeable', 'marked', 'heavy'];
const levelLabels: Record<LevelId, string> = { scant: 'Scant', noticeable: 'Noticeable', marked: 'Marked', heavy: 'Heavy', 'not-set': 'Level not set' };
const levelAt = (i: number): LevelId => levels[(i * 7 + (i % 3)) % 4]!;

function islandRing(cx: number, cy: number, r: number, from: number, to: number): [number, number][] {
  const out: [number, number][] = [];
  for (let k = 0; k <= 12; k++) {
    const a = ((from + ((to - from) * k) / 12) * Math.PI) / 180;
    const rr = r * (1 + 0.2 * Math.sin(3 * a));
    out.push(toLonLat(cx + rr * Math.cos(a), cy + rr * Math.sin(a)));
  }
  return out;
}

export function denseCoast(): MapSegment[] {
  const segments: MapSegment[] = [];
  const mainland = 50;
  const length = 300;
  for (let i = 0; i < mainland; i++) {
    const coords: [number, number][] = [];
    for (let k = 0; k <= 24; k++) {
      const y = length / 2 - ((i + k / 24) * length) / mainland;
      coords.push(toLonLat(shoreX(y), y));
    }
    segments.push({
      id: `shore-${i + 1}`,
      name: `Shore ${i + 1}`,
      level: levelAt(i),
      levelLabel: levelLabels[levelAt(i)],
      geometry: { type: 'LineString', coordinates: coords } as Geometry,
    });
  }
  const islands = [
    { cx: -14, cy: 40, r: 7 },
    { cx: -12, cy: -60, r: 6 },
  ];
  let n = mainland;
  for (const [j, island] of islands.entries()) {
    for (let part = 0; part < 5; part++) {
      const level = levelAt(n);
      segments.push({
        id: `island-${j + 1}-${part + 1}`,
        name: `Island ${j + 1} shore ${part + 1}`,
        level,
        levelLabel: levelLabels[level],
        geometry: { type: 'LineString', coordinates: islandRing(island.cx, island.cy, island.r, part * 72, (part + 1) * 72) } as Geometry,
      });
      n++;
    }
  }
  return segments;
}

/** Land of the dense coast: the mainland east of the shore and the two islands. */
export function denseLand(): Geometry {
  const shore: [number, number][] = [];
  for (let y = -200; y <= 200; y += 0.5) shore.push(toLonLat(shoreX(y), y));
  const mainland = [...shore, toLonLat(400, 200), toLonLat(400, -200), shore[0]!].reverse();
  const island = (cx: number, cy: number, r: number) => islandRing(cx, cy, r, 0, 360);
  return { type: 'MultiPolygon', coordinates: [[mainland], [island(-14, 40, 7)], [island(-12, -60, 6)]] };
}
