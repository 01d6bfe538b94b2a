/**
 * One bulletin: a segment in a published season, from the season's evaluation (and last season's),
 * through the sentence templates of generator/bulletin.
 */
import { notesFor } from './publisher-notes.ts';
import { debrisCautions, shellfishCautions } from '../bulletin/cautions.ts';
import { chartTrendWords } from '../bulletin/chart-words.ts';
import { indicatorSubjects } from '../bulletin/indicator-words.ts';
import { likelihoodWord } from '../bulletin/likelihood.ts';
import { formatNumber, formatPlain } from '../bulletin/numbers.ts';
import {
  belowDetectionWords,
  directionChangeSentence,
  directionPhrases,
  headline,
  levelAndTrendSentence,
  levelChangeWithReason,
  levelSummarySentence,
  mainTrendSentence,
  printedValueWords,
  seasonCountSentence,
  seasonValueSentence,
  whySentence,
} from '../bulletin/phrase-level.ts';
import { directionSentences, noneReportedSentences, phraseTrend, printedRate, rateSentences, seasonsDisagree, unitAfter, type TrendPhraseInput } from '../bulletin/phrase-trend.ts';
import { explainLevelChange } from '../risk/explain-change.ts';
import type { RiskRule } from '../scenario/settings.ts';
import { growersSection, reportersSection, visitorsSection } from '../bulletin/sections.ts';
import { getIndicator } from '../indicators/index.ts';
import { levelWords } from '../risk/levels.ts';
import type { LoadedScenario, Segment } from '../scenario/types.ts';
import type { IndicatorEvaluation, SeasonEvaluation } from './evaluate-season.ts';
import { mostSamplesDrawn, seasonSampleSummaries } from './sample-summary.ts';
import { seasonRef } from './seasons.ts';
import type { Bulletin, IndicatorBulletin, Observation } from './types.ts';

export function permalinkOf(seasonId: string, segmentId: string): string {
  return `/seasons/${seasonId}/${segmentId}/`;
}

export function trendPhraseInput(evaluation: IndicatorEvaluation, scenario: LoadedScenario): TrendPhraseInput {
  const definition = getIndicator(evaluation.indicator);
  const seasonLabels: { [name: string]: string } = {};
  for (const s of scenario.settings.seasons) seasonLabels[s.id] = s.label;
  return {
    subject: indicatorSubjects[evaluation.indicator],
    unit: definition.unit,
    trend: evaluation.trend,
    direction: evaluation.direction,
    qValue: evaluation.qValue,
    probabilityUp: evaluation.probabilityUp,
    falseDiscoveryRate: scenario.settings.trend.falseDiscoveryRate,
    confidence: scenario.settings.trend.confidence,
    segmentsTested: evaluation.segmentsTested,
    seasonLabels,
    samples: evaluation.yearSpan
      ? {
          count: evaluation.sampleCount,
          firstYear: evaluation.yearSpan.first,
          lastYear: evaluation.yearSpan.last,
          noun: definition.aggregation === 'season-total' ? 'seasons' : 'samples',
        }
      : null,
    minValues: scenario.settings.trend.minValues,
    minYears: scenario.settings.trend.minYears,
  };
}

/**
 * The trend told again in a reader's section, kept short so the page does not repeat itself: the
 * direction in one sentence, plus (for growers) the yearly rate when a rise or fall is claimed.
 */
function sectionTrendSentences(input: TrendPhraseInput, withRate: boolean): string[] {
  const first = directionSentences(input).slice(0, 1);
  if (!withRate || (input.direction !== 'rising' && input.direction !== 'falling')) return first;
  return [...first, ...rateSentences(input).slice(0, 1)];
}

/** Season totals of a per-season count (what its trend is computed on), null for other indicators. */
function seasonTotalsOf(evaluation: IndicatorEvaluation, scenario: LoadedScenario): Observation[] | null {
  if (getIndicator(evaluation.indicator).aggregation !== 'season-total') return null;
  return evaluation.values.map((v) => ({
    date: seasonRef(v.season, scenario.settings.seasons)?.end ?? '',
    t: v.t,
    season: v.season,
    value: v.value,
    censored: false,
  }));
}

function chartDescription(evaluation: IndicatorEvaluation, scenario: LoadedScenario, segmentName: string, confidence: number): string {
  const definition = getIndicator(evaluation.indicator);
  const span = evaluation.yearSpan
    ? evaluation.yearSpan.first === evaluation.yearSpan.last
      ? ` in ${evaluation.yearSpan.first}`
      : ` from ${evaluation.yearSpan.first} to ${evaluation.yearSpan.last}`
    : '';
  const drawn = chartTrendWords(
    {
      direction: evaluation.direction,
      seasonsDisagree: seasonsDisagree(evaluation.trend, confidence),
      trend: evaluation.trend,
      values: (seasonTotalsOf(evaluation, scenario) ?? evaluation.observations).map((o) => o.value),
    },
    confidence,
  );
  const summarised =
    evaluation.observations.length > mostSamplesDrawn && !seasonTotalsOf(evaluation, scenario)
      ? " Each dot is the median of one season's samples, with a line from the lowest to the highest."
      : '';
  return `${definition.label} at ${segmentName}, ${definition.unitShort}: ${evaluation.sampleCount.toLocaleString('en-GB')} values${span}. Direction: ${directionPhrases[evaluation.direction]}. ${drawn}${summarised}`;
}

/** A count of animals where every season so far counted 0. */
function noneEverReported(evaluation: IndicatorEvaluation): boolean {
  return evaluation.indicator === 'wildlife-reports' && evaluation.yearSpan !== null && evaluation.values.every((v) => v.value === 0);
}

function indicatorBulletin(evaluation: IndicatorEvaluation, scenario: LoadedScenario, segment: Segment): IndicatorBulletin {
  const definition = getIndicator(evaluation.indicator);
  const input = trendPhraseInput(evaluation, scenario);
  const totals = seasonTotalsOf(evaluation, scenario);
  const summaries = totals ? null : seasonSampleSummaries(evaluation.observations);
  const claimed = evaluation.direction === 'falling' && evaluation.probabilityUp !== null ? 1 - evaluation.probabilityUp : evaluation.probabilityUp;
  return {
    indicator: evaluation.indicator,
    label: definition.label,
    unit: definition.unit,
    unitShort: definition.unitShort,
    observations: evaluation.observations,
    seasonValue: evaluation.seasonValue,
    seasonValueCensored: evaluation.seasonValueCensored,
    seasonValueText:
      evaluation.seasonValue === null
        ? null
        : printedValueWords({
            text: isCount(evaluation.indicator) ? formatNumber(evaluation.seasonValue, 0) : formatPlain(evaluation.seasonValue),
            censored: evaluation.seasonValueCensored,
          }),
    assessmentValue: evaluation.assessmentValue,
    assessmentValueCensored: evaluation.assessmentValueCensored,
    trend: evaluation.trend,
    qValue: evaluation.qValue,
    direction: evaluation.direction,
    probabilityUp: evaluation.probabilityUp,
    likelihoodWords: evaluation.direction === 'rising' || evaluation.direction === 'falling' ? likelihoodWord(claimed) : null,
    threshold: definition.threshold ? { ...definition.threshold } : null,
    sentences:
      noneEverReported(evaluation) && evaluation.yearSpan
        ? noneReportedSentences('animals harmed by litter', evaluation.yearSpan.first, evaluation.yearSpan.last)
        : phraseTrend(input),
    chartDescription: chartDescription(evaluation, scenario, segment.name, scenario.settings.trend.confidence),
    seasonsDisagree: seasonsDisagree(evaluation.trend, scenario.settings.trend.confidence),
    ...(totals ? { seasonTotals: totals } : {}),
    ...(summaries ? { sampleSummaries: summaries } : {}),
  };
}

/** Counts of animals reported are printed as whole numbers, in words for 0 and 1. */
function isCount(indicator: IndicatorBulletin['indicator']): boolean {
  return indicator === 'wildlife-reports';
}

function keyNumbers(bulletin: Pick<Bulletin, 'level' | 'indicators' | 'drift'>, confidence: number): { label: string; value: string }[] {
  const rows: { label: string; value: string }[] = [{ label: 'Level', value: levelWords(bulletin.level.id) }];
  for (const ind of bulletin.indicators) {
    if (ind.seasonValue !== null) {
      const value = isCount(ind.indicator) ? formatNumber(ind.seasonValue, 0) : formatPlain(ind.seasonValue);
      rows.push({
        label: `${ind.label}, this season`,
        value: ind.seasonValueCensored ? belowDetectionWords(value, ind.unitShort) : `${value} ${unitAfter(value, ind.unitShort)}`,
      });
    }
    const noneReported = ind.indicator === 'wildlife-reports' && ind.observations.length > 0 && ind.observations.every((o) => o.value === 0);
    let trendText: string = noneReported ? 'none reported' : directionPhrases[ind.direction];
    const rate = printedRate({
      subject: ind.label,
      unit: ind.unit,
      trend: ind.trend,
      direction: ind.direction,
      qValue: ind.qValue,
      probabilityUp: ind.probabilityUp,
      falseDiscoveryRate: 0,
      confidence,
      segmentsTested: 0,
      seasonLabels: {},
      samples: null,
    });
    const allZero = rate !== null && rate.slope === 0 && rate.lower === 0 && rate.upper === 0;
    if (rate && ind.direction !== 'too-little-data' && !allZero) {
      const range = rate.text.lower !== null && rate.text.upper !== null ? ` (${Math.round(confidence * 100)}% confidence interval ${rate.text.lower} to ${rate.text.upper})` : '';
      trendText += `; ${rate.slope > 0 ? '+' : ''}${rate.text.slope} ${unitAfter(rate.text.slope.replace('\u2212', ''), ind.unitShort)} a year${range}`;
    }
    rows.push({ label: `${ind.label}, trend`, value: trendText });
  }
  if (bulletin.drift && !bulletin.indicators.some((i) => i.indicator === 'drift-arrivals')) {
    rows.push({ label: 'Modelled particles arriving per km of shore, this season', value: formatPlain(bulletin.drift.arrivalsPerKm) });
  }
  return rows;
}

export function composeBulletin(
  scenario: LoadedScenario,
  segment: Segment,
  now: SeasonEvaluation,
  previous: SeasonEvaluation | null,
  published: string,
  context: { rules: readonly RiskRule[]; publishedSeasons: ReadonlySet<string> } = { rules: [], publishedSeasons: new Set() },
): Bulletin {
  const settings = scenario.settings;
  const evaluation = now.segments.get(segment.id);
  if (!evaluation) throw new Error(`composeBulletin: segment ${segment.id} was not evaluated for ${now.season.id}`);
  const before = previous?.segments.get(segment.id) ?? null;
  const indicators = evaluation.indicators.map((e) => indicatorBulletin(e, scenario, segment));
  const permalink = permalinkOf(now.season.id, segment.id);

  // Counts with nothing ever reported have no trend to tell; they are left out of the headline and
  // the summary's trend sentence (their own section says "none reported").
  const moving = evaluation.indicators.filter((e) => !noneEverReported(e)).map((e) => ({ subject: indicatorSubjects[e.indicator], direction: e.direction }));
  const previousLevel = before?.level ?? null;
  const summary = [levelSummarySentence(evaluation.level, previousLevel), whySentence(evaluation.level), mainTrendSentence(moving)];

  const changes: string[] = [];
  const reason = explainLevelChange(evaluation.level, previousLevel, context.rules, evaluation.levelInputs);
  // An unchanged level is said once, in the summary; a change is said here with its reason.
  const levelChange = previousLevel && previousLevel.rank !== evaluation.level.rank ? levelChangeWithReason(evaluation.level, previousLevel, reason?.clause ?? null) : null;
  if (levelChange) changes.push(levelChange);
  const levelAndTrend = levelAndTrendSentence(evaluation.level, previousLevel, moving);
  if (levelAndTrend) changes.push(levelAndTrend);
  for (const e of evaluation.indicators) {
    const old = before?.indicators.find((b) => b.indicator === e.indicator) ?? null;
    const subject = indicatorSubjects[e.indicator];
    const oldValue = old?.seasonValue === null || old?.seasonValue === undefined ? null : old.seasonValue;
    const valueSentence = isCount(e.indicator)
      ? seasonCountSentence('animals harmed by litter', e.seasonValue === null ? null : Math.round(e.seasonValue), oldValue === null ? null : Math.round(oldValue))
      : seasonValueSentence(
          subject,
          getIndicator(e.indicator).unit,
          e.seasonValue === null ? null : { text: formatPlain(e.seasonValue), censored: e.seasonValueCensored },
          oldValue === null ? null : { text: formatPlain(oldValue), censored: old?.seasonValueCensored ?? false },
        );
    if (valueSentence) changes.push(valueSentence);
    const directionChange = directionChangeSentence(subject, e.direction, old ? old.direction : null);
    if (directionChange) changes.push(directionChange);
  }
  if (changes.length === 0) changes.push('Nothing to compare with last season.');

  const tissue = evaluation.indicators.find((e) => e.indicator === 'shellfish-tissue') ?? null;
  const litter = evaluation.indicators.find((e) => e.indicator === 'beach-litter') ?? null;
  const mentionsShellfish = segment.shellfish !== 'none' || tissue !== null;
  const correction =
    [...settings.corrections]
      .filter((c) => c.season === now.season.id && (c.segment === null || c.segment === segment.id))
      .sort((a, b) => (a.date < b.date ? 1 : a.date > b.date ? -1 : 0))
      .map((c) => ({ date: c.date, reason: c.reason }))[0] ?? null;

  const notes = notesFor(settings.notes, now.season.id, segment.id);
  const partial = { level: evaluation.level, indicators, drift: evaluation.drift };
  const reporters = reportersSection({
    segmentName: segment.name,
    season: now.season,
    published,
    publisher: settings.publisher,
    permalink,
    keyNumbers: keyNumbers(partial, settings.trend.confidence),
  });

  return {
    schemaVersion: 1,
    invented: settings.invented,
    season: now.season,
    previousSeason: previous?.season ?? null,
    previousSeasonPublished: previous ? context.publishedSeasons.has(previous.season.id) : false,
    published,
    correction,
    ...(notes.length > 0 ? { notes } : {}),
    segment: {
      id: segment.id,
      name: segment.name,
      kind: segment.kind,
      shellfish: segment.shellfish,
      place: segment.place,
      lengthKm: segment.lengthKm,
      geometry: segment.geometry,
      bbox: segment.bbox,
    },
    level: evaluation.level,
    previousLevel,
    headline: headline(segment.name, evaluation.level, now.season.label, moving),
    summary,
    changes,
    indicators,
    drift: evaluation.drift,
    sections: {
      growers: growersSection({
        shellfish: segment.shellfish,
        tissue: tissue
          ? {
              seasonValue: tissue.seasonValue,
              seasonValueCensored: tissue.seasonValueCensored,
              assessmentValue: tissue.assessmentValue,
              assessmentValueCensored: tissue.assessmentValueCensored,
              unit: getIndicator('shellfish-tissue').unit,
              trendSentences: sectionTrendSentences(trendPhraseInput(tissue, scenario), true),
            }
          : null,
        nearestZone: evaluation.drift?.nearestZone ?? null,
        driftAvailable: evaluation.drift !== null,
      }),
      visitors: visitorsSection({
        litter: litter
          ? {
              seasonValue: litter.seasonValue,
              unit: getIndicator('beach-litter').unit,
              threshold: getIndicator('beach-litter').threshold,
              trendSentences: sectionTrendSentences(trendPhraseInput(litter, scenario), false),
            }
          : null,
        drift: evaluation.drift,
      }),
      reporters,
    },
    cautions: {
      shellfish: mentionsShellfish ? shellfishCautions(settings.authorities) : [],
      debris: debrisCautions(settings.authorities),
    },
    authorities: settings.authorities.map((a) => ({ ...a })),
    permalink,
  };
}
