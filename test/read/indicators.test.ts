// The indicator registry and its normalisations, checked against published worked values.
import { describe, expect, test } from 'vitest';
import { cleanCoastClass, cleanCoastIndex, getIndicator, indicatorDefinitions, indicatorIds, itemsPer100m } from '../../generator/indicators/index.ts';
import { readCsvTable } from '../../generator/read/csv-table.ts';
import { IssueLog } from '../../generator/read/issue-log.ts';
import { parseCell } from '../../generator/read/table-cells.ts';
import type { CellRule } from '../../generator/read/table-cells.ts';
import { assertInDelta } from '../asserts.ts';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

describe('indicator registry', () => {
  test('every indicator has a label, units, columns and an aggregation', () => {
    expect(indicatorIds).toEqual(['beach-litter', 'water-microplastics', 'shellfish-tissue', 'wildlife-reports', 'drift-arrivals']);
    for (const id of indicatorIds) {
      const d = indicatorDefinitions[id];
      expect(d.id).toBe(id);
      expect(d.label.length).toBeGreaterThan(0);
      expect(d.unitShort.length).toBeGreaterThan(0);
      expect(d.columns.some((c) => c.name === d.keyColumn)).toBe(true);
    }
    expect(getIndicator('wildlife-reports').aggregation).toBe('season-total');
    expect(getIndicator('beach-litter').aggregation).toBe('per-sample');
  });

  test('the beach-litter threshold is the EU threshold value of 20 items per 100 m', () => {
    // Van Loon et al. 2020, JRC: EU threshold value 20 items/100 m of coastline.
    expect(getIndicator('beach-litter').threshold?.value).toBe(20);
  });
});

describe('beach-litter normalisation', () => {
  test('37 items on 85 m → 43.53 items per 100 m', () => {
    // items × 100 / length (EMODnet normalisation to 100 m; reference check 14).
    assertInDelta(itemsPer100m(37, 85), 43.53, 0.005);
    const value = getIndicator('beach-litter').normalise({ values: { items: 37, surveyed_length_m: 85, plastic_items: null, area_m2: null }, censored: {} });
    assertInDelta(value.value, 43.5294, 1e-4);
    expect(value.extra['cleanCoastIndex']).toBeNull();
  });
});

describe('Clean Coast Index (Alkalay, Pasternak & Zask 2007)', () => {
  test('15 plastic items on 100 m² → 3.0, clean', () => {
    assertInDelta(cleanCoastIndex(15, 100), 3.0, 1e-12);
    expect(cleanCoastClass(3.0)).toBe('clean');
  });

  test('120 plastic items on 100 m² → 24, extremely dirty', () => {
    assertInDelta(cleanCoastIndex(120, 100), 24, 1e-12);
    expect(cleanCoastClass(24)).toBe('extremely-dirty');
  });

  test('published example values fall in their classes (Löffler et al. 2022: 1.48, 2.76, 8.24)', () => {
    expect([1.48, 2.76, 8.24].map(cleanCoastClass)).toEqual(['very-clean', 'clean', 'moderate']);
  });

  test('no area → no index', () => {
    expect(cleanCoastIndex(3, 0)).toBeNull();
  });
});

describe('Frictionless missing values', () => {
  const rule: CellRule = { name: 'note', type: 'string', required: false, minimum: null, exclusiveMinimum: null, maximum: null, enum: null, detectionLimitPrefix: null };

  test('default missingValues [""]: "" is null and "NA" stays a string', () => {
    // Frictionless Table Schema: missingValues defaults to [""] (reference check 22).
    expect(parseCell('', rule, [''], '.', 'f.csv', 2)).toEqual({ ok: true, value: null, censored: false });
    expect(parseCell('NA', rule, [''], '.', 'f.csv', 2)).toEqual({ ok: true, value: 'NA', censored: false });
  });

  test('"NA" is null only when listed', () => {
    expect(parseCell('NA', rule, ['', 'NA'], '.', 'f.csv', 2)).toEqual({ ok: true, value: null, censored: false });
  });

  test('a table without missingValues uses the default through the whole reader', async () => {
    const path = join(mkdtempSync(join(tmpdir(), 'wrackline-mv-')), 't.csv');
    writeFileSync(path, 'id,note\na,NA\nb,\n');
    const log = new IssueLog();
    const rows: unknown[] = [];
    const { tableSchemaSchema } = await import('../../generator/read/package-descriptor.ts');
    const schema = tableSchemaSchema.parse({ fields: [{ name: 'id' }, { name: 'note' }] });
    expect(schema.missingValues).toEqual(['']);
    await readCsvTable({
      absolutePath: path,
      file: 't.csv',
      dialect: { delimiter: ',', header: true, quoteChar: '"', decimalChar: '.' },
      compression: null,
      rules: [{ ...rule, name: 'id' }, rule],
      missingValues: schema.missingValues,
      essentialColumns: [],
      primaryKey: ['id'],
      log,
      onRow: (row) => {
        rows.push(row.values);
        return 'kept';
      },
    });
    expect(rows).toEqual([
      { id: 'a', note: 'NA' },
      { id: 'b', note: null },
    ]);
  });
});
