/**
 * Decodes CF discrete-sampling-geometry trajectory files into particle positions.
 *
 * CF Conventions (since 1.6), chapter 9 "Discrete Sampling Geometries" and Appendix H.4
 * (trajectories): global attribute featureType = "trajectory" (case-insensitive; required except
 * for the orthogonal representation; some model outputs write `feature_type`, accepted too);
 * coordinates x (longitude), y (latitude), t (time); four representations:
 * - orthogonal multidimensional: lon/lat(trajectory, obs), time(obs) shared;
 * - incomplete multidimensional: lon/lat/time(trajectory, obs), padded with missing values;
 * - contiguous ragged: an integer count variable with attribute `sample_dimension`, one count per
 *   trajectory, observations stored trajectory after trajectory (H.4.3);
 * - indexed ragged: an integer index variable with attribute `instance_dimension`, one zero-based
 *   trajectory index per observation (H.4.4).
 * Unused storage holds missing values (_FillValue, missing_value, the NetCDF default fill or NaN)
 * and is skipped. Time is "<unit> since <reference>" in the standard (Gregorian) calendar.
 */
import { InputValidationError, NetcdfNotTrajectory, NetcdfValueInvalid } from '../errors.ts';
import type { IssueLog } from '../read/issue-log.ts';
import type { AttributeValue, NetcdfDataset, NetcdfVariable } from './netcdf-dataset.ts';
import type { Position } from './positions-csv.ts';
import { parseDateTime } from './positions-csv.ts';

export type CfLayout = 'orthogonal' | 'incomplete' | 'contiguous-ragged' | 'indexed-ragged';

export interface TrajectorySummary {
  layout: CfLayout;
  trajectories: number;
  observations: number;
}

function text(value: AttributeValue | undefined): string | null {
  return typeof value === 'string' ? value.trim() : null;
}

function notTrajectory(file: string, column: string, reason: string): InputValidationError {
  return new InputValidationError(NetcdfNotTrajectory, {
    file,
    row: null,
    column,
    value: null,
    expected: 'a CF trajectory file (featureType = "trajectory", longitude, latitude, time)',
    message: NetcdfNotTrajectory.message(file, column, reason),
    severity: 'error',
    excluded: true,
    code: NetcdfNotTrajectory.name,
    hint: NetcdfNotTrajectory.hint,
  });
}

function findCoordinate(dataset: NetcdfDataset, standardName: string, names: readonly string[], units: RegExp): NetcdfVariable | null {
  const byStandard = dataset.variables.find((v) => text(v.attributes['standard_name']) === standardName);
  if (byStandard) return byStandard;
  const byUnits = dataset.variables.find((v) => units.test(text(v.attributes['units']) ?? '') && v.shape.length > 0);
  if (byUnits) return byUnits;
  return dataset.variables.find((v) => names.includes(v.name.toLowerCase())) ?? null;
}

const unitMilliseconds: { [unit: string]: number } = {
  s: 1000,
  sec: 1000,
  secs: 1000,
  second: 1000,
  seconds: 1000,
  min: 60_000,
  mins: 60_000,
  minute: 60_000,
  minutes: 60_000,
  h: 3_600_000,
  hr: 3_600_000,
  hrs: 3_600_000,
  hour: 3_600_000,
  hours: 3_600_000,
  d: 86_400_000,
  day: 86_400_000,
  days: 86_400_000,
};

/** Parses CF time units "<unit> since <reference>" into a scale and an epoch, or a reason. */
export function parseTimeUnits(units: string): { msPerUnit: number; epochMs: number } | { reason: string } {
  const m = /^\s*([a-zA-Z]+)\s+since\s+(.+?)\s*$/.exec(units);
  if (!m) return { reason: `time units ${JSON.stringify(units)} are not "<unit> since <date>"` };
  const msPerUnit = unitMilliseconds[(m[1] ?? '').toLowerCase()];
  if (msPerUnit === undefined) return { reason: `time unit ${JSON.stringify(m[1])} is not seconds, minutes, hours or days` };
  // Reference: "2026-01-01", "2026-1-1 0:0:0", "2026-01-01T00:00:00Z", optional UTC offset.
  const ref = /^(\d{4})-(\d{1,2})-(\d{1,2})(?:[T ](\d{1,2}):(\d{1,2})(?::(\d{1,2}(?:\.\d+)?))?)?\s*(Z|UTC|[+-]\d{1,2}(?::?\d{2})?)?$/i.exec(m[2] ?? '');
  if (!ref) return { reason: `time reference ${JSON.stringify(m[2])} is not a date` };
  const pad = (v: string | undefined, n = 2): string => (v ?? '0').padStart(n, '0');
  let zone = ref[7] ?? 'Z';
  if (/^utc$/i.test(zone)) zone = 'Z';
  else if (zone !== 'Z' && zone !== 'z') {
    const sign = zone[0];
    const digits = zone.slice(1).replace(':', '');
    zone = `${sign}${pad(digits.length <= 2 ? digits : digits.slice(0, digits.length - 2))}:${digits.length <= 2 ? '00' : digits.slice(-2)}`;
  } else zone = 'Z';
  const seconds = ref[6] ?? '0';
  const [whole, fraction] = seconds.split('.');
  const iso = `${ref[1]}-${pad(ref[2])}-${pad(ref[3])}T${pad(ref[4])}:${pad(ref[5])}:${pad(whole)}${fraction ? `.${fraction}` : ''}${zone}`;
  const epochMs = parseDateTime(iso);
  if (Number.isNaN(epochMs)) return { reason: `time reference ${JSON.stringify(m[2])} is not a valid date` };
  return { msPerUnit, epochMs };
}

/** Missing-value test for one variable: its _FillValue, missing_value, the default fills, NaN. */
function missingTest(variable: NetcdfVariable): (v: number) => boolean {
  const marks: number[] = [];
  for (const key of ['_FillValue', 'missing_value']) {
    const value = variable.attributes[key];
    if (typeof value === 'number') marks.push(value);
    else if (Array.isArray(value)) marks.push(...(value as number[]));
  }
  return (v: number) => Number.isNaN(v) || Math.abs(v) >= 9.9e36 || v === -2147483647 || marks.some((m) => v === m || Math.abs(v - m) <= Math.abs(m) * 1e-7);
}

function checkCalendar(time: NetcdfVariable, file: string): void {
  const calendar = (text(time.attributes['calendar']) ?? 'standard').toLowerCase();
  if (!['standard', 'gregorian', 'proleptic_gregorian'].includes(calendar)) {
    throw notTrajectory(file, time.name, `calendar ${JSON.stringify(calendar)} is not supported; expected the standard (Gregorian) calendar`);
  }
}

/** Which trajectories are ashore at an observation, from a status variable with flag meanings. */
function ashoreTest(dataset: NetcdfDataset, observationShape: string): ((k: number) => boolean) | null {
  const status = dataset.variables.find((v) => v.name.toLowerCase() === 'status' && v.dimensions.join() === observationShape);
  if (!status) return null;
  const meanings = (text(status.attributes['flag_meanings']) ?? '').split(/\s+/);
  const flagValues = status.attributes['flag_values'];
  const values = typeof flagValues === 'number' ? [flagValues] : Array.isArray(flagValues) ? (flagValues as number[]) : [];
  const ashoreValues = new Set<number>();
  meanings.forEach((meaning, i) => {
    if (/^(ashore|stranded|beached|landed)$/i.test(meaning) && values[i] !== undefined) ashoreValues.add(values[i] as number);
  });
  if (ashoreValues.size === 0) return null;
  const data = status.readNumbers();
  return (k: number) => ashoreValues.has(data[k] ?? Number.NaN);
}

/**
 * Decodes a CF trajectory dataset and hands each usable position to `emit` (which returns whether
 * the position was used). Throws InputValidationError when the file is not a CF trajectory file;
 * bad single values are reported and left out.
 */
export function decodeTrajectories(dataset: NetcdfDataset, file: string, log: IssueLog, emit: (position: Position) => boolean): TrajectorySummary {
  const counts = log.countsFor(file);
  const featureType = text(dataset.attributes['featureType']) ?? text(dataset.attributes['feature_type']);
  const lon = findCoordinate(dataset, 'longitude', ['lon', 'longitude'], /^degrees?_?(east|e)$/i);
  const lat = findCoordinate(dataset, 'latitude', ['lat', 'latitude'], /^degrees?_?(north|n)$/i);
  const time = findCoordinate(dataset, 'time', ['time', 't'], /\bsince\b/i);
  if (featureType !== null && featureType.toLowerCase() !== 'trajectory') {
    throw notTrajectory(file, 'featureType', `featureType is ${JSON.stringify(featureType)}; expected "trajectory"`);
  }
  if (!lon) throw notTrajectory(file, 'lon', 'no longitude variable (standard_name "longitude" or units "degrees_east")');
  if (!lat) throw notTrajectory(file, 'lat', 'no latitude variable (standard_name "latitude" or units "degrees_north")');
  if (!time) throw notTrajectory(file, 'time', 'no time variable (standard_name "time" or units "<unit> since <date>")');
  if (lon.dimensions.join() !== lat.dimensions.join())
    throw notTrajectory(file, 'lat', `longitude ${JSON.stringify(lon.dimensions)} and latitude ${JSON.stringify(lat.dimensions)} have different dimensions`);
  // CF Conventions §4.1: longitude in degrees_east, latitude in degrees_north (or their listed
  // spellings); anything else (radians, metres of a projection) would place particles wrongly.
  for (const [variable, axis, pattern] of [
    [lon, 'longitude', /^degrees?_?(east|e)$/i],
    [lat, 'latitude', /^degrees?_?(north|n)$/i],
  ] as const) {
    const declared = text(variable.attributes['units']);
    if (declared !== null && !pattern.test(declared.trim())) {
      throw notTrajectory(
        file,
        variable.name,
        `${axis} units are ${JSON.stringify(declared)}; expected degrees_${axis === 'longitude' ? 'east' : 'north'} (CF conventions, section 4.1)`,
      );
    }
  }
  const units = parseTimeUnits(text(time.attributes['units']) ?? '');
  if ('reason' in units) throw notTrajectory(file, time.name, units.reason);
  checkCalendar(time, file);

  const countVariable = dataset.variables.find((v) => text(v.attributes['sample_dimension']) !== null);
  const indexVariable = dataset.variables.find((v) => text(v.attributes['instance_dimension']) !== null);
  const idVariable = dataset.variables.find((v) => text(v.attributes['cf_role']) === 'trajectory_id');

  let layout: CfLayout;
  let trajectories: number;
  /** For observation k (flat index into lon/lat): its trajectory and its observation number. */
  let trajectoryOf: (k: number) => number;
  let observationOf: (k: number) => number;
  let timeIndexOf: (k: number) => number;

  if (countVariable && lon.dimensions.length === 1) {
    layout = 'contiguous-ragged';
    const sampleDimension = text(countVariable.attributes['sample_dimension']);
    if (lon.dimensions[0] !== sampleDimension && dataset.format === 'netcdf3') {
      throw notTrajectory(file, countVariable.name, `sample_dimension ${JSON.stringify(sampleDimension)} is not the dimension of longitude ${JSON.stringify(lon.dimensions[0])}`);
    }
    const rowSizes = countVariable.readNumbers();
    trajectories = rowSizes.length;
    const totalObservations = lon.shape[0] ?? 0;
    const owner = new Int32Array(totalObservations).fill(-1);
    const ordinal = new Int32Array(totalObservations);
    let start = 0;
    for (let t = 0; t < trajectories; t++) {
      const size = rowSizes[t] ?? 0;
      if (!Number.isInteger(size) || size < 0 || start + size > totalObservations) {
        throw notTrajectory(file, countVariable.name, `count ${size} of trajectory ${t} does not fit the ${totalObservations} observations (counts so far add up to ${start})`);
      }
      for (let j = 0; j < size; j++) {
        owner[start + j] = t;
        ordinal[start + j] = j;
      }
      start += size;
    }
    trajectoryOf = (k) => owner[k] ?? -1;
    observationOf = (k) => ordinal[k] ?? 0;
    timeIndexOf = (k) => k;
  } else if (indexVariable && lon.dimensions.length === 1) {
    layout = 'indexed-ragged';
    const instanceDimension = text(indexVariable.attributes['instance_dimension']) ?? '';
    trajectories = dataset.dimensions[instanceDimension] ?? idVariable?.shape[0] ?? 0;
    const index = indexVariable.readNumbers();
    const seen = new Int32Array(Math.max(trajectories, 0));
    const ordinal = new Int32Array(index.length);
    for (let k = 0; k < index.length; k++) {
      const t = index[k] ?? -1;
      if (Number.isInteger(t) && t >= 0 && t < trajectories) {
        ordinal[k] = seen[t] ?? 0;
        seen[t] = (seen[t] ?? 0) + 1;
      }
    }
    trajectoryOf = (k) => {
      const t = index[k] ?? -1;
      return Number.isInteger(t) && t >= 0 && t < trajectories ? t : -1;
    };
    observationOf = (k) => ordinal[k] ?? 0;
    timeIndexOf = (k) => k;
  } else if (lon.dimensions.length === 2) {
    // Multidimensional: which dimension holds the trajectories?
    const idDimension = idVariable?.dimensions[0];
    const trajectoryAxis = idDimension !== undefined && lon.dimensions[1] === idDimension && lon.dimensions[0] !== idDimension ? 1 : 0;
    const observationAxis = 1 - trajectoryAxis;
    trajectories = lon.shape[trajectoryAxis] ?? 0;
    const observations = lon.shape[observationAxis] ?? 0;
    const stride = lon.shape[1] ?? 0;
    trajectoryOf = (k) => (trajectoryAxis === 0 ? Math.floor(k / stride) : k % stride);
    observationOf = (k) => (trajectoryAxis === 0 ? k % stride : Math.floor(k / stride));
    if (time.dimensions.length === 1) {
      layout = 'orthogonal';
      if ((time.shape[0] ?? 0) !== observations) {
        throw notTrajectory(file, time.name, `time has ${time.shape[0] ?? 0} values but there are ${observations} observations per trajectory`);
      }
      timeIndexOf = (k) => observationOf(k);
    } else if (time.dimensions.join() === lon.dimensions.join()) {
      layout = 'incomplete';
      timeIndexOf = (k) => k;
    } else {
      throw notTrajectory(file, time.name, `time dimensions ${JSON.stringify(time.dimensions)} fit neither the orthogonal nor the incomplete multidimensional layout`);
    }
  } else {
    throw notTrajectory(file, lon.name, `longitude has ${lon.dimensions.length} dimensions and no count or index variable; expected one of the four CF trajectory layouts`);
  }
  if (featureType === null && layout !== 'orthogonal') {
    throw notTrajectory(file, 'featureType', 'the global attribute featureType (or feature_type) is missing; expected "trajectory"');
  }

  const lonValues = lon.readNumbers();
  const latValues = lat.readNumbers();
  const timeValues = time.readNumbers();
  const lonMissing = missingTest(lon);
  const latMissing = missingTest(lat);
  const timeMissing = missingTest(time);
  const ashore = ashoreTest(dataset, lon.dimensions.join());
  let observations = 0;
  for (let k = 0; k < lonValues.length; k++) {
    const x = lonValues[k] ?? Number.NaN;
    const y = latValues[k] ?? Number.NaN;
    const tv = timeValues[timeIndexOf(k)] ?? Number.NaN;
    if (lonMissing(x) || latMissing(y) || timeMissing(tv)) continue; // unused storage
    observations++;
    counts.read++;
    const trajectory = trajectoryOf(k);
    const observation = observationOf(k);
    const row = k + 1;
    const reject = (column: string, value: string, expected: string): void => {
      log.add(NetcdfValueInvalid, NetcdfValueInvalid.message(file, row, trajectory, observation, column, value, expected), {
        file,
        row,
        column,
        value,
        expected,
        severity: 'warning',
        excluded: true,
      });
      counts.excluded++;
    };
    if (trajectory < 0) {
      reject(indexVariable?.name ?? 'trajectory', String(indexVariable ? indexVariable.readNumbers()[k] : ''), `a trajectory index 0..${trajectories - 1}`);
      continue;
    }
    const lonFixed = x > 180 && x <= 360 ? x - 360 : x;
    if (!(lonFixed >= -180 && lonFixed <= 180)) {
      reject(lon.name, String(x), 'a longitude −180..360');
      continue;
    }
    if (!(y >= -90 && y <= 90)) {
      reject(lat.name, String(y), 'a latitude −90..90');
      continue;
    }
    const timeMs = units.epochMs + tv * units.msPerUnit;
    if (!Number.isFinite(timeMs)) {
      reject(time.name, String(tv), 'a finite time');
      continue;
    }
    if (emit({ particle: trajectory, timeMs, lon: lonFixed, lat: y, ashore: ashore ? ashore(k) : false })) counts.kept++;
    else counts.excluded++;
  }
  return { layout, trajectories, observations };
}
