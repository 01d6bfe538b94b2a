/**
 * The two CSV downloads of a bulletin: every observation behind it, and the trend results per
 * indicator (RFC 4180: comma separated, CRLF line ends, fields quoted when they hold a
 * comma, quote or line break). Cells that would start a spreadsheet formula (=, +, -, @)
 * are prefixed with an apostrophe when they are text — common practice against formula
 * injection; numbers are written as plain numbers.
 */
import type { Bulletin } from './types.ts';

type Cell = string | number | boolean | null | undefined;

function cell(value: Cell): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  if (typeof value === 'boolean') return value ? 'true' : 'false';
  const text = /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function toCsv(header: string[], rows: Cell[][]): string {
  return [header, ...rows].map((r) => r.map(cell).join(',')).join('\r\n') + '\r\n';
}

export function observationsCsv(b: Bulletin): string {
  const rows: Cell[][] = [];
  for (const ind of b.indicators) {
    for (const o of ind.observations) {
      rows.push([b.segment.id, b.season.id, ind.indicator, o.date, o.season, o.value, o.censored, ind.unitShort, o.note ?? '']);
    }
  }
  return toCsv(['segment_id', 'bulletin_season', 'indicator', 'date', 'sample_season', 'value', 'below_detection_limit', 'unit', 'note'], rows);
}

export function resultsCsv(b: Bulletin): string {
  const rows = b.indicators.map((i): Cell[] => {
    const t = i.trend;
    return [
      b.segment.id,
      b.season.id,
      i.indicator,
      i.unitShort,
      t?.n ?? 0,
      t?.nCensored ?? 0,
      i.seasonValue,
      i.seasonValueCensored ?? false,
      i.assessmentValue,
      i.assessmentValueCensored ?? false,
      t?.mannKendall?.S,
      t?.mannKendall?.z,
      t?.mannKendall?.p,
      t?.mannKendall?.tau,
      i.qValue,
      t?.sen?.slope,
      t?.sen?.lower,
      t?.sen?.upper,
      t?.sen?.confidence,
      i.direction,
      i.probabilityUp,
      i.threshold?.value ?? null,
      b.level.id,
      b.level.rank,
    ];
  });
  return toCsv(
    [
      'segment_id',
      'bulletin_season',
      'indicator',
      'unit',
      'n',
      'n_below_detection',
      'season_median',
      'season_median_below_detection_limit',
      'assessment_median',
      'assessment_median_below_detection_limit',
      'mk_S',
      'mk_z',
      'mk_p',
      'kendall_tau',
      'bh_q',
      'sen_slope_per_year',
      'sen_lower',
      'sen_upper',
      'confidence',
      'direction',
      'probability_up',
      'threshold',
      'level',
      'level_rank',
    ],
    rows,
  );
}
