/**
 * An invented toy drift model for the demo: particles moved through a seeded velocity field made
 * of offshore gyres (a swirl plus a weak inflow, so floating particles gather near their centres,
 * the way wind-driven convergence gathers floating debris), a coastal current running along the
 * shore, season-dependent windage, and random-walk diffusion. It is a picture for the demo, not
 * an ocean model: no real currents or winds are used.
 *
 * Integration: forward Euler with a quarter-day step and a Gaussian random walk of variance
 * 2·K·Δt per axis (common practice for Lagrangian particle tracking). Positions are written once a
 * day at 00:00 UTC; a particle that crosses the shore is placed on the shore line, marked
 * "ashore", and stops. Beyond the two ends of the mainland there is open sea; a particle leaving
 * the model area is no longer written.
 */
import { createSeededRandom, type SeededRandom } from '../../generator/random/seeded-random.ts';
import type { DemoSeason, SeasonName } from './seasons.ts';

export interface Gyre {
  x: number;
  y: number;
  radiusKm: number;
  swirlKmPerDay: number;
  inflowKmPerDay: number;
}

export interface ParticleSource {
  name: string;
  x: number;
  y: number;
  /** Share of the released particles; the rest start in the offshore box. */
  share: number;
  spreadKm: number;
}

export interface DriftSetup {
  coastX: (y: number) => number;
  /** Northing range [south, north] of the mainland; beyond its ends there is open sea. */
  landRange: [number, number];
  /** Island test and snap, when the coast has an island. */
  island?: { contains: (x: number, y: number) => boolean; shorePoint: (x: number, y: number) => [number, number] };
  gyres: Gyre[];
  coastalCurrentKmPerDay: number;
  coastalWidthKm: number;
  /** Windage drift (km/day, east and north) for each season name. */
  wind: Record<SeasonName, [number, number]>;
  /** Gyre inflow multiplier per season (stronger convergence in some seasons). */
  gyreSeasonFactor: Record<SeasonName, number>;
  diffusionKm2PerDay: number;
  bounds: { xMin: number; xMax: number; yMin: number; yMax: number };
  offshoreBox: { xMin: number; xMax: number; yMin: number; yMax: number };
  sources: ParticleSource[];
  particlesPerSeason: number;
  maxDays: number;
  /** Latest release, in days after the season's first day. */
  releaseWindowDays: number;
  toLonLat: (x: number, y: number) => [number, number];
}

export interface PositionRow {
  particle: number;
  day: number; // day number (days since 1970-01-01 UTC), whole days
  lon: number;
  lat: number;
  ashore: boolean;
}

const STEPS_PER_DAY = 4;

function velocity(setup: DriftSetup, season: SeasonName, x: number, y: number): [number, number] {
  let u = 0;
  let v = 0;
  for (const gyre of setup.gyres) {
    const dx = x - gyre.x;
    const dy = y - gyre.y;
    const r = Math.hypot(dx, dy);
    if (r < 1e-9) continue;
    const shape = (r / gyre.radiusKm) * Math.exp(1 - r / gyre.radiusKm);
    const inflow = gyre.inflowKmPerDay * setup.gyreSeasonFactor[season];
    // Anticlockwise swirl (−dy, dx)/r plus inflow −(dx, dy)/r, both scaled by the radial shape.
    u += (shape * (-gyre.swirlKmPerDay * dy - inflow * dx)) / r;
    v += (shape * (gyre.swirlKmPerDay * dx - inflow * dy)) / r;
  }
  const offshoreDistance = setup.coastX(y) - x;
  if (offshoreDistance > 0) {
    // The coastal current weakens beyond the ends of the land (e-folding over 15 km).
    const [south, north] = setup.landRange;
    const beyond = y < south ? south - y : y > north ? y - north : 0;
    v -= setup.coastalCurrentKmPerDay * Math.exp(-offshoreDistance / setup.coastalWidthKm - beyond / 15);
  }
  const [windU, windV] = setup.wind[season];
  return [u + windU, v + windV];
}

function releasePoint(setup: DriftSetup, random: SeededRandom): [number, number] {
  let pick = random.uniform();
  const atSea = (x: number, y: number) => x < setup.coastX(y) - 0.05 && !setup.island?.contains(x, y);
  for (const source of setup.sources) {
    if (pick < source.share) {
      // Spread around the source, redrawn until the point is on water (the source itself is).
      for (let attempt = 0; attempt < 50; attempt++) {
        const x = source.x + random.normal(0, source.spreadKm);
        const y = source.y + random.normal(0, source.spreadKm);
        if (atSea(x, y)) return [x, y];
      }
      return [source.x, source.y];
    }
    pick -= source.share;
  }
  const box = setup.offshoreBox;
  for (;;) {
    const x = random.between(box.xMin, box.xMax);
    const y = random.between(box.yMin, box.yMax);
    if (x < setup.coastX(y) - 1 && atSea(x, y)) return [x, y];
  }
}

function round4(value: number): number {
  return Math.round(value * 1e4) / 1e4;
}

/**
 * Run the model for one season and hand each daily position to `emit`, particle by particle.
 * Returns the next free particle number.
 */
export function runSeason(setup: DriftSetup, season: DemoSeason, firstParticle: number, seed: number, emit: (row: PositionRow) => void): number {
  const random = createSeededRandom(seed).derive(`drift/${season.id}`);
  const sd = Math.sqrt((2 * setup.diffusionKm2PerDay) / STEPS_PER_DAY);
  const dt = 1 / STEPS_PER_DAY;
  let particle = firstParticle;
  for (let p = 0; p < setup.particlesPerSeason; p++, particle++) {
    let [x, y] = releasePoint(setup, random);
    const releaseDay = season.startDay + random.integer(0, setup.releaseWindowDays);
    const lastDay = Math.min(season.endDay, releaseDay + setup.maxDays);
    const write = (day: number, ashore: boolean) => {
      const [lon, lat] = setup.toLonLat(x, y);
      emit({ particle, day, lon: round4(lon), lat: round4(lat), ashore });
    };
    write(releaseDay, false);
    days: for (let day = releaseDay + 1; day <= lastDay; day++) {
      for (let step = 0; step < STEPS_PER_DAY; step++) {
        const previousY = y;
        const [u, v] = velocity(setup, season.name, x, y);
        x += u * dt + random.normal(0, sd);
        y += v * dt + random.normal(0, sd);
        const b = setup.bounds;
        if (x < b.xMin || x > b.xMax || y < b.yMin || y > b.yMax) break days; // left the model area
        const [south, north] = setup.landRange;
        const shoreX = setup.coastX(y);
        if (x >= shoreX && y >= south && y <= north) {
          // Came round the end of the land rather than across the shore: leaves the model area.
          if (previousY < south || previousY > north) break days;
          x = shoreX - 0.05;
          write(day, true);
          break days;
        }
        if (setup.island?.contains(x, y)) {
          [x, y] = setup.island.shorePoint(x, y);
          write(day, true);
          break days;
        }
      }
      write(day, false);
    }
  }
  return particle;
}
