/**
 * Parses the JSON files of a scenario (datapackage.json, settings, segments) within bounds, so a
 * hostile file ends in a clear report entry and never in a stack overflow or a polluted object:
 *
 * - nesting depth is measured on the text before parsing (one pass, no recursion) and capped at
 *   `maxJsonDepth`; size is capped at `maxJsonBytes`;
 * - keys that name the prototype machinery of JavaScript objects (`__proto__`, `constructor`,
 *   `prototype`) are refused wherever they appear; JSON.parse itself makes them own properties,
 *   but a later spread or merge could turn them into prototype changes.
 */
import { KeyForbidden } from '../errors.ts';
import type { IssueLog } from './issue-log.ts';

export const maxJsonDepth = 64;
export const maxJsonBytes = 512 * 1024 * 1024;
export const forbiddenKeys: ReadonlySet<string> = new Set(['__proto__', 'constructor', 'prototype']);

export type JsonOutcome = { ok: true; value: unknown; forbidden: string[] } | { ok: false; kind: 'bounds' | 'syntax'; reason: string };

/** Deepest nesting of arrays and objects in a JSON text, stopping early past `limit`. */
export function jsonDepth(text: string, limit = maxJsonDepth): number {
  let depth = 0;
  let deepest = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (inString) {
      if (c === 92)
        i++; // backslash: skip the escaped character
      else if (c === 34) inString = false;
    } else if (c === 34) inString = true;
    else if (c === 123 || c === 91) {
      depth++;
      if (depth > deepest) {
        deepest = depth;
        if (deepest > limit) return deepest;
      }
    } else if (c === 125 || c === 93) depth--;
  }
  return deepest;
}

/** JSON paths ($.a.b[0]) of every forbidden key in a parsed value; depth is already bounded. */
export function forbiddenKeyPaths(value: unknown, path = '$'): string[] {
  if (Array.isArray(value)) return value.flatMap((item, i) => forbiddenKeyPaths(item, `${path}[${i}]`));
  if (value === null || typeof value !== 'object') return [];
  const found: string[] = [];
  for (const key of Object.keys(value)) {
    const at = /^[A-Za-z_$][\w$]*$/.test(key) ? `${path}.${key}` : `${path}[${JSON.stringify(key)}]`;
    if (forbiddenKeys.has(key)) found.push(at);
    else found.push(...forbiddenKeyPaths((value as { [key: string]: unknown })[key], at));
  }
  return found;
}

/** Checks depth of an already parsed value (YAML), without recursion. */
export function valueDepth(value: unknown, limit = maxJsonDepth): number {
  let deepest = 0;
  const stack: [unknown, number][] = [[value, 0]];
  while (stack.length > 0) {
    const [item, depth] = stack.pop() as [unknown, number];
    if (item === null || typeof item !== 'object') continue;
    if (depth + 1 > deepest) deepest = depth + 1;
    if (deepest > limit) return deepest;
    for (const child of Object.values(item)) stack.push([child, depth + 1]);
  }
  return deepest;
}

/** Parses JSON text within the bounds; a byte-order mark is dropped first. */
export function parseBoundedJson(text: string): JsonOutcome {
  if (text.length > maxJsonBytes) return { ok: false, kind: 'bounds', reason: `larger than ${maxJsonBytes / 1024 / 1024} MB` };
  const clean = text.replace(/^\ufeff/, '');
  if (jsonDepth(clean) > maxJsonDepth) return { ok: false, kind: 'bounds', reason: `nested deeper than ${maxJsonDepth} levels` };
  let value: unknown;
  try {
    value = JSON.parse(clean);
  } catch (error) {
    return { ok: false, kind: 'syntax', reason: error instanceof Error ? error.message : String(error) };
  }
  return { ok: true, value, forbidden: forbiddenKeyPaths(value) };
}

/** The same checks for a value parsed by another reader (YAML settings). */
export function checkParsedValue(value: unknown): JsonOutcome {
  if (valueDepth(value) > maxJsonDepth) return { ok: false, kind: 'bounds', reason: `nested deeper than ${maxJsonDepth} levels` };
  return { ok: true, value, forbidden: forbiddenKeyPaths(value) };
}

/** Puts one error per forbidden key into the log, naming its JSON path (settings and segments files). */
export function logForbiddenKeys(log: IssueLog, file: string, paths: readonly string[]): void {
  for (const path of paths) {
    log.add(KeyForbidden, KeyForbidden.message(file, path), {
      file,
      row: null,
      column: path,
      value: path.split(/[.[]/).pop() ?? null,
      expected: 'no key named __proto__, constructor or prototype',
      severity: 'error',
      excluded: true,
    });
  }
}
