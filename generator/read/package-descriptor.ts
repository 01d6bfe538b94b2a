/**
 * Reads datapackage.json, the single entry point of a scenario (Frictionless Data Package), and
 * turns its resources into typed entries. Custom resource properties `role` and `indicator` say
 * what each file is; tables carry a Frictionless Table Schema (fields, missingValues, primaryKey,
 * foreignKeys) and a CSV dialect (with our custom `decimalChar`). Our custom `columnNames` maps
 * our column names to the file's own ({"mesh_um": "net_mesh_um"}), so a file is used as it is.
 *
 * An unreadable descriptor throws ScenarioError; a single bad resource becomes a report issue and
 * is skipped.
 */
import { readUtf8File, type Utf8Outcome } from './utf8-text.ts';
import { isAbsolute, normalize } from 'node:path';
import { z } from 'zod';
import { FileNotUtf8, KeyForbidden, PackageDescriptorUnreadable, ResourceInvalid, ScenarioError } from '../errors.ts';
import { isIndicatorId } from '../indicators/index.ts';
import type { IndicatorId } from '../model/types.ts';
import type { IssueLog } from './issue-log.ts';
import { formatZodPath } from './zod-issues.ts';
import { parseBoundedJson } from './json-input.ts';

export const resourceRoles = ['settings', 'segments', 'land', 'indicator', 'drift-positions', 'drift-trajectories', 'drift-arrivals', 'drift-end-positions'] as const;
export type ResourceRole = (typeof resourceRoles)[number];

const fieldSchema = z
  .object({
    name: z.string().min(1),
    type: z.string().default('string'),
    format: z.string().optional(),
    unit: z.string().optional(),
    detectionLimitPrefix: z.string().min(1).optional(),
    constraints: z
      .object({
        required: z.boolean().optional(),
        unique: z.boolean().optional(),
        minimum: z.union([z.number(), z.string()]).optional(),
        maximum: z.union([z.number(), z.string()]).optional(),
        exclusiveMinimum: z.number().optional(),
        enum: z.array(z.union([z.string(), z.number()])).optional(),
      })
      .passthrough()
      .optional(),
  })
  .passthrough();

const keyList = z.union([
  z
    .string()
    .min(1)
    .transform((s) => [s]),
  z.array(z.string().min(1)),
]);

export const tableSchemaSchema = z
  .object({
    fields: z.array(fieldSchema).min(1),
    // Frictionless default: only the empty string means "no value".
    missingValues: z.array(z.string()).default(['']),
    primaryKey: keyList.optional(),
    foreignKeys: z
      .array(
        z.object({
          fields: keyList,
          reference: z.object({ resource: z.string(), fields: keyList }),
        }),
      )
      .default([]),
  })
  .passthrough();

export const dialectSchema = z
  .object({
    delimiter: z.string().length(1).default(','),
    header: z.boolean().default(true),
    quoteChar: z.string().length(1).default('"'),
    decimalChar: z.string().length(1).default('.'),
  })
  .passthrough()
  .default({});

const resourceSchema = z
  .object({
    name: z.string().min(1),
    role: z.enum(resourceRoles),
    indicator: z.string().optional(),
    path: z.string().min(1),
    format: z.string().optional(),
    compression: z.string().optional(),
    encoding: z.string().optional(),
    dialect: dialectSchema,
    schema: tableSchemaSchema.optional(),
    columnNames: z.record(z.string().min(1), z.string().min(1)).default({}),
  })
  .passthrough();

export type FieldDescriptor = z.infer<typeof fieldSchema>;
export type TableSchema = z.infer<typeof tableSchemaSchema>;
export type Dialect = z.infer<typeof dialectSchema>;

export interface ResourceEntry {
  /** Position in the resources array, from 0. */
  index: number;
  name: string;
  role: ResourceRole;
  indicator: IndicatorId | null;
  /** Path relative to the scenario folder, with forward slashes. */
  path: string;
  format: string | null;
  compression: string | null;
  encoding: string;
  dialect: Dialect;
  schema: TableSchema | null;
  /** Our column name → the column's name in the file. */
  columnNames: { [ours: string]: string };
}

export interface PackageDescriptor {
  name: string | null;
  title: string | null;
  description: string | null;
  resources: ResourceEntry[];
}

/** A resource path must stay inside the scenario folder. */
export function safeRelativePath(path: string): string | null {
  if (isAbsolute(path) || /^[a-z]+:/i.test(path) || path.includes('\0')) return null;
  const clean = normalize(path).replace(/\\/g, '/');
  if (clean === '..' || clean.startsWith('../') || clean.startsWith('/')) return null;
  return clean;
}

export async function readPackageDescriptor(descriptorPath: string, displayName: string, log: IssueLog): Promise<PackageDescriptor> {
  let read: Utf8Outcome;
  try {
    read = await readUtf8File(descriptorPath);
  } catch (error) {
    const reason = error instanceof Error ? error.message : String(error);
    throw new ScenarioError(PackageDescriptorUnreadable, PackageDescriptorUnreadable.message(displayName, reason));
  }
  if (!read.ok) throw new ScenarioError(FileNotUtf8, FileNotUtf8.message(displayName, read.line, read.sample));
  const text = read.text;
  const outcome = parseBoundedJson(text);
  if (!outcome.ok) throw new ScenarioError(PackageDescriptorUnreadable, PackageDescriptorUnreadable.message(displayName, outcome.reason));
  if (outcome.forbidden.length > 0) {
    throw new ScenarioError(PackageDescriptorUnreadable, KeyForbidden.message(displayName, outcome.forbidden.join(', ')));
  }
  const json = outcome.value;
  if (typeof json !== 'object' || json === null || Array.isArray(json) || !Array.isArray((json as { resources?: unknown }).resources)) {
    throw new ScenarioError(PackageDescriptorUnreadable, PackageDescriptorUnreadable.message(displayName, 'no "resources" array'));
  }
  const descriptor = json as { name?: unknown; title?: unknown; description?: unknown; resources: unknown[] };
  const resources: ResourceEntry[] = [];
  const names = new Set<string>();
  descriptor.resources.forEach((raw, index) => {
    const at = `resources[${index}]`;
    const parsed = resourceSchema.safeParse(raw);
    if (!parsed.success) {
      for (const problem of parsed.error.issues) {
        const path = `${at}${formatZodPath(problem.path)}`;
        log.add(ResourceInvalid, ResourceInvalid.message(displayName, path, problem.message), {
          file: displayName,
          row: null,
          column: path,
          value: null,
          expected: problem.message,
          severity: 'error',
          excluded: true,
        });
      }
      return;
    }
    const resource = parsed.data;
    const path = safeRelativePath(resource.path);
    if (path === null) {
      const message = ResourceInvalid.message(displayName, `${at}.path`, `path ${JSON.stringify(resource.path)} leaves the scenario folder; expected a relative path inside it`);
      log.add(ResourceInvalid, message, {
        file: displayName,
        row: null,
        column: `${at}.path`,
        value: resource.path,
        expected: 'a relative path inside the scenario folder',
        severity: 'error',
        excluded: true,
      });
      return;
    }
    let indicator: IndicatorId | null = null;
    if (resource.role === 'indicator') {
      if (!isIndicatorId(resource.indicator) || resource.indicator === 'drift-arrivals') {
        const message = ResourceInvalid.message(
          displayName,
          `${at}.indicator`,
          `${JSON.stringify(resource.indicator ?? null)} is not a monitoring indicator; expected beach-litter, water-microplastics, shellfish-tissue or wildlife-reports`,
        );
        log.add(ResourceInvalid, message, {
          file: displayName,
          row: null,
          column: `${at}.indicator`,
          value: resource.indicator ?? null,
          expected: 'a known indicator id',
          severity: 'error',
          excluded: true,
        });
        return;
      }
      indicator = resource.indicator;
      if (!resource.schema) {
        const message = ResourceInvalid.message(displayName, `${at}.schema`, 'an indicator table needs a Table Schema; none is given');
        log.add(ResourceInvalid, message, {
          file: displayName,
          row: null,
          column: `${at}.schema`,
          value: null,
          expected: 'a Table Schema with fields',
          severity: 'error',
          excluded: true,
        });
        return;
      }
    }
    if (names.has(resource.name)) {
      const message = ResourceInvalid.message(displayName, `${at}.name`, `resource name ${JSON.stringify(resource.name)} is used twice; expected unique names`);
      log.add(ResourceInvalid, message, {
        file: displayName,
        row: null,
        column: `${at}.name`,
        value: resource.name,
        expected: 'a unique resource name',
        severity: 'error',
        excluded: true,
      });
      return;
    }
    names.add(resource.name);
    resources.push({
      index,
      name: resource.name,
      role: resource.role,
      indicator,
      path,
      format: resource.format ?? null,
      compression: resource.compression ?? (path.endsWith('.gz') ? 'gz' : null),
      encoding: resource.encoding ?? 'utf-8',
      dialect: resource.dialect,
      schema: resource.schema ?? null,
      columnNames: resource.columnNames,
    });
  });
  return {
    name: typeof descriptor.name === 'string' ? descriptor.name : null,
    title: typeof descriptor.title === 'string' ? descriptor.title : null,
    description: typeof descriptor.description === 'string' ? descriptor.description : null,
    resources,
  };
}
