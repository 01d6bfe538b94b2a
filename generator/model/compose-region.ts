/**
 * The region's page for one published season: every segment's level and directions, the Regional
 * Kendall trend per indicator (Helsel & Frans 2006: the Seasonal Kendall test with sites in place
 * of seasons), the accumulation zones, and a short summary.
 *
 * Trends that differ between places: the van Belle & Hughes (1984) homogeneity chi-square over the
 * sites (χ² = Σ_k Z_k² − K·Z̄², df K − 1; stats/regional-kendall.ts). Where it rejects homogeneity
 * at 1 − confidence and places go both ways, the sentence names how many go each way instead of a
 * single regional direction.
 */
import { notesFor } from './publisher-notes.ts';
import { debrisCautions, shellfishCautions } from '../bulletin/cautions.ts';
import { indicatorSubjects, lowerFirst } from '../bulletin/indicator-words.ts';
import { formatNumber, formatSignificant } from '../bulletin/numbers.ts';
import { getIndicator } from '../indicators/index.ts';
import { levelNotSet, levelScale } from '../risk/levels.ts';
import type { LoadedScenario } from '../scenario/types.ts';
import type { RegionalResult, SeasonEvaluation } from './evaluate-season.ts';
import type { AreaSummary, Direction, HeadlinePart, IndicatorId, LevelResult, RegionalTrend, RegionSummary } from './types.ts';
import { scenarioAreas, type AreaPlan } from './areas.ts';
import { max } from 'd3-array';

/**
 * The region's sentence for one indicator.
 * - Trends that differ between places (van Belle & Hughes 1984 homogeneity chi-square below
 *   1 − confidence) with places going both ways (each place's own claimed direction, the q-value
 *   rule of the bulletins) are told as they are: "Beach litter is going up at 10 places and down at
 *   8; there is no single direction across the region." USGS practice for the Regional Kendall
 *   test (Helsel & Frans 2006) is to report no single regional trend where trends are heterogeneous.
 * - A regional rise or fall is claimed only when p is below the false-discovery rate and the
 *   median slope is not 0 and has the sign of S (the rule of direction.ts).
 */
export function regionalTrendSentence(
  subject: string,
  unit: string,
  result: RegionalResult | null,
  segments: number,
  falseDiscoveryRate: number,
  places: { up: number; down: number; confidence: number } = { up: 0, down: 0, confidence: 0.95 },
): string {
  const lower = lowerFirst(subject);
  if (!result || result.p === null) return `Too little data to say if ${lower} is changing across the region.`;
  const count = (n: number): string => `${formatNumber(n, 0)} ${n === 1 ? 'place' : 'places'}`;
  const heterogeneous = result.homogeneity !== null && result.homogeneity !== undefined && result.homogeneity.p < 1 - places.confidence;
  if (heterogeneous && places.up > 0 && places.down > 0) {
    return `${subject} is going up at ${count(places.up)} and down at ${formatNumber(places.down, 0)}; there is no single direction across the region.`;
  }
  const across = `Across ${count(segments)}`;
  if (result.p < falseDiscoveryRate && result.S !== null && result.S !== 0) {
    const up = result.S > 0;
    if (result.slope === null || result.slope === 0 || Math.sign(result.slope) !== Math.sign(result.S)) {
      return `${across}, we cannot tell if ${lower} is going up or down: the typical yearly change is zero.`;
    }
    return `${across}, ${lower} is going ${up ? 'up' : 'down'} by about ${formatSignificant(Math.abs(result.slope))} ${unit} a year.`;
  }
  return `${across}, we cannot tell if ${lower} is going up or down.`;
}

/** How many places the headline names at the highest level before "and N more". */
export const namedAtHighest = 5;

/**
 * "Brin Coast, autumn 2026: the highest level is Heavy (level 4 of 4), at 2 of 30 places: East Bay
 * and North Beach." Names up to five places (segment order), then "and N more"; each name is a part
 * of its own with the segment id, so the page can link it to the bulletin.
 */
export function highestLevelHeadline(lead: string, levelText: string, atHighest: readonly { id: string; name: string }[], total: number): HeadlinePart[] {
  const n = atHighest.length;
  const parts: HeadlinePart[] = [
    { text: `${lead}: the highest level is ${levelText}, at ${formatNumber(n, 0)} of ${formatNumber(total, 0)} ${total === 1 ? 'place' : 'places'}: ` },
  ];
  const named = atHighest.slice(0, namedAtHighest);
  const more = n - named.length;
  named.forEach((place, i) => {
    if (i > 0) parts.push({ text: i === named.length - 1 && more === 0 ? ' and ' : ', ' });
    parts.push({ text: place.name, segmentId: place.id });
  });
  parts.push({ text: more > 0 ? ` and ${formatNumber(more, 0)} more.` : '.' });
  return parts;
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
    const placesUp = rows.filter((r) => r.directions[indicator] === 'rising').length;
    const placesDown = rows.filter((r) => r.directions[indicator] === 'falling').length;
    return {
      indicator,
      label: definition.label,
      S: result?.S ?? null,
      z: result?.z ?? null,
      p: result?.p ?? null,
      slope: result?.slope === null || result?.slope === undefined ? null : result.slope,
      unitShort: definition.unitShort,
      sentence: regionalTrendSentence(indicatorSubjects[indicator], definition.unit, result, count, settings.trend.falseDiscoveryRate, {
        up: placesUp,
        down: placesDown,
        confidence: settings.trend.confidence,
      }),
      homogeneity: result?.homogeneity ?? null,
      placesUp,
      placesDown,
    };
  };
  const regionalTrends: RegionalTrend[] = now.regional.map(trendOf);
  const counts = levelScale
    .slice()
    .reverse()
    .map((level) => ({ level, n: rows.filter((r) => r.level.id === level.id).length }))
    .filter((c) => c.n > 0)
    .map((c) => `${formatNumber(c.n, 0)} ${c.level.label}`);
  // Places with no level (no survey in the last four seasons) are counted apart, never as Scant.
  const notSet = rows.filter((r) => r.level.id === 'not-set').length;
  // A move to or from "no level" is not a level going up or down.
  const ranked = (r: (typeof rows)[number]): boolean => r.level.rank > 0 && (r.previousLevel?.rank ?? 0) > 0;
  const up = rows.filter((r) => ranked(r) && r.previousLevel && r.level.rank > r.previousLevel.rank).length;
  const down = rows.filter((r) => ranked(r) && r.previousLevel && r.level.rank < r.previousLevel.rank).length;
  const levelCounts = counts.length > 0 ? `Levels of the ${formatNumber(rows.length, 0)} places this season: ${counts.join(', ')}.` : `No place has a level this season.`;
  const summary = [
    notSet === 0
      ? levelCounts
      : `${levelCounts} ${notSet === 1 ? '1 place has' : `${formatNumber(notSet, 0)} places have`} no level set, because no survey was made there in the last four seasons.`,
  ];
  if (previous) {
    const places = (n: number): string => (n === 0 ? 'no place' : `${formatNumber(n, 0)} ${n === 1 ? 'place' : 'places'}`);
    summary.push(
      up === 0 && down === 0 ? 'Since last season, no place went up or down a level.' : `Since last season, ${places(up)} went up a level and ${places(down)} went down.`,
    );
  }
  for (const trend of regionalTrends) summary.push(trend.sentence);
  const seasonNotes = notesFor(settings.notes, now.season.id, null);
  const plans = scenarioAreas(scenario.segments);
  const highest = max(rows, (r) => r.level.rank) ?? 0;
  const highestLabel = levelScale.find((l) => l.rank === highest)?.label ?? 'Scant';
  const headlineParts: HeadlinePart[] =
    highest === 0
      ? [{ text: `${settings.region.name}, ${lowerFirst(now.season.label)}: no place has a level set, because no survey was made in the last four seasons.` }]
      : highestLevelHeadline(
          `${settings.region.name}, ${lowerFirst(now.season.label)}`,
          `${highestLabel} (level ${highest} of 4)`,
          rows.filter((r) => r.level.rank === highest),
          rows.length,
        );
  return {
    schemaVersion: 1,
    invented: settings.invented,
    season: now.season,
    published,
    region: { id: settings.region.id, name: settings.region.name, description: settings.region.description },
    publisher: settings.publisher,
    ...(seasonNotes.length > 0 ? { notes: seasonNotes } : {}),
    segments: rows,
    regionalTrends,
    zones: now.zones,
    cautions: {
      shellfish: rows.some((r) => r.shellfish !== 'none') || regionalTrends.some((t) => t.indicator === 'shellfish-tissue') ? shellfishCautions(settings.authorities) : [],
      debris: debrisCautions(settings.authorities),
    },
    authorities: settings.authorities.map((a) => ({ ...a })),
    headline: headlineParts.map((p) => p.text).join(''),
    headlineParts,
    ...(plans ? { areas: plans.map((plan) => composeArea(plan, rows, (now.areaRegional ?? []).filter((r) => r.area === plan.id).map(trendOf))) } : {}),
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
  const counts = levelScale
    .slice()
    .reverse()
    .map((l) => ({ level: l.id, rank: l.rank, label: l.label, n: members.filter((m) => m.level.id === l.id).length }));
  const notSet = members.filter((m) => m.level.rank === 0).length;
  const levelWords = [...counts.filter((c) => c.n > 0).map((c) => `${formatNumber(c.n, 0)} ${c.label}`), ...(notSet > 0 ? [`${formatNumber(notSet, 0)} with no level set`] : [])];
  const summary = [`Levels of the ${formatNumber(members.length, 0)} places in this area: ${levelWords.join(', ')}.`];
  // An area none of whose places has a level set is never shown at the lowest level.
  if (highest === null || highest.rank === 0) {
    return {
      id: plan.id,
      number: plan.number,
      name: plan.name,
      segmentIds: members.map((m) => m.id),
      level: { id: levelNotSet.id, rank: levelNotSet.rank, label: levelNotSet.label },
      counts,
      headline: `${plan.name}: no place in this area has a level set, because no survey was made in the last four seasons.`,
      summary,
      regionalTrends,
    };
  }
  const top = levelScale.find((l) => l.rank === highest.rank) ?? levelScale[0]!;
  const atTop = counts.find((c) => c.level === top.id)?.n ?? 0;
  return {
    id: plan.id,
    number: plan.number,
    name: plan.name,
    segmentIds: members.map((m) => m.id),
    level: { id: top.id, rank: top.rank, label: top.label },
    counts,
    headline: `${plan.name}: the highest level is ${top.label} (level ${top.rank} of 4), at ${formatNumber(atTop, 0)} of ${formatNumber(members.length, 0)} places.`,
    summary,
    regionalTrends,
  };
}
