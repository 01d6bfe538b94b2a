/**
 * Collects validation issues and per-file record counts while a scenario is read, and turns them
 * into the ValidationReport. Nothing is dropped: every excluded record has an issue with
 * `excluded: true`, and each file's read = kept + excluded.
 */
import type { ErrorData, IssueInput } from '../errors.ts';
import { issue } from '../errors.ts';
import type { ValidationIssue, ValidationReport } from '../model/types.ts';

export interface FileCounts {
  file: string;
  read: number;
  kept: number;
  excluded: number;
}

export class IssueLog {
  readonly issues: ValidationIssue[] = [];
  private readonly counts = new Map<string, FileCounts>();

  add(entry: ErrorData, message: string, input: IssueInput): ValidationIssue {
    const item = issue(entry, message, input);
    this.issues.push(item);
    return item;
  }

  /** Adds an issue raised elsewhere (e.g. carried by an InputValidationError). */
  push(item: ValidationIssue): void {
    this.issues.push(item);
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
    for (const item of this.issues) if (item.severity === 'warning') item.severity = 'error';
  }

  hasErrors(): boolean {
    return this.issues.some((i) => i.severity === 'error');
  }

  report(): ValidationReport {
    return {
      ok: !this.hasErrors(),
      files: [...this.counts.values()],
      issues: this.issues,
    };
  }
}
