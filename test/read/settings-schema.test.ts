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
    const schema = JSON.parse(settingsJsonSchemaText()) as { definitions: { WracklineScenarioSettings: { required: string[]; properties: { drift: { properties: { arrivalDistanceKm: { default: number } } } } } } };
    const root = schema.definitions.WracklineScenarioSettings;
    expect(root.required.sort()).toEqual(['authorities', 'publications', 'publisher', 'region']);
    expect(root.properties.drift.properties.arrivalDistanceKm.default).toBe(2);
  });

  test('the fixture settings are valid', () => {
    const json = JSON.parse(readFileSync(new URL('../fixtures/inputs/base/scenario.json', import.meta.url), 'utf8')) as unknown;
    expect(settingsSchema.safeParse(json).success).toBe(true);
  });
});
