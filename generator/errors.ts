/**
 * The catalogue of input problems Wrackline reports. Each entry is data: a stable `name`, a short
 * `title`, a `message(...)` that names the file, the row and the column with the value and what
 * was expected, and a `hint` saying how to fix the input. Messages are not sentences: no final
 * period.
 *
 * Severity: a problem that makes a whole input unusable or untrustworthy (unreadable file, wrong
 * header, wrong unit, invalid settings, bad segment) is an `error` and stops a build; a single
 * record left out (bad cell, unknown segment, duplicate id, date out of range) is a `warning`
 * with `excluded: true`, listed in the report; a table where no record survives is an error.
 *
 * Two error classes exist:
 * - `ScenarioError`: the scenario folder or its datapackage.json cannot be read at all; the only
 *   thing `loadScenario` throws.
 * - `InputValidationError`: thrown by a low-level reader (e.g. a corrupt NetCDF file) and caught by
 *   `loadScenario`, which turns it into a report entry. Readers throw nothing else for bad input.
 */
import type { ValidationIssue } from './model/types.ts';

export interface ErrorData {
  name: string;
  title: string;
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  message: (...args: any[]) => string;
  hint: string;
}

/** Shows a value in a message: quoted, control characters made visible, long text shortened. */
export function quoteValue(value: string | null | undefined): string {
  if (value === null || value === undefined) return '(nothing)';
  // biome-ignore lint/suspicious/noControlCharactersInRegex: control and direction characters are made visible on purpose
  const visible = value.replace(/[\u0000-\u001f\u007f\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069]/g, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
  const short = visible.length > 80 ? `${visible.slice(0, 77)}...` : visible;
  return `"${short}"`;
}

// ---------------------------------------------------------------------------------------------
// The scenario folder and its package descriptor
// ---------------------------------------------------------------------------------------------

export const ScenarioFolderUnreadable = {
  name: 'ScenarioFolderUnreadable',
  title: 'Scenario folder cannot be read',
  message: (dir: string, reason: string) => `${dir}: cannot read the scenario folder (${reason})`,
  hint: 'Pass the folder that holds datapackage.json, e.g. --scenario content/demo',
} satisfies ErrorData;

export const PackageDescriptorUnreadable = {
  name: 'PackageDescriptorUnreadable',
  title: 'datapackage.json cannot be read',
  message: (file: string, reason: string) => `${file}: not a readable data package descriptor (${reason})`,
  hint: 'datapackage.json must be a JSON object with a "resources" array (Frictionless Data Package)',
} satisfies ErrorData;

export const ResourceInvalid = {
  name: 'ResourceInvalid',
  title: 'Resource entry is not usable',
  message: (file: string, path: string, reason: string) => `${file}, at ${path}: ${reason}`,
  hint: 'Each resource needs a name, a path inside the scenario folder and a role (settings, segments, land, indicator, drift-positions, drift-trajectories, drift-arrivals)',
} satisfies ErrorData;

export const ResourceFileMissing = {
  name: 'ResourceFileMissing',
  title: 'Listed file is missing',
  message: (file: string, reason: string) => `${file}: the file listed in datapackage.json cannot be opened (${reason})`,
  hint: 'Check the resource path; it is relative to the scenario folder',
} satisfies ErrorData;

// ---------------------------------------------------------------------------------------------
// Settings
// ---------------------------------------------------------------------------------------------

export const SettingsUnreadable = {
  name: 'SettingsUnreadable',
  title: 'Settings file cannot be parsed',
  message: (file: string, reason: string) => `${file}: not valid ${/\.ya?ml$/i.test(file) ? 'YAML' : 'JSON'} (${reason})`,
  hint: 'Open the file in an editor with the published JSON Schema (schema/scenario.schema.json) to see the mistake',
} satisfies ErrorData;

export const SettingsInvalid = {
  name: 'SettingsInvalid',
  title: 'Setting has a wrong value',
  message: (file: string, jsonPath: string, value: string, expected: string) => `${file}, at ${jsonPath}: ${value} is not allowed; expected ${expected}`,
  hint: 'See schema/scenario.schema.json for every setting and its allowed values',
} satisfies ErrorData;

export const SettingUnknown = {
  name: 'SettingUnknown',
  title: 'Unknown setting',
  message: (file: string, jsonPath: string) => `${file}, at ${jsonPath}: this setting is not known and was ignored; expected one of the settings in schema/scenario.schema.json`,
  hint: 'Check the spelling (names are case-sensitive); an editor using schema/scenario.schema.json completes them',
} satisfies ErrorData;

export const PublisherLogoRefused = {
  name: 'PublisherLogoRefused',
  title: "Publisher's logo cannot be used",
  message: (file: string, jsonPath: string, logo: string, found: string, expected: string) =>
    `${file}, at ${jsonPath}: the logo file ${quoteValue(logo)} is ${found}; expected ${expected}`,
  hint: 'Give a PNG, JPEG or WebP image inside the scenario folder, at most 256 KB and 2,000 pixels a side (a PNG about 400 pixels wide is plenty for the page header)',
} satisfies ErrorData;

export const NoteTargetUnknown = {
  name: 'NoteTargetUnknown',
  title: 'Publisher note names an unknown season or segment',
  message: (file: string, jsonPath: string, value: string, expected: string) => `${file}, at ${jsonPath}: ${value} is not known; expected ${expected}`,
  hint: 'A note belongs to a season listed in "publications" and, unless segment is null, to a segment id of the segments file; a note naming anything else would be shown nowhere',
} satisfies ErrorData;

// ---------------------------------------------------------------------------------------------
// Table structure
// ---------------------------------------------------------------------------------------------

export const FileEmpty = {
  name: 'FileEmpty',
  title: 'File is empty',
  message: (file: string) => `${file} row 1: the file is empty; expected a header row and data rows`,
  hint: 'Export the table again; an empty export often means a filter hid every row',
} satisfies ErrorData;

export const NoDataRows = {
  name: 'NoDataRows',
  title: 'Table has no data rows',
  message: (file: string) => `${file} row 2: the table has a header but no data rows; expected at least one record`,
  hint: 'Export the table again, or remove the resource from datapackage.json if there is nothing to report',
} satisfies ErrorData;

export const NoUsableRows = {
  name: 'NoUsableRows',
  title: 'No record could be used',
  message: (file: string, read: number) => `${file} row 2: none of the ${read} records could be used; every one was left out (see the entries above)`,
  hint: 'A whole file failing the same check usually means a wrong dialect, unit or date format in datapackage.json',
} satisfies ErrorData;

export const ByteOrderMark = {
  name: 'ByteOrderMark',
  title: 'UTF-8 byte-order mark',
  message: (file: string) => `${file} row 1: the file starts with a UTF-8 byte-order mark; it was read without it`,
  hint: 'Nothing to fix; some spreadsheet programs add the mark when saving as "CSV UTF-8"',
} satisfies ErrorData;

export const WindowsLineEnds = {
  name: 'WindowsLineEnds',
  title: 'Windows line ends',
  message: (file: string) => `${file} row 1: lines end with CR LF; they were read as ordinary line ends`,
  hint: 'Nothing to fix',
} satisfies ErrorData;

export const DelimiterMismatch = {
  name: 'DelimiterMismatch',
  title: 'Columns are separated by a different character',
  message: (file: string, found: string, declared: string) =>
    `${file} row 1, column (header): columns appear to be separated by ${quoteValue(found)}, but the dialect declares ${quoteValue(declared)}; the table was not read`,
  hint: 'Declare the separator in datapackage.json, e.g. "dialect": {"delimiter": ";", "decimalChar": ","} for a semicolon export with decimal commas',
} satisfies ErrorData;

export const HeaderMissingColumn = {
  name: 'HeaderMissingColumn',
  title: 'Column missing from the header',
  message: (file: string, column: string, header: string) => `${file} row 1, column ${column}: the header has no column ${quoteValue(column)}; found ${quoteValue(header)}`,
  hint: 'The header row must name every field of the table schema, spelled exactly as in datapackage.json',
} satisfies ErrorData;

export const HeaderUnknownColumn = {
  name: 'HeaderUnknownColumn',
  title: 'Column not in the table schema',
  message: (file: string, column: string) => `${file} row 1, column ${column}: the header names a column the table schema does not describe; it was ignored`,
  hint: 'Add the field to the schema in datapackage.json, or remove the column',
} satisfies ErrorData;

export const HeaderLooksLikeData = {
  name: 'HeaderLooksLikeData',
  title: 'First row is data, not a header',
  message: (file: string, header: string) => `${file} row 1, column (header): the first row ${quoteValue(header)} looks like data; expected the column names of the table schema`,
  hint: 'Add a header row with the field names, or check that "header": true in the dialect is right',
} satisfies ErrorData;

export const SchemaFieldMissing = {
  name: 'SchemaFieldMissing',
  title: 'Table schema lacks a field the indicator needs',
  message: (file: string, column: string, expected: string) =>
    `${file} row 1, column ${column}: the table schema in datapackage.json does not declare this field; expected ${expected}`,
  hint: 'Each indicator needs certain fields; see generator/indicators for the list',
} satisfies ErrorData;

export const SchemaFieldType = {
  name: 'SchemaFieldType',
  title: 'Table schema declares another type',
  message: (file: string, column: string, declared: string, expected: string) =>
    `${file} row 1, column ${column}: the table schema declares type ${quoteValue(declared)}; expected ${expected}`,
  hint: 'Change the field type in datapackage.json',
} satisfies ErrorData;

export const UnitMismatch = {
  name: 'UnitMismatch',
  title: 'Unit differs from the one this indicator uses',
  message: (file: string, column: string, declared: string | null, expected: string) =>
    `${file} row 1, column ${column}: the declared unit is ${quoteValue(declared)}; expected ${quoteValue(expected)}; the table was not read`,
  hint: 'Convert the values to the expected unit and declare it as "unit" on the field in datapackage.json',
} satisfies ErrorData;

export const RowWrongLength = {
  name: 'RowWrongLength',
  title: 'Row has a different number of cells',
  message: (file: string, row: number, found: number, expected: number) => `${file} row ${row}, column (all): the row has ${found} cells; expected ${expected}`,
  hint: 'A decimal comma in a comma-separated file, or a stray separator inside an unquoted name, splits a cell in two',
} satisfies ErrorData;

export const RowTruncated = {
  name: 'RowTruncated',
  title: 'Last line is cut short',
  message: (file: string, row: number, found: number, expected: number) =>
    `${file} row ${row}, column (all): the last line is cut short (${found} of ${expected} cells, no line end); the record was left out`,
  hint: 'The export or copy was interrupted; export the file again',
} satisfies ErrorData;

export const QuoteNotClosed = {
  name: 'QuoteNotClosed',
  title: 'Quoted cell never closed',
  message: (file: string, row: number, reason: string) => `${file} row ${row}, column (all): a quoted cell is never closed, so the rest of the file cannot be read (${reason})`,
  hint: 'Look for a lone double quote in a name or note',
} satisfies ErrorData;

export const CsvUnreadable = {
  name: 'CsvUnreadable',
  title: 'CSV cannot be read',
  message: (file: string, row: number, reason: string) => `${file} row ${row}, column (all): the CSV cannot be read further (${reason})`,
  hint: 'Check the file is UTF-8 CSV matching its dialect in datapackage.json',
} satisfies ErrorData;

// ---------------------------------------------------------------------------------------------
// Cell values
// ---------------------------------------------------------------------------------------------

export const ValueMissing = {
  name: 'ValueMissing',
  title: 'Required value missing',
  message: (file: string, row: number, column: string) => `${file} row ${row}, column ${column}: the value is missing; a value is required`,
  hint: 'Fill in the value or leave the record out of the export',
} satisfies ErrorData;

export const ValueWrongType = {
  name: 'ValueWrongType',
  title: 'Value of the wrong type',
  message: (file: string, row: number, column: string, value: string, expected: string) => `${file} row ${row}, column ${column}: ${quoteValue(value)} is not ${expected}`,
  hint: 'Numbers use a decimal point unless the dialect declares "decimalChar": ","; dates are written YYYY-MM-DD',
} satisfies ErrorData;

export const ValueNotFinite = {
  name: 'ValueNotFinite',
  title: 'Not a finite number',
  message: (file: string, row: number, column: string, value: string) =>
    `${file} row ${row}, column ${column}: ${quoteValue(value)} is not a finite number; expected a measured value`,
  hint: 'NaN and Infinity usually come from a division by zero in a spreadsheet formula',
} satisfies ErrorData;

export const ValueBelowMinimum = {
  name: 'ValueBelowMinimum',
  title: 'Value below the allowed minimum',
  message: (file: string, row: number, column: string, value: string, expected: string) =>
    `${file} row ${row}, column ${column}: ${quoteValue(value)} is too small; expected ${expected}`,
  hint: 'Counts cannot be negative and surveyed lengths and areas must be above zero',
} satisfies ErrorData;

export const ValueAboveMaximum = {
  name: 'ValueAboveMaximum',
  title: 'Value above the allowed maximum',
  message: (file: string, row: number, column: string, value: string, expected: string) =>
    `${file} row ${row}, column ${column}: ${quoteValue(value)} is too large; expected ${expected}`,
  hint: 'Check the unit and the position of the decimal separator',
} satisfies ErrorData;

export const ValueNotAllowed = {
  name: 'ValueNotAllowed',
  title: 'Value not among the allowed ones',
  message: (file: string, row: number, column: string, value: string, allowed: readonly string[]) =>
    `${file} row ${row}, column ${column}: ${quoteValue(value)} is not allowed; expected one of ${allowed.join(', ')}`,
  hint: 'Use one of the listed words, spelled exactly',
} satisfies ErrorData;

export const CensoredNotAllowed = {
  name: 'CensoredNotAllowed',
  title: 'Below-detection value where none is allowed',
  message: (file: string, row: number, column: string, value: string) =>
    `${file} row ${row}, column ${column}: ${quoteValue(value)} is a below-detection value, but this field does not allow one; expected a number`,
  hint: 'Only fields with "detectionLimitPrefix" in the schema accept values such as <0.05',
} satisfies ErrorData;

export const DecimalCommaFound = {
  name: 'DecimalCommaFound',
  title: 'Decimal comma not declared',
  message: (file: string, row: number, column: string, value: string) =>
    `${file} row ${row}, column ${column}: ${quoteValue(value)} uses a decimal comma, but the dialect does not declare one; expected a number with a decimal point`,
  hint: 'If every number of the table uses a decimal comma, declare "decimalChar": "," in the dialect (usually with "delimiter": ";"); if only some rows do, write those with a decimal point: declaring it would leave out every row written with a point',
} satisfies ErrorData;

export const DateBeforeScenario = {
  name: 'DateBeforeScenario',
  title: 'Date before the monitored period',
  message: (file: string, row: number, column: string, value: string, start: string) =>
    `${file} row ${row}, column ${column}: ${quoteValue(value)} is before the monitored period; expected ${start} or later`,
  hint: 'Check the year; or set monitoringStart in scenario.json',
} satisfies ErrorData;

export const DateAfterScenario = {
  name: 'DateAfterScenario',
  title: 'Date after the last published season',
  message: (file: string, row: number, column: string, value: string, end: string) =>
    `${file} row ${row}, column ${column}: ${quoteValue(value)} is after the last published season; expected ${end} or earlier`,
  hint: 'The record belongs to a season not yet published; it will be used once that season is',
} satisfies ErrorData;

export const DateInFuture = {
  name: 'DateInFuture',
  title: 'Date in the future',
  message: (file: string, row: number, column: string, value: string, published: string) =>
    `${file} row ${row}, column ${column}: ${quoteValue(value)} is after the publication date ${published}; a sample cannot be dated in the future`,
  hint: 'Check the day and month are not swapped, and the year',
} satisfies ErrorData;

export const DateNotInSeason = {
  name: 'DateNotInSeason',
  title: 'Date in no season',
  message: (file: string, row: number, column: string, value: string) =>
    `${file} row ${row}, column ${column}: ${quoteValue(value)} falls in a month no season of scenario.json covers; expected a date inside a season`,
  hint: 'Check the season definitions in scenario.json cover all twelve months',
} satisfies ErrorData;

export const UnknownSegment = {
  name: 'UnknownSegment',
  title: 'Unknown coastline segment',
  message: (file: string, row: number, column: string, value: string, segmentsFile: string) =>
    `${file} row ${row}, column ${column}: ${quoteValue(value)} is not a segment id in ${segmentsFile}; expected an existing segment id`,
  hint: 'Segment ids are lower-case slugs; check spelling or add the segment',
} satisfies ErrorData;

export const SegmentLeftOut = {
  name: 'SegmentLeftOut',
  title: 'Rows of a segment that was left out',
  message: (file: string, rows: number, segment: string, firstRow: number) =>
    `${file} row ${firstRow}, column segment_id: ${rows} row(s) for segment ${quoteValue(segment)} not used: the segment was left out, see its error above`,
  hint: 'Fix the segment in the segments file; its rows are used again once it is',
} satisfies ErrorData;

export const TableLoss = {
  name: 'TableLoss',
  title: 'Too many rows of a table left out',
  message: (file: string, excluded: number, read: number, causes: string, allowed: string) =>
    `${file}: ${excluded} of ${read} row(s) left out (${causes}); more than the ${allowed} allowed, so nothing is published`,
  hint: 'Fix the rows (see the warnings), or accept the loss on purpose in scenario.json',
} satisfies ErrorData;

export const SeriesLoss = {
  name: 'SeriesLoss',
  title: 'Every row of a series left out',
  message: (file: string, segment: string, excluded: number, causes: string) =>
    `${file}: all ${excluded} row(s) for segment ${quoteValue(segment)} left out (${causes}); the segment would be shown as not measured, so nothing is published`,
  hint: 'Fix the rows (see the warnings), or accept the loss on purpose in scenario.json',
} satisfies ErrorData;

export const RuleWithoutData = {
  name: 'RuleWithoutData',
  title: 'Risk rule about an indicator with no data',
  message: (file: string, path: string, rule: string, indicator: string) =>
    `${file} at ${path}: risk rule ${quoteValue(rule)} is about ${indicator}, but the scenario has no ${indicator} data; the rule can never match`,
  hint: 'Remove the rule, or add the table (or drift model) it needs to datapackage.json',
} satisfies ErrorData;

export const DuplicateKey = {
  name: 'DuplicateKey',
  title: 'Duplicate record id',
  message: (file: string, row: number, column: string, value: string, firstRow: number) =>
    `${file} row ${row}, column ${column}: ${quoteValue(value)} was already used on row ${firstRow}; expected a unique id`,
  hint: 'A duplicate usually means a record was exported twice; the first one was kept',
} satisfies ErrorData;

export const MarkupInText = {
  name: 'MarkupInText',
  title: 'Markup in a text value',
  message: (file: string, row: number | null, column: string, value: string) =>
    `${file}${row === null ? '' : ` row ${row}`}, column ${column}: ${quoteValue(value)} contains HTML or script markup; it is kept and shown as plain text`,
  hint: 'Names and notes are always shown as text, never as markup',
} satisfies ErrorData;

// ---------------------------------------------------------------------------------------------
// Coastline segments
// ---------------------------------------------------------------------------------------------

export const SegmentsUnreadable = {
  name: 'SegmentsUnreadable',
  title: 'Segments file cannot be read',
  message: (file: string, reason: string) => `${file} row 1, column (all): not a GeoJSON FeatureCollection or TopoJSON Topology (${reason})`,
  hint: 'Export the coastline segments as GeoJSON (RFC 7946, WGS84 longitude/latitude)',
} satisfies ErrorData;

export const SegmentPropertyInvalid = {
  name: 'SegmentPropertyInvalid',
  title: 'Segment property has a wrong value',
  message: (file: string, feature: number, column: string, value: string, expected: string) =>
    `${file} row ${feature}, column ${column}: ${quoteValue(value)} is not allowed; expected ${expected}`,
  hint: 'Rows of a segments file are its features, counted from 1',
} satisfies ErrorData;

export const SegmentIdDuplicate = {
  name: 'SegmentIdDuplicate',
  title: 'Segment id used twice',
  message: (file: string, feature: number, value: string, first: number) =>
    `${file} row ${feature}, column id: ${quoteValue(value)} was already used by feature ${first}; expected a unique id`,
  hint: 'Segment ids appear in web addresses and must be unique',
} satisfies ErrorData;

export const GeometryInvalid = {
  name: 'GeometryInvalid',
  title: 'Geometry not usable',
  message: (file: string, feature: number, reason: string) => `${file} row ${feature}, column geometry: ${reason}`,
  hint: 'Segments are LineString, MultiLineString or Polygon geometries in WGS84 longitude/latitude',
} satisfies ErrorData;

export const CoordinateOutOfRange = {
  name: 'CoordinateOutOfRange',
  title: 'Coordinate out of range',
  message: (file: string, feature: number, value: string) =>
    `${file} row ${feature}, column geometry: position ${value} is not a valid longitude/latitude; expected longitude −180..180 and latitude −90..90`,
  hint: 'Longitude comes first in GeoJSON; projected coordinates (metres) must be converted to WGS84',
} satisfies ErrorData;

export const GeometrySelfIntersects = {
  name: 'GeometrySelfIntersects',
  title: 'Geometry crosses itself',
  message: (file: string, feature: number, segment: string, where: string, detail: string) =>
    `${file} row ${feature}, column geometry: segment ${quoteValue(segment)} crosses itself at ${where} (${detail}); it is kept, measured and drawn as given`,
  hint: 'Usually a digitising slip; redraw the line there so it does not cross itself. The segment is published meanwhile',
} satisfies ErrorData;

// ---------------------------------------------------------------------------------------------
// Land polygons (optional map background)
// ---------------------------------------------------------------------------------------------

export const LandUnreadable = {
  name: 'LandUnreadable',
  title: 'Land file cannot be read',
  message: (file: string, reason: string) => `${file} row 1, column (all): not a GeoJSON or TopoJSON file of land polygons (${reason})`,
  hint: 'Land is optional: give Polygon or MultiPolygon features (WGS84 longitude/latitude), or leave the "land" resource out',
} satisfies ErrorData;

export const LandShapeInvalid = {
  name: 'LandShapeInvalid',
  title: 'Land shape not usable',
  message: (file: string, feature: number, reason: string) => `${file} row ${feature}, column geometry: ${reason}`,
  hint: 'Land shapes are Polygon or MultiPolygon geometries in WGS84 longitude/latitude; rows are features, counted from 1',
} satisfies ErrorData;

// ---------------------------------------------------------------------------------------------
// Drift-model output
// ---------------------------------------------------------------------------------------------

export const NetcdfUnreadable = {
  name: 'NetcdfUnreadable',
  title: 'NetCDF file cannot be read',
  message: (file: string, reason: string) => `${file} row (none), column (all): not a readable NetCDF file (${reason}); it may be truncated or corrupt`,
  hint: 'Copy or download the file again and compare its size with the original',
} satisfies ErrorData;

export const NetcdfNotTrajectory = {
  name: 'NetcdfNotTrajectory',
  title: 'NetCDF file is not a CF trajectory file',
  message: (file: string, column: string, reason: string) => `${file} row (none), column ${column}: ${reason}`,
  hint: 'Expected a CF discrete sampling geometry file with featureType = "trajectory" (CF conventions, chapter 9)',
} satisfies ErrorData;

export const NetcdfValueInvalid = {
  name: 'NetcdfValueInvalid',
  title: 'NetCDF position not usable',
  message: (file: string, row: number, trajectory: number, observation: number, column: string, value: string, expected: string) =>
    `${file} row ${row} (trajectory ${trajectory}, observation ${observation}), column ${column}: ${quoteValue(value)} is not allowed; expected ${expected}`,
  hint: 'The row of a trajectory file is the position of the observation in the file, from 1; trajectory and observation are counted from 0 as in the file',
} satisfies ErrorData;

export const DriftSeasonUnknown = {
  name: 'DriftSeasonUnknown',
  title: 'Season not defined in the settings',
  message: (file: string, row: number, column: string, value: string) =>
    `${file} row ${row}, column ${column}: ${quoteValue(value)} is not a season of this scenario; expected YYYY-<season id> as in scenario.json`,
  hint: 'Season ids look like 2026-autumn',
} satisfies ErrorData;

export const PositionsOutsideSeasons = {
  name: 'PositionsOutsideSeasons',
  title: 'Positions in no season',
  message: (file: string, count: number) => `${file} row (several), column time: ${count} position(s) fall in months no season of scenario.json covers; they were left out`,
  hint: 'Check the season definitions in scenario.json cover all twelve months',
} satisfies ErrorData;

export const PositionsOutsidePeriod = {
  name: 'PositionsOutsidePeriod',
  title: 'Positions dated outside the scenario',
  message: (file: string, count: number, first: string, start: string, end: string) =>
    `${file} row (several), column time: ${count} position(s) are dated outside ${start} to ${end} (first: ${first}); they were left out`,
  hint: 'Check the time units and reference date of the drift-model output; positions must fall between the monitoring start and the publication date',
} satisfies ErrorData;

export const DriftFarFromCoast = {
  name: 'DriftFarFromCoast',
  title: 'Drift positions nowhere near the coast',
  message: (file: string, box: string, coast: string) =>
    `${file} row (several), column lon/lat: every position lies in ${box}, more than 10 degrees from the segments (${coast}); longitude and latitude may be in radians or swapped; the file was not used`,
  hint: 'Write positions as longitude and latitude in degrees (WGS84), longitude first',
} satisfies ErrorData;

// ---------------------------------------------------------------------------------------------
// Error classes
// ---------------------------------------------------------------------------------------------

/** The scenario folder or its descriptor cannot be read: nothing else can be checked. */
export class ScenarioError extends Error {
  readonly code: string;
  readonly hint: string;
  constructor(entry: ErrorData, message: string) {
    super(message);
    this.name = 'ScenarioError';
    this.code = entry.name;
    this.hint = entry.hint;
  }
}

/** A reader met input it cannot use; carries the report entry that describes it. */
export class InputValidationError extends Error {
  readonly code: string;
  readonly issue: ValidationIssue;
  constructor(entry: ErrorData, issue: ValidationIssue) {
    super(issue.message);
    this.name = 'InputValidationError';
    this.code = entry.name;
    this.issue = issue;
  }
}

// ---------------------------------------------------------------------------------------------
// Hostile and oversized inputs: links out of the folder, polluting keys, bounds, hidden bytes
// ---------------------------------------------------------------------------------------------

export const ResourceOutsideScenario = {
  name: 'ResourceOutsideScenario',
  title: 'Resource resolves outside the scenario folder',
  message: (file: string, resolved: string) => `${file}: this path leads through a symbolic link to ${resolved}, outside the scenario folder; it was not read`,
  hint: 'Copy the file into the scenario folder; links may only point to places inside it',
} satisfies ErrorData;

export const KeyForbidden = {
  name: 'KeyForbidden',
  title: 'Key that could alter objects is not allowed',
  message: (file: string, path: string) => `${file}, at ${path}: the keys __proto__, constructor and prototype are not allowed in scenario files; the file was not used`,
  hint: 'Remove the key; no setting or property of Wrackline has that name',
} satisfies ErrorData;

export const JsonTooDeep = {
  name: 'JsonTooDeep',
  title: 'JSON nested too deeply or too large',
  message: (file: string, reason: string) => `${file}: ${reason}; the file was not read`,
  hint: 'Scenario JSON files are shallow; look for a broken export or a file that is not what its name says',
} satisfies ErrorData;

export const InputTooLarge = {
  name: 'InputTooLarge',
  title: 'File larger than Wrackline reads',
  message: (file: string, row: number | null, reason: string) => `${file}${row === null ? '' : ` row ${row}`}, column (all): ${reason}; reading stopped here`,
  hint: 'Check that the file is the table it claims to be; split genuinely huge tables or aggregate them first',
} satisfies ErrorData;

export const LineTooLong = {
  name: 'LineTooLong',
  title: 'Line longer than any table row',
  message: (file: string, row: number, limit: string) => `${file} row ${row}, column (all): the row is longer than ${limit} (no line end found); reading stopped here`,
  hint: 'Check the line ends and quotes of the file; a row of a monitoring table is a few hundred characters',
} satisfies ErrorData;

export const InvalidUtf8 = {
  name: 'InvalidUtf8',
  title: 'Bytes that are not UTF-8',
  message: (file: string, row: number | null, column: string, value: string) =>
    `${file}${row === null ? '' : ` row ${row}`}, column ${column}: ${quoteValue(value)} holds bytes that are not valid UTF-8 (shown as \u{fffd}); the record was left out`,
  hint: 'Save the file as UTF-8; a spreadsheet export in another encoding changes letters such as é or ø',
} satisfies ErrorData;

export const FileNotUtf8 = {
  name: 'FileNotUtf8',
  title: 'File that is not UTF-8',
  message: (file: string, line: number, sample: string) =>
    `${file} row ${line}: ${quoteValue(sample)} holds bytes that are not valid UTF-8 (shown as \u{fffd}); the file was not read`,
  hint: 'Save the file as UTF-8 (in most editors: "Save with encoding", UTF-8); a file saved in another encoding changes letters such as é or ø',
} satisfies ErrorData;

export const NulInText = {
  name: 'NulInText',
  title: 'NUL byte in a text value',
  message: (file: string, row: number | null, column: string, value: string) =>
    `${file}${row === null ? '' : ` row ${row}`}, column ${column}: ${quoteValue(value)} holds a NUL byte (\u0000); the record was left out`,
  hint: 'A NUL byte means the file is binary or was cut badly; export the table again',
} satisfies ErrorData;

export const HeaderDuplicateColumn = {
  name: 'HeaderDuplicateColumn',
  title: 'Column named twice in the header',
  message: (file: string, column: string, first: number, second: number) =>
    `${file} row 1, column ${column}: columns ${first} and ${second} are both named ${column}; it is unclear which one holds the values, so the table was not read`,
  hint: 'Rename or remove one of the two columns',
} satisfies ErrorData;

export const BidiControlInText = {
  name: 'BidiControlInText',
  title: 'Invisible direction control in a text value',
  message: (file: string, row: number | null, column: string, value: string, codes: string) =>
    `${file}${row === null ? '' : ` row ${row}`}, column ${column}: ${quoteValue(value)} holds the invisible direction control ${codes}, which can make text read in another order than written; it is kept and shown isolated from the text around it`,
  hint: 'Remove the control character unless the name really mixes right-to-left and left-to-right writing',
} satisfies ErrorData;

export interface IssueInput {
  file: string;
  row: number | null;
  column: string | null;
  value: string | null;
  expected: string;
  severity: 'error' | 'warning';
  excluded: boolean;
  /** A hint fitting this very case, instead of the catalogue entry's general one. */
  hint?: string;
}

/** Builds a report entry from a catalogue entry's message and the place it concerns. */
export function issue(entry: ErrorData, message: string, input: IssueInput): ValidationIssue {
  return {
    file: input.file,
    row: input.row,
    column: input.column,
    value: input.value,
    expected: input.expected,
    message,
    severity: input.severity,
    excluded: input.excluded,
    code: entry.name,
    hint: input.hint ?? entry.hint,
  };
}
