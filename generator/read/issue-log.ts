/**
 * Collects validation issues and per-file record counts while a scenario is read, and turns them
 * into the ValidationReport. Nothing is dropped: every excluded record has an issue with
 * `excluded: true`, and each file's read = kept + excluded.
 *
 * Per-cause cap: a cause is one problem code in one column of one file. The first
 * `perCauseLimit` issues of a cause are kept in full (file, row, column, value); the rest are only
 * counted, so a huge table whose every row is bad holds a few thousand issue objects, not one per
 * row. The report then carries one more entry per capped cause saying how many records of that
 * cause are not listed one by one (`omitted` gives the same counts as data).
 */
import type { ErrorData, IssueInput } from '../errors.ts';
import { issue } from '../errors.ts';
import type { ValidationIssue, ValidationReport } from '../model/types.ts';
import { bidiControls, isolateBidi } from './bidi-controls.ts';

export interface FileCounts {
  file: string;
  read: number;
  kept: number;
  excluded: number;
}

/** Issues of one cause beyond the cap: counted, not kept. */
export interface OmittedIssues {
  file: string;
  code: string;
  column: string | null;
  /** How many issues of this cause were counted but not kept. */
  count: number;
  severity: 'error' | 'warning';
  excluded: boolean;
  /** The first kept issue of the cause, for its wording and hint. */
  example: ValidationIssue;
}

export const defaultPerCauseLimit = 1000;

function causeKey(item: { code?: string | undefined; file: string; column: string | null }): string {
  return `${item.code ?? ''}\u0000${item.file}\u0000${item.column ?? ''}`;
}

export class IssueLog {
  readonly issues: ValidationIssue[] = [];
  private readonly counts = new Map<string, FileCounts>();
  private readonly kept = new Map<string, number>();
  private readonly omitted = new Map<string, OmittedIssues>();
  private errors = false;

  constructor(readonly perCauseLimit: number = defaultPerCauseLimit) {}

  add(entry: ErrorData, message: string, input: IssueInput): ValidationIssue {
    const item = issue(entry, message, input);
    this.push(item);
    return item;
  }

  /** Adds an issue raised elsewhere (e.g. carried by an InputValidationError); capped like add(). */
  push(raw: ValidationIssue): void {
    // A value or message holding direction controls is shown as an isolate (bidi-controls.ts).
    const item =
      bidiControls(`${raw.value ?? ''}${raw.message}`).length === 0
        ? raw
        : { ...raw, value: raw.value === null ? null : isolateBidi(raw.value), message: isolateBidi(raw.message) };
    if (item.severity === 'error') this.errors = true;
    const key = causeKey(item);
    const seen = this.kept.get(key) ?? 0;
    if (seen < this.perCauseLimit) {
      this.kept.set(key, seen + 1);
      this.issues.push(item);
      return;
    }
    const over = this.omitted.get(key);
    if (over) {
      over.count++;
      if (item.severity === 'error') over.severity = 'error';
      if (item.excluded) over.excluded = true;
      return;
    }
    const example = this.issues.find((i) => causeKey(i) === key) ?? item;
    this.omitted.set(key, { file: item.file, code: item.code ?? 'unnamed', column: item.column, count: 1, severity: item.severity, excluded: item.excluded, example });
  }

  /** Issues of capped causes that were counted but not kept. */
  omittedIssues(): OmittedIssues[] {
    return [...this.omitted.values()];
  }

  countsFor(file: string): FileCounts {
    let counts = this.counts.get(file);
    if (!counts) {
      counts = { file, read: 0, kept: 0, excluded: 0 };
      this.counts.set(file, counts);
    }
    return counts;
  }

  /** `--strict`: every warning becomes an error, so a build stops on it. */
  makeWarningsErrors(): void {
    for (const item of this.issues) {
      if (item.severity !== 'warning') continue;
      item.severity = 'error';
      this.errors = true;
    }
    for (const over of this.omitted.values()) over.severity = 'error';
  }

  hasErrors(): boolean {
    return this.errors;
  }

  report(): ValidationReport {
    const summaries: ValidationIssue[] = this.omittedIssues().map((over) => ({
      file: over.file,
      row: null,
      column: over.column,
      value: String(over.count),
      expected: over.example.expected,
      message: `${over.file}${over.column === null ? '' : `, column ${over.column}`}: ${over.count.toLocaleString('en-GB')} more ${over.excluded ? 'records left out' : 'issues'} for the same reason (${over.code}), counted but not listed one by one; the first ${this.perCauseLimit.toLocaleString('en-GB')} are listed above`,
      severity: over.severity,
      excluded: over.excluded,
      code: over.code,
      hint: over.example.hint,
    }));
    return {
      ok: !this.hasErrors(),
      files: [...this.counts.values()],
      issues: [...this.issues, ...summaries],
      omitted: this.omittedIssues().map(({ file, code, column, count, severity, excluded }) => ({ file, code, column, count, severity, excluded })),
    };
  }
}
