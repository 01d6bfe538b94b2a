/**
 * The region's page for one published season: every segment's level and directions, the Regional
 * Kendall trend per indicator (Helsel & Frans 2006: the Seasonal Kendall test with sites in place
 * of seasons), the accumulation zones, and a short summary.
 */
import { debrisCautions, shellfishCautions } from '../bulletin/cautions.ts';
import { indicatorSubjects, lowerFirst } from '../bulletin/indicator-words.ts';
import { formatNumber, formatSignificant } from '../bulletin/numbers.ts';
import { getIndicator } from '../indicators/index.ts';
import { levelScale } from '../risk/levels.ts';
import type { LoadedScenario } from '../scenario/types.ts';
import type { RegionalResult, SeasonEvaluation } from './evaluate-season.ts';
import type { AreaSummary, Direction, IndicatorId, LevelResult, RegionalTrend, RegionSummary } from './types.ts';
import { scenarioAreas, type AreaPlan } from './areas.ts';

export function regionalTrendSentence(subject: string, unit: string, result: RegionalResult | null, segments: number, falseDiscoveryRate: number): string {
  const lower = lowerFirst(subject);
  if (!result || result.p === null) return `Too little data to say if ${lower} is changing across the region.`;
  const places = `${formatNumber(segments, 0)} ${segments === 1 ? 'place' : 'places'}`;
  if (result.p < falseDiscoveryRate && result.S !== null && result.S !== 0) {
    const up = result.S > 0;
    const rate = result.slope !== null && result.slope !== 0 ? ` by about ${formatSignificant(Math.abs(result.slope))} ${unit} a year` : '';
    return `Across ${places}, ${lower} is going ${up ? 'up' : 'down'}${rate}.`;
  }
  return `Across ${places}, we cannot tell if ${lower} is going up or down.`;
}

/** What composeRegion reads of a season's evaluation (a SeasonEvaluation is one). */
export interface RegionInputs {
  season: SeasonEvaluation['season'];
  segments: ReadonlyMap<string, { level: LevelResult; indicators: readonly { indicator: IndicatorId; direction: Direction }[] }>;
  regional: SeasonEvaluation['regional'];
  zones: SeasonEvaluation['zones'];
  areaRegional?: SeasonEvaluation['areaRegional'];
}

export function composeRegion(scenario: LoadedScenario, now: RegionInputs, previous: RegionInputs | null, published: string): RegionSummary {
  const settings = scenario.settings;
  const segments = [...scenario.segments].sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  const rows = segments.map((segment) => {
    const evaluation = now.segments.get(segment.id);
    if (!evaluation) throw new Error(`composeRegion: segment ${segment.id} was not evaluated`);
    const directions: Partial<Record<IndicatorId, Direction>> = {};
    for (const e of evaluation.indicators) directions[e.indicator] = e.direction;
    return {
      id: segment.id,
      name: segment.name,
      kind: segment.kind,
      shellfish: segment.shellfish,
      level: evaluation.level,
      previousLevel: previous?.segments.get(segment.id)?.level ?? null,
      directions,
      geometry: segment.geometry,
    };
  });
  const trendOf = ({ indicator, result, segments: count }: RegionInputs['regional'][number]): RegionalTrend => {
    const definition = getIndicator(indicator);
    return {
      indicator,
      label: definition.label,
      S: result?.S ?? null,
      z: result?.z ?? null,
      p: result?.p ?? null,
      slope: result?.slope === null || result?.slope === undefined ? null : result.slope,
      unitShort: definition.unitShort,
      sentence: regionalTrendSentence(indicatorSubjects[indicator], definition.unit, result, count, settings.trend.falseDiscoveryRate),
    };
  };
  const regionalTrends: RegionalTrend[] = now.regional.map(trendOf);
  const counts = levelScale
    .slice()
    .reverse()
    .map((level) => ({ level, n: rows.filter((r) => r.level.id === level.id).length }))
    .filter((c) => c.n > 0)
    .map((c) => `${formatNumber(c.n, 0)} ${c.level.label}`);
  const up = rows.filter((r) => r.previousLevel && r.level.rank > r.previousLevel.rank).length;
  const down = rows.filter((r) => r.previousLevel && r.level.rank < r.previousLevel.rank).length;
  const summary = [`Levels of the ${formatNumber(rows.length, 0)} places this season: ${counts.join(', ')}.`];
  if (previous) {
    const places = (n: number): string => (n === 0 ? 'no place' : `${formatNumber(n, 0)} ${n === 1 ? 'place' : 'places'}`);
    summary.push(
      up === 0 && down === 0
        ? 'Since last season, no place went up or down a level.'
        : `Since last season, ${places(up)} went up a level and ${places(down)} went down.`,
    );
  }
  for (const trend of regionalTrends) summary.push(trend.sentence);
  const plans = scenarioAreas(scenario.segments);
  const highest = Math.max(0, ...rows.map((r) => r.level.rank));
  const atHighest = rows.filter((r) => r.level.rank === highest).length;
  const highestLabel = levelScale.find((l) => l.rank === highest)?.label ?? 'Scant';
  return {
    schemaVersion: 1,
    invented: settings.invented,
    season: now.season,
    published,
    region: { id: settings.region.id, name: settings.region.name, description: settings.region.description },
    publisher: settings.publisher,
    segments: rows,
    regionalTrends,
    zones: now.zones,
    cautions: {
      shellfish:
        rows.some((r) => r.shellfish !== 'none') || regionalTrends.some((t) => t.indicator === 'shellfish-tissue')
          ? shellfishCautions(settings.authorities)
          : [],
      debris: debrisCautions(settings.authorities),
    },
    authorities: settings.authorities.map((a) => ({ ...a })),
    ...(plans ? { areas: plans.map((plan) => composeArea(plan, rows, (now.areaRegional ?? []).filter((r) => r.area === plan.id).map(trendOf))) } : {}),
    headline: `${settings.region.name}, ${lowerFirst(now.season.label)}: the highest level is ${highestLabel} (level ${highest} of 4), at ${formatNumber(atHighest, 0)} of ${formatNumber(rows.length, 0)} places.`,
    summary,
  };
}


/** An area's line on the overview and the head of its page: highest level, counts, its own trends. */
export function composeArea(plan: AreaPlan, rows: readonly { id: string; name: string; level: LevelResult }[], regionalTrends: RegionalTrend[]): AreaSummary {
  const byId = new Map(rows.map((r) => [r.id, r] as const));
  const members = plan.segmentIds.map((id) => byId.get(id)).filter((r): r is (typeof rows)[number] => r !== undefined);
  // highest level first, then by name: the order of the area's map badges and of its lists
  members.sort((a, b) => b.level.rank - a.level.rank || a.name.localeCompare(b.name, 'en') || (a.id < b.id ? -1 : 1));
  const highest = members[0]?.level ?? null;
  const top = levelScale.find((l) => l.rank === (highest?.rank ?? 1)) ?? levelScale[0]!;
  const counts = levelScale.slice().reverse().map((l) => ({ level: l.id, rank: l.rank, label: l.label, n: members.filter((m) => m.level.id === l.id).length }));
  const atTop = counts.find((c) => c.level === top.id)?.n ?? 0;
  return {
    id: plan.id,
    number: plan.number,
    name: plan.name,
    segmentIds: members.map((m) => m.id),
    level: { id: top.id, rank: top.rank, label: top.label },
    counts,
    headline: `${plan.name}: the highest level is ${top.label} (level ${top.rank} of 4), at ${formatNumber(atTop, 0)} of ${formatNumber(members.length, 0)} places.`,
    summary: [`Levels of the ${formatNumber(members.length, 0)} places in this area: ${counts.filter((c) => c.n > 0).map((c) => `${formatNumber(c.n, 0)} ${c.label}`).join(', ')}.`],
    regionalTrends,
  };
}
