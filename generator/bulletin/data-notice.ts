/**
 * The notice every page carries when its figures are not real, final monitoring results. The
 * settings choose which (`dataNotice`); without it, `invented: true` gives the demo notice.
 *
 * - demo: a made-up coast, places, agencies and figures.
 * - test-data: real places with made-up figures (a coast used to try the tool out).
 * - provisional: real places with figures not yet checked by the agencies that collected them.
 */
import type { DataNotice } from '../model/types.ts';

export type DataNoticeKind = DataNotice['kind'];

export function dataNoticeOf(settings: { invented: boolean; dataNotice?: DataNoticeKind | 'none' | undefined }): DataNotice | null {
  const kind = settings.dataNotice ?? (settings.invented ? 'demo' : 'none');
  switch (kind) {
    case 'demo':
      return {
        kind,
        title: 'Data invented for demonstration.',
        text: 'Places, agencies and figures here are made up; do not use them for any decision.',
      };
    case 'test-data':
      return {
        kind,
        title: 'Test figures on real places.',
        text: 'The places are real, but the figures are made up to test this site. They say nothing about plastic at these places; do not use them for any decision.',
      };
    case 'provisional':
      return {
        kind,
        title: 'Provisional figures.',
        text: 'The agencies that collected these figures have not yet checked them, and they may change. For harvesting and health, ask the authorities named on each page.',
      };
    case 'none':
      return null;
  }
}
