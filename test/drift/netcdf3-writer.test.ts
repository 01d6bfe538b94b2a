// The NetCDF-3 writer is checked by reading its output back with two independent readers:
// netcdfjs (a general-purpose JavaScript reader) and, when Debian's python3 with SciPy is present,
// scipy.io.netcdf_file (SciPy's reader of the classic format).
import { execFileSync } from 'node:child_process';
import { existsSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { NetCDFReader } from 'netcdfjs';
import { describe, expect, test } from 'vitest';
import { writeNetcdf3 } from '../../generator/drift/netcdf3-writer.ts';

const spec = {
  dimensions: [
    { name: 'time', size: 'unlimited' as const },
    { name: 'trajectory', size: 3 },
    { name: 'n', size: 5 },
  ],
  attributes: [
    { name: 'featureType', value: 'trajectory' },
    { name: 'version', value: 3, type: 'int' as const },
    { name: 'scale', value: [0.5, 1.5] },
  ],
  variables: [
    {
      name: 'lon',
      type: 'double' as const,
      dimensions: ['trajectory', 'n'],
      data: Array.from({ length: 15 }, (_, i) => i + 0.5),
      attributes: [{ name: 'units', value: 'degrees_east' }],
    },
    { name: 'label', type: 'char' as const, dimensions: ['n'], data: 'abc' },
    { name: 'flag', type: 'byte' as const, dimensions: ['n'], data: [1, -2, 3, 4, 5] },
    { name: 'count', type: 'short' as const, dimensions: ['n'], data: [1, -2, 3, 7, 9] },
    { name: 'time', type: 'float' as const, dimensions: ['time'], data: [1.5, 2.5, 3.5, 4.5] },
    { name: 'step', type: 'int' as const, dimensions: ['time', 'trajectory'], data: [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12] },
  ],
};

describe('writeNetcdf3', () => {
  test('writes a classic-format header that netcdfjs reads back', () => {
    const reader = new NetCDFReader(writeNetcdf3(spec));
    expect(reader.version).toBe('classic format');
    expect(reader.dimensions).toEqual([
      { name: 'time', size: 0 },
      { name: 'trajectory', size: 3 },
      { name: 'n', size: 5 },
    ]);
    expect(reader.recordDimension.length).toBe(4);
    expect(reader.getAttribute('featureType')).toBe('trajectory');
    expect(reader.getAttribute('version')).toBe(3);
    const lon = reader.variables.find((v) => v.name === 'lon');
    expect(lon?.attributes).toEqual([{ name: 'units', type: 'char', value: 'degrees_east' }]);
  });

  test('writes fixed-size and record data that netcdfjs reads back', () => {
    const reader = new NetCDFReader(writeNetcdf3(spec));
    expect(reader.getDataVariable('lon')).toEqual(Array.from({ length: 15 }, (_, i) => i + 0.5));
    // netcdfjs returns the 4-byte padding of short variables too: only the first 5 are data.
    expect(reader.getDataVariable('count').slice(0, 5)).toEqual([1, -2, 3, 7, 9]);
    expect(reader.getDataVariable('time')).toEqual([1.5, 2.5, 3.5, 4.5]);
    expect(reader.getDataVariable('step')).toEqual([
      [1, 2, 3],
      [4, 5, 6],
      [7, 8, 9],
      [10, 11, 12],
    ]);
  });

  test.skipIf(!existsSync('/usr/bin/python3'))('is read identically by SciPy netcdf_file', () => {
    const dir = mkdtempSync(join(tmpdir(), 'wrackline-nc3-'));
    const file = join(dir, 'check.nc');
    writeFileSync(file, writeNetcdf3(spec));
    const script = [
      'import json, sys',
      'from scipy.io import netcdf_file',
      'f = netcdf_file(sys.argv[1], "r", mmap=False)',
      'out = {"dims": {k: v for k, v in f.dimensions.items()},',
      '       "featureType": f.featureType.decode(),',
      '       "lon": f.variables["lon"][:].tolist(), "flag": f.variables["flag"][:].tolist(),',
      '       "count": f.variables["count"][:].tolist(), "label": f.variables["label"][:].tobytes().decode().rstrip("\\x00"),',
      '       "time": f.variables["time"][:].tolist(), "step": f.variables["step"][:].tolist()}',
      'f.close()',
      'print(json.dumps(out))',
    ].join('\n');
    const out = JSON.parse(execFileSync('/usr/bin/python3', ['-c', script, file], { encoding: 'utf8' })) as Record<string, unknown>;
    expect(out).toEqual({
      dims: { time: null, trajectory: 3, n: 5 },
      featureType: 'trajectory',
      lon: [
        [0.5, 1.5, 2.5, 3.5, 4.5],
        [5.5, 6.5, 7.5, 8.5, 9.5],
        [10.5, 11.5, 12.5, 13.5, 14.5],
      ],
      flag: [1, -2, 3, 4, 5],
      count: [1, -2, 3, 7, 9],
      label: 'abc',
      time: [1.5, 2.5, 3.5, 4.5],
      step: [
        [1, 2, 3],
        [4, 5, 6],
        [7, 8, 9],
        [10, 11, 12],
      ],
    });
  });

  test('writes a single short record variable unpadded between records, as the classic format requires', () => {
    const bytes = writeNetcdf3({
      dimensions: [{ name: 'obs', size: 'unlimited' }],
      variables: [{ name: 'v', type: 'short', dimensions: ['obs'], data: [1, 2, 3] }],
    });
    // header: 4 magic + 4 numrecs + dim list (4+4 + 4+4(name) + 4) + empty gatts 8 + var list ...
    // the data part is exactly 3 × 2 bytes at the end of the file.
    const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    const end = bytes.byteLength;
    expect([view.getInt16(end - 6), view.getInt16(end - 4), view.getInt16(end - 2)]).toEqual([1, 2, 3]);
  });

  test('refuses a dimension name it does not know', () => {
    expect(() => writeNetcdf3({ dimensions: [], variables: [{ name: 'v', type: 'int', dimensions: ['x'], data: [1] }] })).toThrow(/unknown dimension x/);
  });
});
