/**
 * Every bulletin of the invented demo scenario (content/demo), built end to end:
 * readability (Flesch–Kincaid grade, Kincaid et al. 1975: main text ≤ 8, cautions ≤ 6; targets
 * after US EPA's plain-language guidance for fish and shellfish advice), the shellfish cautions with
 * the authority's contact, no claimed trend without q below the false-discovery rate, and numbers
 * that equal the model's numbers after the stated rounding.
 */
import { describe, expect, test } from 'vitest';
import { readability } from '../../generator/bulletin/readability.ts';
import { printedRate } from '../../generator/bulletin/phrase-trend.ts';
import { formatPlain, formatSignificant } from '../../generator/bulletin/numbers.ts';
import { buildModel } from '../../generator/model/build-model.ts';
import type { Bulletin } from '../../generator/model/types.ts';
import { loadScenario } from '../../generator/read/load-scenario.ts';

const scenario = await loadScenario('content/demo');
const set = buildModel(scenario);

function mainText(b: Bulletin): string[] {
  return [b.headline, ...b.summary, ...b.changes, ...b.indicators.flatMap((i) => i.sentences), ...(b.sections.growers?.sentences ?? []), ...b.sections.visitors.sentences];
}

describe('demo bulletins', () => {
  test('there is one bulletin per segment per published season', () => {
    expect(set.bulletins.length).toBe(scenario.segments.length * scenario.settings.publications.length);
  });

  test.each(set.bulletins.map((b) => [`${b.season.id}/${b.segment.id}`, b] as const))('%s reads at grade 8 or lower, cautions at 6 or lower', (_name, b) => {
    const main = readability(mainText(b)).grade;
    expect(main).not.toBeNull();
    expect(main ?? 99).toBeLessThanOrEqual(8);
    if (b.cautions.shellfish.length > 0) expect(readability(b.cautions.shellfish.map((c) => c.text)).grade ?? 99).toBeLessThanOrEqual(6);
    expect(readability(b.cautions.debris.map((c) => c.text)).grade ?? 99).toBeLessThanOrEqual(6);
  });

  test('every bulletin that mentions shellfish carries the cautions and the authority contact', () => {
    const authority = scenario.settings.authorities.find((a) => a.role === 'shellfish-sanitation') ?? scenario.settings.authorities.find((a) => a.role === 'public-health');
    expect(authority).toBeDefined();
    for (const b of set.bulletins) {
      const mentions = b.segment.shellfish !== 'none' || b.indicators.some((i) => i.indicator === 'shellfish-tissue') || mainText(b).some((s) => /shellfish/i.test(s));
      if (!mentions) continue;
      const ids = b.cautions.shellfish.map((c) => c.id);
      expect(ids).toEqual(['not-a-closure', 'check-authority', 'separate-closures', 'no-safe-limit', 'local-rules']);
      const text = b.cautions.shellfish.map((c) => c.text).join(' ');
      expect(text).toContain(authority!.name);
      if (authority!.phone) expect(text).toContain(authority!.phone);
    }
  });

  test('no sentence claims a rise or fall unless q is below the false-discovery rate', () => {
    const rate = scenario.settings.trend.falseDiscoveryRate;
    // Claims: "… is going up." / "… is going down.", or a claimed rate, which starts "That is about".
    const claimWords = /is going (up|down)\.|^That is about/;
    for (const b of set.bulletins) {
      for (const i of b.indicators) {
        const claims = i.sentences.some((s) => claimWords.test(s));
        if (claims) {
          expect(i.qValue).not.toBeNull();
          expect(i.qValue!).toBeLessThan(rate);
          expect(['rising', 'falling']).toContain(i.direction);
        } else {
          expect(['no-clear-direction', 'too-little-data']).toContain(i.direction);
          expect(i.sentences[0]).toMatch(/^(We cannot tell|Too little data|There are no samples|No animals harmed by litter were reported)/);
        }
      }
    }
  });

  test('the headline names a rise or fall only for claimed directions', () => {
    for (const b of set.bulletins) {
      const up = b.indicators.some((i) => i.direction === 'rising');
      const down = b.indicators.some((i) => i.direction === 'falling');
      expect(/going up/.test(b.headline)).toBe(up);
      expect(/going down/.test(b.headline)).toBe(down);
      if (b.level.id === 'not-set') expect(b.headline).toMatch(new RegExp(`^Level not set at ${b.segment.name.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')} in `));
      else expect(b.headline).toContain(`${b.level.label} (level ${b.level.rank} of 4)`);
      expect(b.headline).toContain(b.segment.name);
    }
  });

  test('the rates printed equal the model slopes after the width rounding rule, as sizes with more/fewer', () => {
    const fmt = (x: number, d: number): string => Math.abs(x).toLocaleString('en-US', { minimumFractionDigits: d, maximumFractionDigits: d });
    const amount = (x: number, d: number): string => (x === 0 ? 'no change' : `${fmt(x, d)} ${x > 0 ? 'more' : 'fewer'}`);
    let checked = 0;
    for (const b of set.bulletins) {
      for (const i of b.indicators) {
        if (i.direction === 'too-little-data') continue;
        const rate = printedRate({
          subject: i.label,
          unit: i.unit,
          trend: i.trend,
          direction: i.direction,
          qValue: i.qValue,
          probabilityUp: i.probabilityUp,
          falseDiscoveryRate: 0,
          confidence: scenario.settings.trend.confidence,
          segmentsTested: 0,
          seasonLabels: {},
          samples: null,
        });
        if (!rate) continue;
        const claimed = i.direction === 'rising' || i.direction === 'falling';
        const text = i.sentences.join(' ');
        if (rate.slope !== 0) {
          const sentence = i.sentences.find((s) => s.startsWith(claimed ? 'That is about ' : 'Our best guess is about '));
          expect(sentence).toBeDefined();
          expect(sentence).toContain(` ${amount(rate.slope, rate.decimals)} `);
        } else if (rate.lower !== 0 || rate.upper !== 0) {
          expect(text).toContain('Our best guess is close to no change.');
        }
        if (rate.lower !== null && rate.upper !== null && !(rate.lower === 0 && rate.upper === 0)) {
          // each bound with its own decimals: both are two significant figures where the range spans zero
          const words =
            rate.lower > 0
              ? `${fmt(rate.lower, rate.lowerDecimals)} to ${fmt(rate.upper, rate.upperDecimals)} more`
              : rate.upper < 0
                ? `${fmt(rate.upper, rate.upperDecimals)} to ${fmt(rate.lower, rate.lowerDecimals)} fewer`
                : `${amount(rate.lower, rate.lowerDecimals)} to ${amount(rate.upper, rate.upperDecimals)}`;
          if (rate.lower < 0 && rate.upper > 0) expect(words).toMatch(/^[\d.,]+ fewer to [\d.,]+ more$/u);
          expect(text).toContain(`95% confidence interval runs from ${words}`);
          checked += 1;
        }
        // No signed numbers and no likelihood word in the rate sentences (Hirsch et al. 2015 words
        // are kept for the chance of a direction).
        for (const s of i.sentences.filter((x) => /confidence interval|best guess|That is about/.test(x))) {
          expect(s).not.toMatch(/[+\u2212]\d|\blikely\b|\bprobabl/);
        }
      }
    }
    expect(checked).toBeGreaterThan(20);
  });

  test('season values in "what changed" equal the model values at two significant figures; counts as whole numbers', () => {
    for (const b of set.bulletins) {
      for (const i of b.indicators) {
        if (i.seasonValue === null) continue;
        if (i.indicator === 'wildlife-reports') {
          expect(Number.isInteger(i.seasonValue)).toBe(true);
          const n = i.seasonValue;
          const said =
            n === 0
              ? 'No animals harmed by litter were reported this season'
              : `${n} ${n === 1 ? 'animal' : 'animals'} harmed by litter ${n === 1 ? 'was' : 'were'} reported this season`;
          expect(b.changes.some((c) => c.startsWith(said))).toBe(true);
          continue;
        }
        const shown = formatPlain(i.seasonValue);
        // The plain form is the same rounded number as two significant figures, trailing zeros dropped.
        expect(Number(shown.replace(/,/g, ''))).toBe(Number(formatSignificant(i.seasonValue).replace(/,/g, '')));
        // a median below the lab's detection limit is never printed as a measurement
        const said = i.seasonValueCensored ? `this season: below the lab's detection limit (${shown} ` : `this season: ${shown} ${i.unit}`;
        expect(b.changes.some((c) => c.includes(said))).toBe(true);
      }
    }
  });

  test('modelled arrivals are said to be modelled particles, with the model number', () => {
    for (const b of set.bulletins) {
      if (!b.drift) continue;
      const text = b.sections.visitors.sentences.join(' ');
      const perKm = b.drift.arrivalsPerKm;
      expect(text).toContain(perKm === 0 ? 'In the drift model, no modelled particles reached this stretch' : `In the drift model, about ${formatPlain(perKm)} modelled`);
      expect(text).toContain('This shows where floating litter tends to go, not how much there is.');
    }
  });

  test('the beach-litter threshold is the threshold value used in the EU, never a limit', () => {
    for (const b of set.bulletins) {
      const text = mainText(b).join(' ');
      expect(text).not.toMatch(/EU limit|legal limit of/);
      const litter = b.indicators.find((i) => i.indicator === 'beach-litter');
      if (litter?.seasonValue !== null && litter?.seasonValue !== undefined) {
        expect(b.sections.visitors.sentences.join(' ')).toContain('the threshold value used in the European Union (20 items per 100 m)');
      }
    }
  });

  test('a level change says why, naming the rule that started or stopped applying', () => {
    let changed = 0;
    for (const b of set.bulletins) {
      if (!b.previousLevel || b.previousLevel.rank === b.level.rank) {
        expect(b.changes.some((c) => c.startsWith('The level went'))).toBe(false);
        continue;
      }
      const sentence = b.changes[0] ?? '';
      // A move to or from "no level" is no rise or fall of a level, and names no rule.
      if (b.level.rank === 0 || b.previousLevel.rank === 0) {
        expect(sentence).toMatch(/^Last season (no level was set; this season it is|the level was) .+\.$/u);
        continue;
      }
      changed += 1;
      expect(sentence).toMatch(new RegExp(`^The level went ${b.level.rank > b.previousLevel.rank ? 'up' : 'down'} from .* because .+\\.$`));
      const moving = b.indicators.some((i) => i.direction === (b.level.rank < b.previousLevel!.rank ? 'rising' : 'falling'));
      expect(b.changes.includes('The level looks at the last four seasons; the trend looks at all the years, so the two can differ.')).toBe(moving);
    }
    expect(changed).toBeGreaterThan(0);
  });

  test('the previous season is marked published only when it has a bulletin', () => {
    const published = new Set(scenario.settings.publications.map((p) => p.season));
    for (const b of set.bulletins) {
      expect(b.previousSeasonPublished).toBe(b.previousSeason !== null && published.has(b.previousSeason.id));
    }
    expect(set.bulletins.filter((b) => b.season.id === '2026-summer').every((b) => b.previousSeasonPublished === false)).toBe(true);
  });

  test('no statistical jargon or unrounded numbers in the main text', () => {
    for (const b of set.bulletins) {
      for (const sentence of mainText(b)) {
        expect(sentence).not.toMatch(/q-value|\bSen\b|heterogeneity|Mann|Kendall|p-value|bootstrap/i);
        // At most three decimals, except a number below 0.01 at two significant figures (a tiny
        // rate or a bound kept apart from zero, "0.0025"); never a padded 0.0000.
        for (const m of sentence.matchAll(/\d+\.\d{4,}/gu)) expect(m[0]).toMatch(/^0\.00\d*[1-9]\d?$/u);
        expect(sentence).not.toMatch(/(^|[^\d.,])1 (items|animals|particles|seasons|samples)\b/);
      }
    }
  });

  test('the demo says its data are invented', () => {
    expect(set.site.invented).toBe(true);
    expect(set.bulletins.every((b) => b.invented)).toBe(true);
  });
});
