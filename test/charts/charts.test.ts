// Snapshot of every kind of chart the site draws (site/lib/chart.ts), one named scenario each:
// test/output/<scenario>.svg. See test/snapshot.ts for the normalisation and the review workflow.
import { describe } from 'vitest';
import { renderIndicatorChart } from '../../site/lib/chart.ts';
import { svgSnapshot } from '../snapshot.ts';
import { countSeries, indicatorOf } from './fixture-pictures.ts';

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

  svgSnapshot(function narrowPhoneWidth() {
    return renderIndicatorChart(indicatorOf('beach-litter'), { width: 340 });
  });
});
