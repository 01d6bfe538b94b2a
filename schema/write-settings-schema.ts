/**
 * Writes schema/scenario.schema.json, the JSON Schema of scenario.json, from the zod settings
 * schema (generator/scenario/settings.ts), so editors can check and complete the settings file.
 * Run: npx tsx schema/write-settings-schema.ts   (check only: add --check; exits 1 when stale)
 */
import { readFile, writeFile } from 'node:fs/promises';
import { fileURLToPath } from 'node:url';
import { zodToJsonSchema } from 'zod-to-json-schema';
import { settingsSchema } from '../generator/scenario/settings.ts';
import { settingsDocs } from '../generator/scenario/settings-docs.ts';

type SchemaNode = { [key: string]: unknown };

/**
 * Gives every property its description and example from settings-docs.ts (paths with [] for the
 * items of a list). Throws when a property has no entry, so a new setting cannot go undocumented.
 */
export function addDocs(node: SchemaNode, path: string): void {
  const properties = node['properties'] as { [name: string]: SchemaNode } | undefined;
  if (properties) {
    for (const [name, child] of Object.entries(properties)) {
      const childPath = path === '' ? name : `${path}.${name}`;
      const doc = settingsDocs[childPath];
      if (!doc) throw new Error(`schema/scenario.schema.json: setting ${childPath} has no description in generator/scenario/settings-docs.ts`);
      child['description'] = doc.description;
      child['examples'] = [doc.example];
      addDocs(child, childPath);
    }
  }
  const items = node['items'] as SchemaNode | undefined;
  if (items && typeof items === 'object') addDocs(items, `${path}[]`);
  for (const key of ['anyOf', 'oneOf', 'allOf']) {
    const options = node[key] as SchemaNode[] | undefined;
    if (Array.isArray(options)) for (const option of options) addDocs(option, path);
  }
}

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
  const root = (schema as { definitions: { [name: string]: SchemaNode } }).definitions['WracklineScenarioSettings'];
  if (root) addDocs(root, '');
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
