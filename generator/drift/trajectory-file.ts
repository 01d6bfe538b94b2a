/**
 * Reads one CF trajectory file (NetCDF-3 or NetCDF-4) and hands its positions to a callback.
 * Any failure while reading a damaged file — in our decoder or inside the format libraries — is
 * turned into an InputValidationError naming the file, so a bad file never escapes as a crash.
 */
import { InputValidationError } from '../errors.ts';
import type { IssueLog } from '../read/issue-log.ts';
import type { TrajectorySummary } from './cf-trajectories.ts';
import { decodeTrajectories } from './cf-trajectories.ts';
import type { NetcdfDataset } from './netcdf-dataset.ts';
import { netcdfUnreadable, openNetcdf } from './netcdf-dataset.ts';
import type { Position } from './positions-csv.ts';

export async function readTrajectoryFile(absolutePath: string, file: string, log: IssueLog, emit: (position: Position) => boolean): Promise<TrajectorySummary> {
  let dataset: NetcdfDataset | null = null;
  try {
    dataset = await openNetcdf(absolutePath, file);
    return decodeTrajectories(dataset, file, log, emit);
  } catch (error) {
    if (error instanceof InputValidationError) throw error;
    throw netcdfUnreadable(file, error instanceof Error ? error.message : String(error));
  } finally {
    try {
      dataset?.close();
    } catch {
      // closing a damaged file may fail too; nothing more to report
    }
  }
}
