/**
 * Input keys: the SHA-256 of everything one result is computed from, so a build can take the
 * result of an earlier build whose key is the same (generator/publish/cache/model-memo.ts). The code
 * that computes the results is not in these keys: the memo as a whole belongs to one code
 * fingerprint and is dropped when it changes.
 *
 * - series key: one series of one season (season-series.ts) — its records dated up to the end of
 *   the season, every field a series' evaluation reads; the indicator's monitored span; the
 *   segment's modelled arrivals (for the drift indicator); the whole scenario settings.
 * - regional key: one Regional Kendall test — the series keys of the segments taking part.
 * - bulletin key: one bulletin (compose-bulletin.ts) — the segment, the publication, the
 *   settings, and for this season and the one before the segment's series keys and verdicts
 *   (judge-season.ts: q-values, directions, percentiles, drift, level).
 */
import { createHash } from 'node:crypto';
import type { DriftArrivals, Record as ScenarioRecord, Segment } from '../scenario/types.ts';
import type { SegmentVerdict } from './judge-season.ts';
import type { MonitoredSpan } from './season-series.ts';
import type { IndicatorId } from './types.ts';

/** Changes whenever what goes into a key changes (old entries then never match). */
const keyScheme = 'wrackline-input-keys-1';

function sha256(parts: readonly string[]): string {
  const hash = createHash('sha256');
  for (const part of parts) hash.update(`${part.length}:${part}`);
  return hash.digest('hex');
}

/** The fields of a record that a series' evaluation reads, as text. */
export function recordText(record: ScenarioRecord): string {
  return JSON.stringify([record.date, record.t, record.season, record.seasonName, record.value, record.censored, record.extra]);
}

export function seriesInputKey(input: {
  settings: string;
  seasonId: string;
  indicator: IndicatorId;
  segmentId: string;
  monitored: MonitoredSpan | null;
  /** recordText of each record of the series dated up to the season's end, in file order */
  records: readonly string[];
  /** the segment's modelled arrivals, every season (drift indicator only, else empty) */
  drift: readonly DriftArrivals[];
}): string {
  return sha256([
    keyScheme,
    'series',
    input.settings,
    input.seasonId,
    input.indicator,
    input.segmentId,
    JSON.stringify(input.monitored),
    JSON.stringify(input.drift),
    ...input.records,
  ]);
}

export function regionalInputKey(seasonId: string, indicator: IndicatorId, confidence: number, sites: readonly { site: string; key: string }[]): string {
  return sha256([keyScheme, 'regional', seasonId, indicator, String(confidence), ...sites.map((s) => `${s.site}\u0000${s.key}`)]);
}

export interface SeasonSide {
  seasonId: string;
  /** series key of each indicator at this segment, in the order of indicatorIds */
  seriesKeys: readonly string[];
  verdict: SegmentVerdict;
}

export function bulletinInputKey(input: {
  settings: string;
  segment: Segment;
  published: string;
  publishedSeasons: readonly string[];
  now: SeasonSide;
  before: SeasonSide | null;
}): string {
  const side = (s: SeasonSide | null): string => (s === null ? 'none' : JSON.stringify([s.seasonId, s.seriesKeys, s.verdict]));
  return sha256([
    keyScheme,
    'bulletin',
    input.settings,
    JSON.stringify(input.segment),
    input.published,
    JSON.stringify([...input.publishedSeasons].sort()),
    side(input.now),
    side(input.before),
  ]);
}
