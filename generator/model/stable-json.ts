/**
 * The one JSON text of the bulletin model: object keys sorted at every depth (arrays keep their
 * order), 2-space indent, a trailing newline, non-finite numbers as null. write-model.ts writes
 * every model file with it and assemble-with-memo.ts writes a composed bulletin with it, so a
 * bulletin taken from the model memo is byte for byte the file a build without memo writes.
 */

/** JSON with object keys sorted at every depth (arrays keep their order). */
export function stableJson(value: unknown): string {
  return `${JSON.stringify(sortKeys(value), null, 2)}\n`;
}

function sortKeys(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(sortKeys);
  if (value !== null && typeof value === 'object') {
    const out: { [key: string]: unknown } = {};
    for (const key of Object.keys(value).sort()) {
      const child = (value as { [key: string]: unknown })[key];
      if (child !== undefined) out[key] = sortKeys(child);
    }
    return out;
  }
  if (typeof value === 'number' && !Number.isFinite(value)) return null;
  return value;
}
