/**
 * Why a segment's level changed since last season, in one clause: the rule that started applying
 * (level up) or stopped applying (level down), with the measure's value now and the rule's
 * threshold. Rules are those of the transparent rule table (settings.riskRules or
 * defaultRiskRules); measures are those the level was assessed on (see assess-level.ts).
 *
 * - Level up: the first rule, in the order of the level's hits, whose level is above last
 *   season's level. It did not apply last season (else last season's level would have been higher).
 * - Level down: the first of last season's hits whose level is above this season's level. It does
 *   not apply now (else this season's level would be higher).
 */
import { indicatorSubjects, lowerFirst } from '../bulletin/indicator-words.ts';
import { chanceWords } from '../bulletin/phrase-trend.ts';
import { getIndicator } from '../indicators/index.ts';
import type { LevelResult } from '../model/types.ts';
import type { RiskRule } from '../scenario/settings.ts';
import { formatMeasure, formatThreshold, measureValue, type LevelInputs } from './assess-level.ts';
import { levelRank } from './levels.ts';

const comparisonWords: { readonly [K in RiskRule['op']]: { holds: string; fails: string } } = {
  '>=': { holds: 'at or above', fails: 'below' },
  '>': { holds: 'above', fails: 'at or below' },
  '<=': { holds: 'at or below', fails: 'above' },
  '<': { holds: 'below', fails: 'at or above' },
};

/** Nouns for "with the most …" in region-percentile rules. */
function amountNoun(rule: RiskRule): string {
  if (rule.indicator === 'drift-arrivals') return 'modelled litter coming ashore';
  return lowerFirst(indicatorSubjects[rule.indicator]);
}

/** The clause for one rule that started (`holds` true) or stopped (`holds` false) applying. */
export function ruleChangeClause(rule: RiskRule, inputs: LevelInputs, holds: boolean): string {
  const subject = lowerFirst(indicatorSubjects[rule.indicator]);
  const measures = inputs[rule.indicator];
  const value = measures ? measureValue(rule, measures) : null;
  const threshold = formatThreshold(rule.measure, rule.value);
  const words = comparisonWords[rule.op];
  switch (rule.measure) {
    case 'probability-up':
      if (!holds) return `${subject} is no longer clearly going up`;
      return value === null ? `${subject} is now going up` : `${subject} is now going up, and the chance of a rise is ${chanceWords(value)}`;
    case 'region-percentile': {
      const high = rule.op === '>=' || rule.op === '>';
      const share = high ? 100 - rule.value : rule.value;
      const group = `among the ${formatThreshold(rule.measure, share)}% of places on this coast with the ${high ? 'most' : 'least'} ${amountNoun(rule)}`;
      return holds ? `this place is now ${group}` : `this place is no longer ${group}`;
    }
    case 'assessment-median':
    case 'clean-coast-index': {
      const what = rule.measure === 'assessment-median' ? `the median ${subject} over the last four seasons` : 'the Clean Coast Index over the last four seasons';
      const unit = rule.measure === 'assessment-median' ? ` ${getIndicator(rule.indicator).unit}` : '';
      if (value === null) return holds ? `${what} now meets the rule "${rule.id}"` : `there are no values left for ${what}`;
      return `${what} is now ${formatMeasure(rule.measure, value)}${unit}, ${holds ? words.holds : words.fails} ${threshold}`;
    }
  }
}

/** The clause explaining a level change, or null when the level did not change or no rule is found. */
export function explainLevelChange(level: LevelResult, previous: LevelResult | null, rules: readonly RiskRule[], inputs: LevelInputs): { ruleId: string; clause: string } | null {
  if (!previous || previous.rank === level.rank) return null;
  const up = level.rank > previous.rank;
  const hit = up ? level.hits.find((h) => levelRank(h.level) > previous.rank) : previous.hits.find((h) => levelRank(h.level) > level.rank);
  if (!hit) return null;
  const rule = rules.find((r) => r.id === hit.ruleId);
  if (!rule) return null;
  return { ruleId: rule.id, clause: ruleChangeClause(rule, inputs, up) };
}
