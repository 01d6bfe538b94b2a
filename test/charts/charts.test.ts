// Snapshot of every kind of chart the site draws (site/lib/chart.ts), one named scenario each:
// test/output/<scenario>.svg. See test/snapshot.ts for the normalisation and the review workflow.
import { describe, expect, it } from 'vitest';
import { chartPlanOf, renderIndicatorChart, yScale } from '../../site/lib/chart.ts';
import { pageBulletin } from '../../site/lib/model.ts';
import { svgSnapshot } from '../snapshot.ts';
import { seasonSampleSummaries } from '../../generator/model/sample-summary.ts';
import { bulletin as fixtureBulletin, countSeries, indicatorOf, manySamples } from './fixture-pictures.ts';

describe('chart pictures', () => {
  svgSnapshot(function trendBandAndThreshold() {
    const beach = indicatorOf('beach-litter');
    if (!beach.threshold || !beach.trend?.band) throw new Error('the fixture beach-litter series lost its threshold or band');
    return renderIndicatorChart(beach, {});
  });

  svgSnapshot(function censoredBelowDetection() {
    const tissue = indicatorOf('shellfish-tissue');
    if (!tissue.observations.some((o) => o.censored)) throw new Error('the fixture tissue series has no value below detection');
    return renderIndicatorChart(tissue, {});
  });

  svgSnapshot(function seasonalPanels() {
    return renderIndicatorChart({ ...indicatorOf('beach-litter'), seasonsDisagree: true }, {});
  });

  svgSnapshot(function allZeroSeries() {
    return renderIndicatorChart(countSeries([0, 0, 0, 0, 0, 0]), {});
  });

  svgSnapshot(function countsWholeNumberAxis() {
    return renderIndicatorChart(countSeries([0, 1, 0, 2, 1, 3, 0, 1, 2, 1, 0, 3]), {});
  });

  svgSnapshot(function senLineWithoutBand() {
    const water = indicatorOf('water-microplastics');
    const trend = water.trend;
    if (!trend?.sen) throw new Error('the fixture water series has no Sen line');
    return renderIndicatorChart({ ...water, trend: { ...trend, band: null } }, {});
  });

  svgSnapshot(function tooLittleDataNoTrendMark() {
    return renderIndicatorChart({ ...indicatorOf('beach-litter'), direction: 'too-little-data' }, {});
  });

  svgSnapshot(function seasonMediansOfManySamples() {
    // 2,000 copies of each sample: the 1,000,000-row table that once overflowed the stack in yScale
    const many = manySamples(2000);
    const summaries = seasonSampleSummaries(many.observations);
    if (!summaries) throw new Error('the many-samples series was not summarised');
    const svg = renderIndicatorChart({ ...many, sampleSummaries: summaries }, {});
    // one dot per season, not one per sample
    if ((svg.match(/<circle/g) ?? []).length !== summaries.length) throw new Error('the chart does not draw one dot per season');
    return svg;
  });

  svgSnapshot(function narrowPhoneWidth() {
    return renderIndicatorChart(indicatorOf('beach-litter'), { width: 340 });
  });
});

describe('chart scales on large series', () => {
  it('finds the y range of a million values without overflowing the call stack', () => {
    // a 1,000,000-row beach-litter table crashed the build here: Math.max(...values) takes one argument per value
    const values = Array.from({ length: 1_000_000 }, (_, i) => (i * 7919) % 1000);
    expect(() => yScale(indicatorOf('beach-litter'), values, [], [])).not.toThrow();
    // a count axis states its domain: from 0 to at least the highest value, 999
    const domain = yScale(countSeries([0]), values, [], [])['domain'] as [number, number];
    expect(domain[0]).toBe(0);
    expect(domain[1]).toBeGreaterThanOrEqual(999);
  });
});

describe('bulletins of many samples in the site', () => {
  it('keeps the first and last sample of a summarised series, and its chart is the same as from every sample', () => {
    const many = manySamples(50);
    const summaries = seasonSampleSummaries(many.observations);
    if (!summaries) throw new Error('the many-samples series was not summarised');
    const full = { ...many, sampleSummaries: summaries };
    const bulletin = { ...fixtureBulletin, indicators: [full, indicatorOf('water-microplastics')] };
    const slim = pageBulletin(bulletin);
    const [slimLitter, slimWater] = slim.indicators;
    expect(slimLitter?.observations).toEqual([full.observations[0], full.observations[full.observations.length - 1]]);
    expect(slimWater).toBe(bulletin.indicators[1]);
    expect(renderIndicatorChart(slimLitter!, {})).toBe(renderIndicatorChart(full, {}));
    expect(chartPlanOf(slimLitter!)).toEqual(chartPlanOf(full));
  });
});
