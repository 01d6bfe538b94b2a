/**
 * loadScenario: reads a scenario folder through its datapackage.json into a LoadedScenario —
 * settings, coastline segments, monitoring records of every indicator, drift-model results, the
 * list of input files with their digests, and the validation report.
 *
 * Never throws for bad data: every problem is in `report` (errors make `report.ok` false and stop
 * a build; warnings don't). Throws ScenarioError only when the folder or datapackage.json cannot
 * be read at all.
 */
import { realpath, stat } from 'node:fs/promises';
import { join, resolve } from 'node:path';
import {
  InputValidationError,
  NoUsableRows,
  ResourceFileMissing,
  ResourceInvalid,
  ResourceOutsideScenario,
  RuleWithoutData,
  ScenarioError,
  ScenarioFolderUnreadable,
  SettingsInvalid,
} from '../errors.ts';
import { readDrift } from '../drift/drift-model.ts';
import { driftLogEntries, driftMemoKey, replayDriftLog, type DriftMemo } from './drift-memo.ts';
import { indicatorDefinitions } from '../indicators/index.ts';
import type { ScenarioSettings } from '../scenario/settings.ts';
import { settingsSchema } from '../scenario/settings.ts';
import type { InputFile, LoadedScenario, Record as ScenarioRecord, Segment } from '../scenario/types.ts';
import { fileDigest } from './file-digest.ts';
import type { ScenarioPeriod } from './indicator-table.ts';
import { readIndicatorTable } from './indicator-table.ts';
import { IssueLog } from './issue-log.ts';
import { guardLosses } from './loss-guard.ts';
import type { SeriesRows, TableRows } from './loss-guard.ts';
import type { ResourceEntry } from './package-descriptor.ts';
import { readPackageDescriptor } from './package-descriptor.ts';
import { readSettings } from './read-settings.ts';
import { readSegments } from './read-segments.ts';
import { placeInFolder } from './inside-folder.ts';
import { readLand } from './read-land.ts';
import { readPublisherLogo } from './publisher-logo.ts';
import { checkNoteTargets } from './note-targets.ts';
import { seasonRange } from './season-calendar.ts';

export interface LoadOptions {
  /**
   * Called as reading goes on: phases "package", "settings", "segments", "reading <file>" (done and
   * total in bytes of the file), "drift zones", and "done".
   */
  onProgress?(phase: string, done: number, total?: number): void;
  /** Drift figures remembered from an earlier build with the same drift inputs (drift-memo.ts). */
  driftMemo?: DriftMemo;
  /** Every warning counts as an error (`--strict`). */
  strict?: boolean;
}

const descriptorName = 'datapackage.json';

/** Settings used when scenario.json cannot be read, so the other files can still be checked. */
function placeholderSettings(): ScenarioSettings {
  return settingsSchema.parse({
    region: { id: 'unreadable-settings', name: 'Settings could not be read' },
    publisher: { role: 'publisher', name: 'Unknown' },
    authorities: [{ role: 'publisher', name: 'Unknown' }],
    publications: [{ season: '1970-winter', date: '1970-01-01' }],
  });
}

/** The scenario's period: monitoring start, end of the last published season, publication date. */
function periodOf(settings: ScenarioSettings, file: string, log: IssueLog): ScenarioPeriod | null {
  let ok = true;
  settings.publications.forEach((publication, i) => {
    const range = seasonRange(publication.season, settings.seasons);
    if (!range) {
      const path = `$.publications[${i}].season`;
      log.add(SettingsInvalid, SettingsInvalid.message(file, path, JSON.stringify(publication.season), 'YYYY-<season id> with a season defined in "seasons"'), {
        file,
        row: null,
        column: path,
        value: publication.season,
        expected: 'YYYY-<season id>',
        severity: 'error',
        excluded: true,
      });
      ok = false;
    } else if (publication.date < range.end) {
      const path = `$.publications[${i}].date`;
      log.add(SettingsInvalid, SettingsInvalid.message(file, path, JSON.stringify(publication.date), `a date after the season ends (${range.end})`), {
        file,
        row: null,
        column: path,
        value: publication.date,
        expected: `after ${range.end}`,
        severity: 'warning',
        excluded: false,
      });
    }
  });
  const last = settings.publications[settings.publications.length - 1];
  if (!ok || !last) return null;
  const range = seasonRange(last.season, settings.seasons);
  if (!range) return null;
  return { start: settings.monitoringStart ?? null, end: range.end, published: last.date };
}

function compareRecords(a: ScenarioRecord, b: ScenarioRecord): number {
  return a.indicator.localeCompare(b.indicator) || a.segmentId.localeCompare(b.segmentId) || a.date.localeCompare(b.date) || a.source.row - b.source.row;
}

export async function loadScenario(dir: string, options: LoadOptions = {}): Promise<LoadedScenario> {
  const root = resolve(dir);
  const progress = options.onProgress ?? (() => {});
  try {
    const info = await stat(root);
    if (!info.isDirectory()) throw new Error('not a folder');
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    throw new ScenarioError(ScenarioFolderUnreadable, ScenarioFolderUnreadable.message(dir, reason));
  }
  const log = new IssueLog();
  progress('package', 0);
  const descriptor = await readPackageDescriptor(join(root, descriptorName), descriptorName, log);

  // Every listed file must exist; each becomes an input with its digest.
  const inputs: InputFile[] = [];
  const present: ResourceEntry[] = [];
  const realRoot = await realpath(root);
  for (const resource of descriptor.resources) {
    const path = join(root, resource.path);
    try {
      const placement = await placeInFolder(realRoot, resource.path);
      if (!placement.inside) {
        log.add(ResourceOutsideScenario, ResourceOutsideScenario.message(resource.path, placement.real), {
          file: resource.path,
          row: null,
          column: null,
          value: resource.path,
          expected: 'a file inside the scenario folder',
          severity: 'error',
          excluded: true,
        });
        continue;
      }
      const info = await stat(path);
      if (!info.isFile()) throw new Error('not a file');
      const digest = await fileDigest(path);
      inputs.push({ file: resource.path, sha256: digest.sha256, bytes: digest.bytes });
      present.push(resource);
    } catch (error) {
      const reason = error instanceof Error ? error.message : String(error);
      log.add(ResourceFileMissing, ResourceFileMissing.message(resource.path, reason), {
        file: resource.path,
        row: null,
        column: null,
        value: resource.path,
        expected: 'an existing file',
        severity: 'error',
        excluded: true,
      });
    }
  }
  for (const resource of present) {
    if (!/^utf-?8$/i.test(resource.encoding)) {
      const path = `resources[${resource.index}].encoding`;
      log.add(ResourceInvalid, ResourceInvalid.message(descriptorName, path, `encoding ${JSON.stringify(resource.encoding)} is not supported; the file was read as UTF-8`), {
        file: descriptorName,
        row: null,
        column: path,
        value: resource.encoding,
        expected: 'utf-8',
        severity: 'warning',
        excluded: false,
      });
    }
  }
  const single = (role: ResourceEntry['role']): ResourceEntry | null => {
    const found = descriptor.resources.filter((r) => r.role === role);
    if (found.length === 0) {
      log.add(ResourceInvalid, ResourceInvalid.message(descriptorName, 'resources', `no resource has role "${role}"; expected exactly one`), {
        file: descriptorName,
        row: null,
        column: 'resources',
        value: null,
        expected: `one resource with role "${role}"`,
        severity: 'error',
        excluded: true,
      });
      return null;
    }
    if (found.length > 1) {
      log.add(ResourceInvalid, ResourceInvalid.message(descriptorName, `resources[${found[1]?.index ?? 0}]`, `a second resource has role "${role}"; only the first is used`), {
        file: descriptorName,
        row: null,
        column: `resources[${found[1]?.index ?? 0}]`,
        value: found[1]?.name ?? null,
        expected: `one resource with role "${role}"`,
        severity: 'error',
        excluded: true,
      });
    }
    const first = found[0] ?? null;
    return first && present.includes(first) ? first : null;
  };

  progress('settings', 0);
  const settingsResource = single('settings');
  const readSettingsResult = settingsResource ? await readSettings(join(root, settingsResource.path), settingsResource.path, log, settingsResource.format) : null;
  const settings = readSettingsResult ?? placeholderSettings();
  const period = readSettingsResult && settingsResource ? periodOf(readSettingsResult, settingsResource.path, log) : null;

  progress('segments', 0);
  const segmentsResource = single('segments');
  const segmentsFile = segmentsResource?.path ?? 'segments.geojson';
  const leftOutSegments = new Set<string>();
  const segments: Segment[] = segmentsResource ? await readSegments(join(root, segmentsResource.path), segmentsResource.path, log, leftOutSegments) : [];
  const segmentIds = new Set(segments.map((s) => s.id));

  // Land for the maps: optional, at most one resource.
  const landResources = descriptor.resources.filter((r) => r.role === 'land');
  if (landResources.length > 1) {
    const extra = landResources[1]!;
    log.add(ResourceInvalid, ResourceInvalid.message(descriptorName, `resources[${extra.index}]`, 'a second resource has role "land"; only the first is used'), {
      file: descriptorName,
      row: null,
      column: `resources[${extra.index}]`,
      value: extra.name,
      expected: 'at most one resource with role "land"',
      severity: 'warning',
      excluded: true,
    });
  }
  const landResource = landResources[0] && present.includes(landResources[0]) ? landResources[0] : null;
  if (landResource) progress('land', 0);
  const land = landResource ? await readLand(join(root, landResource.path), landResource.path, log) : null;

  const records: ScenarioRecord[] = [];
  const tableRows: TableRows[] = [];
  const tables = present.filter((r) => r.role === 'indicator' && r.indicator !== null);
  for (const resource of tables) {
    if (resource.indicator === null) continue;
    progress(`reading ${resource.path}`, 0);
    const seriesRows = new Map<string, SeriesRows>();
    tableRows.push({ file: resource.path, series: seriesRows });
    try {
      const read = await readIndicatorTable({
        resource,
        absolutePath: join(root, resource.path),
        definition: indicatorDefinitions[resource.indicator],
        settings,
        period,
        segmentIds,
        leftOutSegments,
        segmentsFile,
        log,
        seriesRows,
        onProgress: (done, total) => progress(`reading ${resource.path}`, done, total),
      });
      // One by one: spreading a large array into push() overflows the call stack.
      for (const record of read) records.push(record);
    } catch (error) {
      if (error instanceof InputValidationError) log.push(error.issue);
      else throw error;
    }
  }
  records.sort(compareRecords);

  const driftResources = present
    .filter((r) => r.role === 'drift-positions' || r.role === 'drift-trajectories' || r.role === 'drift-arrivals' || r.role === 'drift-end-positions')
    .map((resource) => ({ resource, absolutePath: join(root, resource.path) }));
  const memoKey =
    options.driftMemo && driftResources.length > 0
      ? driftMemoKey(
          driftResources.map((r) => r.resource),
          inputs,
          segments,
          settings,
        )
      : null;
  const remembered = memoKey === null ? null : await options.driftMemo?.get(memoKey);
  let drift: LoadedScenario['drift'];
  if (remembered) {
    progress('drift figures taken over from an earlier build', 1, 1);
    replayDriftLog(log, remembered);
    drift = remembered.drift;
  } else {
    const issuesBefore = log.issues.length;
    drift = await readDrift({ resources: driftResources, segments, settings, segmentsFile, log, onProgress: progress });
    if (memoKey !== null) {
      const entries = driftLogEntries(
        log,
        issuesBefore,
        driftResources.map((r) => r.resource.path),
      );
      // Only a reading without errors is remembered: a broken file is read (and reported) again.
      if (!entries.issues.some((item) => item.severity === 'error')) await options.driftMemo?.set(memoKey, { drift, ...entries });
    }
  }
  // A file whose every record was left out is an error, not a list of warnings.
  for (const counts of log.report().files) {
    const hasError = log.issues.some((item) => item.file === counts.file && item.severity === 'error');
    if (counts.read > 0 && counts.kept === 0 && !hasError) {
      log.add(NoUsableRows, NoUsableRows.message(counts.file, counts.read), {
        file: counts.file,
        row: 2,
        column: null,
        value: null,
        expected: 'at least one usable record',
        severity: 'error',
        excluded: true,
      });
    }
  }
  const settingsFile = settingsResource?.path ?? 'scenario.json';
  guardLosses(tableRows, log.report().files, settings, settingsFile, log);
  // A rule about an indicator with no data can never match: say so rather than keep it silently.
  const withData = new Set<string>(records.map((r) => r.indicator));
  if (drift !== null) withData.add('drift-arrivals');
  settings.riskRules.forEach((rule, i) => {
    if (withData.has(rule.indicator)) return;
    const path = `$.riskRules[${i}].indicator`;
    log.add(RuleWithoutData, RuleWithoutData.message(settingsFile, path, rule.id, rule.indicator), {
      file: settingsFile,
      row: null,
      column: path,
      value: rule.indicator,
      expected: 'an indicator the scenario has data for',
      severity: 'warning',
      excluded: false,
    });
  });
  // Publisher notes must name a published season and, unless season-wide, a segment of the file.
  if (readSettingsResult) checkNoteTargets(settings, segments, leftOutSegments, settingsFile, log);
  // The publisher's logo: read through the same resolver as the resources, checked by its bytes.
  const publisherLogo =
    readSettingsResult && readSettingsResult.publisherLogo !== undefined ? await readPublisherLogo(realRoot, readSettingsResult.publisherLogo, settingsFile, log) : null;
  if (publisherLogo && !inputs.some((input) => input.file === publisherLogo.file)) {
    inputs.push({ file: publisherLogo.file, sha256: publisherLogo.sha256, bytes: publisherLogo.bytes.length });
  }
  if (options.strict) log.makeWarningsErrors();
  progress('done', 1, 1);

  return { dir: root, settings, segments, land, records, drift, inputs, ...(publisherLogo ? { publisherLogo } : {}), report: log.report() };
}
