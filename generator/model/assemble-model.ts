/**
 * assembleModel: a loaded scenario and a trend engine in, the bulletin model out (site, one region summary per published
 * season, one bulletin per segment per published season). Pure and deterministic: stable ordering,
 * no clock, seeds derived from the scenario's seed.
 *
 * Each published season is evaluated with only the data dated up to its end, and so is the season
 * just before it (for "last season"), so a past bulletin never changes when new data arrive.
 */
import { dataNoticeOf } from '../bulletin/data-notice.ts';
import packageJson from '../../package.json' with { type: 'json' };
import { defaultRiskRules } from '../risk/default-rules.ts';
import type { RiskRule, ScenarioSettings } from '../scenario/settings.ts';
import type { LoadedScenario } from '../scenario/types.ts';
import { composeBulletin } from './compose-bulletin.ts';
import { composeRegion } from './compose-region.ts';
import { siteMap } from './site-map.ts';
import { publisherLogoAsset, publisherLogoRef } from './publisher-logo.ts';
import { evaluateSeason, type SeasonEvaluation, type TrendEngine } from './evaluate-season.ts';
import { previousSeasonId, seasonRef } from './seasons.ts';
import type { Bulletin, RegionSummary, SiteModel } from './types.ts';

export interface BulletinModelSet {
  site: SiteModel;
  regions: RegionSummary[];
  bulletins: Bulletin[];
  /** the publisher's logo file for the site (publisher-logo.ts); absent when none */
  publisherLogo?: { file: string; bytes: Uint8Array };
}

export interface AssembleModelOptions {
  /** Called after each evaluated season. */
  onProgress?(phase: string, done: number, total?: number): void;
}

export const generatorVersion: string = packageJson.version;

function byId<T extends { id: string }>(a: T, b: T): number {
  return a.id < b.id ? -1 : a.id > b.id ? 1 : 0;
}

/**
 * What a model covers: the rule table in force, the publications whose season is defined, the
 * seasons to evaluate (each published one and the one before it, in order), the published season
 * ids, and the segments sorted by id. Shared by assembleModel and assembleModelWithMemo.
 */
/** Indicators the scenario has data for: its monitoring records, and drift arrivals when a drift model was read. */
export function indicatorsWithData(scenario: Pick<LoadedScenario, 'records' | 'drift'>): Set<string> {
  const present = new Set<string>(scenario.records.map((r) => r.indicator));
  if (scenario.drift !== null) present.add('drift-arrivals');
  return present;
}

export function modelScope(scenario: LoadedScenario): {
  rules: readonly RiskRule[];
  publications: ScenarioSettings['publications'][number][];
  wanted: string[];
  publishedSeasons: Set<string>;
  segments: LoadedScenario['segments'];
} {
  const settings = scenario.settings;
  // Built-in rules about an indicator with no data are not used (a scenario without a drift model
  // gets no drift rule); rules given in the settings are kept as written (check warns about them).
  const withData = indicatorsWithData(scenario);
  const rules = settings.riskRules.length > 0 ? settings.riskRules : defaultRiskRules.filter((rule) => withData.has(rule.indicator));
  const publications = settings.publications.filter((p) => seasonRef(p.season, settings.seasons) !== null);
  const wanted: string[] = [];
  for (const publication of publications) {
    const before = previousSeasonId(publication.season, settings.seasons);
    for (const id of [before, publication.season]) if (id && !wanted.includes(id)) wanted.push(id);
  }
  const publishedSeasons = new Set(publications.map((p) => p.season));
  return { rules, publications, wanted, publishedSeasons, segments: [...scenario.segments].sort(byId) };
}

export function assembleModel(scenario: LoadedScenario, engine: TrendEngine, options: AssembleModelOptions = {}): BulletinModelSet {
  const settings = scenario.settings;
  const { rules, publications, wanted, publishedSeasons, segments } = modelScope(scenario);
  const evaluations = new Map<string, SeasonEvaluation>();
  wanted.forEach((id, i) => {
    evaluations.set(id, evaluateSeason(scenario, id, rules, engine));
    options.onProgress?.('evaluate', i + 1, wanted.length);
  });

  const regions: RegionSummary[] = [];
  const bulletins: Bulletin[] = [];
  for (const publication of publications) {
    const now = evaluations.get(publication.season);
    if (!now) continue;
    const beforeId = previousSeasonId(publication.season, settings.seasons);
    const before = beforeId ? (evaluations.get(beforeId) ?? null) : null;
    regions.push(composeRegion(scenario, now, before, publication.date));
    for (const segment of segments) bulletins.push(composeBulletin(scenario, segment, now, before, publication.date, { rules, publishedSeasons }));
  }

  return { site: siteModel(scenario, rules, publications), regions, bulletins, ...publisherLogoAsset(scenario) };
}

/** site.json: the region, the published seasons (the last one current), the inputs and the validation report. */
export function siteModel(scenario: LoadedScenario, rules: readonly RiskRule[], publications: readonly ScenarioSettings['publications'][number][]): SiteModel {
  const settings = scenario.settings;
  const last = publications[publications.length - 1];
  const site: SiteModel = {
    schemaVersion: 1,
    invented: settings.invented,
    notice: dataNoticeOf(settings),
    generator: { name: 'wrackline', version: generatorVersion },
    region: { id: settings.region.id, name: settings.region.name, description: settings.region.description },
    seasons: publications.flatMap((p) => {
      const ref = seasonRef(p.season, settings.seasons);
      return ref ? [{ ...ref, published: p.date, current: p === last }] : [];
    }),
    manifest: [...scenario.inputs].sort((a, b) => (a.file < b.file ? -1 : a.file > b.file ? 1 : 0)).map((i) => ({ file: i.file, sha256: i.sha256, bytes: i.bytes })),
    validation: scenario.report,
    driftModel: scenario.drift !== null,
    map: siteMap(scenario),
    ...(scenario.publisherLogo ? { publisherLogo: publisherLogoRef(scenario.publisherLogo) } : {}),
    settingsDigest: {
      riskRules: rules.map((r) => ({ id: r.id, level: r.level, text: r.text })),
      riskRulesNote:
        settings.riskRules.length > 0
          ? 'These rules are set in the published settings of this coast.'
          : "This coast's settings give no rules of their own, so the built-in rule table applies, limited to the indicators this coast has data for.",
      confidence: settings.trend.confidence,
      falseDiscoveryRate: settings.trend.falseDiscoveryRate,
    },
  };
  return site;
}
