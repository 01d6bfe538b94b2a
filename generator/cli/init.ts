/**
 * `wrackline init DIR`: writes a minimal, valid scenario to start from — settings with every field
 * explained (YAML, comments from generator/scenario/settings-docs.ts), an empty segments file with
 * a worked example in the folder's README, and one empty table per monitoring indicator with its
 * Frictionless Table Schema in datapackage.json. `wrackline check` passes on it as written.
 *
 *   wrackline init DIR [--force]
 *
 * Never overwrites a file unless --force is given. Exit codes: 0 written, 2 bad usage or a file
 * already there.
 */
import { existsSync } from 'node:fs';
import { mkdir, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { commandWriters, parseCommandOptions, usageError } from './command-io.ts';
import { indicatorDefinitions } from '../indicators/index.ts';
import type { IndicatorDefinition } from '../indicators/index.ts';
import { settingsDocs } from '../scenario/settings-docs.ts';
import { segmentKinds, shellfishUses } from '../read/read-segments.ts';

export const initHelp = `Usage: wrackline init DIR [options]

Writes a new, empty scenario into DIR to fill in with your own data:
  datapackage.json   lists every file, with the Table Schema of each table
  scenario.yaml      the settings, every field explained in a comment
  segments.geojson   your coastline segments (empty; see README.md for one)
  tables/*.csv       one empty table per indicator, header only
  README.md          what to fill in, in which order

\`wrackline check --scenario DIR\` passes on it as written.

Options:
  --force          replace files already in DIR
  -h, --help       show this help

Exit codes: 0 written, 2 bad usage or files already there`;

const monitoring = ['beach-litter', 'water-microplastics', 'shellfish-tissue', 'wildlife-reports'] as const;

/** The Table Schema of an indicator's table, from the indicator module's columns. */
export function tableSchemaFor(definition: IndicatorDefinition): object {
  return {
    fields: definition.columns.map((column) => ({
      name: column.name,
      type: column.type,
      ...(column.unit ? { unit: column.unit } : {}),
      ...(column.censorable ? { detectionLimitPrefix: '<' } : {}),
      ...(column.required || column.enum ? { constraints: { ...(column.required ? { required: true } : {}), ...(column.enum ? { enum: column.enum } : {}) } } : {}),
    })),
    missingValues: [''],
    primaryKey: [definition.keyColumn],
    foreignKeys: [{ fields: ['segment_id'], reference: { resource: 'segments', fields: ['id'] } }],
  };
}

export function datapackageFor(name: string): object {
  return {
    profile: 'data-package',
    name,
    title: 'New coast',
    resources: [
      { name: 'settings', role: 'settings', path: 'scenario.yaml', format: 'yaml' },
      { name: 'segments', role: 'segments', path: 'segments.geojson', format: 'geojson' },
      ...monitoring.map((id) => ({
        name: id,
        role: 'indicator',
        indicator: id,
        title: indicatorDefinitions[id].label,
        path: `tables/${id}.csv`,
        profile: 'tabular-data-resource',
        format: 'csv',
        encoding: 'utf-8',
        dialect: { delimiter: ',', header: true },
        schema: tableSchemaFor(indicatorDefinitions[id]),
      })),
    ],
  };
}

function comment(text: string, indent: string): string[] {
  const words = text.split(/\s+/);
  const lines: string[] = [];
  let line = '';
  for (const word of words) {
    if (line.length + word.length + 1 > 92 - indent.length && line !== '') {
      lines.push(`${indent}# ${line}`);
      line = word;
    } else line = line === '' ? word : `${line} ${word}`;
  }
  if (line !== '') lines.push(`${indent}# ${line}`);
  return lines;
}

function doc(key: string): string {
  const entry = settingsDocs[key];
  if (!entry) throw new Error(`no description for setting ${key}`);
  return entry.description;
}

/** Settings as YAML, every field with its description; optional fields are commented out. */
export function settingsYaml(regionId: string, season: string, published: string): string {
  const out: string[] = [
    '# Settings of this coast for Wrackline. Every field is explained above it; fields starting',
    '# with "# " are optional: remove the "# " to use them. JSON Schema: schema/scenario.schema.json',
    '',
  ];
  const field = (key: string, line: string, indent = ''): void => {
    out.push(...comment(doc(key), indent), `${indent}${line}`);
  };
  field('invented', 'invented: false');
  field('region', 'region:');
  field('region.id', `id: ${regionId}`, '  ');
  field('region.name', 'name: "Name of your coast"', '  ');
  field('region.description', 'description: ""', '  ');
  field('publisher', 'publisher:');
  field('publisher.role', 'role: publisher', '  ');
  field('publisher.name', 'name: "Your organisation"', '  ');
  field('publisher.email', '# email: bulletins@example.org', '  ');
  field('publisher.phone', '# phone: "+00 555 0100"', '  ');
  field('publisher.url', '# url: https://example.org/', '  ');
  field('authorities', 'authorities:');
  field('authorities[].role', '- role: shellfish-sanitation', '  ');
  field('authorities[].name', '  name: "Shellfish sanitation authority of your coast"', '  ');
  field('authorities[].phone', '  # phone: "+00 555 0142"', '  ');
  field('authorities[].email', '  # email: office@example.org', '  ');
  field('authorities[].url', '  # url: https://example.org/', '  ');
  field('publications', 'publications:');
  field('publications[].season', `- season: ${season}`, '  ');
  field('publications[].date', `  date: ${published}`, '  ');
  field('monitoringStart', '# monitoringStart: 2018-01-01');
  out.push(...comment(`${doc('seasons')} (${doc('seasons[].id')} ${doc('seasons[].label')} ${doc('seasons[].months')})`, ''));
  out.push(
    '# seasons:',
    '#   - { id: winter, label: Winter, months: [12, 1, 2] }',
    '#   - { id: spring, label: Spring, months: [3, 4, 5] }',
    '#   - { id: summer, label: Summer, months: [6, 7, 8] }',
    '#   - { id: autumn, label: Autumn, months: [9, 10, 11] }',
  );
  field('corrections', '# corrections: []');
  out.push(
    ...comment(
      `${doc('trend')} confidence: ${doc('trend.confidence')} falseDiscoveryRate: ${doc('trend.falseDiscoveryRate')} bootstrapResamples: ${doc('trend.bootstrapResamples')} seed: ${doc('trend.seed')} minYears: ${doc('trend.minYears')} minValues: ${doc('trend.minValues')}`,
      '',
    ),
  );
  out.push('# trend: { confidence: 0.95, falseDiscoveryRate: 0.05, bootstrapResamples: 500, seed: 1, minYears: 5, minValues: 8 }');
  out.push(
    ...comment(
      `${doc('drift')} arrivalDistanceKm: ${doc('drift.arrivalDistanceKm')} zoneDistanceKm: ${doc('drift.zoneDistanceKm')} zoneMinParticles: ${doc('drift.zoneMinParticles')}`,
      '',
    ),
  );
  out.push('# drift: { arrivalDistanceKm: 2, zoneDistanceKm: 4, zoneMinParticles: 25 }');
  field('riskRules', '# riskRules: []');
  field('leftOutAllowed', '# leftOutAllowed: [{ table: tables/beach-litter.csv, share: 0.2, reason: "why the loss is accepted" }]');
  return `${out.join('\n')}\n`;
}

export function readmeFor(): string {
  const example = {
    type: 'Feature',
    properties: { id: 'north-beach', name: 'North Beach', kind: 'beach', shellfish: 'none', place: 'Northtown' },
    geometry: {
      type: 'LineString',
      coordinates: [
        [-1.2051, 50.7202],
        [-1.1987, 50.7231],
        [-1.1902, 50.7244],
      ],
    },
  };
  const tables = monitoring
    .map(
      (id) =>
        `- \`tables/${id}.csv\` — ${indicatorDefinitions[id].label.toLowerCase()}: ${indicatorDefinitions[id].columns.map((c) => `\`${c.name}\`${c.required ? '' : ' (optional)'}`).join(', ')}`,
    )
    .join('\n');
  return `# A new Wrackline scenario

Written by \`wrackline init\`. Fill it in in this order, running \`npx wrackline check --scenario .\`
after each step: it names every problem with its file, row and column.

1. **scenario.yaml** — the settings. Every field is explained in a comment above it.
2. **segments.geojson** — your coastline segments, a GeoJSON FeatureCollection in WGS84
   longitude/latitude. Each feature is a LineString, MultiLineString or Polygon (a closed line
   for the whole shore of an island is fine) with these properties:
   \`id\` (lower-case letters, digits, hyphens; used in web addresses), \`name\`, \`kind\`
   (${segmentKinds.join(', ')}), \`shellfish\` (${shellfishUses.join(', ')}; yes/no are read as
   farmed-and-gathered/none) and, optionally, \`place\`. One feature:

   \`\`\`json
   ${JSON.stringify(example)}
   \`\`\`

3. **tables/** — one CSV table per indicator, header row already written. Add rows; a table
   you have no data for can stay empty or be removed from datapackage.json.

${tables}

   The record-id column (the first one) may be left out: the row number then stands in for it.
   If your own files name columns differently, keep them as they are: describe the file's own
   column names in the Table Schema in datapackage.json and add \`"columnNames"\` to the resource,
   e.g. \`"columnNames": { "mesh_um": "net_mesh_um" }\` (Wrackline's name → your name).
   Dates are YYYY-MM-DD unless the field says otherwise, e.g. \`"format": "%d/%m/%Y"\`.

Drift-model output is optional: add a resource with role \`drift-positions\`,
\`drift-trajectories\` or \`drift-arrivals\` when you have it. Without it, no page mentions a drift model.

Then \`npx wrackline build --scenario . --out site\` publishes the site.
`;
}

/** The folder as the user would type it: relative when below the working folder. */
function shown(dir: string): string {
  const relative = path.relative(process.cwd(), dir);
  return relative === '' ? '.' : relative.startsWith('..') ? dir : relative;
}

export async function runInit(argv: string[], io: { stdout?: (text: string) => void; stderr?: (text: string) => void } = {}): Promise<number> {
  const { stdout, stderr } = commandWriters(io);
  const parsed = parseCommandOptions(
    'init',
    { args: argv, strict: true, allowPositionals: true, options: { force: { type: 'boolean' }, help: { type: 'boolean', short: 'h' } } },
    stderr,
  );
  if (parsed === null) return 2;
  if (parsed.values.help) {
    stdout(initHelp);
    return 0;
  }
  const [target, ...extra] = parsed.positionals;
  if (target === undefined || extra.length > 0)
    return usageError(stderr, 'init', new Error('give exactly one folder to write the new scenario into, e.g. wrackline init my-coast'));
  const dir = path.resolve(target);
  const regionId =
    path
      .basename(dir)
      .toLowerCase()
      .replace(/[^a-z0-9-]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, 63) || 'my-coast';
  const files: [string, string][] = [
    ['datapackage.json', `${JSON.stringify(datapackageFor(regionId), null, 2)}\n`],
    ['scenario.yaml', settingsYaml(regionId, '2026-autumn', '2026-12-01')],
    ['segments.geojson', `${JSON.stringify({ type: 'FeatureCollection', features: [] }, null, 2)}\n`],
    ...monitoring.map((id): [string, string] => [`tables/${id}.csv`, `${indicatorDefinitions[id].columns.map((c) => c.name).join(',')}\n`]),
    ['README.md', readmeFor()],
  ];
  const present = files.filter(([file]) => existsSync(path.join(dir, file))).map(([file]) => file);
  if (present.length > 0 && parsed.values.force !== true) {
    stderr(`wrackline init: ${dir} already holds ${present.join(', ')}; nothing was written. Choose an empty folder, or add --force to replace them.`);
    return 2;
  }
  await mkdir(path.join(dir, 'tables'), { recursive: true });
  for (const [file, text] of files) await writeFile(path.join(dir, file), text);
  stdout(
    [
      `Wrote a new scenario to ${dir}:`,
      ...files.map(([file]) => `  ${file}`),
      '',
      'Next: fill in scenario.yaml, segments.geojson and the tables (README.md there says how), then',
      `  npx wrackline check --scenario ${shown(dir)}`,
    ].join('\n'),
  );
  return 0;
}
