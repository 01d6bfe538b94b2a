// From nothing to a published site, as a new user goes: `wrackline init`, five invented segments
// (a closed island ring, a line that crosses itself, a strand of 200,000 vertices, a MultiLineString
// and a plain line) and two tables, then `check` and `build`. No drift model is given, so no page
// may speak of one. All data here is invented.
import { existsSync } from 'node:fs';
import { mkdtemp, readdir, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, expect, test } from 'vitest';
import { parse as parseYaml, stringify as stringifyYaml } from 'yaml';
import { runCli } from './helpers/cli-build.ts';

let work: string;
beforeAll(async () => {
  work = await mkdtemp(path.join(tmpdir(), 'wrackline-init-'));
});
afterAll(async () => {
  await rm(work, { recursive: true, force: true });
});

type Position = [number, number];

/** Open water around 37.5° S, 127.5° W (no land): an invented coast. */
function segments(): object {
  const ring: Position[] = [
    [-127.5, -37.5],
    [-127.48, -37.49],
    [-127.46, -37.5],
    [-127.47, -37.52],
    [-127.5, -37.5],
  ];
  const crossing: Position[] = [
    [-127.4, -37.4],
    [-127.38, -37.38],
    [-127.38, -37.4],
    [-127.4, -37.38],
  ];
  const strand: Position[] = [];
  for (let i = 0; i < 200_000; i++) strand.push([-127.3 + 0.0004 * Math.sin(i / 9), -37.6 + i * 0.0000005]);
  const feature = (id: string, name: string, kind: string, shellfish: string, geometry: object) => ({ type: 'Feature', properties: { id, name, kind, shellfish }, geometry });
  return {
    type: 'FeatureCollection',
    features: [
      feature('tern-island', 'Tern Island', 'Island shore', 'no', { type: 'LineString', coordinates: ring }),
      feature('crooked-spit', 'Crooked Spit', 'beach', 'none', { type: 'LineString', coordinates: crossing }),
      feature('long-strand', 'Long Strand', 'beach', 'none', { type: 'LineString', coordinates: strand }),
      feature('mill-bay', 'Mill Bay', 'bay', 'yes', {
        type: 'LineString',
        coordinates: [
          [-127.2, -37.45],
          [-127.18, -37.44],
          [-127.16, -37.45],
        ],
      }),
      feature('harbour-wall', 'Harbour Wall', 'harbour', 'farmed', {
        type: 'MultiLineString',
        coordinates: [
          [
            [-127.1, -37.4],
            [-127.09, -37.4],
          ],
          [
            [-127.08, -37.41],
            [-127.07, -37.41],
          ],
        ],
      }),
    ],
  };
}

const seasonDates = ['01-20', '04-20', '07-20', '10-20'];

function beachTable(): string {
  const lines = ['survey_id,segment_id,date,surveyed_length_m,items,plastic_items,area_m2'];
  let n = 0;
  for (const segment of ['tern-island', 'crooked-spit', 'long-strand', 'mill-bay', 'harbour-wall']) {
    for (let year = 2020; year <= 2026; year++) {
      for (const [k, day] of seasonDates.entries()) {
        if (year === 2026 && k === 3) continue; // after the autumn season's date range is fine, but keep it simple
        n++;
        lines.push(`S${n},${segment},${year}-${day},100,${20 + ((n * 7) % 13) + (2026 - year) * 3},,`);
      }
    }
  }
  lines.push(`S${n + 1},mill-bay,2026-10-20,100,-2,,`); // one bad row among 141: left out, a warning
  return `${lines.join('\n')}\n`;
}

function waterTable(): string {
  const lines = ['sample_id,segment_id,date,particles_per_m3,mesh_um'];
  let n = 0;
  for (const segment of ['mill-bay', 'harbour-wall']) {
    for (let year = 2021; year <= 2026; year++) {
      for (const day of seasonDates.slice(0, 3)) lines.push(`W${++n},${segment},${year}-${day},0.${(n % 7) + 2},333`);
    }
  }
  return `${lines.join('\n')}\n`;
}

test('init → five segments and two tables → check and build pass, with no drift words on any page', async () => {
  const scenario = path.join(work, 'new-coast');
  const init = await runCli(['init', scenario], {}, { lock: false });
  expect(init.code).toBe(0);
  expect(init.stdout).toContain('Wrote a new scenario to');
  const fresh = await runCli(['check', '--scenario', scenario], {}, { lock: false });
  expect(fresh.code).toBe(0);

  // Fill it in as a user would: settings, segments, two tables; the other two tables removed.
  const settings = parseYaml(await readFile(path.join(scenario, 'scenario.yaml'), 'utf8')) as { [key: string]: unknown };
  settings['invented'] = true;
  settings['region'] = { id: 'new-coast', name: 'New Coast (invented)', description: 'An invented coast for a test.' };
  settings['publications'] = [
    { season: '2026-summer', date: '2026-09-01' },
    { season: '2026-autumn', date: '2026-12-01' },
  ];
  await writeFile(path.join(scenario, 'scenario.yaml'), stringifyYaml(settings));
  await writeFile(path.join(scenario, 'segments.geojson'), JSON.stringify(segments()));
  await writeFile(path.join(scenario, 'tables', 'beach-litter.csv'), beachTable());
  await writeFile(path.join(scenario, 'tables', 'water-microplastics.csv'), waterTable());
  const descriptorPath = path.join(scenario, 'datapackage.json');
  const descriptor = JSON.parse(await readFile(descriptorPath, 'utf8')) as { resources: { name: string }[] };
  descriptor.resources = descriptor.resources.filter((r) => r.name !== 'shellfish-tissue' && r.name !== 'wildlife-reports');
  await writeFile(descriptorPath, JSON.stringify(descriptor, null, 2));

  const checked = await runCli(['check', '--scenario', scenario], {}, { lock: false });
  expect(checked.stdout).toContain('Result: usable');
  expect(checked.stdout).toContain('segment "crooked-spit" crosses itself at [-127.39, -37.39]');
  expect(checked.code).toBe(0);

  const out = path.join(work, 'site');
  const built = await runCli(['build', '--scenario', scenario, '--out', out], { CI: '' }, { lock: false });
  expect(built.code, built.stderr).toBe(0);
  // The warnings grouped by cause, and the exact command that lists them.
  expect(built.stderr + built.stdout).toMatch(/Warnings by cause:\n\s+1\s+GeometrySelfIntersects/);
  expect(built.stderr + built.stdout).toContain(`See every one: npx wrackline check --scenario ${path.relative(process.cwd(), scenario)}`);

  // Every segment has its page, the self-crossing one and the 200,000-vertex one included.
  for (const id of ['tern-island', 'crooked-spit', 'long-strand', 'mill-bay', 'harbour-wall']) {
    expect(existsSync(path.join(out, 'segments', id, 'index.html')), id).toBe(true);
  }
  // No drift words anywhere: no drift model, no accumulation zones, no hatched areas.
  const pages: string[] = [];
  const walk = async (dir: string): Promise<void> => {
    for (const entry of await readdir(dir, { withFileTypes: true })) {
      const full = path.join(dir, entry.name);
      if (entry.isDirectory()) await walk(full);
      else if (entry.name.endsWith('.html')) pages.push(full);
    }
  };
  await walk(out);
  expect(pages.length).toBeGreaterThan(10);
  const offending: string[] = [];
  for (const page of pages) {
    const text = await readFile(page, 'utf8');
    const found = /drift model|accumulation zone|hatched|modelled drift|drift arrivals/i.exec(text);
    if (found) offending.push(`${path.relative(out, page)}: ${found[0]}`);
  }
  expect(offending).toEqual([]);
  const methods = await readFile(path.join(out, 'methods', 'index.html'), 'utf8');
  expect(methods).toContain('the built-in rule table applies, limited to the indicators this coast has data for');
}, 900_000);
