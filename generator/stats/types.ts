/**
 * Result types of the trend engine. Field names of MannKendallResult, SenResult and
 * SeasonalKendallResult are a public contract: `wrackline trend --json` prints them as is.
 * Undefined quantities are null, never NaN.
 */

/** One value of a series. `censored` means the value was reported as "<value" (below detection). */
export interface SeriesPoint {
  t: number; // time, e.g. decimal year
  value: number | null; // null = missing
  censored?: boolean;
  season?: string; // season name for the Seasonal Kendall test ("winter", …)
  /** Cycle (e.g. the year a winter belongs to) for the Hirsch & Slack covariance; defaults to ⌊t⌋. */
  cycle?: number;
}

export interface MannKendallResult {
  S: number;
  varS: number;
  z: number | null;
  p: number | null; // two-sided, normal approximation with continuity correction
  tau: number | null; // Kendall's tau-b
  pExact?: number | null; // exact null distribution of S, n ≤ 10 and no ties
  /** Kendall's tau-a, S / [n(n−1)/2] (the form EnvStats prints). */
  tauA?: number | null;
}

export interface SenResult {
  slope: number | null;
  lower: number | null;
  upper: number | null;
  intercept: number | null;
  confidence: number;
  /** Set when the slope cannot be estimated (e.g. censoring makes it meaningless). */
  notEstimable?: string | null;
}

export interface SeasonalKendallResult {
  S: number;
  varS: number;
  z: number | null;
  p: number | null;
  tau: number | null;
  slope: number | null;
  lower: number | null;
  upper: number | null;
  /** Hirsch & Slack (1984) covariance-corrected variance and p. */
  varSCovariance: number | null;
  pCovariance: number | null;
  /** van Belle & Hughes (1984) test of homogeneous seasonal trends. */
  heterogeneity: { chi2: number; df: number; p: number } | null;
  seasons: { season: string; n: number; S: number; varS: number }[];
  /** S′ / Σ n_g(n_g−1)/2 (the form EnvStats prints). */
  tauA?: number | null;
  /** z from the covariance-corrected variance. */
  zCovariance?: number | null;
  /** Number of within-season slopes. */
  nSlopes?: number;
}

export interface SerialCorrectionResult {
  method: 'hamed-rao-1998';
  factor: number; // n/n*
  varS: number;
  z: number | null;
  p: number | null;
}

export interface TrendBand {
  t: number[];
  fit: number[];
  lower: number[];
  upper: number[];
  resamples: number;
  blockLength: number;
  seed: number;
}

export interface TrendResult {
  n: number; // values used
  nCensored: number;
  mannKendall: MannKendallResult | null;
  sen: SenResult | null;
  seasonalKendall?: SeasonalKendallResult | null;
  serialCorrection?: SerialCorrectionResult | null;
  probabilityUp?: number | null;
  band?: TrendBand | null;
  /** Set when the data cannot support a claim; the bulletin says "too little data" with this reason. */
  insufficient: { rule: string; reason: string } | null;
}

export interface TrendOptions {
  /** Confidence level of the slope interval; defaults to 0.95. */
  confidence?: number;
  /** Run the Seasonal Kendall test on `season`; defaults to false. */
  seasonal?: boolean;
  /** Bootstrap band and probability of an upward trend; defaults to off. */
  bootstrap?: { resamples: number; seed: number } | false;
}
