// One test per bad-input case of monitoring tables. Each checks the catalogue code, that the
// message names the file, the row and the column, the severity, and that the record is listed as
// left out. The fixture scenario is invented (test/fixtures/inputs/base).
import { describe, expect, test } from 'vitest';
import { loadScenario } from '../../generator/read/load-scenario.ts';
import { beachHeader, expectIssue, resourceNamed, scenarioCopy } from './fixture-scenario.ts';

const beach = 'tables/beach-litter.csv';

async function loadWithBeach(rows: string[], header = beachHeader): Promise<Awaited<ReturnType<typeof loadScenario>>> {
  return loadScenario(scenarioCopy({ files: { [beach]: `${[header, ...rows].join('\n')}\n` } }));
}

function countsOf(scenario: Awaited<ReturnType<typeof loadScenario>>, file: string) {
  return scenario.report.files.find((f) => f.file === file);
}

describe('monitoring tables: bad input catalogue', () => {
  test('the untouched fixture loads without any issue', async () => {
    const scenario = await loadScenario(scenarioCopy());
    expect(scenario.report.issues).toEqual([]);
    expect(scenario.report.ok).toBe(true);
    expect(scenario.records).toHaveLength(12);
  });

  test('wrong header: a misspelled required column stops the table', async () => {
    const scenario = await loadWithBeach(['BL-1,north-beach,2026-01-15,100,25,,'], beachHeader.replace('items,plastic', 'itmes,plastic'));
    expectIssue(scenario.report.issues, { code: 'HeaderMissingColumn', file: beach, row: 1, column: 'items', severity: 'error', excluded: true });
    expectIssue(scenario.report.issues, { code: 'HeaderUnknownColumn', file: beach, row: 1, column: 'itmes', severity: 'warning' });
    expect(countsOf(scenario, beach)).toEqual({ file: beach, read: 1, kept: 0, excluded: 1 });
    expect(scenario.report.ok).toBe(false);
  });

  test('missing header: a first row of data is reported and the table is not read', async () => {
    const scenario = await loadWithBeach(['BL-2,north-beach,2026-01-16,100,20,,'], 'BL-1,north-beach,2026-01-15,100,25,,');
    const issue = expectIssue(scenario.report.issues, { code: 'HeaderLooksLikeData', file: beach, row: 1, severity: 'error' });
    expect(issue.message).toContain('row 1');
    expect(countsOf(scenario, beach)?.kept).toBe(0);
  });

  test('wrong type: text in an integer column', async () => {
    const scenario = await loadWithBeach(['BL-1,north-beach,2026-01-15,100,twelve,,', 'BL-2,north-beach,2026-01-16,100,12,,']);
    const issue = expectIssue(scenario.report.issues, { code: 'ValueWrongType', file: beach, row: 2, column: 'items', severity: 'warning', excluded: true });
    expect(issue.value).toBe('twelve');
    expect(countsOf(scenario, beach)).toEqual({ file: beach, read: 2, kept: 1, excluded: 1 });
  });

  test('wrong type: an impossible calendar date', async () => {
    const scenario = await loadWithBeach(['BL-1,north-beach,2026-02-30,100,12,,']);
    expectIssue(scenario.report.issues, { code: 'ValueWrongType', file: beach, row: 2, column: 'date' });
  });

  test('unit not the one this indicator uses: surveyed length declared in km', async () => {
    const dir = scenarioCopy({
      descriptor: (d) => {
        const fields = (resourceNamed(d, 'beach-litter')['schema'] as { fields: { name: string; unit?: string }[] }).fields;
        const field = fields.find((f) => f.name === 'surveyed_length_m');
        if (field) field.unit = 'km';
      },
    });
    const scenario = await loadScenario(dir);
    const issue = expectIssue(scenario.report.issues, { code: 'UnitMismatch', file: beach, row: 1, column: 'surveyed_length_m', severity: 'error', excluded: true });
    expect(issue.value).toBe('km');
    expect(countsOf(scenario, beach)).toEqual({ file: beach, read: 5, kept: 0, excluded: 5 });
  });

  test('unit not declared: read in the expected unit with a warning', async () => {
    const dir = scenarioCopy({
      descriptor: (d) => {
        const fields = (resourceNamed(d, 'beach-litter')['schema'] as { fields: { name: string; unit?: string }[] }).fields;
        const field = fields.find((f) => f.name === 'surveyed_length_m');
        if (field) delete field.unit;
      },
    });
    const scenario = await loadScenario(dir);
    expectIssue(scenario.report.issues, { code: 'UnitMismatch', file: beach, row: 1, column: 'surveyed_length_m', severity: 'warning', excluded: false });
    expect(countsOf(scenario, beach)?.kept).toBe(5);
  });

  test('equivalent unit spellings are accepted (µm for um, m³ for m3)', async () => {
    const dir = scenarioCopy({
      descriptor: (d) => {
        const fields = (resourceNamed(d, 'water-microplastics')['schema'] as { fields: { name: string; unit?: string }[] }).fields;
        for (const f of fields) {
          if (f.name === 'mesh_um') f.unit = 'µm';
          if (f.name === 'particles_per_m3') f.unit = 'particles per m³';
        }
      },
    });
    const scenario = await loadScenario(dir);
    expect(scenario.report.issues).toEqual([]);
  });

  test('date before the monitored period', async () => {
    const scenario = await loadWithBeach(['BL-1,north-beach,2019-12-31,100,12,,']);
    expectIssue(scenario.report.issues, { code: 'DateBeforeScenario', file: beach, row: 2, column: 'date', severity: 'warning', excluded: true });
  });

  test('date after the last published season (but not after publication)', async () => {
    const scenario = await loadWithBeach(['BL-1,north-beach,2026-12-01,100,12,,', 'BL-2,north-beach,2026-11-30,100,12,,']);
    expectIssue(scenario.report.issues, { code: 'DateAfterScenario', file: beach, row: 2, column: 'date', excluded: true });
    expect(countsOf(scenario, beach)?.kept).toBe(1);
  });

  test('date in the future relative to the publication date', async () => {
    const scenario = await loadWithBeach(['BL-1,north-beach,2027-02-14,100,12,,']);
    const issue = expectIssue(scenario.report.issues, { code: 'DateInFuture', file: beach, row: 2, column: 'date', excluded: true });
    expect(issue.message).toContain('2026-12-01');
  });

  test('unknown segment id (foreign key)', async () => {
    const scenario = await loadWithBeach(['BL-1,south-beach,2026-01-15,100,12,,']);
    const issue = expectIssue(scenario.report.issues, { code: 'UnknownSegment', file: beach, row: 2, column: 'segment_id', excluded: true });
    expect(issue.message).toContain('segments.geojson');
  });

  test('duplicate primary key: the later row is left out and names the first', async () => {
    const scenario = await loadWithBeach(['BL-1,north-beach,2026-01-15,100,12,,', 'BL-1,north-beach,2026-01-16,100,13,,']);
    const issue = expectIssue(scenario.report.issues, { code: 'DuplicateKey', file: beach, row: 3, column: 'survey_id', excluded: true });
    expect(issue.message).toContain('row 2');
    expect(scenario.records.filter((r) => r.indicator === 'beach-litter').map((r) => r.source.row)).toEqual([2]);
  });

  test('negative count', async () => {
    const scenario = await loadWithBeach(['BL-1,north-beach,2026-01-15,100,-4,,']);
    const issue = expectIssue(scenario.report.issues, { code: 'ValueBelowMinimum', file: beach, row: 2, column: 'items', excluded: true });
    expect(issue.value).toBe('-4');
  });

  test('surveyed length zero', async () => {
    const scenario = await loadWithBeach(['BL-1,north-beach,2026-01-15,0,12,,']);
    const issue = expectIssue(scenario.report.issues, { code: 'ValueBelowMinimum', file: beach, row: 2, column: 'surveyed_length_m', excluded: true });
    expect(issue.expected).toContain('> 0');
  });

  test('NaN and Infinity', async () => {
    const scenario = await loadWithBeach(['BL-1,north-beach,2026-01-15,NaN,12,,', 'BL-2,north-beach,2026-01-16,Infinity,12,,', 'BL-3,north-beach,2026-01-17,100,12,,-INF']);
    expectIssue(scenario.report.issues, { code: 'ValueNotFinite', file: beach, row: 2, column: 'surveyed_length_m' });
    expectIssue(scenario.report.issues, { code: 'ValueNotFinite', file: beach, row: 3, column: 'surveyed_length_m' });
    expectIssue(scenario.report.issues, { code: 'ValueNotFinite', file: beach, row: 4, column: 'area_m2' });
    expect(countsOf(scenario, beach)).toEqual({ file: beach, read: 3, kept: 0, excluded: 3 });
    // every record left out → the table as a whole is an error
    expectIssue(scenario.report.issues, { code: 'NoUsableRows', file: beach, row: 2, severity: 'error' });
  });

  test('empty file', async () => {
    const scenario = await loadScenario(scenarioCopy({ files: { [beach]: '' } }));
    expectIssue(scenario.report.issues, { code: 'FileEmpty', file: beach, row: 1, severity: 'error' });
  });

  test('header only: no data rows is a warning', async () => {
    const scenario = await loadScenario(scenarioCopy({ files: { [beach]: `${beachHeader}\n` } }));
    expectIssue(scenario.report.issues, { code: 'NoDataRows', file: beach, row: 2, severity: 'warning' });
  });

  test('UTF-8 byte-order mark: read without it, noted as a warning', async () => {
    const scenario = await loadScenario(scenarioCopy({ files: { [beach]: `\ufeff${beachHeader}\nBL-1,north-beach,2026-01-15,100,12,,\n` } }));
    expectIssue(scenario.report.issues, { code: 'ByteOrderMark', file: beach, row: 1, severity: 'warning', excluded: false });
    const records = scenario.records.filter((r) => r.indicator === 'beach-litter');
    expect(records.map((r) => [r.segmentId, r.value])).toEqual([['north-beach', 12]]);
  });

  test('CR LF line ends: read as ordinary line ends', async () => {
    const scenario = await loadScenario(
      scenarioCopy({ files: { [beach]: `${beachHeader}\r\nBL-1,north-beach,2026-01-15,100,12,,\r\nBL-2,north-beach,2026-01-16,50,12,3,40\r\n` } }),
    );
    expectIssue(scenario.report.issues, { code: 'WindowsLineEnds', file: beach, row: 1, severity: 'warning' });
    const records = scenario.records.filter((r) => r.indicator === 'beach-litter');
    expect(records.map((r) => r.value)).toEqual([12, 24]);
    expect(records[1]?.extra['areaM2']).toBe(40);
  });

  test('semicolons and decimal commas not declared: detected, reported, not misread', async () => {
    const text = `${beachHeader.replaceAll(',', ';')}\nBL-1;north-beach;2026-01-15;85,5;12;;\n`;
    const scenario = await loadScenario(scenarioCopy({ files: { [beach]: text } }));
    const issue = expectIssue(scenario.report.issues, { code: 'DelimiterMismatch', file: beach, row: 1, severity: 'error' });
    expect(issue.message).toContain('";"');
    expect(scenario.records.some((r) => r.indicator === 'beach-litter')).toBe(false);
  });

  test('semicolons and decimal commas declared in the dialect: read correctly', async () => {
    const text = `${beachHeader.replaceAll(',', ';')}\nBL-1;north-beach;2026-01-15;85,5;12;;\n`;
    const dir = scenarioCopy({
      files: { [beach]: text },
      descriptor: (d) => {
        resourceNamed(d, 'beach-litter')['dialect'] = { delimiter: ';', header: true, decimalChar: ',' };
      },
    });
    const scenario = await loadScenario(dir);
    expect(scenario.report.issues).toEqual([]);
    const record = scenario.records.find((r) => r.indicator === 'beach-litter');
    expect(record?.extra['surveyedLengthM']).toBe(85.5);
  });

  test('decimal comma in a semicolon file without decimalChar: reported on the cell', async () => {
    const text = `${beachHeader.replaceAll(',', ';')}\nBL-1;north-beach;2026-01-15;85,5;12;;\n`;
    const dir = scenarioCopy({
      files: { [beach]: text },
      descriptor: (d) => {
        resourceNamed(d, 'beach-litter')['dialect'] = { delimiter: ';', header: true };
      },
    });
    const scenario = await loadScenario(dir);
    expectIssue(scenario.report.issues, { code: 'DecimalCommaFound', file: beach, row: 2, column: 'surveyed_length_m', excluded: true });
  });

  test('a decimal comma in a comma file splits the row: wrong cell count', async () => {
    const scenario = await loadWithBeach(['BL-1,north-beach,2026-01-15,85,5,12,,']);
    expectIssue(scenario.report.issues, { code: 'RowWrongLength', file: beach, row: 2, excluded: true });
  });

  test('truncated last line', async () => {
    const text = `${beachHeader}\nBL-1,north-beach,2026-01-15,100,12,,\nBL-2,north-beach,2026-01-1`;
    const scenario = await loadScenario(scenarioCopy({ files: { [beach]: text } }));
    const issue = expectIssue(scenario.report.issues, { code: 'RowTruncated', file: beach, row: 3, excluded: true });
    expect(issue.message).toContain('cut short');
    expect(countsOf(scenario, beach)).toEqual({ file: beach, read: 2, kept: 1, excluded: 1 });
  });

  test('a quote never closed stops the reading at that row', async () => {
    const text = `${beachHeader}\nBL-1,north-beach,2026-01-15,100,12,,\n"BL-2,north-beach,2026-01-16,100,12,,\nBL-3,north-beach,2026-01-17,100,12,,\n`;
    const scenario = await loadScenario(scenarioCopy({ files: { [beach]: text } }));
    expectIssue(scenario.report.issues, { code: 'QuoteNotClosed', file: beach, severity: 'error' });
  });

  test('a below-detection value where the schema allows none', async () => {
    const scenario = await loadWithBeach(['BL-1,north-beach,2026-01-15,100,<5,,']);
    expectIssue(scenario.report.issues, { code: 'CensoredNotAllowed', file: beach, row: 2, column: 'items', excluded: true });
  });

  test('below-detection values are kept as censored at the detection limit', async () => {
    const scenario = await loadScenario(scenarioCopy());
    const censored = scenario.records.filter((r) => r.censored).map((r) => [r.indicator, r.value]);
    expect(censored).toEqual([
      ['shellfish-tissue', 0.08],
      ['water-microplastics', 0.05],
    ]);
  });

  test('a value outside an enum', async () => {
    const text = 'report_id,segment_id,date,kind,animals\nWR-1,seal-island,2026-02-02,bycatch,1\n';
    const scenario = await loadScenario(scenarioCopy({ files: { 'tables/wildlife-reports.csv': text } }));
    expectIssue(scenario.report.issues, { code: 'ValueNotAllowed', file: 'tables/wildlife-reports.csv', row: 2, column: 'kind', excluded: true });
  });

  test('a required value missing', async () => {
    const scenario = await loadWithBeach(['BL-1,,2026-01-15,100,12,,']);
    expectIssue(scenario.report.issues, { code: 'ValueMissing', file: beach, row: 2, column: 'segment_id', excluded: true });
  });

  test('HTML or script text in a name is kept as plain text and pointed out', async () => {
    const species = '<script>alert(1)</script> mussel';
    const text = `sample_id,segment_id,date,species,particles_per_g_ww\nST-1,harbour-mouth,2026-05-02,"${species}",0.36\n`;
    const scenario = await loadScenario(scenarioCopy({ files: { 'tables/shellfish-tissue.csv': text } }));
    expectIssue(scenario.report.issues, { code: 'MarkupInText', file: 'tables/shellfish-tissue.csv', row: 2, column: 'species', severity: 'warning', excluded: false });
    const record = scenario.records.find((r) => r.indicator === 'shellfish-tissue');
    expect(record?.extra['species']).toBe(species);
  });

  test('a listed file that does not exist', async () => {
    const scenario = await loadScenario(scenarioCopy({ files: { [beach]: null } }));
    expectIssue(scenario.report.issues, { code: 'ResourceFileMissing', file: beach, severity: 'error' });
  });
});
