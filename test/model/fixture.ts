/**
 * A small invented scenario held in memory, and a trend engine for model tests built from the
 * Mann–Kendall test, pairwise slopes and Benjamini–Hochberg adjustment of generator/stats, with a
 * fixed stand-in for the bootstrap chance. Used to test the model's plumbing on its own.
 */
import { benjaminiHochberg } from '../../generator/stats/benjamini-hochberg.ts';
import { mannKendall } from '../../generator/stats/mann-kendall.ts';
import { listAllSlopes } from '../../generator/stats/slope-selection.ts';
import { prepareSeries } from '../../generator/stats/series-input.ts';
import type { TrendEngine } from '../../generator/model/evaluate-season.ts';
import { decimalYear, seasonOfDate } from '../../generator/model/seasons.ts';
import { median } from '../../generator/model/series.ts';
import { settingsSchema } from '../../generator/scenario/settings.ts';
import type { LoadedScenario, Record as ScenarioRecord, Segment } from '../../generator/scenario/types.ts';
import type { IndicatorId } from '../../generator/model/types.ts';

export const testEngine: TrendEngine = {
  analyze(points) {
    const s = prepareSeries(points);
    const mk = mannKendall(s.t, s.y, s.censored);
    const slope = median([...listAllSlopes(s.t, s.y)]);
    return {
      n: s.t.length,
      nCensored: s.nCensored,
      mannKendall: { S: mk.S, varS: mk.varS, z: mk.z, p: mk.p, tau: mk.tau },
      sen: { slope, lower: slope === null ? null : slope - 1, upper: slope === null ? null : slope + 1, intercept: null, confidence: 0.95 },
      probabilityUp: mk.S > 0 ? 0.97 : mk.S < 0 ? 0.03 : 0.5,
      insufficient: s.t.length < 3 ? { rule: 'n', reason: 'fewer than 3 values' } : null,
    };
  },
  adjust: (p) => benjaminiHochberg(p),
  regional: () => null,
};

export function segment(id: string, name: string, kind: Segment['kind'], shellfish: Segment['shellfish']): Segment {
  return {
    id,
    name,
    kind,
    shellfish,
    place: 'Brinmouth',
    lengthKm: 2,
    geometry: {
      type: 'LineString',
      coordinates: [
        [0, 50],
        [0.02, 50.01],
      ],
    },
    bbox: [0, 50, 0.02, 50.01],
  };
}

export function record(indicator: IndicatorId, segmentId: string, date: string, value: number, censored = false, extra: ScenarioRecord['extra'] = {}): ScenarioRecord {
  const season = seasonOfDate(date, settings.seasons) ?? '';
  return { indicator, segmentId, date, t: decimalYear(date), season, seasonName: season.slice(5), value, censored, extra, source: { file: 'tables/x.csv', row: 2 } };
}

const settings = settingsSchema.parse({
  invented: true,
  region: { id: 'brin-coast', name: 'Brin Coast', description: 'Invented for tests.' },
  publisher: { role: 'publisher', name: 'Brin Coast Watch' },
  authorities: [
    { role: 'shellfish-sanitation', name: 'Brin Shellfish Board', phone: '+00 555 0101' },
    { role: 'debris-report', name: 'Brin Debris Desk', phone: '+00 555 0102' },
  ],
  publications: [
    { season: '2026-summer', date: '2026-09-01' },
    { season: '2026-autumn', date: '2026-12-01' },
  ],
  corrections: [{ season: '2026-summer', segment: 'east-bay', date: '2026-09-20', reason: 'A survey was entered twice.' }],
  trend: { bootstrapResamples: 0 },
});

/** Mid-season survey dates from winter 2019 to autumn 2026. */
export function seasonDates(): string[] {
  const dates: string[] = [];
  for (let year = 2019; year <= 2026; year += 1) for (const month of ['01', '04', '07', '10']) dates.push(`${year}-${month}-15`);
  return dates;
}

export function fixtureScenario(): LoadedScenario {
  const records: ScenarioRecord[] = [];
  seasonDates().forEach((date, k) => {
    // East Bay: rising by about 3 items/100 m per season with small wiggles.
    records.push(record('beach-litter', 'east-bay', date, 20 + 3 * k + (k % 3), false, { cleanCoastIndex: 4 + k / 4 }));
    // North Beach: no trend, values cycle.
    records.push(record('beach-litter', 'north-beach', date, [14, 9, 17, 11, 15, 8][k % 6]!));
    // Shellfish at East Bay: below detection at first, then measured.
    records.push(record('shellfish-tissue', 'east-bay', date, k < 8 ? 0.05 : 0.05 + 0.01 * k, k < 8, { species: 'mussel' }));
  });
  // West Cove: surveyed only in 2026.
  for (const date of ['2026-01-15', '2026-04-15', '2026-07-15', '2026-10-15']) records.push(record('beach-litter', 'west-cove', date, 12));
  records.sort((a, b) => (a.indicator + a.segmentId + a.date < b.indicator + b.segmentId + b.date ? -1 : 1));
  return {
    dir: '/invented',
    settings,
    segments: [segment('north-beach', 'North Beach', 'beach', 'none'), segment('east-bay', 'East Bay', 'bay', 'farmed'), segment('west-cove', 'West Cove', 'beach', 'none')],
    records,
    drift: null,
    inputs: [{ file: 'datapackage.json', sha256: 'a'.repeat(64), bytes: 10 }],
    report: { ok: true, files: [], issues: [] },
  };
}
