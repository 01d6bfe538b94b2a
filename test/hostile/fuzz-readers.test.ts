// A seeded sample of the fuzz bench (bench/fuzz/run.ts runs 10,000 inputs per reader): generated
// CSV tables, segments, settings and drift positions, read as `wrackline check` reads them. No
// uncaught exception, exit 0/1/2 only, every left-out record named, nothing read from outside the
// scenario and nothing written into it. Definitions in fuzz-harness.ts.
import { describe, expect, test } from 'vitest';
import { fuzzReader, readerKinds, runTrial } from './fuzz-harness.ts';

describe('fuzzed readers: no crash, no escape, no loss', () => {
  test.each([...readerKinds])(
    '%s reader, 40 seeded inputs',
    async (kind) => {
      const tally = await fuzzReader(kind, 40, 20_261_205);
      expect(tally.examples).toEqual([]);
      expect(tally.tried).toBe(40);
      expect({ crashes: tally.crashes, escapes: tally.escapes, losses: tally.losses }).toEqual({ crashes: 0, escapes: 0, losses: 0 });
      expect(Object.keys(tally.exits).every((code) => ['0', '1', '2'].includes(code))).toBe(true);
    },
    120_000,
  );

  test.each([...readerKinds])(
    '%s reader: a link to a file outside the scenario is refused',
    async (kind) => {
      const outcome = await runTrial(kind, { kind: 'escape', folder: false });
      expect(outcome).toEqual({ exit: 1, crash: null, escape: null, loss: null });
    },
    60_000,
  );

  test('csv reader: a linked folder outside the scenario is refused', async () => {
    expect(await runTrial('csv', { kind: 'escape', folder: true })).toEqual({ exit: 1, crash: null, escape: null, loss: null });
  }, 60_000);
});
