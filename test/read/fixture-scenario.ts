/**
 * Test helper: copies the small invented scenario in test/fixtures/inputs/base to a fresh
 * temporary folder, applies changes to its files, and finds report entries.
 */
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { expect } from 'vitest';
import type { ValidationIssue } from '../../generator/model/types.ts';

export const baseScenario = fileURLToPath(new URL('../fixtures/inputs/base', import.meta.url));

export interface ScenarioChanges {
  /** File path (relative) → new content (string or bytes), or null to delete it. */
  files?: { [path: string]: string | Uint8Array | null };
  /** Edits the parsed datapackage.json in place. */
  descriptor?: (descriptor: { resources: { [key: string]: unknown }[] }) => void;
}

export function scenarioCopy(changes: ScenarioChanges = {}): string {
  const dir = mkdtempSync(join(tmpdir(), 'wrackline-read-'));
  cpSync(baseScenario, dir, { recursive: true });
  for (const [path, content] of Object.entries(changes.files ?? {})) {
    const target = join(dir, path);
    if (content === null) rmSync(target, { force: true });
    else writeFileSync(target, content);
  }
  if (changes.descriptor) {
    const path = join(dir, 'datapackage.json');
    const descriptor = JSON.parse(readFileSync(path, 'utf8')) as { resources: { [key: string]: unknown }[] };
    changes.descriptor(descriptor);
    writeFileSync(path, JSON.stringify(descriptor, null, 2));
  }
  return dir;
}

/** The resource entry of a given name (for descriptor edits). */
export function resourceNamed(descriptor: { resources: { [key: string]: unknown }[] }, name: string): { [key: string]: unknown } {
  const found = descriptor.resources.find((r) => r['name'] === name);
  if (!found) throw new Error(`no resource ${name}`);
  return found;
}

/**
 * Finds the one issue with the given catalogue code and checks that its message names the file,
 * the row and the column (when the issue has them), as every report entry must.
 */
export function expectIssue(
  issues: readonly ValidationIssue[],
  want: { code: string; file: string; row?: number | null; column?: string | null; severity?: 'error' | 'warning'; excluded?: boolean },
): ValidationIssue {
  const matches = issues.filter(
    (i) => i.code === want.code && i.file === want.file && (want.row === undefined || i.row === want.row) && (want.column === undefined || i.column === want.column),
  );
  expect(matches, `no ${want.code} issue for ${want.file} among:\n${issues.map((i) => `${i.code}: ${i.message}`).join('\n')}`).toHaveLength(1);
  const found = matches[0] as ValidationIssue;
  expect(found.message).toContain(want.file);
  if (found.row !== null) expect(found.message).toMatch(new RegExp(`\\brow ${found.row}\\b`));
  // A table cell is named "column X"; a setting is named by its JSON path, "at $.path".
  if (found.column !== null) expect(found.message.includes(`column ${found.column}`) || found.message.includes(`at ${found.column}`), found.message).toBe(true);
  if (want.severity) expect(found.severity).toBe(want.severity);
  if (want.excluded !== undefined) expect(found.excluded).toBe(want.excluded);
  return found;
}

export const beachHeader = 'survey_id,segment_id,date,surveyed_length_m,items,plastic_items,area_m2';
