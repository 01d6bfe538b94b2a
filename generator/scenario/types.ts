/**
 * What the readers hand to the rest of the build: a validated, typed scenario.
 * Produced by `loadScenario(dir)` in generator/read/load-scenario.ts. Reading never throws on
 * bad data: every problem lands in `report`; only an unreadable scenario folder throws a
 * ScenarioError (generator/errors.ts).
 */
import type { IndicatorId, SegmentKind, ShellfishUse, ValidationReport, AccumulationZone } from '../model/types.ts';
import type { ScenarioSettings } from './settings.ts';
import type { MultiPolygon } from 'geojson';

export interface Segment {
  id: string;
  name: string;
  kind: SegmentKind;
  shellfish: ShellfishUse;
  place: string | null;
  /** the area the segments file puts it in (property "area"), for national coasts */
  area?: string;
  lengthKm: number;
  geometry: GeoJSON.Geometry; // as read, WGS84 lon/lat
  bbox: [number, number, number, number];
}

/** One kept record of a monitoring table, normalised to the indicator's unit. */
export interface Record {
  indicator: IndicatorId;
  segmentId: string;
  date: string; // ISO 8601 date
  t: number; // decimal year
  season: string; // "2026-autumn"
  seasonName: string; // "autumn"
  value: number | null; // normalised; for censored = detection limit
  censored: boolean;
  /** Extra numbers some rules need, e.g. cleanCoastIndex for beach litter. */
  extra: { [key: string]: number | string | null };
  source: { file: string; row: number };
}

/** Modelled drift results for one segment and one season. */
export interface DriftArrivals {
  segmentId: string;
  season: string;
  arrivals: number;
  arrivalsPerKm: number;
  nearestZone: { id: string; distanceKm: number } | null;
}

export interface InputFile {
  file: string; // relative to the scenario folder
  sha256: string;
  bytes: number;
}

export interface LoadedScenario {
  dir: string;
  settings: ScenarioSettings;
  segments: Segment[];
  records: Record[]; // all indicators, sorted by indicator, segment, date
  /** land polygons for the maps (resource role "land"), simplified; absent when not given */
  land?: LandShapes | null;
  drift: { arrivals: DriftArrivals[]; zones: { season: string; zones: AccumulationZone[] }[] } | null;
  inputs: InputFile[];
  /** the publisher's logo (setting `publisherLogo`), checked by read/publisher-logo.ts; absent when none */
  publisherLogo?: PublisherLogo | null;
  report: ValidationReport;
}

/** The publisher's logo as read: its bytes, their SHA-256, and the kind and size told by its header. */
export interface PublisherLogo {
  file: string; // as named in the settings, relative to the scenario folder
  sha256: string;
  bytes: Uint8Array;
  type: 'png' | 'jpeg' | 'webp';
  mediaType: string;
  width: number;
  height: number;
}

/** Land polygons for the maps (the optional `land` resource, read by read/read-land.ts). */
export interface LandShapes {
  geometry: MultiPolygon;
  coarse: MultiPolygon;
  verticesRead: number;
  verticesKept: number;
}
