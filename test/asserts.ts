/** Float comparison for tests: the one tolerance helper (after d3-geo's test/asserts.js). */
export function assertInDelta(actual: number | null | undefined, expected: number, delta = 1e-6): void {
  if (actual === null || actual === undefined || !Number.isFinite(actual) || Math.abs(actual - expected) > delta) {
    throw new Error(`expected ${String(actual)} to be within ${delta} of ${expected}`);
  }
}
