// Progress: phases with counts and times on a terminal, one line per phase in a log, and
// nothing at all with --quiet or when the CI variable is set.
import { describe, expect, test } from 'vitest';
import { createProgress, formatDuration, isContinuousIntegration } from '../../generator/progress/progress.ts';

function recorder(isTTY: boolean): { text: () => string; stream: { isTTY: boolean; write: (s: string) => void } } {
  let text = '';
  return { text: () => text, stream: { isTTY, write: (s: string) => (text += s) } };
}

describe('progress', () => {
  test('a terminal sees counts redrawn in place and a final line per phase', () => {
    const out = recorder(true);
    const progress = createProgress({ stream: out.stream, env: {}, redrawEveryMs: 0 });
    progress.start('reading');
    progress.update(10, 20);
    progress.start('statistics', 2000);
    progress.update(2000);
    progress.end();
    expect(out.text()).toContain('\r\x1b[2K  reading      10 of 20');
    expect(out.text()).toMatch(/statistics {3}2,000 in \d+ ms\n$/);
    expect(progress.timings().map((timing) => [timing.phase, timing.done, timing.total])).toEqual([
      ['reading', 10, 20],
      ['statistics', 2000, 2000],
    ]);
  });
  test('a log file gets one plain line per phase, without control codes', () => {
    const out = recorder(false);
    const progress = createProgress({ stream: out.stream, env: {} });
    progress.start('pages', 3, 'pages');
    progress.update(2);
    progress.end();
    expect(out.text()).toMatch(/^ {2}pages {8}2 of 3 pages in \d+ ms\n$/);
  });
  test.each([
    [{ CI: 'true' }, false],
    [{ CI: '1' }, false],
    [{}, true],
    [{ CI: 'false' }, true],
  ])('environment %j shown: %s', (env, shown) => {
    const out = recorder(true);
    const progress = createProgress({ stream: out.stream, env });
    progress.start('reading');
    progress.end();
    progress.note('done');
    expect(out.text() !== '').toBe(shown);
    expect(progress.timings()).toHaveLength(1); // timings are kept even when quiet
  });
  test('--quiet silences a terminal', () => {
    const out = recorder(true);
    const progress = createProgress({ stream: out.stream, env: {}, quiet: true });
    progress.start('reading');
    progress.end();
    expect(out.text()).toBe('');
    expect(isContinuousIntegration({ CI: 'yes' })).toBe(true);
  });
  test('durations read naturally', () => {
    expect(formatDuration(850)).toBe('850 ms');
    expect(formatDuration(12_340)).toBe('12.3 s');
    expect(formatDuration(125_000)).toBe('2 min 05 s');
  });
});
