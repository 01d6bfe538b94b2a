/**
 * assembleModelWithMemo: the bulletin model of assembleModel (assemble-model.ts), taking from a
 * memo of earlier builds whatever of it has the same inputs (input-keys.ts):
 * - a series whose key is known gives its summary (judge-season.ts) without being evaluated;
 * - a Regional Kendall test whose key is known gives its result;
 * - a bulletin whose key is known gives its model file, byte for byte.
 * Everything that compares segments (q-values, percentiles, levels) and the region summaries is
 * worked out afresh from the summaries every time, by the same code as a build without memo, and
 * a bulletin is composed only when its key is new. The bulletins come out written (stable-json.ts,
 * as write-model.ts writes them), ready for the model folder.
 *
 * With an empty memo the result equals assembleModel's, file for file; with a memo filled by any
 * earlier build it still does (test/model/assemble-with-memo.test.ts).
 */
import { createHash } from 'node:crypto';
import { indicatorIds } from '../indicators/index.ts';
import type { LoadedScenario, Record as ScenarioRecord } from '../scenario/types.ts';
import { modelScope, siteModel, type AssembleModelOptions } from './assemble-model.ts';
import { publisherLogoAsset } from './publisher-logo.ts';
import { composeBulletin } from './compose-bulletin.ts';
import { areaRegionalSites, scenarioAreas } from './areas.ts';
import { composeRegion, type RegionInputs } from './compose-region.ts';
import { regionalTrend, segmentEvaluation } from './evaluate-season.ts';
import type { IndicatorEvaluation, RegionalResult, SeasonEvaluation, SegmentEvaluation, TrendEngine } from './evaluation-types.ts';
import { bulletinInputKey, recordText, regionalInputKey, seriesInputKey, type SeasonSide } from './input-keys.ts';
import { judgeSeason, summarizeSeries, type SeasonVerdict, type SeriesSummary } from './judge-season.ts';
import { evaluateSeries, seasonContext, seasonSeries, seriesKey, seriesRecords, type SeasonContext, type SeasonSeries, type SeriesId } from './season-series.ts';
import { previousSeasonId } from './seasons.ts';
import type { IndicatorId, RegionSummary, SiteModel } from './types.ts';
import { listingOf, type BulletinListing } from './listing.ts';
import { stableJson } from './stable-json.ts';
import type { WrittenBulletin } from './written-bulletin.ts';

export type { WrittenBulletin };

/** Results of earlier builds by input key; `keep` records a result of this build. */
export interface ModelMemo {
  summary(key: string): SeriesSummary | undefined;
  keepSummary(key: string, summary: SeriesSummary): void;
  /** undefined: not known; null: the test could not run */
  regional(key: string): RegionalResult | null | undefined;
  keepRegional(key: string, result: RegionalResult | null): void;
  /**
   * The model file of a bulletin, its SHA-256 and listing, the file checked against the hash it
   * was stored with; undefined when unknown or damaged.
   */
  bulletin(key: string): { text: Buffer; sha256: string; listing: BulletinListing } | undefined;
  keepBulletin(key: string, text: Buffer, listing: BulletinListing): void;
}

export interface MemoModelSet {
  site: SiteModel;
  regions: RegionSummary[];
  bulletins: WrittenBulletin[];
  /** the publisher's logo file for the site (publisher-logo.ts); absent when none */
  publisherLogo?: { file: string; bytes: Uint8Array };
  counts: { seriesEvaluated: number; seriesReused: number; bulletinsComposed: number; bulletinsReused: number };
}

interface SeasonState {
  context: SeasonContext;
  keys: Map<string, string>;
  summaries: Map<string, SeriesSummary>;
  /** own evaluations of the series evaluated in this build */
  evaluated: Map<string, { series: SeasonSeries; evaluation: IndicatorEvaluation | null }>;
  verdict: SeasonVerdict;
  regional: SeasonEvaluation['regional'];
  areaRegional?: SeasonEvaluation['areaRegional'];
  zones: SeasonEvaluation['zones'];
}

function sha256(text: string): string {
  return createHash('sha256').update(text).digest('hex');
}

export function assembleModelWithMemo(scenario: LoadedScenario, engine: TrendEngine, memo: ModelMemo, options: AssembleModelOptions = {}): MemoModelSet {
  const settings = scenario.settings;
  const settingsText = sha256(JSON.stringify(settings));
  const { rules, publications, wanted, publishedSeasons, segments } = modelScope(scenario);
  const counts = { seriesEvaluated: 0, seriesReused: 0, bulletinsComposed: 0, bulletinsReused: 0 };

  const texts = new Map<ScenarioRecord, string>();
  const textOf = (record: ScenarioRecord): string => {
    let text = texts.get(record);
    if (text === undefined) {
      text = recordText(record);
      texts.set(record, text);
    }
    return text;
  };

  const seasons = new Map<string, SeasonState>();
  wanted.forEach((seasonId, i) => {
    const context = seasonContext(scenario, seasonId);
    const keys = new Map<string, string>();
    const summaries = new Map<string, SeriesSummary>();
    const missing: SeriesId[] = [];
    for (const indicator of indicatorIds) {
      for (const segment of context.segments) {
        const name = seriesKey(indicator, segment.id);
        const records = seriesRecords(context, indicator, segment.id).map(textOf);
        const key = seriesInputKey({
          settings: settingsText,
          seasonId,
          indicator,
          segmentId: segment.id,
          monitored: context.monitored.get(indicator) ?? null,
          records,
          drift: indicator === 'drift-arrivals' ? (context.driftBySegment.get(segment.id) ?? []) : [],
        });
        keys.set(name, key);
        const known = memo.summary(key);
        if (known) summaries.set(name, known);
        else missing.push({ indicator, segmentId: segment.id });
      }
    }
    const evaluated = missing.length > 0 ? evaluateSeries(context, engine, missing) : new Map<string, { series: SeasonSeries; evaluation: IndicatorEvaluation | null }>();
    for (const [name, entry] of evaluated) {
      const summary = summarizeSeries(entry.evaluation);
      summaries.set(name, summary);
      memo.keepSummary(keys.get(name) as string, summary);
    }
    counts.seriesEvaluated += missing.length;
    counts.seriesReused += keys.size - missing.length;
    for (const [name, summary] of summaries) if (!evaluated.has(name)) memo.keepSummary(keys.get(name) as string, summary);

    const segmentIds = context.segments.map((s) => s.id);
    const driftRows = scenario.drift?.arrivals.filter((a) => a.season === seasonId) ?? [];
    const verdict = judgeSeason(segmentIds, (indicator, segmentId) => summaries.get(seriesKey(indicator, segmentId)) as SeriesSummary, driftRows, settings, rules, engine);
    const seriesOf = (indicator: IndicatorId, segmentId: string): SeasonSeries =>
      evaluated.get(seriesKey(indicator, segmentId))?.series ?? seasonSeries(context, indicator, segmentId);
    const regional = verdict.regionalSites.map(({ indicator, sites }) => {
      const key = regionalInputKey(
        seasonId,
        indicator,
        settings.trend.confidence,
        sites.map((site) => ({ site, key: keys.get(seriesKey(indicator, site)) as string })),
      );
      let result = memo.regional(key);
      if (result === undefined) result = regionalTrend(context, engine, indicator, sites, seriesOf);
      memo.keepRegional(key, result);
      return { indicator, result, segments: sites.length };
    });
    const areas = scenarioAreas(scenario.segments);
    const areaRegional = areas
      ? areaRegionalSites(areas, verdict.regionalSites).map(({ area, indicator: name, sites }) => {
          const indicator = name as IndicatorId;
          const key = regionalInputKey(
            seasonId,
            indicator,
            settings.trend.confidence,
            sites.map((site) => ({ site, key: keys.get(seriesKey(indicator, site)) as string })),
          );
          let result = memo.regional(key);
          if (result === undefined) result = regionalTrend(context, engine, indicator, sites, seriesOf);
          memo.keepRegional(key, result);
          return { area, indicator, result, segments: sites.length };
        })
      : undefined;
    const zones = scenario.drift?.zones.find((z) => z.season === seasonId)?.zones ?? [];
    seasons.set(seasonId, { context, keys, summaries, evaluated, verdict, regional, zones, ...(areaRegional ? { areaRegional } : {}) });
    options.onProgress?.('evaluate', i + 1, wanted.length);
  });

  // The season as composeRegion reads it: every segment's level and directions (the verdicts).
  const judged = (state: SeasonState): RegionInputs => ({
    season: state.context.season,
    segments: state.verdict.segments,
    regional: state.regional,
    zones: state.zones,
    ...(state.areaRegional ? { areaRegional: state.areaRegional } : {}),
  });
  const side = (state: SeasonState, segmentId: string): SeasonSide => ({
    seasonId: state.context.seasonId,
    seriesKeys: indicatorIds.map((indicator) => state.keys.get(seriesKey(indicator, segmentId)) as string),
    verdict: state.verdict.segments.get(segmentId) as SeasonSide['verdict'],
  });
  // A segment's full evaluation, for composing its bulletin: series not evaluated in this build
  // are evaluated now (their trends come from the trend engine, or its cache).
  const fullSegment = (state: SeasonState, segmentId: string): SegmentEvaluation => {
    const verdict = state.verdict.segments.get(segmentId);
    if (!verdict) throw new Error(`assembleModel: segment ${segmentId} was not judged for ${state.context.seasonId}`);
    const absent = verdict.indicators.filter((v) => !state.evaluated.has(seriesKey(v.indicator, segmentId))).map((v) => ({ indicator: v.indicator, segmentId }));
    if (absent.length > 0) for (const [name, entry] of evaluateSeries(state.context, engine, absent)) state.evaluated.set(name, entry);
    return segmentEvaluation(verdict, (indicator) => state.evaluated.get(seriesKey(indicator, segmentId))?.evaluation ?? null);
  };

  const regions: RegionSummary[] = [];
  const bulletins: WrittenBulletin[] = [];
  for (const publication of publications) {
    const now = seasons.get(publication.season);
    if (!now) continue;
    const beforeId = previousSeasonId(publication.season, settings.seasons);
    const before = beforeId ? (seasons.get(beforeId) ?? null) : null;
    regions.push(composeRegion(scenario, judged(now), before ? judged(before) : null, publication.date));
    for (const segment of segments) {
      const key = bulletinInputKey({
        settings: settingsText,
        segment,
        published: publication.date,
        publishedSeasons: [...publishedSeasons],
        now: side(now, segment.id),
        before: before ? side(before, segment.id) : null,
      });
      const known = memo.bulletin(key);
      if (known) {
        counts.bulletinsReused += 1;
        memo.keepBulletin(key, known.text, known.listing);
        bulletins.push({ seasonId: now.context.seasonId, segmentId: segment.id, text: known.text, sha256: known.sha256, listing: known.listing, reused: true });
        continue;
      }
      const one = (state: SeasonState): SeasonEvaluation => ({
        season: state.context.season,
        segments: new Map([[segment.id, fullSegment(state, segment.id)]]),
        regional: state.regional,
        zones: state.zones,
      });
      const bulletin = composeBulletin(scenario, segment, one(now), before ? one(before) : null, publication.date, { rules, publishedSeasons });
      const text = Buffer.from(stableJson(bulletin), 'utf8');
      counts.bulletinsComposed += 1;
      const listing = listingOf(bulletin);
      memo.keepBulletin(key, text, listing);
      bulletins.push({ seasonId: now.context.seasonId, segmentId: segment.id, text, sha256: createHash('sha256').update(text).digest('hex'), listing, reused: false });
    }
  }
  return { site: siteModel(scenario, rules, publications), regions, bulletins, counts, ...publisherLogoAsset(scenario) };
}
