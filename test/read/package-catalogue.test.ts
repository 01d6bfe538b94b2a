// Bad-input cases of the package descriptor and of table schemas, and the rest of the catalogue
// not covered elsewhere. Each checks the catalogue code and that the message names the place.
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';
import { decodeTrajectories } from '../../generator/drift/cf-trajectories.ts';
import { openNetcdf } from '../../generator/drift/netcdf-dataset.ts';
import { writeNetcdf3 } from '../../generator/drift/netcdf3-writer.ts';
import { InputValidationError, ScenarioError } from '../../generator/errors.ts';
import { IssueLog } from '../../generator/read/issue-log.ts';
import { loadScenario } from '../../generator/read/load-scenario.ts';
import { contiguousSpec, sampleTrajectories } from '../drift/cf-fixtures.ts';
import { baseScenario, expectIssue, resourceNamed, scenarioCopy } from './fixture-scenario.ts';

type Fields = { fields: { name: string; type?: string; constraints?: { [key: string]: unknown } }[] };

describe('scenario folder and package descriptor', () => {
  test('a folder that does not exist throws ScenarioError naming it', async () => {
    const missing = join(tmpdir(), 'wrackline-nowhere-at-all');
    const error = await loadScenario(missing).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ScenarioError);
    expect((error as ScenarioError).code).toBe('ScenarioFolderUnreadable');
    expect((error as ScenarioError).message).toContain(missing);
  });

  test('a datapackage.json that is not JSON throws ScenarioError naming the file', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'wrackline-pkg-'));
    writeFileSync(join(dir, 'datapackage.json'), '{ "resources": [');
    const error = await loadScenario(dir).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ScenarioError);
    expect((error as ScenarioError).code).toBe('PackageDescriptorUnreadable');
    expect((error as ScenarioError).message).toContain('datapackage.json');
  });

  test('a resource path leaving the scenario folder is refused', async () => {
    const dir = scenarioCopy({
      descriptor: (d) => {
        resourceNamed(d, 'wildlife-reports')['path'] = '../../etc/passwd';
      },
    });
    const scenario = await loadScenario(dir);
    const issue = expectIssue(scenario.report.issues, { code: 'ResourceInvalid', file: 'datapackage.json', column: 'resources[5].path', severity: 'error' });
    expect(issue.message).toContain('leaves the scenario folder');
  });

  test('an unknown indicator and a missing role are reported with their JSON path', async () => {
    const dir = scenarioCopy({
      descriptor: (d) => {
        resourceNamed(d, 'wildlife-reports')['indicator'] = 'seabird-counts';
        delete resourceNamed(d, 'shellfish-tissue')['role'];
      },
    });
    const scenario = await loadScenario(dir);
    expectIssue(scenario.report.issues, { code: 'ResourceInvalid', file: 'datapackage.json', column: 'resources[5].indicator' });
    expectIssue(scenario.report.issues, { code: 'ResourceInvalid', file: 'datapackage.json', column: 'resources[4].role' });
  });
});

describe('table schema against the indicator', () => {
  test('a field the indicator needs is not declared', async () => {
    const dir = scenarioCopy({
      descriptor: (d) => {
        const schema = resourceNamed(d, 'beach-litter')['schema'] as Fields;
        schema.fields = schema.fields.filter((f) => f.name !== 'items');
      },
    });
    const scenario = await loadScenario(dir);
    expectIssue(scenario.report.issues, { code: 'SchemaFieldMissing', file: 'tables/beach-litter.csv', row: 1, column: 'items', severity: 'error' });
  });

  test('a field declared with another type', async () => {
    const dir = scenarioCopy({
      descriptor: (d) => {
        const schema = resourceNamed(d, 'beach-litter')['schema'] as Fields;
        const date = schema.fields.find((f) => f.name === 'date');
        if (date) date.type = 'string';
      },
    });
    const scenario = await loadScenario(dir);
    expectIssue(scenario.report.issues, { code: 'SchemaFieldType', file: 'tables/beach-litter.csv', row: 1, column: 'date', severity: 'error' });
  });

  test('a value above a declared maximum', async () => {
    const dir = scenarioCopy({
      descriptor: (d) => {
        const schema = resourceNamed(d, 'water-microplastics')['schema'] as Fields;
        const mesh = schema.fields.find((f) => f.name === 'mesh_um');
        if (mesh) mesh.constraints = { maximum: 300 };
      },
    });
    const scenario = await loadScenario(dir);
    expectIssue(scenario.report.issues, { code: 'ValueAboveMaximum', file: 'tables/water-microplastics.csv', row: 2, column: 'mesh_um', excluded: true });
  });

  test('a sample dated in a month no season covers', async () => {
    const settings = JSON.parse(readFileSync(join(baseScenario, 'scenario.json'), 'utf8')) as { [key: string]: unknown };
    settings['seasons'] = [
      { id: 'winter', label: 'Winter', months: [12, 1, 2] },
      { id: 'spring', label: 'Spring', months: [3, 4] },
      { id: 'summer', label: 'Summer', months: [6, 7, 8] },
      { id: 'autumn', label: 'Autumn', months: [9, 10, 11] },
    ];
    const dir = scenarioCopy({
      files: {
        'scenario.json': JSON.stringify(settings),
        'tables/shellfish-tissue.csv':
          'sample_id,segment_id,date,species,particles_per_g_ww\nST-1,harbour-mouth,2026-05-02,blue mussel,0.36\nST-2,harbour-mouth,2026-10-02,blue mussel,0.3\n',
      },
    });
    const scenario = await loadScenario(dir);
    expectIssue(scenario.report.issues, { code: 'DateNotInSeason', file: 'tables/shellfish-tissue.csv', row: 2, column: 'date', excluded: true });
  });
});

describe('NetCDF that is not a CF trajectory file', () => {
  test('featureType of another kind is refused, naming the attribute', async () => {
    const spec = contiguousSpec(sampleTrajectories);
    const bytes = writeNetcdf3({ ...spec, attributes: [{ name: 'featureType', value: 'timeSeries' }] });
    const path = join(mkdtempSync(join(tmpdir(), 'wrackline-nt-')), 't.nc');
    writeFileSync(path, bytes);
    const dataset = await openNetcdf(path, 'drift/t.nc');
    let error: unknown = null;
    try {
      decodeTrajectories(dataset, 'drift/t.nc', new IssueLog(), () => true);
    } catch (e) {
      error = e;
    }
    expect(error).toBeInstanceOf(InputValidationError);
    const issue = (error as InputValidationError).issue;
    expect(issue.code).toBe('NetcdfNotTrajectory');
    expect(issue.message).toContain('drift/t.nc');
    expect(issue.message).toContain('column featureType');
  });

  test('no latitude variable', async () => {
    const spec = contiguousSpec(sampleTrajectories);
    const bytes = writeNetcdf3({ ...spec, variables: spec.variables.filter((v) => v.name !== 'lat') });
    const path = join(mkdtempSync(join(tmpdir(), 'wrackline-nt-')), 't.nc');
    writeFileSync(path, bytes);
    const dataset = await openNetcdf(path, 'drift/t.nc');
    expect(() => decodeTrajectories(dataset, 'drift/t.nc', new IssueLog(), () => true)).toThrow(/column lat: no latitude variable/);
  });
});
