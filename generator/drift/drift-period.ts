/**
 * Plausibility of drift-model positions before they are tallied, per file:
 * - time: a position dated before the monitoring start (or, when none is set, before 1950, as no
 *   ocean-current forcing of a drift model reaches further back; common practice) or after the
 *   latest publication date is left out and counted (an error in the time units or reference
 *   date, such as "days since 1826" or a date in the future);
 * - place: when every kept position of a file lies more than 10 degrees from the bounding box of
 *   the segments, the coordinates are not degrees of this coast (radians, swapped axes), and the
 *   file is not used: arrivals of zero would otherwise be published as if measured.
 */
import { DriftFarFromCoast, PositionsOutsidePeriod } from '../errors.ts';
import type { IssueLog } from '../read/issue-log.ts';
import type { ScenarioSettings } from '../scenario/settings.ts';
import type { Segment } from '../scenario/types.ts';
import { max, min } from 'd3-array';

const earliestPlausible = '1950-01-01';
const marginDegrees = 10;

export class DriftPeriodGuard {
  private readonly startMs: number;
  private readonly endMs: number;
  readonly start: string;
  readonly end: string;
  private outside = 0;
  private firstOutside: number | null = null;
  private west = Infinity;
  private east = -Infinity;
  private south = Infinity;
  private north = -Infinity;
  private admitted = 0;
  private readonly coast: [number, number, number, number] | null;

  constructor(settings: ScenarioSettings, segments: readonly Segment[]) {
    this.start = settings.monitoringStart ?? earliestPlausible;
    const last =
      settings.publications
        .map((p) => p.date)
        .sort()
        .pop() ?? '2100-01-01';
    this.end = last;
    this.startMs = Date.parse(`${this.start}T00:00:00Z`);
    this.endMs = Date.parse(`${last}T00:00:00Z`) + 86_400_000;
    this.coast =
      segments.length === 0
        ? null
        : [
            min(segments, (s) => s.bbox[0]) as number,
            min(segments, (s) => s.bbox[1]) as number,
            max(segments, (s) => s.bbox[2]) as number,
            max(segments, (s) => s.bbox[3]) as number,
          ];
  }

  /** Whether a position is inside the period; counts it either way. */
  admit(timeMs: number, lon: number, lat: number): boolean {
    if (!(timeMs >= this.startMs && timeMs < this.endMs)) {
      this.outside++;
      if (this.firstOutside === null) this.firstOutside = timeMs;
      return false;
    }
    this.admitted++;
    if (lon < this.west) this.west = lon;
    if (lon > this.east) this.east = lon;
    if (lat < this.south) this.south = lat;
    if (lat > this.north) this.north = lat;
    return true;
  }

  /** Reports what the file had outside the period or far from the coast, then starts afresh. */
  report(file: string, log: IssueLog): void {
    if (this.outside > 0) {
      const first = this.firstOutside === null || !Number.isFinite(this.firstOutside) ? 'not a date' : new Date(this.firstOutside).toISOString().slice(0, 10);
      log.add(PositionsOutsidePeriod, PositionsOutsidePeriod.message(file, this.outside, first, this.start, this.end), {
        file,
        row: null,
        column: 'time',
        value: String(this.outside),
        expected: `times from ${this.start} to ${this.end}`,
        severity: 'warning',
        excluded: true,
      });
    }
    if (this.admitted > 0 && this.coast) {
      const [w, s, e, n] = this.coast;
      const far = this.east < w - marginDegrees || this.west > e + marginDegrees || this.north < s - marginDegrees || this.south > n + marginDegrees;
      if (far) {
        const box = `longitude ${this.west.toFixed(3)}..${this.east.toFixed(3)}, latitude ${this.south.toFixed(3)}..${this.north.toFixed(3)}`;
        const coast = `longitude ${w.toFixed(2)}..${e.toFixed(2)}, latitude ${s.toFixed(2)}..${n.toFixed(2)}`;
        log.add(DriftFarFromCoast, DriftFarFromCoast.message(file, box, coast), {
          file,
          row: null,
          column: 'lon/lat',
          value: box,
          expected: 'positions in degrees near the coast',
          severity: 'error',
          excluded: true,
        });
      }
    }
    this.outside = 0;
    this.firstOutside = null;
    this.admitted = 0;
    this.west = Infinity;
    this.east = -Infinity;
    this.south = Infinity;
    this.north = -Infinity;
  }
}
