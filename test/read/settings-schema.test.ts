// The published JSON Schema of scenario.json must match the zod schema it is generated from, and
// the fixture and demo settings must validate against the zod schema.
import { readFileSync } from 'node:fs';
import { describe, expect, test } from 'vitest';
import { settingsJsonSchemaText, settingsSchemaPath } from '../../schema/write-settings-schema.ts';
import { settingsSchema } from '../../generator/scenario/settings.ts';

describe('schema/scenario.schema.json', () => {
  test('is up to date with generator/scenario/settings.ts (regenerate with npx tsx schema/write-settings-schema.ts)', () => {
    expect(readFileSync(settingsSchemaPath, 'utf8')).toBe(settingsJsonSchemaText());
  });

  test('lists the required settings and the drift defaults', () => {
    const schema = JSON.parse(settingsJsonSchemaText()) as {
      definitions: { WracklineScenarioSettings: { required: string[]; properties: { drift: { properties: { arrivalDistanceKm: { default: number } } } } } };
    };
    const root = schema.definitions.WracklineScenarioSettings;
    expect(root.required.sort()).toEqual(['authorities', 'publications', 'publisher', 'region']);
    expect(root.properties.drift.properties.arrivalDistanceKm.default).toBe(2);
  });

  test('scenario.schema.json: every field has a description and an example; default risk rules stated', () => {
    type Node = { properties?: { [name: string]: Node }; items?: Node; anyOf?: Node[]; description?: string; examples?: unknown[] };
    const schema = JSON.parse(settingsJsonSchemaText()) as { definitions: { WracklineScenarioSettings: Node } };
    const missing: string[] = [];
    const walk = (node: Node, path: string): void => {
      for (const [name, child] of Object.entries(node.properties ?? {})) {
        const at = path === '' ? name : `${path}.${name}`;
        if (!child.description || !child.examples || child.examples.length === 0) missing.push(at);
        walk(child, at);
      }
      if (node.items) walk(node.items, `${path}[]`);
      for (const option of node.anyOf ?? []) walk(option, path);
    };
    const root = schema.definitions.WracklineScenarioSettings;
    walk(root, '');
    expect(missing).toEqual([]);
    expect(root.properties?.['riskRules']?.description).toContain('the built-in rules apply');
    expect(root.properties?.['seasons']?.description).toContain('winter 2026 is December 2025 to February 2026');
    expect(root.properties?.['monitoringStart']?.description).toContain('records dated earlier are left out');
  });

  test('the fixture settings are valid', () => {
    const json = JSON.parse(readFileSync(new URL('../fixtures/inputs/base/scenario.json', import.meta.url), 'utf8')) as unknown;
    expect(settingsSchema.safeParse(json).success).toBe(true);
  });
});
