// CF trajectory files in all four layouts of CF Conventions ch. 9 / Appendix H.4, NetCDF-3 (our
// writer, read back by netcdfjs) and NetCDF-4 (h5wasm), decoded to the same positions; plus
// truncated and corrupt files, which must become our own validation errors.
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, test } from 'vitest';
import { decodeTrajectories, parseTimeUnits } from '../../generator/drift/cf-trajectories.ts';
import { openNetcdf } from '../../generator/drift/netcdf-dataset.ts';
import type { Position } from '../../generator/drift/positions-csv.ts';
import { writeNetcdf3 } from '../../generator/drift/netcdf3-writer.ts';
import { InputValidationError } from '../../generator/errors.ts';
import { IssueLog } from '../../generator/read/issue-log.ts';
import { loadScenario } from '../../generator/read/load-scenario.ts';
import { expectIssue, scenarioCopy } from '../read/fixture-scenario.ts';
import type { Trajectory } from './cf-fixtures.ts';
import { contiguousSpec, incompleteSpec, layouts, orthogonalSpec, sampleTrajectories, writeNetcdf4 } from './cf-fixtures.ts';

const epoch = Date.UTC(2026, 8, 1);

function tempFile(name: string, bytes: Uint8Array): string {
  const path = join(mkdtempSync(join(tmpdir(), 'wrackline-cf-')), name);
  writeFileSync(path, bytes);
  return path;
}

async function decodeFile(path: string): Promise<{ positions: Position[]; layout: string; log: IssueLog }> {
  const log = new IssueLog();
  const positions: Position[] = [];
  const dataset = await openNetcdf(path, 'drift/test.nc');
  try {
    const summary = decodeTrajectories(dataset, 'drift/test.nc', log, (p) => {
      positions.push(p);
      return true;
    });
    return { positions, layout: summary.layout, log };
  } finally {
    dataset.close();
  }
}

/** The positions the sample trajectories should decode to, sorted for comparison. */
function expected(trajectories: Trajectory[]): string[] {
  return trajectories.flatMap((t, k) => t.observations.map((o) => `${k}|${epoch + o.hours * 3_600_000}|${o.lon.toFixed(4)}|${o.lat.toFixed(4)}`)).sort();
}

function described(positions: Position[]): string[] {
  return positions.map((p) => `${p.particle}|${p.timeMs}|${p.lon.toFixed(4)}|${p.lat.toFixed(4)}`).sort();
}

describe('CF trajectory layouts (NetCDF-3)', () => {
  for (const [layout, write] of Object.entries(layouts)) {
    test(`${layout} decodes to the same positions`, async () => {
      const { positions, layout: found, log } = await decodeFile(tempFile(`${layout}.nc`, write(sampleTrajectories)));
      expect(found).toBe(layout);
      expect(described(positions)).toEqual(expected(sampleTrajectories));
      expect(log.issues).toEqual([]);
      expect(log.countsFor('drift/test.nc')).toEqual({ file: 'drift/test.nc', read: 9, kept: 9, excluded: 0 });
    });
  }

  test('the orthogonal layout may leave out featureType; the others may not', async () => {
    const orthogonal = await decodeFile(tempFile('o.nc', writeNetcdf3(orthogonalSpec(sampleTrajectories, false))));
    expect(orthogonal.positions).toHaveLength(9);
    const spec = contiguousSpec(sampleTrajectories);
    const bytes = writeNetcdf3({ ...spec, attributes: [{ name: 'Conventions', value: 'CF-1.8' }] });
    await expect(decodeFile(tempFile('c.nc', bytes))).rejects.toThrow(/featureType/);
  });

  test('the feature_type spelling with lon/lat shaped (trajectory, obs) is accepted', async () => {
    const { positions, layout } = await decodeFile(tempFile('ft.nc', writeNetcdf3(incompleteSpec(sampleTrajectories, 'feature_type'))));
    expect(layout).toBe('incomplete');
    expect(described(positions)).toEqual(expected(sampleTrajectories));
  });

  test('contiguous ragged counts [2, 4, 3, 6]: 15 observations, feature 2 starts at observation 6', async () => {
    // Check value from CF ch. 9 (contiguous ragged array, H.4.3): offsets are cumulative counts.
    const sizes = [2, 4, 3, 6];
    const trajectories = sizes.map((n, k) => ({ id: k, observations: Array.from({ length: n }, (_, j) => ({ hours: j, lon: k + j / 100, lat: 10 + k })) }));
    const { positions, log } = await decodeFile(tempFile('c15.nc', writeNetcdf3(contiguousSpec(trajectories))));
    expect(positions).toHaveLength(15);
    // positions arrive in file order: index 6 is the first observation of trajectory 2
    expect(positions.findIndex((p) => p.particle === 2)).toBe(6);
    expect(log.countsFor('drift/test.nc').read).toBe(15);
  });

  test('a longitude out of range is reported by row, trajectory and observation and left out', async () => {
    const bad = structuredClone(sampleTrajectories);
    (bad[1] as Trajectory).observations[2] = { hours: 48, lon: 400, lat: 49.55 };
    const { positions, log } = await decodeFile(tempFile('bad.nc', layouts['contiguous-ragged'](bad)));
    expect(positions).toHaveLength(8);
    const issue = expectIssue(log.issues, { code: 'NetcdfValueInvalid', file: 'drift/test.nc', row: 5, column: 'lon', severity: 'warning', excluded: true });
    expect(issue.message).toContain('trajectory 1, observation 2');
  });

  test('CF time units are parsed (seconds, hours, days; offsets)', () => {
    expect(parseTimeUnits('seconds since 1970-01-01 00:00:00')).toEqual({ msPerUnit: 1000, epochMs: 0 });
    expect(parseTimeUnits('days since 2026-09-01')).toEqual({ msPerUnit: 86_400_000, epochMs: epoch });
    expect(parseTimeUnits('hours since 2026-09-01T02:00:00+02:00')).toEqual({ msPerUnit: 3_600_000, epochMs: epoch });
    expect('reason' in parseTimeUnits('fortnights since 2026-09-01')).toBe(true);
  });
});

describe('CF trajectory files as NetCDF-4 (HDF5, written with h5wasm)', () => {
  test('contiguous ragged layout decodes to the same positions', async () => {
    const path = join(mkdtempSync(join(tmpdir(), 'wrackline-cf4-')), 'c.nc');
    await writeNetcdf4(path, contiguousSpec(sampleTrajectories));
    const { positions, layout } = await decodeFile(path);
    expect(layout).toBe('contiguous-ragged');
    expect(described(positions)).toEqual(expected(sampleTrajectories));
  });

  test('incomplete multidimensional layout decodes to the same positions', async () => {
    const path = join(mkdtempSync(join(tmpdir(), 'wrackline-cf4-')), 'i.nc');
    await writeNetcdf4(path, incompleteSpec(sampleTrajectories));
    const { positions, layout } = await decodeFile(path);
    expect(layout).toBe('incomplete');
    expect(described(positions)).toEqual(expected(sampleTrajectories));
  });
});

describe('truncated or corrupt NetCDF files become our validation errors', () => {
  const whole = layouts['contiguous-ragged'](sampleTrajectories);

  test('a NetCDF-3 file cut short', async () => {
    const error = await openNetcdf(tempFile('cut.nc', whole.subarray(0, Math.floor(whole.length * 0.8))), 'drift/cut.nc').catch((e: unknown) => e);
    expect(error).toBeInstanceOf(InputValidationError);
    expect((error as InputValidationError).issue.message).toContain('drift/cut.nc');
    expect((error as InputValidationError).code).toBe('NetcdfUnreadable');
  });

  test('a NetCDF-3 header cut short', async () => {
    const error = await openNetcdf(tempFile('head.nc', whole.subarray(0, 40)), 'drift/head.nc').catch((e: unknown) => e);
    expect(error).toBeInstanceOf(InputValidationError);
  });

  test('garbage after a valid magic number', async () => {
    const bytes = new Uint8Array(200).map((_, i) => (i * 37 + 11) % 256);
    bytes.set([0x43, 0x44, 0x46, 0x01], 0);
    const error = await openNetcdf(tempFile('junk.nc', bytes), 'drift/junk.nc').catch((e: unknown) => e);
    expect(error).toBeInstanceOf(InputValidationError);
  });

  test('an HDF5 file cut short', async () => {
    const path = join(mkdtempSync(join(tmpdir(), 'wrackline-cf4-')), 'c.nc');
    await writeNetcdf4(path, contiguousSpec(sampleTrajectories));
    const { readFileSync } = await import('node:fs');
    const full = readFileSync(path);
    const error = await openNetcdf(tempFile('cut4.nc', full.subarray(0, Math.floor(full.length / 2))), 'drift/cut4.nc')
      .then((dataset) => {
        try {
          return decodeTrajectories(dataset, 'drift/cut4.nc', new IssueLog(), () => true);
        } finally {
          dataset.close();
        }
      })
      .catch((e: unknown) => e);
    expect(error).toBeInstanceOf(InputValidationError);
    // HDF5's own error stack is cut to one reason, and is not printed (loadH5)
    expect((error as InputValidationError).issue.message).toMatch(
      /^drift\/cut4\.nc row \(none\), column \(all\): not a readable NetCDF file \(HDF5: [^\n]+\); it may be truncated or corrupt$/,
    );
  });

  test('through loadScenario: a truncated trajectory file is an error naming the file', async () => {
    const dir = scenarioCopy({
      files: { 'drift/trajectories.nc': whole.subarray(0, whole.length - 30) },
      descriptor: (d) => {
        d.resources.push({ name: 'drift-trajectories', role: 'drift-trajectories', path: 'drift/trajectories.nc', format: 'netcdf' });
      },
    });
    const scenario = await loadScenario(dir);
    const issue = expectIssue(scenario.report.issues, { code: 'NetcdfUnreadable', file: 'drift/trajectories.nc', severity: 'error' });
    expect(issue.message).toMatch(/truncated or corrupt/);
    expect(issue.message.split('\n')).toHaveLength(1);
    expect(scenario.report.ok).toBe(false);
  });
});
