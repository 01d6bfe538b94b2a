/**
 * Remembering the drift figures between builds. Turning millions of modelled positions into
 * arrivals and zones is the slowest part of reading; when the drift files, the segments and the
 * drift and season settings are exactly those of an earlier build, its figures (and the
 * validation issues and record counts the drift files produced then) are taken over instead.
 *
 * The key covers everything the drift reader reads: each drift resource's descriptor and the
 * SHA-256 of its file, the loaded segments and the `seasons` and `drift` settings. A store adds
 * its own fingerprint of the reading code (see generator/publish/cache/drift-figures.ts).
 */
import { createHash } from 'node:crypto';
import type { ValidationIssue } from '../model/types.ts';
import type { ScenarioSettings } from '../scenario/settings.ts';
import type { InputFile, LoadedScenario, Segment } from '../scenario/types.ts';
import type { FileCounts, IssueLog } from './issue-log.ts';
import type { ResourceEntry } from './package-descriptor.ts';

export interface DriftMemoEntry {
  drift: LoadedScenario['drift'];
  /** Issues the drift files raised, in the order they were raised. */
  issues: ValidationIssue[];
  /** Record counts of the drift files. */
  counts: FileCounts[];
}

export interface DriftMemo {
  get(key: string): Promise<DriftMemoEntry | null>;
  set(key: string, entry: DriftMemoEntry): Promise<void>;
}

/** The key of one drift reading: null when some drift file has no digest (it could not be read). */
export function driftMemoKey(resources: readonly ResourceEntry[], inputs: readonly InputFile[], segments: readonly Segment[], settings: ScenarioSettings): string | null {
  const digests = new Map(inputs.map((input) => [input.file, input.sha256]));
  const files: unknown[] = [];
  for (const resource of resources) {
    const sha256 = digests.get(resource.path);
    if (sha256 === undefined) return null;
    files.push({ resource, sha256 });
  }
  return (
    createHash('sha256')
      // The period decides which positions are used (drift-period.ts): monitoring start and publication dates.
      .update(
        JSON.stringify({
          files,
          segments,
          seasons: settings.seasons,
          drift: settings.drift,
          monitoringStart: settings.monitoringStart ?? null,
          publications: settings.publications,
        }),
      )
      .digest('hex')
  );
}

/** What the drift reading added to the log after `issuesBefore` issues had been recorded. */
export function driftLogEntries(log: IssueLog, issuesBefore: number, files: readonly string[]): Pick<DriftMemoEntry, 'issues' | 'counts'> {
  const wanted = new Set(files);
  return {
    issues: log.issues.slice(issuesBefore),
    counts: log
      .report()
      .files.filter((counts) => wanted.has(counts.file))
      .map((counts) => ({ ...counts })),
  };
}

/** Replays a remembered reading's issues and counts into the log. */
export function replayDriftLog(log: IssueLog, entry: DriftMemoEntry): void {
  for (const counts of entry.counts) Object.assign(log.countsFor(counts.file), counts);
  for (const item of entry.issues) log.push(item);
}
