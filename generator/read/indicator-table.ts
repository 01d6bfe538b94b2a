/**
 * Reads one monitoring table (an indicator resource) into normalised records. The indicator's
 * module (generator/indicators) says which columns, types and units it needs; the table's own
 * Table Schema adds its constraints. Rows are checked for the segment they name (foreign key),
 * their date against the scenario's period and publication date, then normalised.
 *
 * Tables as agencies keep them:
 * - the record-id column (survey_id, sample_id, report_id) is optional: without it, the row number
 *   in the file stands in for the record id;
 * - a resource may carry `"columnNames": {"<our name>": "<name in the file>"}` so that a file whose
 *   columns are named differently (net_mesh_um for mesh_um) is used as it is. The Table Schema then
 *   describes the file as it is (its own column names); messages name the file's columns;
 * - rows naming a segment that was itself left out are counted and summed up in one line per
 *   segment, not reported one by one.
 */
import {
  DateAfterScenario,
  DateBeforeScenario,
  DateInFuture,
  SchemaFieldMissing,
  SchemaFieldType,
  UnitMismatch,
  UnknownSegment,
  DateNotInSeason,
  SegmentLeftOut,
} from '../errors.ts';
import { didYouMean, nearestWord } from './category-words.ts';
import type { IndicatorDefinition } from '../indicators/index.ts';
import type { ScenarioSettings } from '../scenario/settings.ts';
import type { Record as ScenarioRecord } from '../scenario/types.ts';
import { countDataLines, readCsvTable } from './csv-table.ts';
import type { TableRow } from './csv-table.ts';
import type { IssueLog } from './issue-log.ts';
import type { SeriesRows } from './loss-guard.ts';
import type { FieldDescriptor, ResourceEntry, TableSchema } from './package-descriptor.ts';
import { decimalYear, seasonOfDate } from './season-calendar.ts';
import type { CellRule } from './table-cells.ts';
import { dateFormatUnderstood } from './table-cells.ts';
import { sameUnit } from './units.ts';

export interface ScenarioPeriod {
  /** First allowed date, or null for no lower bound. */
  start: string | null;
  /** Last day of the last published season. */
  end: string;
  /** Publication date of the current season: nothing may be dated after it. */
  published: string;
}

function toNumberOrNull(value: number | string | undefined): number | null {
  if (typeof value === 'number') return value;
  if (typeof value === 'string' && value.trim() !== '' && Number.isFinite(Number(value))) return Number(value);
  return null;
}

function fieldType(field: FieldDescriptor): CellRule['type'] {
  const type = field.type;
  if (type === 'string' || type === 'integer' || type === 'number' || type === 'date' || type === 'datetime') return type;
  return 'other';
}

/** Cell rules for every schema field, tightened by the indicator's own requirements. */
export function buildRules(schema: TableSchema, definition: IndicatorDefinition | null, names: ColumnNames = identityNames): CellRule[] {
  return schema.fields.map((field) => {
    const requirement = definition?.columns.find((c) => names.inFile(c.name) === field.name);
    const constraints = field.constraints ?? {};
    const schemaMinimum = toNumberOrNull(constraints.minimum);
    const schemaMaximum = toNumberOrNull(constraints.maximum);
    const minimum = requirement?.minimum ?? null;
    const enumValues = requirement?.enum ?? (constraints.enum ? constraints.enum.map(String) : null);
    let type = fieldType(field);
    // An integer the indicator needs is checked as an integer even when declared as number.
    if (requirement?.type === 'integer' && type === 'number') type = 'integer';
    return {
      name: field.name,
      type,
      required: constraints.required === true || requirement?.required === true,
      minimum: minimum !== null && schemaMinimum !== null ? Math.max(minimum, schemaMinimum) : (minimum ?? schemaMinimum),
      exclusiveMinimum: requirement?.exclusiveMinimum ?? constraints.exclusiveMinimum ?? null,
      maximum: schemaMaximum,
      enum: enumValues,
      detectionLimitPrefix: field.detectionLimitPrefix ?? null,
      dateFormat: (type === 'date' || type === 'datetime') && field.format !== undefined && field.format !== 'default' ? field.format : null,
    };
  });
}

/** Our column names and the file's, both ways (the resource's `columnNames`). */
export interface ColumnNames {
  inFile(ours: string): string;
  ours(inFile: string): string;
}

const identityNames: ColumnNames = { inFile: (name) => name, ours: (name) => name };

export function columnNamesOf(resource: ResourceEntry): ColumnNames {
  const map = resource.columnNames;
  if (Object.keys(map).length === 0) return identityNames;
  const back = new Map(Object.entries(map).map(([ours, inFile]) => [inFile, ours]));
  return { inFile: (name) => map[name] ?? name, ours: (name) => back.get(name) ?? name };
}

const compatibleTypes: { [required: string]: readonly string[] } = {
  string: ['string'],
  integer: ['integer', 'number'],
  number: ['number', 'integer'],
  date: ['date', 'datetime'],
};

/**
 * Checks the table schema against the indicator: every required column declared with a fitting
 * type and the expected unit. Returns false when the table cannot be read.
 */
export function checkSchema(resource: ResourceEntry, schema: TableSchema, definition: IndicatorDefinition, log: IssueLog): boolean {
  const file = resource.path;
  const names = columnNamesOf(resource);
  let usable = true;
  for (const column of definition.columns) {
    const field = schema.fields.find((f) => f.name === names.inFile(column.name));
    if (!field) {
      // The record id is optional: the row number stands in for it.
      if (column.required && column.name !== definition.keyColumn) {
        const expected = `a field ${column.name} of type ${column.type}${column.unit ? ` in ${column.unit}` : ''}`;
        log.add(SchemaFieldMissing, SchemaFieldMissing.message(file, column.name, expected), {
          file,
          row: 1,
          column: column.name,
          value: null,
          expected,
          severity: 'error',
          excluded: true,
        });
        usable = false;
      }
      continue;
    }
    if ((field.type === 'date' || field.type === 'datetime') && field.format !== undefined && field.format !== 'default' && !dateFormatUnderstood(field.format)) {
      const expected = 'a date format such as "%d/%m/%Y" (directives %d, %m, %Y)';
      log.add(SchemaFieldType, `${file} row 1, column ${field.name}: date format ${JSON.stringify(field.format)} is not understood; expected ${expected}`, {
        file,
        row: 1,
        column: field.name,
        value: field.format,
        expected,
        severity: 'error',
        excluded: true,
        hint: 'Table Schema date patterns use %d (day), %m (month) and %Y (four-digit year) with any separators',
      });
      usable = false;
    }
    const allowed = compatibleTypes[column.type] ?? [column.type];
    if (!allowed.includes(field.type)) {
      log.add(SchemaFieldType, SchemaFieldType.message(file, column.name, field.type, `type ${column.type}`), {
        file,
        row: 1,
        column: column.name,
        value: field.type,
        expected: `type ${column.type}`,
        severity: 'error',
        excluded: true,
      });
      usable = false;
    }
    if (column.unit) {
      if (field.unit === undefined) {
        log.add(UnitMismatch, `${file} row 1, column ${column.name}: no unit is declared; expected "${column.unit}"; values were read as ${column.unit}`, {
          file,
          row: 1,
          column: column.name,
          value: null,
          expected: column.unit,
          severity: 'warning',
          excluded: false,
        });
      } else if (![column.unit, ...(column.unitAlternatives ?? [])].some((unit) => sameUnit(field.unit ?? '', unit))) {
        log.add(UnitMismatch, UnitMismatch.message(file, column.name, field.unit, column.unit), {
          file,
          row: 1,
          column: column.name,
          value: field.unit,
          expected: column.unit,
          severity: 'error',
          excluded: true,
        });
        usable = false;
      }
    }
  }
  return usable;
}

export interface IndicatorTableInput {
  resource: ResourceEntry;
  absolutePath: string;
  definition: IndicatorDefinition;
  settings: ScenarioSettings;
  /** Null when the settings could not be read: dates are then only checked for form. */
  period: ScenarioPeriod | null;
  segmentIds: ReadonlySet<string>;
  /** Segments with an id that were left out (bad geometry or properties). */
  leftOutSegments?: ReadonlySet<string>;
  segmentsFile: string;
  log: IssueLog;
  /** Filled with rows read and kept per known segment, for the loss guard (loss-guard.ts). */
  seriesRows?: Map<string, SeriesRows>;
  onProgress?: (bytesRead: number, bytesTotal: number) => void;
}

export async function readIndicatorTable(input: IndicatorTableInput): Promise<ScenarioRecord[]> {
  const { resource, definition, log, period, settings } = input;
  const file = resource.path;
  const schema = resource.schema;
  const records: ScenarioRecord[] = [];
  if (!schema) return records;
  if (!checkSchema(resource, schema, definition, log)) {
    const lines = await countDataLines(input.absolutePath, resource.compression, resource.dialect.header);
    const counts = log.countsFor(file);
    counts.read += lines;
    counts.excluded += lines;
    return records;
  }
  const names = columnNamesOf(resource);
  const rules = buildRules(schema, definition, names);
  // Segment ids, dates and seasons repeat across rows: one string each instead of one per row
  // (a national table of millions of rows holds a few thousand distinct values).
  const shared = new Map<string, string>();
  const intern = (text: string): string => {
    const found = shared.get(text);
    if (found !== undefined) return found;
    shared.set(text, text);
    return text;
  };
  const hasKeyColumn = schema.fields.some((f) => f.name === names.inFile(definition.keyColumn));
  const primaryKey = schema.primaryKey ?? (hasKeyColumn ? [names.inFile(definition.keyColumn)] : []);
  const segmentColumns = new Set<string>([names.inFile('segment_id')]);
  for (const foreignKey of schema.foreignKeys) {
    if (foreignKey.reference.resource === 'segments' && foreignKey.fields.length === 1 && foreignKey.fields[0]) segmentColumns.add(foreignKey.fields[0]);
  }
  const dateColumn = names.inFile(definition.columns.find((c) => c.type === 'date')?.name ?? 'date');
  const knownIds = [...input.segmentIds];
  const leftOutRows = new Map<string, { rows: number; first: number }>();
  const segmentColumn = names.inFile('segment_id');
  const countSeries = (row: TableRow, kept: boolean): void => {
    const segment = row.values[segmentColumn];
    if (typeof segment !== 'string' || !input.segmentIds.has(segment) || !input.seriesRows) return;
    let seen = input.seriesRows.get(segment);
    if (!seen) {
      seen = { read: 0, kept: 0, leftOut: new Set() };
      input.seriesRows.set(segment, seen);
    }
    seen.read++;
    if (kept) seen.kept++;
    else seen.leftOut.add(row.line);
  };

  await readCsvTable({
    absolutePath: input.absolutePath,
    file,
    dialect: resource.dialect,
    compression: resource.compression,
    rules,
    missingValues: schema.missingValues,
    essentialColumns: definition.columns.filter((c) => c.required && c.name !== definition.keyColumn).map((c) => names.inFile(c.name)),
    primaryKey,
    log,
    ...(input.onProgress ? { onProgress: input.onProgress } : {}),
    onLeftOut: (row) => countSeries(row, false),
    onRow: (row) => {
      const outcome = keepRow(row);
      countSeries(row, outcome === 'kept');
      return outcome;
    },
  });
  for (const [segment, seen] of leftOutRows) {
    log.add(SegmentLeftOut, SegmentLeftOut.message(file, seen.rows, segment, seen.first), {
      file,
      row: seen.first,
      column: segmentColumn,
      value: segment,
      expected: `a segment kept in ${input.segmentsFile}`,
      severity: 'warning',
      excluded: true,
    });
  }
  return records;

  function keepRow(row: TableRow): 'kept' | 'excluded' {
    const line = row.line;
    let keep = true;
    for (const column of segmentColumns) {
      const value = row.values[column];
      if (typeof value === 'string' && input.leftOutSegments?.has(value)) {
        const seen = leftOutRows.get(value);
        if (seen) seen.rows++;
        else leftOutRows.set(value, { rows: 1, first: line });
        return 'excluded';
      }
      if (typeof value === 'string' && !input.segmentIds.has(value)) {
        const suggestion = nearestWord(value, knownIds);
        log.add(UnknownSegment, `${UnknownSegment.message(file, line, column, value, input.segmentsFile)}${didYouMean(suggestion)}`, {
          file,
          row: line,
          column,
          value,
          expected: `a segment id from ${input.segmentsFile}`,
          severity: 'warning',
          excluded: true,
          ...(suggestion === null ? {} : { hint: `Write "${suggestion}", the segment id in ${input.segmentsFile} closest to ${JSON.stringify(value)}` }),
        });
        keep = false;
      }
    }
    const date = String(row.values[dateColumn] ?? '').slice(0, 10);
    if (period === null) {
      // no period to compare with
    } else if (period.start !== null && date < period.start) {
      log.add(DateBeforeScenario, DateBeforeScenario.message(file, line, dateColumn, date, period.start), {
        file,
        row: line,
        column: dateColumn,
        value: date,
        expected: `${period.start} or later`,
        severity: 'warning',
        excluded: true,
      });
      keep = false;
    } else if (date > period.published) {
      log.add(DateInFuture, DateInFuture.message(file, line, dateColumn, date, period.published), {
        file,
        row: line,
        column: dateColumn,
        value: date,
        expected: `${period.published} or earlier`,
        severity: 'warning',
        excluded: true,
      });
      keep = false;
    } else if (date > period.end) {
      log.add(DateAfterScenario, DateAfterScenario.message(file, line, dateColumn, date, period.end), {
        file,
        row: line,
        column: dateColumn,
        value: date,
        expected: `${period.end} or earlier`,
        severity: 'warning',
        excluded: true,
      });
      keep = false;
    }
    const season = seasonOfDate(date, settings.seasons);
    if (!season) {
      log.add(DateNotInSeason, DateNotInSeason.message(file, line, dateColumn, date), {
        file,
        row: line,
        column: dateColumn,
        value: date,
        expected: 'a date in a month covered by the seasons of scenario.json',
        severity: 'warning',
        excluded: true,
      });
      keep = false;
    }
    if (!keep || !season) return 'excluded';
    const ours = names === identityNames ? row : { ...row, values: renameKeys(row.values, names), censored: renameKeys(row.censored, names) };
    const normalised = definition.normalise(ours);
    records.push({
      indicator: definition.id,
      segmentId: intern(String(ours.values['segment_id'])),
      date: intern(date),
      t: decimalYear(date),
      season: intern(season.id),
      seasonName: intern(season.name),
      value: normalised.value,
      censored: normalised.censored,
      extra: normalised.note === undefined ? normalised.extra : { ...normalised.extra, note: normalised.note },
      source: { file, row: line },
    });
    return 'kept';
  }
}

function renameKeys<T>(values: { [column: string]: T }, names: ColumnNames): { [column: string]: T } {
  const out: { [column: string]: T } = {};
  for (const [key, value] of Object.entries(values)) out[names.ours(key)] = value;
  return out;
}
