/**
 * The shapes of a season's evaluation (see evaluate-season.ts) and of the trend engine it asks.
 */
import type { LevelInputs } from '../risk/assess-level.ts';
import type { SeriesPoint, TrendOptions, TrendResult } from '../stats/types.ts';
import type { SeasonValue } from './series.ts';
import type { AccumulationZone, Direction, DriftBulletin, IndicatorId, LevelResult, Observation, SeasonRef } from './types.ts';

/** The statistics the model needs; the real one is in trend-engine.ts, tests may pass their own. */
export interface TrendEngine {
  analyze(points: SeriesPoint[], options: TrendOptions & { minValues?: number; minYears?: number }): TrendResult;
  /** Benjamini–Hochberg adjusted p-values, same order as the input. */
  adjust(pValues: readonly number[]): number[];
  /** Regional Kendall over several segments' series (sites as blocks); null when it cannot run. */
  regional(series: { site: string; points: SeriesPoint[] }[], options: { confidence: number }): RegionalResult | null;
  /**
   * Optional: every series of a season at once (same results as `analyze` one by one, in request
   * order; an error is returned, not thrown), so an engine can spread them over several cores.
   */
  analyzeMany?(requests: readonly TrendRequest[]): TrendOutcome[];
}

export interface TrendRequest {
  points: SeriesPoint[];
  options: TrendOptions & { minValues?: number; minYears?: number };
}

/** The result of one request, or the message of the error it raised. */
export type TrendOutcome = { result: TrendResult } | { error: string };

export interface RegionalResult {
  S: number | null;
  z: number | null;
  p: number | null;
  slope: number | null;
  /** false when p is the plain test's because the cross-site covariance correction could not be computed */
  covarianceCorrected?: boolean;
  /**
   * The van Belle & Hughes (1984) chi-square test for homogeneity of the trends across the sites
   * (χ² = Σ Z_k² − K·Z̄², df K − 1); null when fewer than two sites have a trend test.
   */
  homogeneity?: { chi2: number; df: number; p: number } | null;
}

export interface IndicatorEvaluation {
  indicator: IndicatorId;
  values: SeasonValue[];
  observations: Observation[];
  trend: TrendResult | null;
  pValue: number | null;
  qValue: number | null;
  direction: Direction;
  probabilityUp: number | null;
  seasonValue: number | null;
  /** true when the season's median is a sample reported below the lab's detection limit (then seasonValue is that limit) */
  seasonValueCensored: boolean;
  assessmentValue: number | null;
  /** the same for the median of the last four seasons */
  assessmentValueCensored: boolean;
  cleanCoastIndex: number | null;
  regionPercentile: number | null;
  segmentsTested: number;
  sampleCount: number;
  yearSpan: { first: number; last: number } | null;
}

export interface SegmentEvaluation {
  segmentId: string;
  indicators: IndicatorEvaluation[];
  drift: DriftBulletin | null;
  level: LevelResult;
  /** The measures the level was assessed on (to explain a level change). */
  levelInputs: LevelInputs;
}

export interface SeasonEvaluation {
  season: SeasonRef;
  segments: Map<string, SegmentEvaluation>;
  regional: { indicator: IndicatorId; result: RegionalResult | null; segments: number }[];
  /** The same test over each area's own segments, when the coast is shown by areas (areas.ts). */
  areaRegional?: { area: string; indicator: IndicatorId; result: RegionalResult | null; segments: number }[];
  zones: AccumulationZone[];
}
