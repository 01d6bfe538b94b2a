/**
 * Writes schema/scenario.schema.json, the JSON Schema of scenario.json, from the zod settings
 * schema (generator/scenario/settings.ts), so editors can check and complete the settings file.
 * Run: npx tsx schema/write-settings-schema.ts   (check only: add --check; exits 1 when stale)
 */
import { readFile, writeFile } from 'node:fs/promises';
import { fileURLToPath } from 'node:url';
import { zodToJsonSchema } from 'zod-to-json-schema';
import { settingsSchema } from '../generator/scenario/settings.ts';

export const settingsSchemaPath = fileURLToPath(new URL('./scenario.schema.json', import.meta.url));

/** The JSON Schema text, with a stable key order and a trailing newline. */
export function settingsJsonSchemaText(): string {
  const schema = zodToJsonSchema(settingsSchema, {
    name: 'WracklineScenarioSettings',
    $refStrategy: 'none',
    // Defaults make a property optional for the person writing the file.
    effectStrategy: 'input',
    target: 'jsonSchema7',
  });
  const document = {
    $id: 'wrackline/scenario.schema.json',
    title: 'Wrackline scenario settings (scenario.json)',
    description: 'Settings of one Wrackline scenario: region, contacts, seasons, published seasons, trend, drift and risk rules.',
    ...schema,
  };
  return `${JSON.stringify(document, null, 2)}\n`;
}

async function main(): Promise<void> {
  const text = settingsJsonSchemaText();
  if (process.argv.includes('--check')) {
    const current = await readFile(settingsSchemaPath, 'utf8').catch(() => '');
    if (current !== text) {
      process.stderr.write(`${settingsSchemaPath} is out of date; run npx tsx schema/write-settings-schema.ts\n`);
      process.exitCode = 1;
    }
    return;
  }
  await writeFile(settingsSchemaPath, text);
  process.stdout.write(`wrote ${settingsSchemaPath}\n`);
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) await main();
