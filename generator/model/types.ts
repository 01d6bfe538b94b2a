/**
 * The bulletin model: the one contract between the build step (generator/) and the
 * renderer (site/). generator/ writes it as JSON files; site/ renders only from it.
 *
 * Files written by the build step into the model folder (WRACKLINE_MODEL):
 *   regions/<seasonId>.json             RegionSummary, one per published season
 *   bulletins/<seasonId>/<segmentId>.json  Bulletin, one per segment per published season
 *   site.json                           SiteModel (seasons list, settings digest, manifest, validation report)
 *
 * Every number a sentence prints is also present as a number here, so a test can check the
 * sentence against the model. Undefined quantities are null, never NaN.
 */
import type { TrendResult } from '../stats/types.ts';

/** Season of a given year, e.g. "2026-autumn". Winter of 2026 = Dec 2025 to Feb 2026. */
export type SeasonId = string;

export type IndicatorId = 'beach-litter' | 'water-microplastics' | 'shellfish-tissue' | 'wildlife-reports' | 'drift-arrivals';

/** The four levels, and 'not-set': no survey in the last four seasons and no rule from other evidence. */
export type LevelId = 'scant' | 'noticeable' | 'marked' | 'heavy' | 'not-set';

export type SegmentKind = 'beach' | 'bay' | 'harbour' | 'estuary' | 'island-shore' | 'rocky-shore' | 'lagoon';

export type ShellfishUse = 'farmed' | 'gathered' | 'farmed-and-gathered' | 'none';

export interface SeasonRef {
  id: SeasonId; // "2026-autumn"
  label: string; // "Autumn 2026"
  start: string; // ISO 8601 date, first day
  end: string; // ISO 8601 date, last day
}

export interface Contact {
  role: 'shellfish-sanitation' | 'public-health' | 'debris-report' | 'publisher' | 'wildlife-rescue';
  name: string;
  phone?: string;
  email?: string;
  url?: string;
}

export interface SegmentInfo {
  id: string; // URL-safe slug
  name: string; // plain text from the input; always escaped on output
  kind: SegmentKind;
  shellfish: ShellfishUse;
  place: string | null; // nearest locality, plain text
  lengthKm: number; // geodesic length of the segment line
  /** GeoJSON geometry (WGS84 lon/lat), simplified for maps. */
  geometry: GeoJSON.Geometry;
  /** [west, south, east, north] */
  bbox: [number, number, number, number];
}

export interface Observation {
  date: string; // ISO 8601 date of the survey or sample
  t: number; // decimal year
  season: SeasonId;
  value: number | null; // normalised value in the indicator's unit; for censored = detection limit
  censored: boolean; // true when reported as "<x"
  note?: string; // e.g. species, mesh size
}

/** Samples of one season in one line (generator/model/sample-summary.ts). */
export interface SeasonSampleSummary {
  season: SeasonId;
  /** Decimal year where the summary is drawn: the median time of the season's samples. */
  t: number;
  samples: number;
  median: number;
  lowest: number;
  highest: number;
  /** Samples reported below the lab's detection limit (counted at the limit). */
  belowDetection: number;
}

export type Direction = 'rising' | 'falling' | 'no-clear-direction' | 'too-little-data';

export interface IndicatorBulletin {
  indicator: IndicatorId;
  label: string; // "Beach litter"
  unit: string; // "items per 100 m of beach"
  unitShort: string; // "items/100 m"
  observations: Observation[]; // everything up to the end of the season, oldest first
  /** Value for the published season alone (median of its samples), null when none. */
  seasonValue: number | null;
  /**
   * True when that median is a sample reported below the lab's detection limit ("<x"): then
   * seasonValue is the limit, not a measurement, and every text says "below the lab's detection limit".
   */
  seasonValueCensored: boolean;
  /** seasonValue as the bulletin prints it ("0.62", "below the lab's detection limit (0.05)"), null when none. */
  seasonValueText: string | null;
  /** Median over the last four seasons (the assessment value), null when none. */
  assessmentValue: number | null;
  /** True when that median is below the lab's detection limit (as seasonValueCensored). */
  assessmentValueCensored: boolean;
  trend: TrendResult | null; // null when there is no data at all
  /** Benjamini–Hochberg q-value of this segment's trend among all segments, this indicator. */
  qValue: number | null;
  direction: Direction;
  /** Probability the trend is upward (bootstrap), null when unknown. */
  probabilityUp: number | null;
  likelihoodWords: string | null; // "very likely", from one documented scheme
  threshold: { value: number; label: string; source: string } | null;
  /** Plain-language sentences about this indicator, in order. */
  sentences: string[];
  /** Short text alternative for the chart. */
  chartDescription: string;
  seasonsDisagree: boolean;
  /**
   * For indicators counted per season (animals reported): the season totals the trend is computed
   * on, oldest first, a monitored season with no report counting 0; `date` is the season's last day.
   * Absent where the trend uses the samples themselves.
   */
  seasonTotals?: Observation[];
  /**
   * Where the samples are too many to draw or list one by one (more than 400), one summary per
   * season (count, median, lowest, highest), which the chart and the data table show instead.
   * Absent otherwise, and for season totals.
   */
  sampleSummaries?: SeasonSampleSummary[];
}

export interface RuleHit {
  ruleId: string;
  level: LevelId;
  text: string; // "Median beach litter 43 items/100 m is at or above 20 (EU threshold value)"
}

export interface LevelResult {
  id: LevelId;
  rank: 0 | 1 | 2 | 3 | 4; // 0 for 'not-set'
  label: string; // our own words
  hits: RuleHit[]; // rules that matched; the highest sets the level
  /**
   * Where no survey was made in the last four seasons: why no level is set ("No survey here in
   * the last four seasons; the last, in autumn 2022, found 62 items per 100 m of beach."), or, when
   * other evidence (the drift model) still sets a level, that it alone set it. Absent otherwise.
   */
  note?: string;
}

export interface AccumulationZone {
  id: string; // "zone-1"
  lon: number;
  lat: number;
  particles: number;
  radiusKm: number;
  hull: [number, number][]; // convex hull, lon/lat
}

export interface DriftBulletin {
  arrivals: number; // modelled particles arriving this season
  arrivalsPerKm: number;
  regionPercentile: number; // 0..100 among segments this season
  nearestZone: { id: string; distanceKm: number } | null;
}

export interface Caution {
  id: string; // "not-a-closure", "check-authority", …
  text: string;
}

/** A note from the publisher (scenario settings), in a safe subset of Markdown, rendered in its own box. */
export interface PublisherNote {
  /** "segment": about this segment and season; "season": about the whole season. */
  scope: 'segment' | 'season';
  /** Markdown source; the site renders links, emphasis and lists only and escapes the rest. */
  text: string;
}

export interface Bulletin {
  schemaVersion: 1;
  invented: boolean; // demo data: every page says so
  season: SeasonRef;
  previousSeason: SeasonRef | null;
  /**
   * Whether the previous season (the calendar season before) has a bulletin of its own. It may
   * not (e.g. 2026-spring before the first published season): then link no bulletin for it.
   */
  previousSeasonPublished?: boolean;
  published: string; // ISO date from the scenario, never the clock
  correction: { date: string; reason: string } | null;
  /** Notes from the publisher for this bulletin, season-wide first; absent when none. */
  notes?: PublisherNote[];
  segment: SegmentInfo;
  level: LevelResult;
  previousLevel: LevelResult | null;
  headline: string; // one sentence
  summary: string[]; // 2–4 sentences: level now and last season, main trend
  changes: string[]; // "what changed since last season"
  indicators: IndicatorBulletin[];
  drift: DriftBulletin | null;
  sections: {
    growers: { title: string; sentences: string[] } | null; // only where shellfish ≠ none
    visitors: { title: string; sentences: string[] };
    reporters: {
      keyNumbers: { label: string; value: string }[];
      citation: string;
      /** Site-relative links to the data and the methods (optional). */
      links?: { label: string; href: string }[];
    };
  };
  cautions: { shellfish: Caution[]; debris: Caution[] };
  authorities: Contact[];
  permalink: string; // "/seasons/2026-autumn/<segment>/"
}

export interface RegionalTrend {
  indicator: IndicatorId;
  label: string;
  S: number | null;
  z: number | null;
  p: number | null;
  slope: number | null;
  unitShort: string;
  sentence: string;
  /** van Belle & Hughes (1984) homogeneity of the trends across places; null when not computed. */
  homogeneity?: { chi2: number; df: number; p: number } | null;
  /** Places whose own trend is claimed rising / falling (the bulletins' q-value rule). */
  placesUp?: number;
  placesDown?: number;
}

/** A piece of a sentence; with a segment id, the page links the text to that segment's bulletin. */
export interface HeadlinePart {
  text: string;
  segmentId?: string;
}

export interface RegionSummary {
  schemaVersion: 1;
  invented: boolean;
  season: SeasonRef;
  published: string;
  region: { id: string; name: string; description: string };
  publisher: Contact;
  /** Season-wide notes from the publisher; absent when none. */
  notes?: PublisherNote[];
  segments: {
    id: string;
    name: string;
    kind: SegmentKind;
    shellfish: ShellfishUse;
    level: LevelResult;
    previousLevel: LevelResult | null;
    directions: Partial<Record<IndicatorId, Direction>>;
    geometry: GeoJSON.Geometry;
  }[];
  regionalTrends: RegionalTrend[];
  zones: AccumulationZone[];
  headline: string;
  /** The headline in parts (joined they are `headline`); the places named in it carry their segment id. */
  headlineParts?: HeadlinePart[];
  summary: string[];
  /** Cautions for the region page (it mentions shellfish whenever any segment has shellfish data). */
  cautions?: { shellfish: Caution[]; debris: Caution[] };
  /** The authorities named in the scenario, with their contacts. */
  authorities?: Contact[];
  /**
   * A national coast's areas (generator/model/areas.ts), present when the overview shows areas
   * instead of every segment; each area has a page of its own.
   */
  areas?: AreaSummary[];
}

export interface AreaSummary {
  id: string; // URL-safe slug, "area-…"
  number: number; // 1…, in order along the coast; the badge on the overview map
  name: string;
  segmentIds: string[]; // in the order of the area's table and map list
  level: Pick<LevelResult, 'id' | 'rank' | 'label'>; // the highest level in the area
  counts: { level: LevelId; rank: number; label: string; n: number }[]; // every level, highest first
  headline: string;
  summary: string[];
  /** Regional Kendall over the area's own segments, per indicator */
  regionalTrends: RegionalTrend[];
}

/** What every map draws besides the segments: land and the place names of the overview. */
export interface SiteMapModel {
  /** land polygons (resource role "land"), simplified for drawing; null when not given */
  land: GeoJSON.MultiPolygon | null;
  /** the same land simplified further, for the small inset of locator maps */
  landCoarse: GeoJSON.MultiPolygon | null;
  /** place names printed on the overview map, most important first */
  places: { name: string; lon: number; lat: number; segments: number }[];
  /** what the caption says about land and sea */
  seaNote: string;
}

export interface ValidationIssue {
  file: string; // path relative to the scenario folder
  row: number | null; // 1-based data row (header = row 1 of the file is reported as row 1)
  column: string | null;
  value: string | null;
  expected: string;
  message: string;
  severity: 'error' | 'warning';
  excluded: boolean; // the record was left out of the bulletin
  /** Catalogue entry name (generator/errors.ts), e.g. "DuplicateKey". */
  code?: string;
  /** How to fix the input, from the catalogue. */
  hint?: string;
}

export interface ValidationReport {
  ok: boolean; // no errors
  files: { file: string; read: number; kept: number; excluded: number }[];
  issues: ValidationIssue[];
  /** Causes with more issues than the reader keeps one by one: how many more were only counted. */
  omitted?: { file: string; code: string; column: string | null; count: number; severity: 'error' | 'warning'; excluded: boolean }[];
}

/** The notice on every page when the figures are not real, final results (bulletin/data-notice.ts). */
export interface DataNotice {
  kind: 'demo' | 'test-data' | 'provisional';
  title: string;
  text: string;
}

export interface SiteModel {
  schemaVersion: 1;
  invented: boolean;
  /** the notice every page shows; null when the figures are real, final results */
  notice?: DataNotice | null;
  generator: { name: 'wrackline'; version: string };
  region: { id: string; name: string; description: string };
  seasons: (SeasonRef & { published: string; current: boolean })[];
  manifest: { file: string; sha256: string; bytes: number }[];
  validation: ValidationReport;
  settingsDigest: {
    riskRules: { id: string; level: LevelId; text: string }[];
    /** Where the rules come from: the scenario's settings, or the built-in table (and which of it applies). */
    riskRulesNote: string;
    confidence: number;
    falseDiscoveryRate: number;
  };
  /** Whether the scenario has drift-model input; without it no page speaks of the drift model. */
  driftModel: boolean;
  map?: SiteMapModel;
  /** The publisher's logo in every page header (model/publisher-logo.ts); absent when none. */
  publisherLogo?: PublisherLogoRef;
}

/** Where the built site serves the publisher's logo (a name made from its SHA-256), its kind and size (no alt text: the name is written beside it). */
export interface PublisherLogoRef {
  /** file name under /publisher-logo/, e.g. "3f2a…9c.png" */
  file: string;
  href: string;
  sha256: string;
  mediaType: string;
  width: number;
  height: number;
}
