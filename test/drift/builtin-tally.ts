/**
 * The built-in drift reader run on a scenario folder's drift files, as the build runs it (settings
 * and segments read by the scenario readers), returning the tally's two tables and the messages
 * of every drift issue. The reference the drift job is checked against.
 */
import { join } from 'node:path';
import { tallyDriftFiles } from '../../generator/drift/drift-model.ts';
import { tallyTables, type TallyTables } from '../../generator/drift/tally-tables.ts';
import { IssueLog } from '../../generator/read/issue-log.ts';
import { readPackageDescriptor } from '../../generator/read/package-descriptor.ts';
import { readSegments } from '../../generator/read/read-segments.ts';
import { readSettings } from '../../generator/read/read-settings.ts';

export interface BuiltinTally {
  tables: TallyTables;
  positions: number;
  messages: string[];
}

export async function builtinTally(dir: string): Promise<BuiltinTally> {
  const log = new IssueLog();
  const descriptor = await readPackageDescriptor(join(dir, 'datapackage.json'), 'datapackage.json', log);
  const settingsResource = descriptor.resources.find((r) => r.role === 'settings');
  const segmentsResource = descriptor.resources.find((r) => r.role === 'segments');
  if (!settingsResource || !segmentsResource) throw new Error(`${dir}: no settings or segments resource`);
  const settings = await readSettings(join(dir, settingsResource.path), settingsResource.path, log, settingsResource.format);
  if (!settings) throw new Error(`${dir}: settings not readable: ${log.issues.map((i) => i.message).join('; ')}`);
  const segments = await readSegments(join(dir, segmentsResource.path), segmentsResource.path, log);
  const resources = descriptor.resources
    .filter((r) => r.role === 'drift-positions' || r.role === 'drift-trajectories')
    .map((resource) => ({ resource, absolutePath: join(dir, resource.path) }));
  const tally = await tallyDriftFiles({ resources, segments, settings, segmentsFile: segmentsResource.path, log });
  if (!tally) throw new Error(`${dir}: no drift files`);
  return { tables: tallyTables(tally), positions: tally.positions, messages: log.issues.map((i) => i.message) };
}
