/**
 * Tallies particle positions, one at a time, into what the bulletins need:
 * - arrivals: for each season and segment, the number of distinct particles that came within
 *   `arrivalDistanceKm` of the segment line (great-circle distance; a particle near two segments
 *   counts for the nearer one at that moment);
 * - end-of-season positions: the last position within each season of every particle still
 *   drifting (not ashore), for the accumulation zones.
 * Memory grows with particles × seasons and with distinct arrivals, never with the number of
 * positions, so position files are streamed through it.
 */
import type { SeasonDefinition } from '../scenario/settings.ts';
import type { Segment } from '../scenario/types.ts';
import { seasonOfTime, seasonRange } from '../read/season-calendar.ts';
import { ParticleTable } from './particle-table.ts';
import { SegmentIndex } from './segment-index.ts';

interface SeasonTally {
  id: string;
  /** Distinct arriving particles per segment. */
  arrivals: Int32Array;
  /** particle → slot in the last-position arrays. */
  slots: ParticleTable;
  lastTime: number[];
  lastLon: number[];
  lastLat: number[];
  lastAshore: boolean[];
}

export interface EndOfSeasonPositions {
  season: string;
  lon: Float64Array;
  lat: Float64Array;
}

const dayMs = 86_400_000;

export class DriftTally {
  readonly index: SegmentIndex;
  private readonly seasons: readonly SeasonDefinition[];
  private readonly arrivalKm: number;
  private readonly tallies = new Map<string, SeasonTally>();
  /** Season of each UTC day, cached: positions come in whole-day runs. */
  private readonly dayCache = new Map<number, string | null>();
  /** Keys particle·segments + segment per season seen as arrived. */
  private readonly arrived = new Map<string, Set<number>>();
  positions = 0;
  outsideSeasons = 0;

  constructor(
    readonly segments: readonly Segment[],
    seasons: readonly SeasonDefinition[],
    arrivalDistanceKm: number,
  ) {
    this.index = new SegmentIndex(segments, arrivalDistanceKm);
    this.seasons = seasons;
    this.arrivalKm = arrivalDistanceKm;
  }

  private lastDay = Number.NaN;
  private lastSeason: string | null = null;

  private seasonOf(timeMs: number): string | null {
    const day = Math.floor(timeMs / dayMs);
    if (day === this.lastDay) return this.lastSeason;
    let season = this.dayCache.get(day);
    if (season === undefined) {
      season = seasonOfTime(day * dayMs, this.seasons)?.id ?? null;
      if (this.dayCache.size > 100_000) this.dayCache.clear();
      this.dayCache.set(day, season);
    }
    this.lastDay = day;
    this.lastSeason = season;
    return season;
  }

  private lastTally: SeasonTally | null = null;

  private tallyFor(season: string): SeasonTally {
    if (this.lastTally !== null && this.lastTally.id === season) return this.lastTally;
    let tally = this.tallies.get(season);
    if (!tally) {
      tally = { id: season, arrivals: new Int32Array(this.segments.length), slots: new ParticleTable(), lastTime: [], lastLon: [], lastLat: [], lastAshore: [] };
      this.tallies.set(season, tally);
      this.arrived.set(season, new Set());
    }
    this.lastTally = tally;
    return tally;
  }

  /** Adds one position. Returns false when its time falls in no season. */
  add(particle: number, timeMs: number, lon: number, lat: number, ashore: boolean): boolean {
    const season = this.seasonOf(timeMs);
    if (season === null) {
      this.outsideSeasons++;
      return false;
    }
    this.positions++;
    const tally = this.tallyFor(season);
    const near = this.index.nearestWithin(lon, lat, this.arrivalKm);
    if (near) {
      const key = particle * this.segments.length + near.segment;
      const seen = this.arrived.get(season) as Set<number>;
      if (!seen.has(key)) {
        seen.add(key);
        tally.arrivals[near.segment] = (tally.arrivals[near.segment] ?? 0) + 1;
      }
    }
    const slot = tally.slots.get(particle);
    if (Number.isNaN(slot)) {
      tally.slots.set(particle, tally.lastTime.length);
      tally.lastTime.push(timeMs);
      tally.lastLon.push(lon);
      tally.lastLat.push(lat);
      tally.lastAshore.push(ashore);
    } else if (timeMs >= (tally.lastTime[slot] ?? -Infinity)) {
      tally.lastTime[slot] = timeMs;
      tally.lastLon[slot] = lon;
      tally.lastLat[slot] = lat;
      tally.lastAshore[slot] = ashore;
    }
    return true;
  }

  /** Seasons with at least one position, oldest first. */
  seasonIds(): string[] {
    const start = (id: string): string => seasonRange(id, this.seasons)?.start ?? id;
    return [...this.tallies.keys()].sort((a, b) => (start(a) < start(b) ? -1 : start(a) > start(b) ? 1 : 0));
  }

  arrivalsOf(season: string): Int32Array | null {
    return this.tallies.get(season)?.arrivals ?? null;
  }

  /** Last positions in the season of particles not ashore. */
  endOfSeason(season: string): EndOfSeasonPositions {
    const tally = this.tallies.get(season);
    if (!tally) return { season, lon: new Float64Array(0), lat: new Float64Array(0) };
    const lon: number[] = [];
    const lat: number[] = [];
    for (let i = 0; i < tally.lastTime.length; i++) {
      if (tally.lastAshore[i]) continue;
      lon.push(tally.lastLon[i] ?? 0);
      lat.push(tally.lastLat[i] ?? 0);
    }
    return { season, lon: Float64Array.from(lon), lat: Float64Array.from(lat) };
  }
}
