// `wrackline build` with the real reader: a table that lost 47 of its 48 rows (a decimal comma
// declared for a table written with decimal points) stops the build with exit 1 and nothing
// published, and the message names the table, the count, the cause and how to accept the loss.
// Data: the invented test coast (test/fixtures/inputs/base).
import { existsSync } from 'node:fs';
import path from 'node:path';
import { expect, test } from 'vitest';
import { resourceNamed, scenarioCopy } from '../read/fixture-scenario.ts';
import { runCli } from './helpers/cli-build.ts';

test('decimal-comma loss of 98 % of a table: build exits 1, names the table, the count and the cause; nothing published', async () => {
  const rows = Array.from(
    { length: 47 },
    (_, i) => `WM-${i + 1},harbour-mouth,2025-${String((i % 11) + 1).padStart(2, '0')}-${String((i % 27) + 1).padStart(2, '0')},0.${i + 10},333`,
  );
  const scenario = scenarioCopy({
    files: { 'tables/water-microplastics.csv': `sample_id,segment_id,date,particles_per_m3,mesh_um\n${rows.join('\n')}\nWM-48,harbour-mouth,2026-03-03,"0,5",333\n` },
    descriptor: (d) => {
      resourceNamed(d, 'water-microplastics')['dialect'] = { delimiter: ',', header: true, decimalChar: ',' };
    },
  });
  const out = path.join(scenario, '..', `${path.basename(scenario)}-site`);
  const result = await runCli(['build', '--scenario', scenario, '--out', out], {}, { lock: false });
  expect(result.code).toBe(1);
  expect(result.stderr).toContain('tables/water-microplastics.csv: 47 of 48 row(s) left out (47 value of the wrong type); more than the 5 % allowed, so nothing is published');
  expect(result.stderr).toContain('"leftOutAllowed": [{ "table": "tables/water-microplastics.csv", "share": 0.98');
  expect(result.stderr).toContain('See every problem: npx wrackline check --scenario');
  expect(existsSync(out)).toBe(false);
}, 120_000);
