/**
 * Builds small CF trajectory files (CF Conventions ch. 9, Appendix H.4) in each of the four
 * layouts from one list of invented trajectories, with our NetCDF-3 writer, and a NetCDF-4 (HDF5)
 * file with h5wasm.
 */
import type { Netcdf3Spec, Netcdf3Variable } from '../../generator/drift/netcdf3-writer.ts';
import { writeNetcdf3 } from '../../generator/drift/netcdf3-writer.ts';

export interface Observation {
  hours: number;
  lon: number;
  lat: number;
}
export interface Trajectory {
  id: number;
  observations: Observation[];
}

export const timeUnits = 'hours since 2026-09-01 00:00:00';

/** Three invented drifters with 2, 4 and 3 observations, west of the fixture coast. */
export const sampleTrajectories: Trajectory[] = [
  {
    id: 101,
    observations: [
      { hours: 0, lon: -0.3, lat: 50.0 },
      { hours: 24, lon: -0.2, lat: 50.01 },
    ],
  },
  {
    id: 102,
    observations: [
      { hours: 0, lon: -0.5, lat: 49.5 },
      { hours: 24, lon: -0.45, lat: 49.52 },
      { hours: 48, lon: -0.4, lat: 49.55 },
      { hours: 72, lon: -0.01, lat: 50.05 },
    ],
  },
  {
    id: 103,
    observations: [
      { hours: 12, lon: 0.12, lat: 49.8 },
      { hours: 36, lon: 0.125, lat: 49.88 },
      { hours: 60, lon: 0.125, lat: 49.905 },
    ],
  },
];

const coordinateAttributes = {
  lon: [
    { name: 'standard_name', value: 'longitude' },
    { name: 'units', value: 'degrees_east' },
  ],
  lat: [
    { name: 'standard_name', value: 'latitude' },
    { name: 'units', value: 'degrees_north' },
  ],
  time: [
    { name: 'standard_name', value: 'time' },
    { name: 'units', value: timeUnits },
    { name: 'calendar', value: 'standard' },
  ],
};

function idVariable(trajectories: Trajectory[]): Netcdf3Variable {
  return { name: 'trajectory', type: 'int', dimensions: ['trajectory'], data: trajectories.map((t) => t.id), attributes: [{ name: 'cf_role', value: 'trajectory_id' }] };
}

const global = (layout: string, spelling = 'featureType') => [
  { name: 'Conventions', value: 'CF-1.8' },
  { name: spelling, value: 'trajectory' },
  { name: 'title', value: `Invented test trajectories (${layout})` },
];

/** Contiguous ragged array (H.4.3). */
export function contiguousSpec(trajectories: Trajectory[]): Netcdf3Spec {
  const all = trajectories.flatMap((t) => t.observations);
  return {
    dimensions: [
      { name: 'trajectory', size: trajectories.length },
      { name: 'obs', size: all.length },
    ],
    attributes: global('contiguous ragged'),
    variables: [
      idVariable(trajectories),
      { name: 'row_size', type: 'int', dimensions: ['trajectory'], data: trajectories.map((t) => t.observations.length), attributes: [{ name: 'sample_dimension', value: 'obs' }] },
      { name: 'time', type: 'double', dimensions: ['obs'], data: all.map((o) => o.hours), attributes: coordinateAttributes.time },
      { name: 'lon', type: 'float', dimensions: ['obs'], data: all.map((o) => o.lon), attributes: coordinateAttributes.lon },
      { name: 'lat', type: 'float', dimensions: ['obs'], data: all.map((o) => o.lat), attributes: coordinateAttributes.lat },
    ],
  };
}

/** Indexed ragged array (H.4.4): observations interleaved in time order. */
export function indexedSpec(trajectories: Trajectory[]): Netcdf3Spec {
  const all = trajectories.flatMap((t, k) => t.observations.map((o) => ({ ...o, k }))).sort((a, b) => a.hours - b.hours || a.k - b.k);
  return {
    dimensions: [
      { name: 'trajectory', size: trajectories.length },
      { name: 'obs', size: 'unlimited' },
    ],
    attributes: global('indexed ragged'),
    variables: [
      idVariable(trajectories),
      { name: 'trajectory_index', type: 'int', dimensions: ['obs'], data: all.map((o) => o.k), attributes: [{ name: 'instance_dimension', value: 'trajectory' }] },
      { name: 'time', type: 'double', dimensions: ['obs'], data: all.map((o) => o.hours), attributes: coordinateAttributes.time },
      { name: 'lon', type: 'double', dimensions: ['obs'], data: all.map((o) => o.lon), attributes: coordinateAttributes.lon },
      { name: 'lat', type: 'double', dimensions: ['obs'], data: all.map((o) => o.lat), attributes: coordinateAttributes.lat },
    ],
  };
}

const fill = -999;

/** Incomplete multidimensional array (H.4.2): (trajectory, obs) padded with _FillValue. */
export function incompleteSpec(trajectories: Trajectory[], spelling = 'featureType'): Netcdf3Spec {
  const width = Math.max(...trajectories.map((t) => t.observations.length));
  const grid = (pick: (o: Observation) => number) =>
    trajectories.flatMap((t) => Array.from({ length: width }, (_, j) => (t.observations[j] ? pick(t.observations[j] as Observation) : fill)));
  const withFill = (attributes: { name: string; value: string }[], type: 'double' | 'float') => [...attributes, { name: '_FillValue', value: fill, type }];
  return {
    dimensions: [
      { name: 'trajectory', size: trajectories.length },
      { name: 'obs', size: width },
    ],
    attributes: global('incomplete multidimensional', spelling),
    variables: [
      idVariable(trajectories),
      { name: 'time', type: 'double', dimensions: ['trajectory', 'obs'], data: grid((o) => o.hours), attributes: withFill(coordinateAttributes.time, 'double') },
      { name: 'lon', type: 'float', dimensions: ['trajectory', 'obs'], data: grid((o) => o.lon), attributes: withFill(coordinateAttributes.lon, 'float') },
      { name: 'lat', type: 'float', dimensions: ['trajectory', 'obs'], data: grid((o) => o.lat), attributes: withFill(coordinateAttributes.lat, 'float') },
    ],
  };
}

/**
 * Orthogonal multidimensional array (H.4.1): one time axis shared by all trajectories; positions a
 * trajectory lacks at a time are missing values. featureType may be left out in this layout.
 */
export function orthogonalSpec(trajectories: Trajectory[], withFeatureType = true): Netcdf3Spec {
  const times = [...new Set(trajectories.flatMap((t) => t.observations.map((o) => o.hours)))].sort((a, b) => a - b);
  const grid = (pick: (o: Observation) => number) =>
    trajectories.flatMap((t) =>
      times.map((h) => {
        const o = t.observations.find((x) => x.hours === h);
        return o ? pick(o) : fill;
      }),
    );
  const withFill = (attributes: { name: string; value: string }[]) => [...attributes, { name: '_FillValue', value: fill }];
  return {
    dimensions: [
      { name: 'trajectory', size: trajectories.length },
      { name: 'time', size: times.length },
    ],
    attributes: withFeatureType ? global('orthogonal multidimensional') : [{ name: 'Conventions', value: 'CF-1.8' }],
    variables: [
      idVariable(trajectories),
      { name: 'time', type: 'double', dimensions: ['time'], data: times, attributes: coordinateAttributes.time },
      { name: 'lon', type: 'double', dimensions: ['trajectory', 'time'], data: grid((o) => o.lon), attributes: withFill(coordinateAttributes.lon) },
      { name: 'lat', type: 'double', dimensions: ['trajectory', 'time'], data: grid((o) => o.lat), attributes: withFill(coordinateAttributes.lat) },
    ],
  };
}

export const layouts = {
  orthogonal: (t: Trajectory[]) => writeNetcdf3(orthogonalSpec(t)),
  incomplete: (t: Trajectory[]) => writeNetcdf3(incompleteSpec(t)),
  'contiguous-ragged': (t: Trajectory[]) => writeNetcdf3(contiguousSpec(t)),
  'indexed-ragged': (t: Trajectory[]) => writeNetcdf3(indexedSpec(t)),
} as const;

/** Writes a NetCDF-4 (HDF5) file with h5wasm from a NetCDF-3 style spec (datasets + attributes). */
export async function writeNetcdf4(path: string, spec: Netcdf3Spec): Promise<void> {
  const h5 = await import('h5wasm/node');
  await h5.ready;
  const file = new h5.File(path, 'w');
  try {
    for (const a of spec.attributes ?? []) file.create_attribute(a.name, typeof a.value === 'number' ? a.value : (a.value as string | number[]));
    const sizes = new Map(spec.dimensions.map((d) => [d.name, d.size]));
    for (const v of spec.variables) {
      const shape = v.dimensions.map((d) => {
        const size = sizes.get(d);
        return typeof size === 'number' ? size : (typeof v.data === 'string' ? v.data.length : v.data.length) / Math.max(1, v.dimensions.length);
      });
      const dtype = v.type === 'double' ? '<d' : v.type === 'float' ? '<f' : v.type === 'int' ? '<i' : v.type === 'short' ? '<h' : '<b';
      const values = typeof v.data === 'string' ? [...v.data].map((c) => c.charCodeAt(0)) : Array.from(v.data);
      const data =
        dtype === '<d'
          ? Float64Array.from(values)
          : dtype === '<f'
            ? Float32Array.from(values)
            : dtype === '<i'
              ? Int32Array.from(values)
              : dtype === '<h'
                ? Int16Array.from(values)
                : Int8Array.from(values);
      const dataset = file.create_dataset({ name: v.name, data, shape, dtype });
      for (const a of v.attributes ?? []) {
        if (typeof a.value === 'string') dataset.create_attribute(a.name, a.value);
        else if (a.type === 'float') dataset.create_attribute(a.name, Float32Array.from(typeof a.value === 'number' ? [a.value] : a.value), [1], '<f');
        else dataset.create_attribute(a.name, typeof a.value === 'number' ? a.value : Array.from(a.value));
      }
    }
    // Dimensions as HDF5 dimension scales, the way NetCDF-4 stores them: a coordinate variable of
    // the same name, or a bare dataset of the dimension's length.
    for (const d of spec.dimensions) {
      if (!spec.variables.some((v) => v.name === d.name)) {
        const length = typeof d.size === 'number' ? d.size : 0;
        file.create_dataset({ name: d.name, data: new Float32Array(length), shape: [length], dtype: '<f' });
      }
      (file.get(d.name) as InstanceType<typeof h5.Dataset>).make_scale(d.name);
    }
    for (const v of spec.variables) {
      const dataset = file.get(v.name) as InstanceType<typeof h5.Dataset>;
      v.dimensions.forEach((d, i) => {
        if (d !== v.name) dataset.attach_scale(i, `/${d}`);
      });
    }
  } finally {
    file.close();
  }
}
