/**
 * case 8: the notice on every page fits the data the settings describe (our own wording).
 */
import { describe, expect, test } from 'vitest';
import { dataNoticeOf } from '../../generator/bulletin/data-notice.ts';
import { siteModel } from '../../generator/model/assemble-model.ts';
import { defaultRiskRules } from '../../generator/risk/default-rules.ts';
import { fixtureScenario } from '../model/fixture.ts';

describe('case 8, a notice that fits the data', () => {
  test('case 8: a real coast with made-up figures is not told its places are made up', () => {
    const notice = dataNoticeOf({ invented: true, dataNotice: 'test-data' });
    expect(notice?.title).toBe('Test figures on real places.');
    expect(notice?.text).toBe(
      'The places are real, but the figures are made up to test this site. They say nothing about plastic at these places; do not use them for any decision.',
    );
    expect(notice?.text).not.toMatch(/Places, agencies/u);
  });
  test('case 8: provisional figures defer to the authorities; the demo keeps its notice; real final data has none', () => {
    expect(dataNoticeOf({ invented: false, dataNotice: 'provisional' })).toEqual({
      kind: 'provisional',
      title: 'Provisional figures.',
      text: 'The agencies that collected these figures have not yet checked them, and they may change. For harvesting and health, ask the authorities named on each page.',
    });
    expect(dataNoticeOf({ invented: true })?.text).toBe('Places, agencies and figures here are made up; do not use them for any decision.');
    expect(dataNoticeOf({ invented: false })).toBeNull();
    expect(dataNoticeOf({ invented: true, dataNotice: 'none' })).toBeNull();
  });
  test('case 8: the site model carries the notice the settings chose', () => {
    const scenario = fixtureScenario();
    const site = siteModel({ ...scenario, settings: { ...scenario.settings, dataNotice: 'provisional' } }, defaultRiskRules, scenario.settings.publications);
    expect(site.notice?.kind).toBe('provisional');
  });
});
