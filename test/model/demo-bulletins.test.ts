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
import { buildModel } from '../../generator/model/build-model.ts';
import type { Bulletin } from '../../generator/model/types.ts';
import { loadScenario } from '../../generator/read/load-scenario.ts';

const scenario = await loadScenario('content/demo');
const set = buildModel(scenario);

function mainText(b: Bulletin): string[] {
  return [
    b.headline,
    ...b.summary,
    ...b.changes,
    ...b.indicators.flatMap((i) => i.sentences),
    ...(b.sections.growers?.sentences ?? []),
    ...b.sections.visitors.sentences,
  ];
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
    for (const b of set.bulletins) {
      for (const i of b.indicators) {
        const claims = i.sentences.some((s) => /is going (up|down)\.|more .* each year|fewer .* each year/.test(s));
        if (claims) {
          expect(i.qValue).not.toBeNull();
          expect(i.qValue!).toBeLessThan(rate);
          expect(['rising', 'falling']).toContain(i.direction);
        } else {
          expect(['no-clear-direction', 'too-little-data']).toContain(i.direction);
        }
      }
    }
  });

  test('the rates printed equal the model slopes after the width rounding rule', () => {
    for (const b of set.bulletins) {
      for (const i of b.indicators) {
        if (i.direction === 'too-little-data') continue;
        const rate = printedRate({
          subject: i.label, unit: i.unit, trend: i.trend, direction: i.direction, qValue: i.qValue, probabilityUp: i.probabilityUp,
          falseDiscoveryRate: 0, confidence: scenario.settings.trend.confidence, segmentsTested: 0, seasonLabels: {}, samples: null,
        });
        if (!rate) continue;
        const sentence = i.sentences.find((s) => s.startsWith('That is about') || s.startsWith('Our best guess'));
        expect(sentence).toBeDefined();
        const size = Math.abs(rate.slope).toLocaleString('en-US', { minimumFractionDigits: rate.decimals, maximumFractionDigits: rate.decimals });
        expect(sentence).toContain(size);
      }
    }
  });

  test('the demo says its data are invented', () => {
    expect(set.site.invented).toBe(true);
    expect(set.bulletins.every((b) => b.invented)).toBe(true);
  });
});
