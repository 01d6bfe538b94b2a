/**
 * The demo folder is a valid scenario: datapackage.json lists every data file with a Table
 * Schema whose fields match the CSV headers (Frictionless Table Schema: fields, missingValues,
 * primaryKey, foreignKeys), scenario.json passes the settings schema, segments.geojson is an
 * RFC 7946 FeatureCollection of LineStrings, and the NetCDF file follows CF ch. 9 (discrete
 * sampling geometries: featureType "trajectory", one cf_role trajectory_id variable, contiguous
 * ragged array with sample_dimension, time units "days since …").
 */
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { gunzipSync } from 'node:zlib';
import { NetCDFReader } from 'netcdfjs';
import { describe, expect, test } from 'vitest';
import { settingsSchema } from '../../generator/scenario/settings.ts';
import { DEMO_DIR } from './demo-tables.ts';

interface Resource {
  name: string;
  role: string;
  path: string;
  description?: string;
  schema?: { fields: { name: string; type: string }[]; primaryKey?: string[]; foreignKeys?: unknown[]; missingValues?: string[] };
}
const datapackage = JSON.parse(readFileSync(join(DEMO_DIR, 'datapackage.json'), 'utf8')) as { description: string; resources: Resource[] };

function dataFiles(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) out.push(...dataFiles(path));
    else if (!/\.(ts|md)$/.test(name) && name !== 'datapackage.json') out.push(relative(DEMO_DIR, path));
  }
  return out.sort();
}

describe('demo datapackage.json', () => {
  test('lists every data file, each said to be invented', () => {
    expect(datapackage.resources.map((resource) => resource.path).sort()).toEqual(dataFiles(DEMO_DIR));
    expect(datapackage.description).toMatch(/invented/i);
    for (const resource of datapackage.resources) expect(resource.description, resource.name).toMatch(/invented/i);
  });

  test('table schemas match the CSV headers and declare keys', () => {
    for (const resource of datapackage.resources.filter((r) => r.schema)) {
      const bytes = readFileSync(join(DEMO_DIR, resource.path));
      const text = resource.path.endsWith('.gz') ? gunzipSync(bytes).subarray(0, 200).toString('utf8') : bytes.toString('utf8');
      const header = text.split('\n')[0]?.split(',');
      expect(header, resource.name).toEqual(resource.schema?.fields.map((field) => field.name));
      expect(resource.schema?.primaryKey?.length, resource.name).toBeGreaterThan(0);
      expect(resource.schema?.missingValues, resource.name).toEqual(['']);
      if (resource.role === 'indicator') expect(resource.schema?.foreignKeys, resource.name).toHaveLength(1);
    }
  });

  test('scenario.json passes the settings schema and is marked invented', () => {
    const settings = settingsSchema.parse(JSON.parse(readFileSync(join(DEMO_DIR, 'scenario.json'), 'utf8')));
    expect(settings.invented).toBe(true);
    expect(settings.publications.map((p) => p.season)).toEqual(['2026-summer', '2026-autumn']);
    expect(settings.authorities.map((a) => a.role)).toEqual(expect.arrayContaining(['shellfish-sanitation', 'public-health', 'debris-report']));
    for (const contact of [settings.publisher, ...settings.authorities]) {
      if (contact.email) expect(contact.email).toMatch(/@[a-z-]+\.example\.org$|@example\.org$/);
      if (contact.url) expect(contact.url).toMatch(/^https:\/\/[a-z-.]*example\.org\//);
      if (contact.phone) expect(contact.phone).toMatch(/555/);
    }
    // EU threshold value 20 items/100 m: Van Loon et al. 2020.
    expect(settings.riskRules.some((rule) => rule.indicator === 'beach-litter' && rule.value === 20)).toBe(true);
  });

  test('segments.geojson: thirty LineStrings with ids, kinds and shellfish use, in open ocean', () => {
    const collection = JSON.parse(readFileSync(join(DEMO_DIR, 'segments.geojson'), 'utf8')) as {
      type: string;
      features: { properties: { id: string; kind: string; shellfish: string }; geometry: { type: string; coordinates: [number, number][] } }[];
    };
    expect(collection.type).toBe('FeatureCollection');
    expect(collection.features).toHaveLength(30);
    const kinds = new Set(collection.features.map((f) => f.properties.kind));
    for (const kind of ['beach', 'bay', 'harbour', 'estuary', 'island-shore', 'rocky-shore']) expect(kinds.has(kind), kind).toBe(true);
    expect(collection.features.filter((f) => f.properties.kind === 'bay' && f.properties.shellfish !== 'none').length).toBeGreaterThanOrEqual(2);
    for (const feature of collection.features) {
      expect(feature.geometry.type).toBe('LineString');
      for (const [lon, lat] of feature.geometry.coordinates) {
        expect(lon).toBeGreaterThan(-128.5);
        expect(lon).toBeLessThan(-127);
        expect(lat).toBeGreaterThan(-38.5);
        expect(lat).toBeLessThan(-36.5);
      }
    }
  });
});

describe('demo drift files', () => {
  const csv = gunzipSync(readFileSync(join(DEMO_DIR, 'drift/positions.csv.gz')))
    .toString('utf8')
    .trim()
    .split('\n');

  test('positions: header, ISO times, drifting/ashore status, arrivals that differ by season', () => {
    expect(csv[0]).toBe('particle,time,lon,lat,status');
    const ashoreByMonth = new Map<string, number>();
    for (const line of csv.slice(1)) {
      const [, time, , , status] = line.split(',');
      if (status === 'ashore') ashoreByMonth.set(time?.slice(5, 7) ?? '', (ashoreByMonth.get(time?.slice(5, 7) ?? '') ?? 0) + 1);
    }
    expect(csv[1]).toMatch(/^\d+,\d{4}-\d{2}-\d{2}T00:00:00Z,-12\d\.\d+,-3\d\.\d+,(drifting|ashore)$/);
    const counts = [...ashoreByMonth.values()];
    expect(Math.max(...counts)).toBeGreaterThan(1.5 * Math.min(...counts));
  });

  test('particles gather in offshore accumulation zones (at least 100 last positions within 5 km of one point)', () => {
    // Last position of each particle still drifting at the end of its track.
    const last = new Map<string, [number, number, string]>();
    for (const line of csv.slice(1)) {
      const [particle, , lon, lat, status] = line.split(',');
      last.set(particle ?? '', [Number(lon), Number(lat), status ?? '']);
    }
    const drifting = [...last.values()].filter((p) => p[2] === 'drifting');
    // Grid count at ~5 km cells (0.05°); the fullest cell must hold a real cluster.
    const cells = new Map<string, number>();
    for (const [lon, lat] of drifting) {
      const key = `${Math.floor(lon / 0.05)},${Math.floor(lat / 0.05)}`;
      cells.set(key, (cells.get(key) ?? 0) + 1);
    }
    expect(Math.max(...cells.values())).toBeGreaterThan(100);
  });

  test('trajectories.nc is a CF trajectory file in contiguous ragged layout', () => {
    const reader = new NetCDFReader(readFileSync(join(DEMO_DIR, 'drift/trajectories.nc')));
    const global = Object.fromEntries(reader.globalAttributes.map((a) => [a.name, a.value]));
    expect(global['featureType']).toBe('trajectory');
    expect(global['Conventions']).toMatch(/^CF-1\./);
    const attrs = (name: string): Record<string, unknown> => {
      const variable = reader.variables.find((v) => v.name === name) as { attributes: { name: string; value: unknown }[] } | undefined;
      return Object.fromEntries((variable?.attributes ?? []).map((a) => [a.name, a.value]));
    };
    expect(attrs('trajectory')['cf_role']).toBe('trajectory_id');
    expect(attrs('row_size')['sample_dimension']).toBe('obs');
    expect(attrs('time')['units']).toMatch(/^days since \d{4}-\d{2}-\d{2}/);
    expect(attrs('lon')['standard_name']).toBe('longitude');
    expect(attrs('lat')['standard_name']).toBe('latitude');
    const sizes = reader.getDataVariable('row_size') as number[];
    const lon = reader.getDataVariable('lon') as number[];
    expect(sizes.reduce((a, b) => a + b, 0)).toBe(lon.length);
  });
});

describe('demo README', () => {
  test('lists every segment with the pattern it shows, and says the data is invented', async () => {
    const { SEGMENT_PLANS } = await import('../../content/demo/coast.ts');
    const { SEGMENT_RECIPES } = await import('../../content/demo/monitoring.ts');
    expect(SEGMENT_RECIPES.map((recipe) => recipe.segmentId)).toEqual(SEGMENT_PLANS.map((plan) => plan.id));
    const readme = readFileSync(join(DEMO_DIR, 'README.md'), 'utf8');
    expect(readme).toMatch(/invented for demonstration/i);
    for (const recipe of SEGMENT_RECIPES) {
      expect(recipe.shows.length, recipe.segmentId).toBeGreaterThan(0);
      expect(readme, recipe.segmentId).toContain(`| \`${recipe.segmentId}\` |`);
    }
  });
});
