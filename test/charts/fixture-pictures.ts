/**
 * The small fixed datasets the picture snapshots draw: the invented fixture model
 * (test/fixtures/model, made by its seeded script; every place and number is invented) and a few
 * hand-made series for the edge cases it does not hold.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Bulletin, IndicatorBulletin, IndicatorId, RegionSummary } from '../../generator/model/types.ts';
import type { MapSegment } from '../../site/lib/map.ts';

const fixture = join(import.meta.dirname, '..', 'fixtures', 'model');

export const bulletin = JSON.parse(readFileSync(join(fixture, 'bulletins', '2026-autumn', 'tamsey-estuary.json'), 'utf8')) as Bulletin;
export const region = JSON.parse(readFileSync(join(fixture, 'regions', '2026-autumn.json'), 'utf8')) as RegionSummary;

export function indicatorOf(id: IndicatorId): IndicatorBulletin {
  const found = bulletin.indicators.find((i) => i.indicator === id);
  if (!found) throw new Error(`the fixture bulletin has no ${id}`);
  return found;
}

/** Wildlife reports (whole numbers) with the given values, one a season from spring 2017. */
export function countSeries(values: readonly number[]): IndicatorBulletin {
  return {
    ...indicatorOf('beach-litter'),
    indicator: 'wildlife-reports',
    unitShort: 'animals',
    threshold: null,
    direction: 'rising',
    seasonsDisagree: false,
    observations: values.map((value, i) => ({
      date: `${2017 + Math.floor(i / 4)}-0${1 + (i % 4) * 2}-15`,
      t: 2017 + i / 4 + 0.1,
      season: `${2017 + Math.floor(i / 4)}-spring`,
      value,
      censored: false,
    })),
  };
}

/** The region's segments as the maps take them (as site/lib/bulletin-view.ts prepares them). */
export const regionSegments: MapSegment[] = region.segments.map((s) => ({ id: s.id, name: s.name, level: s.level.id, levelLabel: s.level.label, geometry: s.geometry }));

/**
 * The fixture's beach-litter series with each sample repeated `copies` times, spread over its
 * season by a tenth of a day per copy and scaled by a seeded factor between 0.5 and 1.5: a table
 * with far more surveys than a chart can draw one by one.
 */
export function manySamples(copies: number): IndicatorBulletin {
  const beach = indicatorOf('beach-litter');
  let state = 20_261_205;
  const next = () => {
    // a small linear congruential generator (Numerical Recipes constants): fixed and seedable
    state = (Math.imul(state, 1_664_525) + 1_013_904_223) >>> 0;
    return state / 2 ** 32;
  };
  const observations = beach.observations.flatMap((o) =>
    Array.from({ length: copies }, (_, k) => ({ ...o, t: o.t + k / 3652.5, value: o.value === null ? null : Math.round(o.value * (0.5 + next()) * 10) / 10 })),
  );
  return { ...beach, observations };
}
