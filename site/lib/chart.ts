/**
 * Indicator charts as inline SVG strings, drawn at build time with Observable Plot on a
 * linkedom document (no browser, no client script). Marks: the uncertainty band of the
 * trend, the Sen line, observations (filled dots; values below the detection limit as open
 * downward triangles drawn at the limit), and the threshold line where the model has one.
 * Where the model says seasons disagree, one small panel per season of the year.
 * Each chart is rendered once per build and reused (bulletin, permalink and embed pages).
 */
import * as Plot from '@observablehq/plot';
import { parseHTML } from 'linkedom';
import { max, min, ticks as niceTicks } from 'd3-array';
import { chartTrendMark, type ChartPlanInput } from '../../generator/bulletin/chart-words.ts';
import type { IndicatorBulletin } from '../../generator/model/types.ts';

const { document } = parseHTML('<!doctype html><html><head></head><body></body></html>');
const cache = new Map<string, string>();

const ink = '#1f2a33';
const bandFill = '#9fb9c7';
const lineColour = '#0f4c5c';
const thresholdColour = '#963f30';

/** Decimal year → UTC Date (year length 365.25 days, matching the model's decimal years). */
export function dateFromDecimalYear(t: number): Date {
  const year = Math.floor(t);
  return new Date(Date.UTC(year, 0, 1) + (t - year) * 365.25 * 864e5);
}

function dateFromIso(iso: string): Date {
  return new Date(`${iso.slice(0, 10)}T00:00:00Z`);
}

/** Round numbers inside geometry attributes to one decimal; leave text (tick labels) alone. */
export function roundSvgNumbers(svg: string): string {
  return svg.replace(
    / (d|x|y|x1|x2|y1|y2|cx|cy|r|width|height|transform|points|viewBox)="([^"]*)"/g,
    (_, name: string, value: string) => ` ${name}="${value.replace(/-?\d*\.\d+(?:e-?\d+)?/g, (n) => String(Math.round(Number(n) * 10) / 10))}"`,
  );
}

/** Plot labels its mark groups with aria-label; inside an image role those labels are noise
 * and axe flags them on a plain <g>, so give the root role="img" and drop the group labels. */
function tidyAria(svg: string): string {
  return svg.replace(/(<g\b[^>]*?) aria-label="[^"]*"/g, '$1').replace(/^<svg /, '<svg role="img" focusable="false" ');
}

/** The threshold's label, with its value appended unless the label already states it. */
export function thresholdText(threshold: { value: number; label: string }): string {
  return threshold.label.includes(String(threshold.value)) ? threshold.label : `${threshold.label} ${threshold.value}`;
}

export function seasonOfYear(seasonId: string): string {
  return seasonId.replace(/^\d{4}-/, '');
}

const seasonOrder = ['winter', 'spring', 'summer', 'autumn'];

/** The inputs of the shared chart rule (generator/bulletin/chart-words.ts) for one indicator. */
export function chartPlanOf(indicator: IndicatorBulletin): ChartPlanInput {
  return {
    direction: indicator.direction,
    seasonsDisagree: indicator.seasonsDisagree,
    trend: indicator.trend,
    // summarised samples: every sample lies between a season's lowest and highest
    values: indicator.sampleSummaries ? indicator.sampleSummaries.flatMap((s) => [s.lowest, s.highest]) : (indicator.seasonTotals ?? indicator.observations).map((o) => o.value),
  };
}

/** Counts (animals reported) are whole numbers: their axis gets whole-number ticks only. */
export function isCountIndicator(indicator: Pick<IndicatorBulletin, 'indicator'>): boolean {
  return indicator.indicator === 'wildlife-reports';
}

/**
 * The y scale: from 0, with ticks a reader can read. Counts get whole-number ticks (0, 1, 2… or
 * 0, 5, 10…); a series whose values are all 0 gets a 0–1 axis rather than a collapsed one.
 */
export function yScale(
  indicator: Pick<IndicatorBulletin, 'indicator' | 'unitShort' | 'threshold'>,
  values: readonly number[],
  bandLower: readonly (number | null)[],
  bandUpper: readonly (number | null)[],
): Record<string, unknown> {
  const finite = (list: readonly (number | null)[]) => list.filter((v): v is number => v !== null && Number.isFinite(v));
  // d3's max/min walk the arrays: spreading thousands of values into Math.max overflows the stack
  const top = Math.max(0, max(values) ?? 0, max(finite(bandUpper)) ?? 0, indicator.threshold?.value ?? 0);
  const bottom = Math.min(0, min(values) ?? 0, min(finite(bandLower)) ?? 0);
  const base = { label: indicator.unitShort, grid: false, zero: true };
  if (isCountIndicator(indicator)) {
    const floor = Math.floor(bottom);
    const ceiling = Math.max(floor + 1, Math.ceil(top));
    const tickValues = niceTicks(floor, ceiling, Math.min(5, ceiling - floor)).filter((v) => Number.isInteger(v));
    const first = tickValues[0] ?? floor;
    const last = tickValues[tickValues.length - 1] ?? ceiling;
    return { ...base, domain: [Math.min(floor, first), Math.max(ceiling, last)], ticks: tickValues, tickFormat: 'd' };
  }
  if (top === 0) return { ...base, domain: [0, 1], ticks: [0, 0.5, 1] };
  return { ...base, nice: true };
}

interface ChartOptions {
  /** Keep the drawing under this key and return it when asked again; absent: draw, keep nothing. */
  cacheKey?: string;
  width?: number;
}

export function renderIndicatorChart(indicator: IndicatorBulletin, options: ChartOptions): string {
  const hit = options.cacheKey === undefined ? undefined : cache.get(options.cacheKey);
  if (hit !== undefined) return hit;
  const width = options.width ?? 420;
  const totals = indicator.seasonTotals ?? null;
  const summaries = indicator.sampleSummaries ?? null;
  const source = totals ?? indicator.observations;
  // Too many samples to draw one by one: each season's median, with its range (sample-summary.ts).
  const obs = summaries
    ? summaries.map((s) => ({
        date: dateFromDecimalYear(s.t),
        value: s.median,
        censored: false,
        season: seasonOfYear(s.season),
        title: `${s.season}: median ${s.median} ${indicator.unitShort} of ${s.samples} samples (lowest ${s.lowest}, highest ${s.highest})`,
      }))
    : source
        .filter((o) => o.value !== null)
        .map((o) => ({
          // Season totals sit at the middle of their season, where the trend band is computed.
          date: totals ? dateFromDecimalYear(o.t) : dateFromIso(o.date),
          value: o.value as number,
          censored: o.censored,
          season: seasonOfYear(o.season),
          title: totals
            ? `${o.season}: ${o.value} ${indicator.unitShort}`
            : o.censored
              ? `${o.date}: below the lab's detection limit (${o.value} ${indicator.unitShort})`
              : `${o.date}: ${o.value} ${indicator.unitShort}`,
        }));
  const seasonal = indicator.seasonsDisagree;
  const band = indicator.trend?.band ?? null;
  const sen = indicator.trend?.sen ?? null;
  const mark = chartTrendMark(chartPlanOf(indicator));
  const marks: Plot.Markish[] = [Plot.gridY({ stroke: '#c8d0d4', strokeOpacity: 0.7 })];

  if (mark === 'band' && band) {
    const rows = band.t.map((t, i) => ({ date: dateFromDecimalYear(t), lower: band.lower[i] ?? null, upper: band.upper[i] ?? null, fit: band.fit[i] ?? null }));
    marks.push(Plot.areaY(rows, { x: 'date', y1: 'lower', y2: 'upper', fill: bandFill, fillOpacity: 0.45 }));
    marks.push(Plot.lineY(rows, { x: 'date', y: 'fit', stroke: lineColour, strokeWidth: 2.5 }));
  } else if (mark === 'line' && sen && sen.slope !== null && sen.intercept !== null) {
    const t0 = source[0]!.t;
    const t1 = source[source.length - 1]!.t;
    const rows = [t0, t1].map((t) => ({ date: dateFromDecimalYear(t), fit: sen.intercept! + sen.slope! * t }));
    marks.push(Plot.lineY(rows, { x: 'date', y: 'fit', stroke: lineColour, strokeWidth: 2.5 }));
  }
  if (indicator.threshold) {
    marks.push(Plot.ruleY([indicator.threshold.value], { stroke: thresholdColour, strokeWidth: 1.5, strokeDasharray: '6 4' }));
    if (!seasonal) {
      // A short label at the left end, on the side of the line where the data are not (below
      // the line when most values lie above it); the key names the threshold in full.
      const sorted = obs.map((o) => o.value).sort((a, b) => a - b);
      const middle = sorted.length > 0 ? sorted[Math.floor(sorted.length / 2)]! : 0;
      const highest = sorted.length > 0 ? sorted[sorted.length - 1]! : 0;
      // Below the line only when there is room between it and the zero line.
      const below = middle >= indicator.threshold.value && indicator.threshold.value / Math.max(highest, indicator.threshold.value) >= 0.12;
      marks.push(
        Plot.text([indicator.threshold.value], {
          y: (d: number) => d,
          frameAnchor: 'left',
          dx: 4,
          dy: below ? 11 : -8,
          text: () => `threshold ${indicator.threshold!.value} ${indicator.unitShort}`,
          fill: thresholdColour,
          fontSize: 12,
          textAnchor: 'start',
        }),
      );
    }
  }
  // Seasons of the year as a 2 × 2 grid of panels (winter, spring / summer, autumn), each named inside its frame.
  const seasonsPresent = seasonOrder.filter((s) => obs.some((o) => o.season === s));
  const cell = (season: string) => {
    const i = seasonsPresent.indexOf(season);
    return { col: i % 2, row: Math.floor(i / 2) };
  };
  const facet = seasonal ? { fx: (d: { season: string }) => cell(d.season).col, fy: (d: { season: string }) => cell(d.season).row } : {};
  if (seasonal) {
    marks.push(
      Plot.text(
        seasonsPresent.map((season) => ({ season })),
        { ...facet, text: 'season', frameAnchor: 'top-left', dx: 5, dy: 5, fontWeight: 600, fill: ink },
      ),
    );
  }
  if (summaries) {
    marks.push(
      Plot.ruleX(
        summaries.map((s) => ({ date: dateFromDecimalYear(s.t), lowest: s.lowest, highest: s.highest, season: seasonOfYear(s.season) })),
        { x: 'date', y1: 'lowest', y2: 'highest', stroke: ink, strokeOpacity: 0.55, strokeWidth: 1.2, ...facet },
      ),
    );
  }
  marks.push(
    Plot.dot(
      obs.filter((o) => !o.censored),
      { x: 'date', y: 'value', r: 2.6, fill: ink, fillOpacity: 0.8, stroke: '#fff', strokeWidth: 0.6, title: 'title', ...facet },
    ),
  );
  marks.push(
    Plot.dot(
      obs.filter((o) => o.censored),
      { x: 'date', y: 'value', r: 4, symbol: 'triangle', rotate: 180, fill: '#fff', stroke: ink, strokeWidth: 1.3, title: 'title', ...facet },
    ),
  );
  if (seasonal) marks.push(Plot.frame({ stroke: '#c8d0d4' }));

  const plot = Plot.plot({
    document: document as unknown as Document,
    ariaLabel: `${indicator.label}: ${indicator.chartDescription}`,
    width,
    height: seasonal ? 320 : 250,
    marginLeft: 44,
    marginRight: 16,
    marginTop: 20,
    marginBottom: 30,
    style: { fontSize: '13px', fontFamily: 'inherit', color: ink, background: 'transparent', overflow: 'visible' },
    x: seasonal ? { type: 'utc', label: null, ticks: 3, inset: 6 } : { type: 'utc', label: null, ticks: 5, inset: 8 },
    y: yScale(
      indicator,
      summaries ? summaries.flatMap((s) => [s.lowest, s.highest]) : obs.map((o) => o.value),
      mark === 'band' && band ? band.lower : [],
      mark === 'band' && band ? band.upper : [],
    ),
    ...(seasonal ? { fx: { axis: null, padding: 0.06 }, fy: { axis: null, padding: 0.1 } } : {}),
    marks,
  });
  const svg = tidyAria(roundSvgNumbers((plot as unknown as { outerHTML: string }).outerHTML));
  if (options.cacheKey !== undefined) cache.set(options.cacheKey, svg);
  return svg;
}
