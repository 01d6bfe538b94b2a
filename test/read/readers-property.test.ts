// Property tests (fast-check): whatever bytes or JSON a reader is given, it either returns
// normally (problems in the log) or throws one of our own validation errors — never anything else.
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import { writeNetcdf3 } from '../../generator/drift/netcdf3-writer.ts';
import { readPositionsCsv } from '../../generator/drift/positions-csv.ts';
import { readTrajectoryFile } from '../../generator/drift/trajectory-file.ts';
import { decodeTrajectories } from '../../generator/drift/cf-trajectories.ts';
import { openNetcdf } from '../../generator/drift/netcdf-dataset.ts';
import { InputValidationError, ScenarioError } from '../../generator/errors.ts';
import { readCsvTable } from '../../generator/read/csv-table.ts';
import { buildRules } from '../../generator/read/indicator-table.ts';
import { IssueLog } from '../../generator/read/issue-log.ts';
import { readPackageDescriptor, tableSchemaSchema } from '../../generator/read/package-descriptor.ts';
import { validateSettings } from '../../generator/read/read-settings.ts';
import { checkSegments, toFeatures } from '../../generator/read/read-segments.ts';
import { beachLitter } from '../../generator/indicators/beach-litter.ts';
import { contiguousSpec, indexedSpec, incompleteSpec, orthogonalSpec, sampleTrajectories } from '../drift/cf-fixtures.ts';

const workDir = mkdtempSync(join(tmpdir(), 'wrackline-prop-'));
let counter = 0;
function tempFile(content: string | Uint8Array): string {
  const path = join(workDir, `f${counter++}`);
  writeFileSync(path, content);
  return path;
}

/** Cells that look like table content: ids, numbers, dates, separators, quotes, markup, junk. */
const cell = fc.oneof(
  fc.constantFrom('', 'BL-1', 'north-beach', '2026-01-15', '2026-02-30', '100', '-4', '0', 'NaN', 'Infinity', '<0.5', '12,5', '"', '""', '<b>x</b>', '\ufeff', '\r', ';'),
  fc.string({ maxLength: 8 }),
  fc.double().map(String),
);
const csvText = fc.tuple(fc.constantFrom(',', ';', '\t'), fc.constantFrom('\n', '\r\n')).chain(([separator, end]) =>
  fc
    .array(
      fc.array(cell, { maxLength: 9 }).map((cells) => cells.join(separator)),
      { maxLength: 8 },
    )
    .map((lines) => lines.join(end)),
);
const beachHeader = 'survey_id,segment_id,date,surveyed_length_m,items,plastic_items,area_m2';

const schema = tableSchemaSchema.parse({
  fields: beachHeader.split(',').map((name) => ({
    name,
    type: ['surveyed_length_m', 'area_m2'].includes(name) ? 'number' : ['items', 'plastic_items'].includes(name) ? 'integer' : name === 'date' ? 'date' : 'string',
  })),
});

async function ourErrorsOnly(run: () => Promise<unknown>, allowed: (error: unknown) => boolean = () => false): Promise<void> {
  try {
    await run();
  } catch (error) {
    if (!allowed(error)) throw error;
  }
}

describe('readers never throw for bad input', () => {
  test('CSV table reader', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.oneof(
          csvText,
          csvText.map((t) => `${beachHeader}\n${t}`),
          fc.uint8Array({ maxLength: 200 }),
        ),
        fc.constantFrom(',', ';'),
        async (content, delimiter) => {
          const log = new IssueLog();
          await readCsvTable({
            absolutePath: tempFile(content),
            file: 't.csv',
            dialect: { delimiter, header: true, quoteChar: '"', decimalChar: delimiter === ';' ? ',' : '.' },
            compression: null,
            rules: buildRules(schema, beachLitter),
            missingValues: [''],
            essentialColumns: ['items'],
            primaryKey: ['survey_id'],
            log,
            onRow: () => 'kept',
          });
          const counts = log.countsFor('t.csv');
          expect(counts.read).toBe(counts.kept + counts.excluded);
        },
      ),
      { numRuns: 150 },
    );
  });

  test('positions CSV reader', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.oneof(
          csvText.map((t) => `particle,time,lon,lat,status\n${t}`),
          csvText,
          fc.uint8Array({ maxLength: 200 }),
        ),
        async (content) => {
          const log = new IssueLog();
          await readPositionsCsv({ absolutePath: tempFile(content), file: 'p.csv', compression: null, log, onPosition: () => true });
          const counts = log.countsFor('p.csv');
          expect(counts.read).toBe(counts.kept + counts.excluded);
        },
      ),
      { numRuns: 150 },
    );
  });

  test('segments reader', () => {
    const position = fc.oneof(fc.tuple(fc.double(), fc.double()), fc.anything());
    const geometry = fc.record({
      type: fc.constantFrom('LineString', 'MultiLineString', 'Polygon', 'MultiPolygon', 'Point', 'Nope'),
      coordinates: fc.oneof(
        fc.array(position, { maxLength: 6 }),
        fc.array(fc.array(position, { maxLength: 6 }), { maxLength: 3 }),
        fc.array(fc.array(fc.array(position, { maxLength: 5 }), { maxLength: 2 }), { maxLength: 2 }),
        fc.anything(),
      ),
    });
    const properties = fc.record(
      {
        id: fc.oneof(fc.string(), fc.constantFrom('a-b', 'north-beach'), fc.anything()),
        name: fc.anything(),
        kind: fc.constantFrom('beach', 'bay', 'x'),
        shellfish: fc.constantFrom('none', 'farmed', 7),
      },
      { requiredKeys: [] },
    );
    const feature = fc.oneof(fc.record({ type: fc.constant('Feature'), properties, geometry: fc.oneof(geometry, fc.anything()) }), fc.anything());
    const document = fc.oneof(
      fc.record({ type: fc.constant('FeatureCollection'), features: fc.array(feature, { maxLength: 5 }) }),
      fc.record({ type: fc.constant('Topology'), objects: fc.anything(), arcs: fc.anything() }),
      fc.anything(),
    );
    fc.assert(
      fc.property(document, (json) => {
        const log = new IssueLog();
        const features = toFeatures(json);
        if ('features' in features) checkSegments(features.features, 's.geojson', log);
      }),
      { numRuns: 300 },
    );
  });

  test('settings validation', () => {
    fc.assert(
      fc.property(fc.anything(), (json) => {
        validateSettings(json, 'scenario.json', new IssueLog());
      }),
      { numRuns: 200 },
    );
  });

  test('package descriptor reader throws only ScenarioError', async () => {
    const resource = fc.record(
      {
        name: fc.oneof(fc.string(), fc.constant('x')),
        role: fc.constantFrom('settings', 'segments', 'indicator', 'nope'),
        indicator: fc.constantFrom('beach-litter', 'x'),
        path: fc.oneof(fc.string(), fc.constantFrom('../etc/passwd', '/abs', 'a.csv')),
        schema: fc.anything(),
      },
      { requiredKeys: [] },
    );
    const descriptor = fc.oneof(fc.record({ resources: fc.array(fc.oneof(resource, fc.anything()), { maxLength: 4 }) }), fc.anything());
    await fc.assert(
      fc.asyncProperty(
        fc.oneof(
          descriptor.map((d) => JSON.stringify(d) ?? ''),
          fc.string(),
        ),
        async (text) => {
          await ourErrorsOnly(
            () => readPackageDescriptor(tempFile(text), 'datapackage.json', new IssueLog()),
            (e) => e instanceof ScenarioError,
          );
        },
      ),
      { numRuns: 200 },
    );
  });

  test('NetCDF trajectory reader on damaged files throws only InputValidationError', async () => {
    const originals = [contiguousSpec, indexedSpec, incompleteSpec, orthogonalSpec].map((make) => writeNetcdf3(make(sampleTrajectories)));
    const damaged = fc
      .tuple(fc.nat({ max: originals.length - 1 }), fc.array(fc.tuple(fc.nat(), fc.nat({ max: 255 })), { maxLength: 6 }), fc.option(fc.nat(), { nil: undefined }))
      .map(([k, flips, cut]) => {
        const bytes = new Uint8Array(originals[k] as Uint8Array);
        for (const [at, value] of flips) bytes[at % bytes.length] = value;
        return cut === undefined ? bytes : bytes.subarray(0, cut % (bytes.length + 1));
      });
    await fc.assert(
      fc.asyncProperty(fc.oneof(damaged, fc.uint8Array({ maxLength: 300 })), async (bytes) => {
        await ourErrorsOnly(
          () => readTrajectoryFile(tempFile(bytes), 'd.nc', new IssueLog(), () => true),
          (e) => e instanceof InputValidationError,
        );
        // The decoder itself, without the safety net of readTrajectoryFile, also keeps to our errors.
        await ourErrorsOnly(
          async () => {
            const dataset = await openNetcdf(tempFile(bytes), 'd.nc');
            decodeTrajectories(dataset, 'd.nc', new IssueLog(), () => true);
          },
          (e) => e instanceof InputValidationError,
        );
      }),
      { numRuns: 300 },
    );
  });
});

describe('fast decimal reading in the positions reader', () => {
  test('scanDecimal reads exactly what Number() reads, and rejects what is not a plain decimal', async () => {
    const { scanDecimal } = await import('../../generator/drift/positions-csv.ts');
    const decimal = fc.oneof(
      fc.tuple(fc.double({ min: -400, max: 400, noNaN: true }), fc.integer({ min: 0, max: 12 })).map(([v, k]) => v.toFixed(k)),
      fc.double({ noNaN: true, noDefaultInfinity: true }).map(String),
      fc.stringMatching(/^[+-]?\d{1,20}(\.\d{0,20})?$/),
    );
    fc.assert(
      fc.property(decimal, (text) => {
        const padded = `x,${text},y`;
        expect(scanDecimal(padded, 2, 2 + text.length)).toBe(Number(text));
      }),
      { numRuns: 2000 },
    );
    for (const bad of ['', '-', '.', '1.2.3', '0x10', '12a', 'NaN', 'Infinity', '1,5', ' 1']) {
      expect(scanDecimal(bad, 0, bad.length), bad).toBeNaN();
    }
  });
});
