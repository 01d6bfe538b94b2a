// Broken and hostile inputs at the reader: each test is named after the case it holds. The
// scenario is the small invented fixture (test/fixtures/inputs/base); the hostile parts are made
// here. What counts as a bidirectional control character: Unicode Standard Annex #9 (Unicode
// Bidirectional Algorithm), table 4 "Bidirectional character types" (LRE, RLE, PDF, LRO, RLO,
// LRI, RLI, FSI, PDI) and Unicode Technical Report #36 section 2.1 (bidirectional spoofing).
import { mkdirSync, mkdtempSync, readFileSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { describe, expect, test } from 'vitest';
import { loadScenario } from '../../generator/read/load-scenario.ts';
import { writeNetcdf3 } from '../../generator/drift/netcdf3-writer.ts';
import { contiguousSpec, sampleTrajectories } from '../drift/cf-fixtures.ts';
import { baseScenario, beachHeader, expectIssue, resourceNamed, scenarioCopy } from '../read/fixture-scenario.ts';

const beach = 'tables/beach-litter.csv';

function outsideFolder(): string {
  return mkdtempSync(join(tmpdir(), 'wrackline-outside-'));
}

function countsOf(scenario: Awaited<ReturnType<typeof loadScenario>>, file: string) {
  return scenario.report.files.find((f) => f.file === file);
}

describe('escapes: nothing is read outside the scenario folder', () => {
  test('symlinked resource file outside the scenario is refused and its content never quoted', async () => {
    const outside = outsideFolder();
    const secret = 'survey_id,segment_id,date,surveyed_length_m,items,plastic_items,area_m2\nSECRET-ROW,north-beach,2026-01-15,100,999,,\n';
    writeFileSync(join(outside, 'private.csv'), secret);
    const dir = scenarioCopy({ files: { [beach]: null } });
    symlinkSync(join(outside, 'private.csv'), join(dir, beach));
    const scenario = await loadScenario(dir);
    expectIssue(scenario.report.issues, { code: 'ResourceOutsideScenario', file: beach, severity: 'error', excluded: true });
    expect(JSON.stringify(scenario.report)).not.toContain('SECRET-ROW');
    expect(scenario.records.some((r) => r.source.file === beach)).toBe(false);
    expect(scenario.inputs.some((i) => i.file === beach)).toBe(false);
    expect(scenario.report.ok).toBe(false);
  });

  test('symlinked resource folder outside the scenario is refused and check fails', async () => {
    const outside = outsideFolder();
    const dir = scenarioCopy();
    mkdirSync(join(outside, 'tables'));
    writeFileSync(join(outside, 'tables', 'beach-litter.csv'), readFileSync(join(baseScenario, beach)));
    const linked = join(dir, 'linked');
    symlinkSync(join(outside, 'tables'), linked, 'dir');
    writeFileSync(join(dir, 'datapackage.json'), readFileSync(join(dir, 'datapackage.json'), 'utf8').replace('"tables/beach-litter.csv"', '"linked/beach-litter.csv"'));
    const scenario = await loadScenario(dir);
    expectIssue(scenario.report.issues, { code: 'ResourceOutsideScenario', file: 'linked/beach-litter.csv', severity: 'error' });
    expect(scenario.report.ok).toBe(false);
  });

  test('a link that stays inside the scenario folder is still read', async () => {
    const dir = scenarioCopy();
    mkdirSync(join(dir, 'alias'));
    symlinkSync(join(dir, beach), join(dir, 'alias', 'beach.csv'));
    writeFileSync(join(dir, 'datapackage.json'), readFileSync(join(dir, 'datapackage.json'), 'utf8').replace('"tables/beach-litter.csv"', '"alias/beach.csv"'));
    const scenario = await loadScenario(dir);
    expect(scenario.report.issues).toEqual([]);
    expect(countsOf(scenario, 'alias/beach.csv')?.kept).toBe(5);
  });

  test('settings with a __proto__ key are refused and nothing is polluted', async () => {
    const settings = JSON.parse(readFileSync(join(baseScenario, 'scenario.json'), 'utf8')) as { [key: string]: unknown };
    const text = JSON.stringify(settings)
      .replace('"invented":true', '"invented":true,"__proto__":{"polluted":"yes"},"drift":{"constructor":{"prototype":{"polluted":"yes"}}}')
      .replace(/,"drift":\{"arrivalDistanceKm[^}]*\}/, '');
    const dir = scenarioCopy({ files: { 'scenario.json': text } });
    const scenario = await loadScenario(dir);
    const issue = expectIssue(scenario.report.issues, { code: 'KeyForbidden', file: 'scenario.json', column: '$.__proto__', severity: 'error' });
    expect(issue.message).toContain('__proto__, constructor and prototype');
    expectIssue(scenario.report.issues, { code: 'KeyForbidden', file: 'scenario.json', column: '$.drift.constructor', severity: 'error' });
    expect(({} as { polluted?: string }).polluted).toBeUndefined();
    expect(Object.getPrototypeOf(scenario.settings)).toBe(Object.prototype);
    expect((scenario.settings as unknown as { polluted?: string }).polluted).toBeUndefined();
  });

  test('a __proto__ key in a segment property or the data package is refused', async () => {
    const segments = readFileSync(join(baseScenario, 'segments.geojson'), 'utf8').replace('"place": "Invented Town"', '"place": "Invented Town", "__proto__": {"admin": true}');
    const scenario = await loadScenario(scenarioCopy({ files: { 'segments.geojson': segments } }));
    expectIssue(scenario.report.issues, { code: 'KeyForbidden', file: 'segments.geojson', severity: 'error' });
    const descriptor = readFileSync(join(baseScenario, 'datapackage.json'), 'utf8').replace(
      '"profile": "data-package",',
      '"profile": "data-package", "__proto__": {"resources": []},',
    );
    await expect(loadScenario(scenarioCopy({ files: { 'datapackage.json': descriptor } }))).rejects.toThrow(
      /datapackage\.json, at \$\.__proto__: the keys __proto__, constructor and prototype are not allowed/,
    );
  });

  test('a right-to-left override in a segment name is flagged at check', async () => {
    const segments = readFileSync(join(baseScenario, 'segments.geojson'), 'utf8').replace('"North Beach"', '"North \u202eBeach"');
    const scenario = await loadScenario(scenarioCopy({ files: { 'segments.geojson': segments } }));
    const issue = expectIssue(scenario.report.issues, { code: 'BidiControlInText', file: 'segments.geojson', severity: 'warning' });
    expect(issue.message).toContain('U+202E');
    // Kept as written, inside FIRST STRONG ISOLATE … POP DIRECTIONAL ISOLATE (UAX #9, X6a).
    expect(scenario.segments.find((s) => s.id === 'north-beach')?.name).toBe('\u2068North \u202eBeach\u2069');
    expect(scenario.segments.find((s) => s.id === 'harbour-mouth')?.name).toBe('Harbour Mouth');
  });

  test('a right-to-left override in a setting is flagged and isolated', async () => {
    const settings = readFileSync(join(baseScenario, 'scenario.json'), 'utf8').replace('"Test Coast (invented)"', '"Test \u202eCoast"');
    const scenario = await loadScenario(scenarioCopy({ files: { 'scenario.json': settings } }));
    expectIssue(scenario.report.issues, { code: 'BidiControlInText', file: 'scenario.json', column: '$.region.name', severity: 'warning' });
    expect(scenario.settings.region.name).toBe('\u2068Test \u202eCoast\u2069');
  });

  test('a bidirectional control character in a table text cell is flagged', async () => {
    const dir = scenarioCopy({ files: { [beach]: `${beachHeader}\nBL-\u20661,north-beach,2026-01-15,100,25,,\n` } });
    const scenario = await loadScenario(dir);
    expectIssue(scenario.report.issues, { code: 'BidiControlInText', file: beach, row: 2, column: 'survey_id', severity: 'warning' });
  });
});

describe('losses: nothing disappears without a word', () => {
  test('invalid UTF-8 in a cell is named at its row and column', async () => {
    const bytes = Buffer.concat([
      Buffer.from(`${beachHeader}\nBL-1,north-beach,2026-01-15,100,25,,\nBL-`),
      Buffer.from([0xff, 0xfe]),
      Buffer.from(',north-beach,2026-01-16,100,25,,\n'),
    ]);
    const scenario = await loadScenario(scenarioCopy({ files: { [beach]: bytes } }));
    const issue = expectIssue(scenario.report.issues, { code: 'InvalidUtf8', file: beach, row: 3, column: 'survey_id', excluded: true });
    expect(issue.severity).toBe('warning');
    expect(countsOf(scenario, beach)).toEqual({ file: beach, read: 2, kept: 1, excluded: 1 });
  });

  test('invalid UTF-8 in the segments file is refused naming its line', async () => {
    // Node's readFile(…, 'utf8') turned these bytes into U+FFFD and published the garbled name.
    // 0xE9 alone is "é" in ISO 8859-1 and never valid in UTF-8 (RFC 3629 §3).
    const segments = readFileSync(join(baseScenario, 'segments.geojson'), 'utf8');
    const at = segments.indexOf('"name"');
    const line = segments.slice(0, at).split('\n').length;
    const bytes = Buffer.concat([Buffer.from(segments.slice(0, at)), Buffer.from('"name": "Caf'), Buffer.from([0xe9]), Buffer.from('", "old'), Buffer.from(segments.slice(at))]);
    const scenario = await loadScenario(scenarioCopy({ files: { 'segments.geojson': bytes } }));
    const issue = expectIssue(scenario.report.issues, { code: 'FileNotUtf8', file: 'segments.geojson', row: line, severity: 'error' });
    expect(issue.row).toBe(line);
    expect(issue.message).toContain(`row ${line}`);
    expect(scenario.report.ok).toBe(false);
  });

  test('invalid UTF-8 in the settings file is refused naming its line', async () => {
    const settings = readFileSync(join(baseScenario, 'scenario.json'), 'utf8');
    const bytes = Buffer.concat([Buffer.from(settings.replace(/\n\s*}\s*$/, ',\n  "title": "Caf')), Buffer.from([0xe9]), Buffer.from('"\n}\n')]);
    const scenario = await loadScenario(scenarioCopy({ files: { 'scenario.json': bytes } })).catch((error: unknown) => error);
    const text = JSON.stringify(scenario instanceof Error ? scenario.message : (scenario as Awaited<ReturnType<typeof loadScenario>>).report.issues);
    expect(text).toContain('not valid UTF-8');
    expect(text).toContain(`row ${settings.replace(/\n\s*}\s*$/, '').split('\n').length + 1}`);
  });

  test('a NUL byte in a text cell is named at its row and column', async () => {
    const scenario = await loadScenario(scenarioCopy({ files: { [beach]: `${beachHeader}\nBL-1,north-beach,2026-01-15,100,25,,\nBL-\u00002,north-beach,2026-01-16,100,25,,\n` } }));
    expectIssue(scenario.report.issues, { code: 'NulInText', file: beach, row: 3, column: 'survey_id', excluded: true });
    expect(countsOf(scenario, beach)).toEqual({ file: beach, read: 2, kept: 1, excluded: 1 });
  });

  test('a duplicated column header is an error naming both columns', async () => {
    const scenario = await loadScenario(scenarioCopy({ files: { [beach]: `${beachHeader},items\nBL-1,north-beach,2026-01-15,100,25,,,40\n` } }));
    const issue = expectIssue(scenario.report.issues, { code: 'HeaderDuplicateColumn', file: beach, row: 1, column: 'items', severity: 'error', excluded: true });
    expect(issue.message).toContain('columns 5 and 8');
    expect(scenario.report.ok).toBe(false);
  });
});

describe('crashes and hangs: bounded reading', () => {
  test('a 125,000-row table is read without a stack overflow', async () => {
    const rows: string[] = [beachHeader];
    for (let i = 0; i < 125_000; i++) rows.push(`BL-${i},north-beach,2026-0${1 + (i % 8)}-15,100,${i % 50},,`);
    const scenario = await loadScenario(scenarioCopy({ files: { [beach]: `${rows.join('\n')}\n` } }));
    expect(countsOf(scenario, beach)).toEqual({ file: beach, read: 125_000, kept: 125_000, excluded: 0 });
    expect(scenario.records.filter((r) => r.indicator === 'beach-litter')).toHaveLength(125_000);
  }, 120_000);

  test('deeply nested JSON in settings ends with a clear error naming the file', async () => {
    const deep = `{"region":${'['.repeat(200_000)}${']'.repeat(200_000)}}`;
    const scenario = await loadScenario(scenarioCopy({ files: { 'scenario.json': deep } }));
    const issue = expectIssue(scenario.report.issues, { code: 'JsonTooDeep', file: 'scenario.json', severity: 'error' });
    expect(issue.message).toMatch(/nested deeper than \d+ levels/);
  });

  test('deeply nested JSON in segments ends with a clear error naming the file', async () => {
    const deep = `{"type":"FeatureCollection","features":[{"type":"Feature","properties":{"id":"a","name":"A","kind":"beach","shellfish":"none","x":${'{"a":'.repeat(200_000)}1${'}'.repeat(200_000)}},"geometry":null}]}`;
    const scenario = await loadScenario(scenarioCopy({ files: { 'segments.geojson': deep } }));
    expectIssue(scenario.report.issues, { code: 'JsonTooDeep', file: 'segments.geojson', severity: 'error' });
  });

  test('an unclosed quote is reported on the row where it opens', async () => {
    const rows = [beachHeader];
    for (let i = 1; i <= 4; i++) rows.push(`BL-${i},north-beach,2026-01-1${i},100,25,,`);
    rows.push('"BL-5,north-beach,2026-01-20,100,25,,');
    for (let i = 6; i <= 700; i++) rows.push(`BL-${i},north-beach,2026-01-15,100,25,,`);
    const scenario = await loadScenario(scenarioCopy({ files: { [beach]: `${rows.join('\n')}\n` } }));
    expectIssue(scenario.report.issues, { code: 'QuoteNotClosed', file: beach, row: 6, severity: 'error' });
  });

  test('a gzip bomb stops at the expansion bound with a clear error', async () => {
    const body = Buffer.from(`${'A'.repeat(256 * 1024 - 1)}\n`.repeat(400));
    const bomb = gzipSync(Buffer.concat([Buffer.from(`${beachHeader}\n`), body]), { level: 9 });
    const dir = scenarioCopy({
      descriptor: (d) => {
        resourceNamed(d, 'beach-litter')['path'] = 'tables/beach-litter.csv.gz';
      },
    });
    writeFileSync(join(dir, 'tables/beach-litter.csv.gz'), bomb);
    const before = process.memoryUsage().rss;
    const scenario = await loadScenario(dir);
    const issue = expectIssue(scenario.report.issues, { code: 'InputTooLarge', file: 'tables/beach-litter.csv.gz', severity: 'error' });
    expect(issue.message).toMatch(/expands more than/);
    expect(process.memoryUsage().rss - before).toBeLessThan(400 * 1024 * 1024);
  }, 240_000);

  test('a table whose every row is bad keeps the first issues per cause in full and counts the rest', async () => {
    const rows = [beachHeader];
    for (let i = 0; i < 5000; i++) rows.push(`BL-${i},north-beach,2026-01-15,100,many,,`);
    const scenario = await loadScenario(scenarioCopy({ files: { [beach]: `${rows.join('\n')}\n` } }));
    const wrongType = scenario.report.issues.filter((i) => i.code === 'ValueWrongType' && i.file === beach);
    expect(wrongType.filter((i) => i.row !== null)).toHaveLength(1000);
    const summary = wrongType.filter((i) => i.row === null);
    expect(summary).toHaveLength(1);
    expect(summary[0]?.message).toContain('4,000 more records left out for the same reason (ValueWrongType)');
    expect(scenario.report.omitted).toEqual([{ file: beach, code: 'ValueWrongType', column: 'items', count: 4000, severity: 'warning', excluded: true }]);
    expect(countsOf(scenario, beach)).toEqual({ file: beach, read: 5000, kept: 0, excluded: 5000 });
  });

  test('a 10 MB line with no newline stops at the line bound with a clear error', async () => {
    const scenario = await loadScenario(scenarioCopy({ files: { [beach]: `${beachHeader}\nBL-1,north-beach,2026-01-15,100,25,,\n${'x'.repeat(10 * 1024 * 1024)}` } }));
    const issue = expectIssue(scenario.report.issues, { code: 'LineTooLong', file: beach, row: 3, severity: 'error' });
    expect(issue.message).toContain('1 MB');
  }, 30_000);
});

describe('losses: drift output that cannot be this scenario is named, not kept', () => {
  const positions = 'drift/positions.csv';
  const header = 'particle,time,lon,lat,status';

  test('drift positions dated 1826 or in the future are left out and counted', async () => {
    const original = readFileSync(join(baseScenario, positions), 'utf8').trim().split('\n');
    const rows = [...original, '7,1826-09-10T00:00:00Z,-0.2,50.05,drifting', '7,1826-09-11T00:00:00Z,-0.1,50.05,drifting', '8,2999-09-11T00:00:00Z,-0.1,50.05,drifting'];
    const scenario = await loadScenario(scenarioCopy({ files: { [positions]: `${rows.join('\n')}\n` } }));
    const issue = expectIssue(scenario.report.issues, { code: 'PositionsOutsidePeriod', file: positions, severity: 'warning', excluded: true });
    expect(issue.message).toContain('3 position(s) are dated outside 2020-01-01 to 2026-12-01 (first: 1826-09-10)');
    const counts = countsOf(scenario, positions);
    expect(counts?.read).toBe(original.length - 1 + 3);
    expect(counts?.excluded).toBe(3);
  });

  test('drift positions in radians are refused as far from the coast', async () => {
    const original = readFileSync(join(baseScenario, positions), 'utf8').trim().split('\n').slice(1);
    const radians = original.map((line) => {
      const [particle, time, lon, lat, status] = line.split(',');
      return [particle, time, ((Number(lon) * Math.PI) / 180).toFixed(6), ((Number(lat) * Math.PI) / 180).toFixed(6), status].join(',');
    });
    const scenario = await loadScenario(scenarioCopy({ files: { [positions]: `${[header, ...radians].join('\n')}\n` } }));
    const issue = expectIssue(scenario.report.issues, { code: 'DriftFarFromCoast', file: positions, severity: 'error' });
    expect(issue.message).toContain('may be in radians');
    expect(scenario.report.ok).toBe(false);
  });

  test('a trajectory file with longitude units in radians is refused (CF units attribute)', async () => {
    const spec = contiguousSpec(sampleTrajectories);
    for (const variable of spec.variables) {
      if (variable.name === 'lon')
        variable.attributes = [
          { name: 'standard_name', value: 'longitude' },
          { name: 'units', value: 'radians' },
        ];
    }
    const dir = scenarioCopy({
      descriptor: (d) => {
        d.resources = d.resources.filter((r) => r['role'] !== 'drift-positions');
        d.resources.push({ name: 'trajectories', role: 'drift-trajectories', path: 'drift/run.nc', format: 'netcdf' });
      },
    });
    writeFileSync(join(dir, 'drift/run.nc'), writeNetcdf3(spec));
    const scenario = await loadScenario(dir);
    const issue = expectIssue(scenario.report.issues, { code: 'NetcdfNotTrajectory', file: 'drift/run.nc', severity: 'error' });
    expect(issue.message).toContain('longitude units are "radians"; expected degrees_east');
  });
});

describe('crashes and hangs: drift positions are bounded too', () => {
  const positions = 'drift/positions.csv';
  test('a drift positions line of 10 MB with no newline stops at the line bound', async () => {
    const scenario = await loadScenario(
      scenarioCopy({ files: { [positions]: `particle,time,lon,lat,status\n1,2026-09-10T00:00:00Z,-0.2,50.05,drifting\n${'9'.repeat(10 * 1024 * 1024)}` } }),
    );
    expectIssue(scenario.report.issues, { code: 'LineTooLong', file: positions, row: 3, severity: 'error' });
  }, 60_000);

  test('a gzip bomb as drift positions stops at the expansion bound', async () => {
    const bomb = gzipSync(Buffer.from(`particle,time,lon,lat,status\n${`${'1'.repeat(256 * 1024 - 1)}\n`.repeat(400)}`), { level: 9 });
    const dir = scenarioCopy({
      descriptor: (d) => {
        resourceNamed(d, 'drift-positions')['path'] = 'drift/positions.csv.gz';
      },
    });
    writeFileSync(join(dir, 'drift/positions.csv.gz'), bomb);
    const issue = expectIssue((await loadScenario(dir)).report.issues, { code: 'InputTooLarge', file: 'drift/positions.csv.gz', severity: 'error' });
    expect(issue.message).toMatch(/expands more than 200 times/);
  }, 240_000);
});
