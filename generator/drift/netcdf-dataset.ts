/**
 * One in-memory view of a NetCDF file, whichever format it came in: NetCDF-3 (classic or 64-bit
 * offset, read with netcdfjs) or NetCDF-4 (HDF5, read with h5wasm). The CF trajectory decoder
 * works on this view only.
 */
import { open } from 'node:fs/promises';
import { NetCDFReader } from 'netcdfjs';
import { InputValidationError, NetcdfUnreadable } from '../errors.ts';

export type AttributeValue = string | number | readonly number[];

export interface NetcdfVariable {
  name: string;
  dimensions: readonly string[];
  shape: readonly number[];
  attributes: { readonly [name: string]: AttributeValue };
  /** Character data (char variables), one string per outer index, trailing NULs removed. */
  isText: boolean;
  readNumbers(): ArrayLike<number>;
  readStrings(): string[];
}

export interface NetcdfDataset {
  format: 'netcdf3' | 'netcdf4';
  attributes: { readonly [name: string]: AttributeValue };
  dimensions: { readonly [name: string]: number };
  variables: readonly NetcdfVariable[];
  close(): void;
}

/** HDF5's error stack (many lines, see loadH5) cut to its last, most specific, reason. */
export function shortReason(reason: string): string {
  if (!reason.includes('HDF5')) return reason;
  const minors = [...reason.matchAll(/minor: (.+)/g)].map((match) => match[1]!.trim());
  return minors.length > 0 ? `HDF5: ${minors[minors.length - 1]}` : (reason.split('\n')[0] ?? reason);
}

function unreadable(file: string, reason: string): InputValidationError {
  return netcdfUnreadable(file, shortReason(reason));
}

/** The error for a NetCDF file that cannot be read (to its end), naming the file and the reason. */
export function netcdfUnreadable(file: string, reason: string): InputValidationError {
  return new InputValidationError(NetcdfUnreadable, {
    file,
    row: null,
    column: null,
    value: null,
    expected: 'a complete NetCDF-3 or NetCDF-4 file',
    message: NetcdfUnreadable.message(file, reason),
    severity: 'error',
    excluded: true,
    code: NetcdfUnreadable.name,
    hint: NetcdfUnreadable.hint,
  });
}

function product(values: readonly number[]): number {
  return values.reduce((a, b) => a * b, 1);
}

/** Opens a NetCDF-3 file from its bytes; throws InputValidationError when it is truncated or corrupt. */
export function openNetcdf3(bytes: Uint8Array, file: string): NetcdfDataset {
  let reader: NetCDFReader;
  try {
    reader = new NetCDFReader(bytes);
  } catch (error) {
    throw unreadable(file, error instanceof Error ? error.message : String(error));
  }
  const header = reader.header;
  const dims = header.dimensions ?? [];
  const records = header.recordDimension.length;
  const dimensionSize = (id: number): number => {
    const d = dims[id];
    if (!d) return 0;
    return d.size === 0 && header.recordDimension.id === id ? records : d.size;
  };
  // The file must hold every byte its header promises.
  let needed = 0;
  for (const variable of header.variables ?? []) {
    const end = variable.record ? variable.offset + (records > 0 ? (records - 1) * (header.recordDimension.recordStep ?? 0) + variable.size : 0) : variable.offset + variable.size;
    if (end > needed) needed = end;
  }
  if (needed > bytes.length) throw unreadable(file, `the file has ${bytes.length} bytes but its header describes ${needed}`);
  // Each variable's shape must fit the bytes its header reserves (a damaged header can claim anything).
  const typeBytes: { [type: string]: number } = { byte: 1, char: 1, short: 2, int: 4, float: 4, double: 8 };
  for (const variable of header.variables ?? []) {
    const perSlab = variable.dimensions.reduce((n, id, i) => (variable.record && i === 0 ? n : n * (dims[id]?.size ?? 0)), 1);
    const bytesPerValue = typeBytes[variable.type];
    if (bytesPerValue === undefined || perSlab * bytesPerValue > variable.size || variable.dimensions.some((id) => dims[id] === undefined)) {
      throw unreadable(file, `the header of variable ${variable.name} is inconsistent (type ${variable.type}, ${perSlab} values in ${variable.size} bytes)`);
    }
  }
  const attributes: { [name: string]: AttributeValue } = {};
  for (const a of header.globalAttributes ?? []) attributes[a.name] = a.value as AttributeValue;
  const dimensions: { [name: string]: number } = {};
  dims.forEach((d, i) => {
    dimensions[d.name] = dimensionSize(i);
  });
  const variables: NetcdfVariable[] = (header.variables ?? []).map((variable) => {
    const dimensionNames = variable.dimensions.map((id) => dims[id]?.name ?? `dim${id}`);
    const shape = variable.dimensions.map((id) => dimensionSize(id));
    const count = product(shape);
    const variableAttributes: { [name: string]: AttributeValue } = {};
    for (const a of variable.attributes as { name: string; value: AttributeValue }[]) variableAttributes[a.name] = a.value;
    const readFlat = (): unknown[] => {
      let data: unknown;
      try {
        data = reader.getDataVariable(variable.name);
      } catch (error) {
        throw unreadable(file, `variable ${variable.name}: ${error instanceof Error ? error.message : String(error)}`);
      }
      const flat = (data as unknown[]).flat(4) as unknown[];
      return flat.slice(0, count);
    };
    return {
      name: variable.name,
      dimensions: dimensionNames,
      shape,
      attributes: variableAttributes,
      isText: variable.type === 'char',
      readNumbers() {
        const flat = readFlat();
        const out = new Float64Array(flat.length);
        for (let i = 0; i < flat.length; i++) {
          const v = flat[i];
          let n = typeof v === 'number' ? v : typeof v === 'string' ? v.charCodeAt(0) || 0 : Number.NaN;
          // netcdfjs reads NC_BYTE unsigned; the classic format's byte is signed.
          if (variable.type === 'byte' && n > 127) n -= 256;
          out[i] = n;
        }
        return out;
      },
      readStrings() {
        const flat = readFlat().map((v) => (typeof v === 'string' ? v : String.fromCharCode(Number(v) || 0)));
        const width = shape.length > 1 ? (shape[shape.length - 1] ?? 1) : count;
        const out: string[] = [];
        for (let i = 0; i < flat.length; i += Math.max(1, width))
          out.push(
            flat
              .slice(i, i + width)
              .join('')
              .replace(/\0+$/, ''),
          );
        return out;
      },
    };
  });
  return { format: 'netcdf3', attributes, dimensions, variables, close() {} };
}

type H5Module = typeof import('h5wasm/node');
let h5Promise: Promise<H5Module> | null = null;

async function loadH5(): Promise<H5Module> {
  if (!h5Promise) {
    h5Promise = (async () => {
      const h5 = await import('h5wasm/node');
      const module = await h5.ready;
      // HDF5 prints its whole error stack to stderr by default; raise it as an exception instead,
      // so a damaged file becomes our own validation error (below) and nothing else is printed.
      module.activate_throwing_error_handler();
      return h5;
    })();
  }
  return h5Promise;
}

function toAttributeValue(value: unknown): AttributeValue {
  if (typeof value === 'string' || typeof value === 'number') return value;
  if (typeof value === 'bigint') return Number(value);
  if (ArrayBuffer.isView(value) || Array.isArray(value)) {
    const list = Array.from(value as ArrayLike<unknown>);
    if (list.length === 1) return toAttributeValue(list[0]);
    if (list.every((v) => typeof v === 'string')) return list.join('');
    return list.map((v) => Number(v));
  }
  return String(value);
}

/** Opens a NetCDF-4 (HDF5) file at a path; throws InputValidationError when it cannot be read. */
export async function openNetcdf4(absolutePath: string, file: string): Promise<NetcdfDataset> {
  const h5 = await loadH5();
  let handle: InstanceType<H5Module['File']>;
  try {
    handle = new h5.File(absolutePath, 'r');
  } catch (error) {
    throw unreadable(file, error instanceof Error ? error.message : String(error));
  }
  try {
    const attributes: { [name: string]: AttributeValue } = {};
    for (const [name, attribute] of Object.entries(handle.attrs)) attributes[name] = toAttributeValue(attribute.value);
    const dimensions: { [name: string]: number } = {};
    const variables: NetcdfVariable[] = [];
    for (const name of handle.keys()) {
      const entity = handle.get(name);
      if (!entity || !(entity instanceof h5.Dataset)) continue;
      const dataset = entity;
      const shape = dataset.shape ?? [];
      const dimensionNames = shape.map((size, i) => {
        let scale: string | undefined;
        try {
          scale = dataset.get_attached_scales(i)[0];
        } catch {
          scale = undefined;
        }
        const scaleName = scale ? scale.replace(/^\//, '') : null;
        // A dimension scale is itself a dataset; a 1-D variable that is its own scale names its dimension.
        const dimName = scaleName ?? (shape.length === 1 && dataset.get_scale_name() !== null ? name : `length-${size}`);
        dimensions[dimName] = size;
        return dimName;
      });
      const variableAttributes: { [attr: string]: AttributeValue } = {};
      for (const [attrName, attribute] of Object.entries(dataset.attrs)) {
        if (attrName === 'DIMENSION_LIST' || attrName === 'REFERENCE_LIST' || attrName === 'CLASS' || attrName === 'NAME') continue;
        try {
          variableAttributes[attrName] = toAttributeValue(attribute.value);
        } catch {
          // attributes h5wasm cannot decode (references) are not needed
        }
      }
      const isText = dataset.dtype === 'S' || (typeof dataset.dtype === 'string' && dataset.dtype.startsWith('S'));
      variables.push({
        name,
        dimensions: dimensionNames,
        shape,
        attributes: variableAttributes,
        isText,
        readNumbers() {
          let value: unknown;
          try {
            value = dataset.value;
          } catch (error) {
            throw unreadable(file, `variable ${name}: ${error instanceof Error ? error.message : String(error)}`);
          }
          if (ArrayBuffer.isView(value)) {
            const array = value as unknown as ArrayLike<number | bigint>;
            const out = new Float64Array(array.length);
            for (let i = 0; i < array.length; i++) out[i] = Number(array[i]);
            return out;
          }
          if (Array.isArray(value)) return Float64Array.from(value.flat(4).map((v) => Number(v)));
          if (typeof value === 'number' || typeof value === 'bigint') return Float64Array.of(Number(value));
          return new Float64Array(0);
        },
        readStrings() {
          const value = dataset.value as unknown;
          if (Array.isArray(value)) return value.flat(4).map((v) => String(v).replace(/\0+$/, ''));
          if (typeof value === 'string') return [value];
          if (ArrayBuffer.isView(value)) return Array.from(value as unknown as ArrayLike<number>, (v) => String(v));
          return [];
        },
      });
    }
    return { format: 'netcdf4', attributes, dimensions, variables, close: () => handle.close() };
  } catch (error) {
    try {
      handle.close();
    } catch {
      // already unusable
    }
    if (error instanceof InputValidationError) throw error;
    throw unreadable(file, error instanceof Error ? error.message : String(error));
  }
}

const hdf5Signature = [0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a];

/** Opens a NetCDF file by its first bytes: "CDF" → NetCDF-3, the HDF5 signature → NetCDF-4. */
export async function openNetcdf(absolutePath: string, file: string): Promise<NetcdfDataset> {
  let head: Buffer;
  try {
    const handle = await open(absolutePath, 'r');
    try {
      head = Buffer.alloc(8);
      const { bytesRead } = await handle.read(head, 0, 8, 0);
      head = head.subarray(0, bytesRead);
    } finally {
      await handle.close();
    }
  } catch (error) {
    throw unreadable(file, error instanceof Error ? error.message : String(error));
  }
  if (head.length >= 4 && head[0] === 0x43 && head[1] === 0x44 && head[2] === 0x46) {
    if (head[3] !== 1 && head[3] !== 2) throw unreadable(file, `NetCDF-3 version byte ${head[3]} is not supported (classic 1 or 64-bit offset 2)`);
    const { readFile } = await import('node:fs/promises');
    return openNetcdf3(new Uint8Array(await readFile(absolutePath)), file);
  }
  if (head.length === 8 && hdf5Signature.every((b, i) => head[i] === b)) return openNetcdf4(absolutePath, file);
  throw unreadable(file, head.length === 0 ? 'the file is empty' : 'it starts neither with "CDF" (NetCDF-3) nor with the HDF5 signature (NetCDF-4)');
}
