// canonicalJson (archive ledger and cache keys) must give one text per value whatever the key
// order: checked against a plain recursive writer of sorted-key JSON (RFC 8259 text; keys in
// UTF-16 code-unit order as in RFC 8785 §3.2.3, common practice for canonical JSON), on random
// values with unsorted, integer-like and undefined keys.
import fc from 'fast-check';
import { expect, test } from 'vitest';
import { canonicalJson } from '../../generator/publish/check/archive-ledger.ts';

function oracle(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map((item) => (item === undefined ? 'null' : oracle(item))).join(',')}]`;
  if (value !== null && typeof value === 'object') {
    const record = value as { [key: string]: unknown };
    const keys = Object.keys(record)
      .filter((key) => record[key] !== undefined)
      .sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${keys.map((key) => `${JSON.stringify(key)}:${oracle(record[key])}`).join(',')}}`;
  }
  return JSON.stringify(value) ?? 'null';
}

const key = fc.oneof(fc.string({ maxLength: 6 }), fc.constantFrom('0', '1', '10', '2', 'a', 'B', 'é', '_'));
const leaf = fc.oneof(fc.integer(), fc.double({ noNaN: false }), fc.boolean(), fc.constant(null), fc.constant(undefined), fc.string({ maxLength: 8 }));
const value = fc.letrec((tie) => ({
  node: fc.oneof({ depthSize: 'small' }, leaf, fc.array(tie('node'), { maxLength: 4 }), fc.dictionary(key, tie('node'), { maxKeys: 5 })),
})).node;

test('canonicalJson equals sorted-key JSON on random values', () => {
  fc.assert(
    fc.property(value, (v) => {
      expect(canonicalJson(v)).toBe(oracle(v));
    }),
    { numRuns: 2000 },
  );
});

test('key order does not matter; integer-like keys are sorted as text', () => {
  expect(canonicalJson({ b: 1, a: { d: [1, { z: 0, y: 1 }], c: null } })).toBe('{"a":{"c":null,"d":[1,{"y":1,"z":0}]},"b":1}');
  expect(canonicalJson({ 10: 'x', 2: 'y', a: 'z' })).toBe('{"10":"x","2":"y","a":"z"}');
  expect(canonicalJson({ a: undefined, b: [undefined] })).toBe('{"b":[null]}');
  expect(canonicalJson(undefined)).toBe('null');
});
