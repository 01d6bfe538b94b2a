/**
 * Per-phase build progress: counts and timings for a person watching a terminal, silence for
 * machines. A phase ("reading", "statistics", "pages", …) is started, updated with counts and
 * ended; every phase's wall time is kept so callers (the bench script, the build summary) can
 * print them whether or not anything was shown live.
 *
 * Output rules:
 * - interactive terminal (stream.isTTY) and not quiet: one line per phase, rewritten in place
 *   with a carriage return while counts arrive, finished with the phase's time;
 * - not a terminal and not quiet (a log file, a pipe): one plain line when each phase ends;
 * - quiet (`--quiet`, or the CI environment variable set to a true value): nothing at all.
 */
import { performance } from 'node:perf_hooks';

export interface PhaseTiming {
  phase: string;
  milliseconds: number;
  done: number | null;
  total: number | null;
}

export interface ProgressStream {
  write(text: string): unknown;
  isTTY?: boolean;
}

export interface Progress {
  /** Starts a phase; ends the running one first. `unit` follows the counts ("pages"). */
  start(phase: string, total?: number, unit?: string): void;
  /** Reports how far the running phase is; `detail` names the part in hand (e.g. a file). */
  update(done: number, total?: number, detail?: string): void;
  /** Ends the running phase. */
  end(): void;
  /** Timings of every ended phase, in order. */
  timings(): PhaseTiming[];
  /** Writes a line that is shown unless quiet (e.g. the final summary). */
  note(text: string): void;
}

export interface ProgressOptions {
  /** Defaults to false; forced to true when the environment says CI. */
  quiet?: boolean;
  /** Defaults to process.stderr (so stdout stays clean for data). */
  stream?: ProgressStream;
  /** Defaults to process.env. */
  env?: NodeJS.ProcessEnv;
  /** Milliseconds between live redraws on a terminal; defaults to 100. */
  redrawEveryMs?: number;
}

/** True when the environment variable CI holds a true-looking value ("true", "1", "yes"). */
export function isContinuousIntegration(env: NodeJS.ProcessEnv): boolean {
  const value = (env['CI'] ?? '').trim().toLowerCase();
  return value !== '' && value !== '0' && value !== 'false' && value !== 'no';
}

/** Formats milliseconds as "850 ms", "12.3 s" or "2 min 05 s". */
export function formatDuration(milliseconds: number): string {
  if (milliseconds < 1000) return `${Math.round(milliseconds)} ms`;
  const seconds = milliseconds / 1000;
  if (seconds < 60) return `${seconds.toFixed(1)} s`;
  const minutes = Math.floor(seconds / 60);
  const rest = Math.round(seconds - minutes * 60);
  return `${minutes} min ${String(rest).padStart(2, '0')} s`;
}

/** Formats a count with thin grouping: 5000000 → "5,000,000". */
export function formatCount(count: number): string {
  return Math.round(count).toLocaleString('en-GB');
}

function countText(done: number | null, total: number | null, unit = ''): string {
  if (done === null) return '';
  const counts = total === null || total === done ? formatCount(done) : `${formatCount(done)} of ${formatCount(total)}`;
  return unit ? `${counts} ${unit}` : counts;
}

export function createProgress(options: ProgressOptions = {}): Progress {
  const env = options.env ?? process.env;
  const stream: ProgressStream = options.stream ?? process.stderr;
  const quiet = options.quiet === true || isContinuousIntegration(env);
  const live = !quiet && stream.isTTY === true;
  const redrawEveryMs = options.redrawEveryMs ?? 100;
  const ended: PhaseTiming[] = [];
  let running: { phase: string; startedAt: number; done: number | null; total: number | null; detail: string; unit: string; drawnAt: number } | null = null;

  const line = (phase: string, detail: string): string => `  ${phase.padEnd(12)} ${detail}`;

  function draw(force: boolean): void {
    if (!live || running === null) return;
    const now = performance.now();
    if (!force && now - running.drawnAt < redrawEveryMs) return;
    running.drawnAt = now;
    const elapsed = formatDuration(now - running.startedAt);
    const counts = countText(running.done, running.total);
    const detail = running.detail ? `${running.detail}: ` : '';
    stream.write(`\r\x1b[2K${line(running.phase, `${detail}${counts}${counts ? '  ' : ''}${elapsed}`)}`);
  }

  function end(): void {
    if (running === null) return;
    const milliseconds = performance.now() - running.startedAt;
    ended.push({ phase: running.phase, milliseconds, done: running.done, total: running.total });
    if (!quiet) {
      const counts = countText(running.done, running.total, running.unit);
      const text = line(running.phase, `${counts}${counts ? ' in ' : ''}${formatDuration(milliseconds)}`);
      stream.write(live ? `\r\x1b[2K${text}\n` : `${text}\n`);
    }
    running = null;
  }

  return {
    start(phase, total, unit) {
      end();
      running = { phase, startedAt: performance.now(), done: null, total: total ?? null, detail: '', unit: unit ?? '', drawnAt: -Infinity };
      draw(true);
    },
    update(done, total, detail) {
      if (running === null) return;
      running.done = done;
      if (detail !== undefined) running.detail = detail;
      if (total !== undefined) running.total = total;
      draw(false);
    },
    end,
    timings: () => ended.slice(),
    note(text) {
      if (!quiet) stream.write(`${text}\n`);
    },
  };
}
