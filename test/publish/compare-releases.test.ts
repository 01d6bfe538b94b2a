// The change report's comparisons on small hand-made cases: trend claims that appear, disappear
// or reverse; sentences paired old beside new around unchanged ones (longest common
// subsequence, common practice for text diffs); printed numbers that moved.
import { describe, expect, test } from 'vitest';
import { claimChanges, leftOutChanges, movedNumbers, pairSentences } from '../../generator/review/compare-releases.ts';
import type { Bulletin, Direction } from '../../generator/model/types.ts';

function bulletin(directions: { [indicator: string]: Direction }): Bulletin {
  return {
    segment: { id: 'north-bay', name: 'North Bay' },
    indicators: Object.entries(directions).map(([indicator, direction]) => ({ indicator, label: indicator, direction })),
  } as unknown as Bulletin;
}

describe('change report comparisons', () => {
  test('claims appear, disappear and reverse; unchanged and non-claims are not listed', () => {
    const old = bulletin({ a: 'rising', b: 'no-clear-direction', c: 'falling', d: 'too-little-data', e: 'rising' });
    const next = bulletin({ a: 'falling', b: 'rising', c: 'no-clear-direction', d: 'no-clear-direction', e: 'rising' });
    expect(claimChanges(old, next).map((c) => [c.indicator, c.kind])).toEqual([
      ['a', 'reverses'],
      ['b', 'appears'],
      ['c', 'disappears'],
    ]);
  });

  test('sentences are paired around the ones both versions share', () => {
    const pairs = pairSentences(['A.', 'B 1.', 'C.'], ['New first.', 'A.', 'B 2.', 'C.', 'D.']);
    expect(pairs).toEqual([
      { old: null, new: 'New first.' },
      { old: 'B 1.', new: 'B 2.' },
      { old: null, new: 'D.' },
    ]);
  });

  test('numbers that moved are those printed differently; other words changing gives null', () => {
    expect(movedNumbers('found 83 items, 1,200 in all', 'found 86 items, 1,200 in all')).toEqual([{ old: '83', new: '86' }]);
    expect(movedNumbers('going up by 0.5', 'going down by 0.5')).toBeNull();
  });

  test('records left out are grouped by cause, both ways', () => {
    const r = (row: number, code: string) => ({ file: 't.csv', row, column: 'date', value: 'x', message: 'm', expected: 'e', code });
    const groups = leftOutChanges([r(1, 'A'), r(2, 'B')], [r(2, 'B'), r(3, 'A')]);
    expect(groups.map((g) => [g.cause, g.newlyLeftOut.map((x) => x.row), g.takenBackIn.map((x) => x.row)])).toEqual([['A', [3], [1]]]);
  });
});
