/**
 * Reads scenario.json (the settings) and validates it with the zod schema in
 * generator/scenario/settings.ts. Each problem is reported with the file and the JSON path of the
 * offending setting. Returns null when the settings cannot be used.
 */
import { readUtf8Logged } from './utf8-text.ts';
import { parse as parseYaml } from 'yaml';
import { z } from 'zod';
import { BidiControlInText, JsonTooDeep, SettingUnknown, SettingsInvalid, SettingsUnreadable } from '../errors.ts';
import type { ScenarioSettings } from '../scenario/settings.ts';
import { settingsSchema } from '../scenario/settings.ts';
import type { IssueLog } from './issue-log.ts';
import { checkParsedValue, logForbiddenKeys, parseBoundedJson } from './json-input.ts';
import { bidiControls, isolateBidi } from './bidi-controls.ts';
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

/** Strips optional/default/nullable/effects wrappers off a zod schema. */
function unwrap(schema: z.ZodTypeAny): z.ZodTypeAny {
  let current = schema;
  for (;;) {
    if (current instanceof z.ZodDefault) current = current._def.innerType as z.ZodTypeAny;
    else if (current instanceof z.ZodOptional || current instanceof z.ZodNullable) current = current.unwrap() as z.ZodTypeAny;
    else if (current instanceof z.ZodEffects) current = current.innerType() as z.ZodTypeAny;
    else return current;
  }
}

/**
 * Keys the schema does not know (usually misspelled settings, which zod would drop silently),
 * as JSON paths.
 */
export function unknownSettingKeys(json: unknown, schema: z.ZodTypeAny = settingsSchema, path: (string | number)[] = []): (string | number)[][] {
  const inner = unwrap(schema);
  if (inner instanceof z.ZodObject && json !== null && typeof json === 'object' && !Array.isArray(json)) {
    const shape = inner.shape as { [key: string]: z.ZodTypeAny };
    return Object.entries(json as { [key: string]: unknown }).flatMap(([key, value]) => {
      const child = shape[key];
      return child ? unknownSettingKeys(value, child, [...path, key]) : [[...path, key]];
    });
  }
  if (inner instanceof z.ZodArray && Array.isArray(json)) {
    return json.flatMap((value, i) => unknownSettingKeys(value, inner.element as z.ZodTypeAny, [...path, i]));
  }
  return [];
}

/** Validates parsed JSON; every zod issue becomes a report entry naming the JSON path. */
export function validateSettings(json: unknown, file: string, log: IssueLog): ScenarioSettings | null {
  for (const keyPath of unknownSettingKeys(json)) {
    const jsonPath = `$${formatZodPath(keyPath)}`;
    log.add(SettingUnknown, SettingUnknown.message(file, jsonPath), {
      file,
      row: null,
      column: jsonPath,
      value: String(keyPath[keyPath.length - 1] ?? ''),
      expected: 'a setting described in schema/scenario.schema.json',
      severity: 'warning',
      excluded: false,
    });
  }
  const parsed = settingsSchema.safeParse(json);
  if (parsed.success) return parsed.data;
  for (const problem of parsed.error.issues) {
    const jsonPath = `$${formatZodPath(problem.path)}`;
    const value = valueAt(json, problem.path);
    const shown = showValue(value);
    log.add(SettingsInvalid, SettingsInvalid.message(file, jsonPath, shown, problem.message), {
      file,
      row: null,
      column: jsonPath,
      value: value === undefined ? null : JSON.stringify(value),
      expected: problem.message,
      severity: 'error',
      excluded: true,
    });
  }
  return null;
}

/** Settings may be written as JSON (scenario.json) or YAML (scenario.yaml / .yml). */
export function isYamlSettings(file: string, format: string | null = null): boolean {
  return format === 'yaml' || format === 'yml' || /\.ya?ml$/i.test(file);
}

export async function readSettings(absolutePath: string, file: string, log: IssueLog, format: string | null = null): Promise<ScenarioSettings | null> {
  const unreadable = (reason: string): null => {
    log.add(SettingsUnreadable, SettingsUnreadable.message(file, reason), {
      file,
      row: null,
      column: null,
      value: null,
      expected: 'a JSON object of settings',
      severity: 'error',
      excluded: true,
    });
    return null;
  };
  let outcome;
  try {
    const text = await readUtf8Logged(absolutePath, file, log, 'settings saved as UTF-8');
    if (text === null) return null;
    outcome = isYamlSettings(file, format) ? checkParsedValue(parseYaml(text, { maxAliasCount: 100 })) : parseBoundedJson(text);
  } catch (error) {
    return unreadable(error instanceof Error ? error.message : String(error));
  }
  if (!outcome.ok) {
    if (outcome.kind === 'syntax') return unreadable(outcome.reason);
    log.add(JsonTooDeep, JsonTooDeep.message(file, outcome.reason), {
      file,
      row: null,
      column: null,
      value: null,
      expected: `settings nested at most a few levels deep`,
      severity: 'error',
      excluded: true,
    });
    return null;
  }
  if (outcome.forbidden.length > 0) {
    logForbiddenKeys(log, file, outcome.forbidden);
    return null;
  }
  return validateSettings(isolateSettingText(outcome.value, file, log, '$'), file, log);
}

/** Every text setting holding direction controls is reported and kept as an isolate (bidi-controls.ts). */
function isolateSettingText(value: unknown, file: string, log: IssueLog, path: string): unknown {
  if (typeof value === 'string') {
    const controls = bidiControls(value);
    if (controls.length === 0) return value;
    log.add(BidiControlInText, BidiControlInText.message(file, null, path, value, controls.join(', ')), {
      file,
      row: null,
      column: path,
      value,
      expected: 'text without direction controls',
      severity: 'warning',
      excluded: false,
    });
    return isolateBidi(value);
  }
  if (Array.isArray(value)) return value.map((item, i) => isolateSettingText(item, file, log, `${path}[${i}]`));
  if (value === null || typeof value !== 'object') return value;
  const copy: { [key: string]: unknown } = {};
  for (const [key, item] of Object.entries(value)) copy[key] = isolateSettingText(item, file, log, `${path}.${key}`);
  return copy;
}
