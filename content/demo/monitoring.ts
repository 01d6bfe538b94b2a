/**
 * Invented monitoring series for the demo coast, one recipe per segment and indicator, shaped so
 * that every kind of trend sentence has an example. Values are drawn on a log scale:
 *   log value = log(level) + trend·years + seasonal offset + step + AR(1) noise.
 *
 * Magnitudes stay inside published ranges:
 * - Beach litter, items > 2.5 cm per 100 m: tens to hundreds. EU 2015–2016 baseline means were
 *   150 (EU), 233 (north-east Atlantic), 274 (Mediterranean); the EU threshold value is 20 items per
 *   100 m, the 15th percentile of that baseline (Van Loon et al. 2020, JRC, "A European Threshold
 *   Value and Assessment Method for Macro Litter on Coastlines").
 * - Shellfish tissue: mostly below 1 particle per g wet weight (Van Cauwenberghe & Janssen 2014,
 *   Environ. Pollut. 193:65–70: oysters 0.47 ± 0.16 per g; Danopoulos et al. 2020, EHP 128(12)
 *   126002: most studies below 1 per g).
 * - Surface water, particles per m³ in net tows: spans orders of magnitude, roughly 10⁻³ to 10²
 *   (from memory, unverified; no single published range is cited for this).
 * - Wildlife reports: a few animals per season on a segment (invented; no published rate used).
 */
import { createSeededRandom, type SeededRandom } from '../../generator/random/seeded-random.ts';
import { DEMO_SEASONS, decimalYear, isoDate, type DemoSeason } from './seasons.ts';

export type Sampling =
  | { kind: 'every'; skipChance?: number }
  /** Only the listed season indices (0 = 2017-winter). */
  | { kind: 'only'; seasons: number[] }
  /** Every season except those in the listed inclusive index ranges. */
  | { kind: 'gaps'; gaps: [number, number][]; skipChance?: number }
  /** Only one season of the year (0 winter … 3 autumn). */
  | { kind: 'one-season'; season: number };

export interface SeriesRecipe {
  /** Median level at the start of 2017, in the indicator's unit. */
  level: number;
  /** Change of the log value per year (0.1 ≈ +10 % a year). */
  trendPerYear?: number;
  /** Log offsets for winter, spring, summer, autumn. */
  seasonal?: [number, number, number, number];
  /** Log trend per year for each season separately (seasons that disagree). */
  seasonTrends?: [number, number, number, number];
  /** From this season index on, values are multiplied by `factor`. */
  step?: { fromSeason: number; factor: number };
  /** Lag-1 autocorrelation of the log noise, between seasons. */
  ar1?: number;
  /** Standard deviation of the log noise. */
  noise: number;
  sampling?: Sampling;
  /** Values below this are written as "<limit". */
  detectionLimit?: number;
}

export interface WildlifeRecipe {
  /** Mean number of reports per season at the start and at the end of the record. */
  startRate: number;
  endRate: number;
  entanglementShare: number;
}

export interface BeachSurveyPlan {
  series: SeriesRecipe;
  surveyedLengthM: number;
  /** Width of the surveyed strip, when the survey records area (Clean Coast Index). */
  stripWidthM?: number;
  plasticShare: number;
}

export interface SegmentRecipe {
  segmentId: string;
  /** What this segment shows, in plain words (listed in the README). */
  shows: string[];
  beach?: BeachSurveyPlan;
  water?: SeriesRecipe & { meshUm: number };
  shellfish?: SeriesRecipe & { species: string };
  wildlife?: WildlifeRecipe;
}

const SEASONAL_STORMS: [number, number, number, number] = [0.9, 0.15, -0.85, 0.25];

/** The recipes, one per segment (in the order of the segment plans). */
export const SEGMENT_RECIPES: SegmentRecipe[] = [
  {
    segmentId: 'vellan-head',
    shows: ['wildlife entanglement reports rising', 'surface water flat'],
    water: { level: 0.4, noise: 0.35, meshUm: 333 },
    wildlife: { startRate: 0.3, endRate: 2.6, entanglementShare: 0.8 },
  },
  {
    segmentId: 'corrab-sands',
    shows: ['beach litter rising clearly (about +11 % a year)', 'above the 20 items/100 m threshold', 'Clean Coast Index data'],
    beach: { series: { level: 38, trendPerYear: 0.11, noise: 0.22 }, surveyedLengthM: 100, stripWidthM: 20, plasticShare: 0.8 },
  },
  {
    segmentId: 'ostry-beach',
    shows: ['beach litter falling clearly (about −10 % a year)', 'well above the threshold throughout', 'Clean Coast Index data', 'one bad row (negative count)'],
    beach: { series: { level: 290, trendPerYear: -0.1, noise: 0.2 }, surveyedLengthM: 100, stripWidthM: 15, plasticShare: 0.82 },
  },
  {
    segmentId: 'ketterow-rocks',
    shows: ['gathered mussels flat, below 1 particle/g', 'surface water flat'],
    shellfish: { level: 0.3, noise: 0.3, species: 'blue mussel', detectionLimit: 0.05 },
    water: { level: 0.5, noise: 0.35, meshUm: 333 },
  },
  {
    segmentId: 'ithmere-bay-north',
    shows: ['farmed mussels rising to about 1 particle/g', 'beach litter flat', 'surface water flat'],
    shellfish: { level: 0.36, trendPerYear: 0.12, noise: 0.18, species: 'blue mussel', detectionLimit: 0.05 },
    beach: { series: { level: 60, noise: 0.25 }, surveyedLengthM: 100, plasticShare: 0.75 },
    water: { level: 0.8, noise: 0.3, meshUm: 333 },
  },
  {
    segmentId: 'ithmere-bay-south',
    shows: ['farmed oysters falling', 'beach litter flat', 'a few wildlife reports'],
    shellfish: { level: 0.8, trendPerYear: -0.1, noise: 0.2, species: 'Pacific oyster', detectionLimit: 0.05 },
    beach: { series: { level: 70, noise: 0.25 }, surveyedLengthM: 100, plasticShare: 0.75 },
    wildlife: { startRate: 0.3, endRate: 0.3, entanglementShare: 0.5 },
  },
  {
    segmentId: 'pellow-strand',
    shows: ['beach litter flat (no clear direction)', 'Clean Coast Index data'],
    beach: { series: { level: 45, noise: 0.2 }, surveyedLengthM: 100, stripWidthM: 25, plasticShare: 0.78 },
  },
  {
    segmentId: 'garrith-beach',
    shows: ['beach litter strongly seasonal (winter storms), no trend'],
    beach: { series: { level: 70, seasonal: SEASONAL_STORMS, noise: 0.15 }, surveyedLengthM: 100, plasticShare: 0.8 },
  },
  {
    segmentId: 'quarrow-harbour',
    shows: [
      'beach litter step change (jump of about 2.6× from 2021-spring)',
      'heavy litter, far above the threshold',
      'high surface-water counts',
      'Clean Coast Index data (narrow strip)',
      'ingestion reports',
    ],
    beach: { series: { level: 130, step: { fromSeason: 17, factor: 2.6 }, noise: 0.15 }, surveyedLengthM: 100, stripWidthM: 4, plasticShare: 0.86 },
    water: { level: 6, step: { fromSeason: 17, factor: 1.8 }, noise: 0.3, meshUm: 333 },
    wildlife: { startRate: 0.5, endRate: 0.8, entanglementShare: 0.3 },
  },
  {
    segmentId: 'quarrow-town-beach',
    shows: ['beach litter with strongly autocorrelated noise (long runs up and down), no underlying trend'],
    beach: { series: { level: 90, ar1: 0.85, noise: 0.35 }, surveyedLengthM: 100, plasticShare: 0.8 },
  },
  {
    segmentId: 'sennick-point',
    shows: ['sparse surface-water samples', 'occasional wildlife reports'],
    water: { level: 0.6, noise: 0.4, meshUm: 333, sampling: { kind: 'only', seasons: [2, 9, 14, 21, 26, 33, 38] } },
    wildlife: { startRate: 0.2, endRate: 0.2, entanglementShare: 0.6 },
  },
  {
    segmentId: 'brenna-sands',
    shows: ['beach litter rising moderately', 'gathered cockles with some values below detection', 'surface water rising'],
    beach: { series: { level: 50, trendPerYear: 0.07, noise: 0.22 }, surveyedLengthM: 120, plasticShare: 0.8 },
    shellfish: { level: 0.08, noise: 0.5, species: 'cockle', detectionLimit: 0.05 },
    water: { level: 0.9, trendPerYear: 0.1, noise: 0.3, meshUm: 333 },
  },
  {
    segmentId: 'aldwen-estuary',
    shows: ['surface water rising strongly (river input)', 'gathered cockles flat', 'beach litter flat', 'entanglement reports'],
    water: { level: 1.5, trendPerYear: 0.14, noise: 0.25, meshUm: 333 },
    shellfish: { level: 0.5, noise: 0.25, species: 'cockle', detectionLimit: 0.05 },
    beach: { series: { level: 110, noise: 0.25 }, surveyedLengthM: 85, plasticShare: 0.84 },
    wildlife: { startRate: 0.6, endRate: 0.9, entanglementShare: 0.7 },
  },
  {
    segmentId: 'tolvar-beach',
    shows: ['seasons disagree: winter litter rising, summer litter falling (heterogeneous seasonal trends)'],
    beach: { series: { level: 60, seasonTrends: [0.2, 0, -0.2, 0], noise: 0.12 }, surveyedLengthM: 100, plasticShare: 0.8 },
  },
  {
    segmentId: 'fennock-dunes',
    shows: ['gappy beach-litter record (nothing from December 2018 to May 2022, and about a third of the other seasons skipped)'],
    beach: { series: { level: 30, noise: 0.25, sampling: { kind: 'gaps', gaps: [[8, 21]], skipChance: 0.3 } }, surveyedLengthM: 100, plasticShare: 0.75 },
  },
  {
    segmentId: 'crayle-rocks',
    shows: ['surface water mostly below detection (<0.05 particles/m³)', 'occasional wildlife reports'],
    water: { level: 0.035, noise: 0.5, meshUm: 333, detectionLimit: 0.05 },
    wildlife: { startRate: 0.15, endRate: 0.15, entanglementShare: 0.5 },
  },
  {
    segmentId: 'morrin-bay-north',
    shows: ['farmed mussels mostly below detection (<0.08 particles/g)', 'surface water flat'],
    shellfish: { level: 0.05, noise: 0.4, species: 'blue mussel', detectionLimit: 0.08 },
    water: { level: 0.3, noise: 0.3, meshUm: 333 },
  },
  {
    segmentId: 'morrin-bay-south',
    shows: ['farmed mussels seasonal (higher in summer), no trend', 'beach litter flat'],
    shellfish: { level: 0.3, seasonal: [-0.3, 0, 0.5, -0.2], noise: 0.15, species: 'blue mussel', detectionLimit: 0.05 },
    beach: { series: { level: 40, noise: 0.25 }, surveyedLengthM: 100, plasticShare: 0.78 },
  },
  {
    segmentId: 'lissow-beach',
    shows: ['too little data for any claim: three beach-litter surveys, all in 2026'],
    beach: { series: { level: 55, noise: 0.2, sampling: { kind: 'only', seasons: [37, 38, 39] } }, surveyedLengthM: 100, plasticShare: 0.8 },
  },
  {
    segmentId: 'varrack-sands',
    shows: ['beach litter falling moderately (about −9 % a year)'],
    beach: { series: { level: 60, trendPerYear: -0.09, noise: 0.2 }, surveyedLengthM: 100, plasticShare: 0.8 },
  },
  {
    segmentId: 'druan-cliffs',
    shows: ['very sparse wildlife reports only (mostly seasons with none)'],
    wildlife: { startRate: 0.1, endRate: 0.1, entanglementShare: 0.5 },
  },
  {
    segmentId: 'osselin-bay',
    shows: ['farmed oysters with a gappy record', 'surface water with autocorrelated noise'],
    shellfish: {
      level: 0.4,
      noise: 0.25,
      species: 'Pacific oyster',
      detectionLimit: 0.05,
      sampling: {
        kind: 'gaps',
        gaps: [
          [4, 11],
          [24, 29],
        ],
        skipChance: 0.25,
      },
    },
    water: { level: 0.7, ar1: 0.8, noise: 0.4, meshUm: 333 },
  },
  {
    segmentId: 'ebbal-cove',
    shows: ['beach litter flat', 'too little shellfish data (three samples)'],
    beach: { series: { level: 30, noise: 0.25 }, surveyedLengthM: 100, plasticShare: 0.75 },
    shellfish: { level: 0.25, noise: 0.2, species: 'cockle', detectionLimit: 0.05, sampling: { kind: 'only', seasons: [35, 37, 39] } },
  },
  {
    segmentId: 'wendrel-point',
    shows: ['beach surveys only from 2019 to 2022 (about three times the 20 items/100 m threshold), none in the last four seasons: no level is set', 'drift-model arrivals'],
    beach: {
      series: { level: 60, noise: 0.15, sampling: { kind: 'only', seasons: Array.from({ length: 16 }, (_, i) => 8 + i) } },
      surveyedLengthM: 100,
      plasticShare: 0.8,
    },
  },
  {
    segmentId: 'tamsk-beach',
    shows: ['beach litter flat, hovering near the 20 items/100 m threshold'],
    beach: { series: { level: 22, noise: 0.3 }, surveyedLengthM: 100, plasticShare: 0.75 },
  },
  {
    segmentId: 'quillet-beach',
    shows: ['weak, noisy rise that is not clear (a likely but unproven direction)'],
    beach: { series: { level: 40, trendPerYear: 0.03, noise: 0.45 }, surveyedLengthM: 100, plasticShare: 0.78 },
  },
  {
    segmentId: 'naddor-sands',
    shows: ['beach litter falling from above to below the threshold'],
    beach: { series: { level: 48, trendPerYear: -0.14, noise: 0.2 }, surveyedLengthM: 100, plasticShare: 0.75 },
  },
  {
    segmentId: 'ormsel-head',
    shows: ['surface water flat', 'occasional ingestion reports'],
    water: { level: 0.25, noise: 0.3, meshUm: 333 },
    wildlife: { startRate: 0.25, endRate: 0.25, entanglementShare: 0.2 },
  },
  {
    segmentId: 'tharra-island-west',
    shows: ['beach litter far below the threshold (a few items per 100 m)', 'surface water often below detection'],
    beach: { series: { level: 4, noise: 0.35 }, surveyedLengthM: 200, plasticShare: 0.7 },
    water: { level: 0.045, trendPerYear: 0.05, noise: 0.5, meshUm: 333, detectionLimit: 0.05 },
  },
  {
    segmentId: 'tharra-island-east',
    shows: ['beach litter surveyed in summer only (one season a year), low and flat'],
    beach: { series: { level: 9, noise: 0.3, sampling: { kind: 'one-season', season: 2 } }, surveyedLengthM: 200, plasticShare: 0.72 },
  },
];

export interface DrawnValue {
  season: DemoSeason;
  day: number; // day number of the sample
  value: number; // before any detection-limit censoring
}

function sampled(sampling: Sampling | undefined, season: DemoSeason, random: SeededRandom): boolean {
  const spec = sampling ?? { kind: 'every' };
  switch (spec.kind) {
    case 'every':
      return random.uniform() >= (spec.skipChance ?? 0.04);
    case 'only':
      return spec.seasons.includes(season.index);
    case 'gaps':
      if (spec.gaps.some(([from, to]) => season.index >= from && season.index <= to)) return false;
      return random.uniform() >= (spec.skipChance ?? 0);
    case 'one-season':
      return season.index % 4 === spec.season;
  }
}

/** Draw one value per sampled season following a recipe. Deterministic for a given random source. */
export function drawSeries(recipe: SeriesRecipe, random: SeededRandom, seasons: readonly DemoSeason[] = DEMO_SEASONS): DrawnValue[] {
  const out: DrawnValue[] = [];
  const phi = recipe.ar1 ?? 0;
  let noise = random.normal(0, recipe.noise);
  for (const season of seasons) {
    // AR(1) with the stated marginal standard deviation: e_k = φ e_{k−1} + √(1−φ²) σ z_k.
    noise = phi * noise + Math.sqrt(1 - phi * phi) * random.normal(0, recipe.noise);
    const keep = sampled(recipe.sampling, season, random);
    const dayOffset = random.integer(12, 78);
    if (!keep) continue;
    const day = season.startDay + dayOffset;
    const years = decimalYear(day) - 2017;
    const seasonSlot = season.index % 4;
    let logValue = Math.log(recipe.level) + (recipe.trendPerYear ?? 0) * years;
    logValue += recipe.seasonal?.[seasonSlot] ?? 0;
    logValue += (recipe.seasonTrends?.[seasonSlot] ?? 0) * years;
    if (recipe.step && season.index >= recipe.step.fromSeason) logValue += Math.log(recipe.step.factor);
    out.push({ season, day, value: Math.exp(logValue + noise) });
  }
  return out;
}

/** A number with three significant digits, written without exponent. */
export function threeDigits(value: number): string {
  if (value === 0) return '0';
  const digits = Math.max(0, 2 - Math.floor(Math.log10(Math.abs(value))));
  return String(Number(value.toFixed(Math.min(digits, 6))));
}

function censoredText(value: number, limit: number | undefined): string {
  if (limit !== undefined && value < limit) return `<${limit}`;
  return threeDigits(value);
}

export interface DemoTables {
  beachLitter: string[][];
  water: string[][];
  shellfish: string[][];
  wildlife: string[][];
}

export const TABLE_HEADERS = {
  beachLitter: ['survey_id', 'segment_id', 'date', 'surveyed_length_m', 'items', 'plastic_items', 'area_m2'],
  water: ['sample_id', 'segment_id', 'date', 'particles_per_m3', 'mesh_um'],
  shellfish: ['sample_id', 'segment_id', 'date', 'species', 'particles_per_g_ww'],
  wildlife: ['report_id', 'segment_id', 'date', 'kind', 'animals'],
} as const;

/** Deliberate bad rows, documented in the README, so the validation report has something to show. */
export const BAD_ROWS = {
  negativeCount: { table: 'tables/beach-litter.csv', segmentId: 'ostry-beach', seasonIndex: 30, items: -4 },
  unknownSegment: { table: 'tables/water-microplastics.csv', segmentId: 'north-spit', date: '2025-04-17' },
  futureDate: { table: 'tables/shellfish-tissue.csv', segmentId: 'ithmere-bay-north', date: '2027-02-14' },
};

function pad(n: number, width: number): string {
  return String(n).padStart(width, '0');
}

/** Generate all four monitoring tables (rows without header). */
export function makeTables(seed: number, recipes: readonly SegmentRecipe[] = SEGMENT_RECIPES, seasons: readonly DemoSeason[] = DEMO_SEASONS): DemoTables {
  const root = createSeededRandom(seed);
  const tables: DemoTables = { beachLitter: [], water: [], shellfish: [], wildlife: [] };
  let beachId = 0;
  let waterId = 0;
  let shellId = 0;
  let reportId = 0;

  for (const recipe of recipes) {
    if (recipe.beach) {
      const plan = recipe.beach;
      const random = root.derive(`${recipe.segmentId}/beach-litter`);
      for (const drawn of drawSeries(plan.series, random, seasons)) {
        const items = Math.max(0, Math.round((drawn.value * plan.surveyedLengthM) / 100));
        let plastic = 0;
        for (let i = 0; i < items; i++) if (random.uniform() < plan.plasticShare) plastic++;
        const area = plan.stripWidthM ? String(plan.surveyedLengthM * plan.stripWidthM) : '';
        const bad = BAD_ROWS.negativeCount;
        const written = recipe.segmentId === bad.segmentId && drawn.season.index === bad.seasonIndex ? bad.items : items;
        tables.beachLitter.push([
          `BL-${pad(++beachId, 5)}`,
          recipe.segmentId,
          isoDate(drawn.day),
          String(plan.surveyedLengthM),
          String(written),
          written < 0 ? '' : String(plastic),
          area,
        ]);
      }
    }
    if (recipe.water) {
      const random = root.derive(`${recipe.segmentId}/water`);
      for (const drawn of drawSeries(recipe.water, random, seasons)) {
        tables.water.push([`WM-${pad(++waterId, 5)}`, recipe.segmentId, isoDate(drawn.day), censoredText(drawn.value, recipe.water.detectionLimit), String(recipe.water.meshUm)]);
      }
    }
    if (recipe.shellfish) {
      const random = root.derive(`${recipe.segmentId}/shellfish`);
      for (const drawn of drawSeries(recipe.shellfish, random, seasons)) {
        tables.shellfish.push([
          `ST-${pad(++shellId, 5)}`,
          recipe.segmentId,
          isoDate(drawn.day),
          recipe.shellfish.species,
          censoredText(drawn.value, recipe.shellfish.detectionLimit),
        ]);
      }
    }
    if (recipe.wildlife) {
      const plan = recipe.wildlife;
      const random = root.derive(`${recipe.segmentId}/wildlife`);
      const last = Math.max(1, seasons.length - 1);
      for (const season of seasons) {
        const rate = plan.startRate + ((plan.endRate - plan.startRate) * season.index) / last;
        const reports = random.poisson(rate);
        const days: number[] = [];
        for (let r = 0; r < reports; r++) days.push(season.startDay + random.integer(0, season.endDay - season.startDay));
        days.sort((a, b) => a - b);
        for (const day of days) {
          const kind = random.uniform() < plan.entanglementShare ? 'entanglement' : 'ingestion';
          tables.wildlife.push([`WR-${pad(++reportId, 5)}`, recipe.segmentId, isoDate(day), kind, String(1 + random.poisson(0.4))]);
        }
      }
    }
  }

  // The two bad rows that are extra records rather than altered ones.
  tables.water.push([`WM-${pad(++waterId, 5)}`, BAD_ROWS.unknownSegment.segmentId, BAD_ROWS.unknownSegment.date, '0.42', '333']);
  tables.shellfish.push([`ST-${pad(++shellId, 5)}`, BAD_ROWS.futureDate.segmentId, BAD_ROWS.futureDate.date, 'blue mussel', '0.61']);
  return tables;
}

export function toCsv(header: readonly string[], rows: readonly string[][]): string {
  const quote = (cell: string) => (/[",\n]/.test(cell) ? `"${cell.replace(/"/g, '""')}"` : cell);
  return [header, ...rows].map((row) => row.map(quote).join(',')).join('\n') + '\n';
}
