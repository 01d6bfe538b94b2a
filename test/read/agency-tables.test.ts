// Tables as agencies keep them, and no quietly gutted publication. Each case seen with real
// agencies' files is one test, named after the case. Data: the invented test coast
// (test/fixtures/inputs/base) with tables written here.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';
import { runCheck } from '../../generator/cli/check.ts';
import { loadScenario } from '../../generator/read/load-scenario.ts';
import { baseScenario, beachHeader, expectIssue, resourceNamed, scenarioCopy } from './fixture-scenario.ts';

const waterFile = 'tables/water-microplastics.csv';
const beachFile = 'tables/beach-litter.csv';

async function check(argv: string[]): Promise<{ code: number; out: string }> {
  let out = '';
  const code = await runCheck(argv, { stdout: (t) => (out += `${t}\n`), stderr: (t) => (out += `${t}\n`), progressStream: { write: () => true, isTTY: false } });
  return { code, out };
}

/** Dates inside the fixture's period (2020-01-01 … 2026-11-30), one per row. */
function dateOf(i: number): string {
  return `2025-${String((i % 11) + 1).padStart(2, '0')}-${String((i % 27) + 1).padStart(2, '0')}`;
}

function withSettings(change: (settings: { [key: string]: unknown }) => void): string {
  const settings = JSON.parse(readFileSync(join(baseScenario, 'scenario.json'), 'utf8')) as { [key: string]: unknown };
  change(settings);
  return JSON.stringify(settings);
}

describe('no quiet gutting', () => {
  // 48 water samples written with decimal points, one written "0,5" (quoted in a comma-separated
  // file). Following the decimal-comma advice, the dialect declares "decimalChar": ",": every
  // value written with a point is then left out, 47 of 48 rows.
  const rows = Array.from({ length: 47 }, (_, i) => `WM-${i + 1},harbour-mouth,${dateOf(i)},0.${i + 10},333`);
  const waterTable = `sample_id,segment_id,date,particles_per_m3,mesh_um\n${rows.join('\n')}\nWM-48,harbour-mouth,2026-03-03,"0,5",333\n`;
  const decimalComma = (descriptor: { resources: { [key: string]: unknown }[] }): void => {
    resourceNamed(descriptor, 'water-microplastics')['dialect'] = { delimiter: ',', header: true, decimalChar: ',' };
  };

  test('decimal-comma hint followed: 47 of 48 rows left out is an error naming the table, the count and the cause', async () => {
    const dir = scenarioCopy({ files: { [waterFile]: waterTable }, descriptor: decimalComma });
    const scenario = await loadScenario(dir);
    expect(scenario.report.ok).toBe(false);
    const loss = expectIssue(scenario.report.issues, { code: 'TableLoss', file: waterFile, severity: 'error' });
    expect(loss.message).toBe(`${waterFile}: 47 of 48 row(s) left out (47 value of the wrong type); more than the 5 % allowed, so nothing is published`);
    expect(loss.hint).toContain(`"leftOutAllowed": [{ "table": "${waterFile}", "share": 0.98`);
    // Each of those rows says what was wrong with it, and the hint fits: a point where a comma was declared.
    const row = expectIssue(scenario.report.issues, { code: 'ValueWrongType', file: waterFile, row: 2, column: 'particles_per_m3' });
    expect(row.hint).toContain('declares "decimalChar": ","');
    const { code, out } = await check(['--scenario', dir]);
    expect(code).toBe(1);
    expect(out).toContain('Result: not usable');
  });

  test('decimal-comma loss accepted on purpose in scenario.json: the scenario is usable', async () => {
    const settings = withSettings((s) => {
      s['leftOutAllowed'] = [{ table: waterFile, share: 0.98, reason: 'Only the 2026 spring sample is kept while the export is fixed.' }];
    });
    const dir = scenarioCopy({ files: { [waterFile]: waterTable, 'scenario.json': settings }, descriptor: decimalComma });
    const scenario = await loadScenario(dir);
    expect(scenario.report.issues.filter((i) => i.severity === 'error')).toEqual([]);
    expect(scenario.records.filter((r) => r.indicator === 'water-microplastics').map((r) => r.value)).toEqual([0.5]);
    expect((await check(['--scenario', dir])).code).toBe(0);
  });

  test("every row of one segment's series left out is an error even when the table loses little", async () => {
    const good = Array.from({ length: 40 }, (_, i) => `BL-${i + 1},north-beach,${dateOf(i)},100,${i},,`);
    const table = `${beachHeader}\n${good.join('\n')}\nBL-99,seal-island,2025-06-01,100,-3,,\n`;
    const scenario = await loadScenario(scenarioCopy({ files: { [beachFile]: table } }));
    expect(scenario.report.issues.filter((i) => i.code === 'TableLoss')).toEqual([]);
    const loss = expectIssue(scenario.report.issues, { code: 'SeriesLoss', file: beachFile, severity: 'error' });
    expect(loss.message).toBe(
      `${beachFile}: all 1 row(s) for segment "seal-island" left out (1 value below the allowed minimum); the segment would be shown as not measured, so nothing is published`,
    );
  });

  test('--strict makes every warning an error', async () => {
    const good = Array.from({ length: 40 }, (_, i) => `BL-${i + 1},north-beach,${dateOf(i)},100,${i},,`);
    const dir = scenarioCopy({ files: { [beachFile]: `${beachHeader}\n${good.join('\n')}\nBL-99,north-beach,2025-06-01,100,-3,,\n` } });
    expect((await check(['--scenario', dir])).code).toBe(0);
    const strict = await check(['--scenario', dir, '--strict']);
    expect(strict.code).toBe(1);
    expect(strict.out).toContain('"-3" is too small');
  });
});

describe('tables as agencies keep them', () => {
  test('no record-id column (survey_id): rows are used, the row number stands in', async () => {
    const dir = scenarioCopy({
      files: { [beachFile]: 'segment_id,date,surveyed_length_m,items\nnorth-beach,2025-10-02,85,37\nnorth-beach,2026-01-15,100,25\n' },
      descriptor: (d) => {
        const schema = resourceNamed(d, 'beach-litter')['schema'] as { fields: { name: string }[]; primaryKey?: unknown };
        schema.fields = schema.fields.filter((f) => !['survey_id', 'plastic_items', 'area_m2'].includes(f.name));
        delete schema.primaryKey;
      },
    });
    const scenario = await loadScenario(dir);
    expect(scenario.report.ok).toBe(true);
    const beach = scenario.records.filter((r) => r.indicator === 'beach-litter');
    expect(beach.map((r) => r.source.row)).toEqual([2, 3]);
  });

  test('agency column name net_mesh_um used as it is through columnNames', async () => {
    const dir = scenarioCopy({
      files: { [waterFile]: 'sample_id,segment_id,date,particles_per_m3,net_mesh_um\nWM-1,harbour-mouth,2026-03-10,0.42,300\n' },
      descriptor: (d) => {
        const resource = resourceNamed(d, 'water-microplastics');
        const schema = resource['schema'] as { fields: { name: string }[] };
        const mesh = schema.fields.find((f) => f.name === 'mesh_um');
        if (mesh) mesh.name = 'net_mesh_um';
        resource['columnNames'] = { mesh_um: 'net_mesh_um' };
      },
    });
    const scenario = await loadScenario(dir);
    expect(scenario.report.issues.filter((i) => i.file === waterFile)).toEqual([]);
    const water = scenario.records.filter((r) => r.indicator === 'water-microplastics');
    expect(water.map((r) => r.extra['meshUm'])).toEqual([300]);
  });

  test('category "island shore" matches island-shore; shellfish yes/no accepted', async () => {
    const base = JSON.parse(readFileSync(join(baseScenario, 'segments.geojson'), 'utf8')) as { features: { properties: { [key: string]: unknown } }[] };
    const [first, , third] = base.features;
    if (first) first.properties['shellfish'] = 'No';
    if (third) Object.assign(third.properties, { kind: 'island shore', shellfish: 'yes' });
    const scenario = await loadScenario(scenarioCopy({ files: { 'segments.geojson': JSON.stringify(base) } }));
    expect(scenario.report.issues.filter((i) => i.file === 'segments.geojson')).toEqual([]);
    const island = scenario.segments.find((s) => s.id === 'seal-island');
    // "yes" says shellfish are taken, not how: read as farmed-and-gathered (both cautions shown).
    expect([island?.kind, island?.shellfish]).toEqual(['island-shore', 'farmed-and-gathered']);
    expect(scenario.segments.find((s) => s.id === 'north-beach')?.shellfish).toBe('none');
  });

  test('category value in a table: " Entanglement " matches, "entanglment" gets did-you-mean', async () => {
    const table = 'report_id,segment_id,date,kind,animals\nWR-1,seal-island,2026-02-02, Entanglement ,1\nWR-2,seal-island,2026-08-19,entanglment,2\n';
    const scenario = await loadScenario(scenarioCopy({ files: { 'tables/wildlife-reports.csv': table } }));
    expect(scenario.records.filter((r) => r.indicator === 'wildlife-reports').map((r) => r.source.row)).toEqual([2]);
    const issue = expectIssue(scenario.report.issues, { code: 'ValueNotAllowed', file: 'tables/wildlife-reports.csv', row: 3, column: 'kind' });
    expect(issue.message).toContain('did you mean "entanglement"?');
  });

  test('date 16/08/2023: the hint shows the declared way (Table Schema date format), not decimal-comma advice', async () => {
    const dir = scenarioCopy({ files: { [beachFile]: `${beachHeader}\nBL-1,north-beach,16/08/2023,85,37,15,100\n` } });
    const scenario = await loadScenario(dir);
    const issue = expectIssue(scenario.report.issues, { code: 'ValueWrongType', file: beachFile, row: 2, column: 'date' });
    expect(issue.hint).toContain('"format": "%d/%m/%Y"');
    expect(issue.hint).not.toContain('decimal');
  });

  test('date 16/08/2023 read when the field declares "format": "%d/%m/%Y"', async () => {
    const dir = scenarioCopy({
      files: { [beachFile]: `${beachHeader}\nBL-1,north-beach,16/08/2023,85,37,15,100\nBL-2,north-beach,2/9/2023,85,30,15,100\n` },
      descriptor: (d) => {
        const schema = resourceNamed(d, 'beach-litter')['schema'] as { fields: { name: string; format?: string }[] };
        const date = schema.fields.find((f) => f.name === 'date');
        if (date) date.format = '%d/%m/%Y';
      },
    });
    const scenario = await loadScenario(dir);
    expect(scenario.report.ok).toBe(true);
    expect(scenario.records.filter((r) => r.indicator === 'beach-litter').map((r) => r.date)).toEqual(['2023-08-16', '2023-09-02']);
  });

  test('unknown segment id orin-bay: did you mean "orrin-bay"?', async () => {
    const base = JSON.parse(readFileSync(join(baseScenario, 'segments.geojson'), 'utf8')) as { features: unknown[] };
    base.features.push({
      type: 'Feature',
      properties: { id: 'orrin-bay', name: 'Orrin Bay', kind: 'bay', shellfish: 'farmed' },
      geometry: {
        type: 'LineString',
        coordinates: [
          [0.5, 50],
          [0.52, 50.01],
        ],
      },
    });
    const good = Array.from({ length: 25 }, (_, i) => `BL-${i + 1},north-beach,${dateOf(i)},100,${i},,`);
    const dir = scenarioCopy({ files: { 'segments.geojson': JSON.stringify(base), [beachFile]: `${beachHeader}\n${good.join('\n')}\nBL-99,orin-bay,2025-06-01,100,3,,\n` } });
    const scenario = await loadScenario(dir);
    const issue = expectIssue(scenario.report.issues, { code: 'UnknownSegment', file: beachFile, row: 27, column: 'segment_id' });
    expect(issue.message).toContain('did you mean "orrin-bay"?');
    expect(issue.hint).toContain('Write "orrin-bay"');
  });

  test('a rule about an indicator with no data is a warning at check', async () => {
    const settings = withSettings((s) => {
      s['riskRules'] = [{ id: 'many-animals', level: 'marked', indicator: 'wildlife-reports', measure: 'assessment-median', op: '>=', value: 3, text: '{value} animals harmed' }];
    });
    const dir = scenarioCopy({ files: { 'scenario.json': settings, 'tables/wildlife-reports.csv': 'report_id,segment_id,date,kind,animals\n' } });
    const scenario = await loadScenario(dir);
    const issue = expectIssue(scenario.report.issues, { code: 'RuleWithoutData', file: 'scenario.json', column: '$.riskRules[0].indicator', severity: 'warning' });
    expect(issue.message).toContain('the rule can never match');
  });
});
