/**
 * Reads scenario.json (the settings) and validates it with the zod schema in
 * generator/scenario/settings.ts. Each problem is reported with the file and the JSON path of the
 * offending setting. Returns null when the settings cannot be used.
 */
import { readFile } from 'node:fs/promises';
import { SettingsInvalid, SettingsUnreadable } from '../errors.ts';
import type { ScenarioSettings } from '../scenario/settings.ts';
import { settingsSchema } from '../scenario/settings.ts';
import type { IssueLog } from './issue-log.ts';
import { formatZodPath } from './zod-issues.ts';

function valueAt(json: unknown, path: readonly (string | number)[]): unknown {
  let current: unknown = json;
  for (const part of path) {
    if (current === null || typeof current !== 'object') return undefined;
    current = (current as { [key: string]: unknown })[part];
  }
  return current;
}

function showValue(value: unknown): string {
  if (value === undefined) return 'a missing value';
  const text = JSON.stringify(value);
  return text.length > 60 ? `${text.slice(0, 57)}...` : text;
}

/** Validates parsed JSON; every zod issue becomes a report entry naming the JSON path. */
export function validateSettings(json: unknown, file: string, log: IssueLog): ScenarioSettings | null {
  const parsed = settingsSchema.safeParse(json);
  if (parsed.success) return parsed.data;
  for (const problem of parsed.error.issues) {
    const jsonPath = `$${formatZodPath(problem.path)}`;
    const value = valueAt(json, problem.path);
    const shown = showValue(value);
    log.add(SettingsInvalid, SettingsInvalid.message(file, jsonPath, shown, problem.message), {
      file, row: null, column: jsonPath, value: value === undefined ? null : JSON.stringify(value), expected: problem.message, severity: 'error', excluded: true,
    });
  }
  return null;
}

export async function readSettings(absolutePath: string, file: string, log: IssueLog): Promise<ScenarioSettings | null> {
  let json: unknown;
  try {
    json = JSON.parse((await readFile(absolutePath, 'utf8')).replace(/^\ufeff/, ''));
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    log.add(SettingsUnreadable, SettingsUnreadable.message(file, reason), {
      file, row: null, column: null, value: null, expected: 'a JSON object of settings', severity: 'error', excluded: true,
    });
    return null;
  }
  return validateSettings(json, file, log);
}
