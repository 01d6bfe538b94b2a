/**
 * A small writer for the NetCDF-3 classic file format (CDF-1), used to make test fixtures and the
 * demo's drift-model trajectory file. No well-kept JavaScript package writes NetCDF, so this one
 * follows the published grammar directly.
 *
 * Format: Unidata, "NetCDF Classic and 64-bit Offset File Formats" (the BNF grammar of the
 * classic format: magic "CDF\x01", numrecs, dim_list, gatt_list, var_list, then the data of the
 * fixed-size variables in order, then the records). All numbers are big-endian; every name,
 * attribute value and fixed-size variable is padded to a multiple of four bytes.
 *
 * Supported: dimensions including one unlimited (record) dimension, global and variable
 * attributes, and the six classic types byte, char, short, int, float, double.
 *
 * @example
 *   const bytes = writeNetcdf3({
 *     dimensions: [{ name: 'obs', size: 3 }],
 *     attributes: [{ name: 'featureType', value: 'trajectory' }],
 *     variables: [{ name: 'lon', type: 'double', dimensions: ['obs'], data: [1, 2, 3] }],
 *   });
 */

export type Netcdf3Type = 'byte' | 'char' | 'short' | 'int' | 'float' | 'double';

export interface Netcdf3Attribute {
  name: string;
  /** A string is written as char; a number or number array as double unless `type` is given. */
  value: string | number | readonly number[];
  type?: Netcdf3Type;
}

export interface Netcdf3Dimension {
  name: string;
  /** A length, or 'unlimited' for the record dimension (its length is the number of records). */
  size: number | 'unlimited';
}

export interface Netcdf3Variable {
  name: string;
  type: Netcdf3Type;
  /** Dimension names, slowest-varying first; an unlimited dimension may only come first. */
  dimensions: readonly string[];
  attributes?: readonly Netcdf3Attribute[];
  /** Values in C (row-major) order; a char variable may be given as a string. */
  data: ArrayLike<number> | string;
}

export interface Netcdf3Spec {
  dimensions: readonly Netcdf3Dimension[];
  attributes?: readonly Netcdf3Attribute[];
  variables: readonly Netcdf3Variable[];
  /** Number of records along the unlimited dimension; inferred from the data when left out. */
  recordCount?: number;
}

// Tags and type codes of the classic grammar.
const NC_DIMENSION = 10;
const NC_VARIABLE = 11;
const NC_ATTRIBUTE = 12;
const typeCode: Record<Netcdf3Type, number> = { byte: 1, char: 2, short: 3, int: 4, float: 5, double: 6 };
const typeSize: Record<Netcdf3Type, number> = { byte: 1, char: 1, short: 2, int: 4, float: 4, double: 8 };

function padTo4(n: number): number {
  return (n + 3) & ~3;
}

/** Growable big-endian byte buffer. */
class ByteSink {
  private bytes = new Uint8Array(1024);
  private view = new DataView(this.bytes.buffer);
  length = 0;

  private ensure(extra: number): void {
    if (this.length + extra <= this.bytes.length) return;
    let size = this.bytes.length * 2;
    while (size < this.length + extra) size *= 2;
    const next = new Uint8Array(size);
    next.set(this.bytes.subarray(0, this.length));
    this.bytes = next;
    this.view = new DataView(next.buffer);
  }

  uint32(value: number): void {
    this.ensure(4);
    this.view.setUint32(this.length, value, false);
    this.length += 4;
  }

  raw(values: Uint8Array): void {
    this.ensure(values.length);
    this.bytes.set(values, this.length);
    this.length += values.length;
  }

  pad(): void {
    const target = padTo4(this.length);
    this.ensure(target - this.length);
    while (this.length < target) this.bytes[this.length++] = 0;
  }

  setUint32At(offset: number, value: number): void {
    this.view.setUint32(offset, value, false);
  }

  result(): Uint8Array {
    return this.bytes.slice(0, this.length);
  }
}

const utf8 = new TextEncoder();

function encodeValues(type: Netcdf3Type, values: ArrayLike<number> | string): Uint8Array {
  if (typeof values === 'string') {
    if (type !== 'char') throw new Error(`writeNetcdf3 requires numbers for a ${type} value`);
    return utf8.encode(values);
  }
  const size = typeSize[type];
  const out = new Uint8Array(values.length * size);
  const view = new DataView(out.buffer);
  for (let i = 0; i < values.length; i++) {
    const v = values[i] ?? 0;
    const at = i * size;
    switch (type) {
      case 'byte':
        view.setInt8(at, v);
        break;
      case 'char':
        view.setUint8(at, v);
        break;
      case 'short':
        view.setInt16(at, v, false);
        break;
      case 'int':
        view.setInt32(at, v, false);
        break;
      case 'float':
        view.setFloat32(at, v, false);
        break;
      case 'double':
        view.setFloat64(at, v, false);
        break;
    }
  }
  return out;
}

function writeName(sink: ByteSink, name: string): void {
  if (name.length === 0) throw new Error('writeNetcdf3 requires non-empty names');
  const bytes = utf8.encode(name);
  sink.uint32(bytes.length);
  sink.raw(bytes);
  sink.pad();
}

function attributeType(attribute: Netcdf3Attribute): Netcdf3Type {
  if (attribute.type) return attribute.type;
  return typeof attribute.value === 'string' ? 'char' : 'double';
}

function writeAttributes(sink: ByteSink, attributes: readonly Netcdf3Attribute[] | undefined): void {
  if (!attributes || attributes.length === 0) {
    sink.uint32(0);
    sink.uint32(0);
    return;
  }
  sink.uint32(NC_ATTRIBUTE);
  sink.uint32(attributes.length);
  for (const attribute of attributes) {
    writeName(sink, attribute.name);
    const type = attributeType(attribute);
    const values = typeof attribute.value === 'number' ? [attribute.value] : attribute.value;
    const bytes = encodeValues(type, values);
    sink.uint32(typeCode[type]);
    sink.uint32(bytes.length / typeSize[type]);
    sink.raw(bytes);
    sink.pad();
  }
}

interface PlannedVariable {
  variable: Netcdf3Variable;
  dimensionIds: number[];
  isRecord: boolean;
  /** Values per record for record variables, total values otherwise. */
  valuesPerSlab: number;
  /** Bytes of one slab before padding. */
  slabBytes: number;
  /** vsize as written in the header: slab size padded to 4 bytes. */
  vsize: number;
  beginFieldOffset: number;
  begin: number;
}

/** Encodes a dataset in the NetCDF-3 classic format and returns the file's bytes. */
export function writeNetcdf3(spec: Netcdf3Spec): Uint8Array {
  const unlimited = spec.dimensions.filter((d) => d.size === 'unlimited');
  if (unlimited.length > 1) throw new Error('writeNetcdf3 allows at most one unlimited dimension');
  const dimIndex = new Map<string, number>();
  spec.dimensions.forEach((d, i) => {
    if (dimIndex.has(d.name)) throw new Error(`writeNetcdf3 found dimension ${d.name} twice`);
    if (d.size !== 'unlimited' && (!Number.isInteger(d.size) || d.size < 1)) {
      throw new Error(`invalid dimension size; not a positive integer: ${d.name}=${String(d.size)}`);
    }
    dimIndex.set(d.name, i);
  });

  const planned: PlannedVariable[] = spec.variables.map((variable) => {
    const dimensionIds = variable.dimensions.map((name) => {
      const id = dimIndex.get(name);
      if (id === undefined) throw new Error(`writeNetcdf3 found unknown dimension ${name} in ${variable.name}`);
      return id;
    });
    const isRecord = variable.dimensions.length > 0 && spec.dimensions[dimensionIds[0] ?? -1]?.size === 'unlimited';
    variable.dimensions.forEach((name, i) => {
      if (i > 0 && spec.dimensions[dimIndex.get(name) ?? -1]?.size === 'unlimited') {
        throw new Error(`writeNetcdf3 allows the unlimited dimension only first (${variable.name})`);
      }
    });
    let valuesPerSlab = 1;
    for (let i = isRecord ? 1 : 0; i < dimensionIds.length; i++) {
      const size = spec.dimensions[dimensionIds[i] ?? -1]?.size;
      valuesPerSlab *= typeof size === 'number' ? size : 1;
    }
    const slabBytes = valuesPerSlab * typeSize[variable.type];
    return { variable, dimensionIds, isRecord, valuesPerSlab, slabBytes, vsize: padTo4(slabBytes), beginFieldOffset: 0, begin: 0 };
  });

  // The record count comes from the data unless given.
  let recordCount = spec.recordCount ?? 0;
  if (spec.recordCount === undefined) {
    for (const p of planned) {
      if (!p.isRecord) continue;
      const n = p.variable.data.length;
      recordCount = Math.max(recordCount, p.valuesPerSlab === 0 ? 0 : Math.ceil(n / p.valuesPerSlab));
    }
  }
  for (const p of planned) {
    const expected = p.isRecord ? p.valuesPerSlab * recordCount : p.valuesPerSlab;
    const dataLength = typeof p.variable.data === 'string' ? utf8.encode(p.variable.data).length : p.variable.data.length;
    if (dataLength > expected) {
      throw new Error(`writeNetcdf3 got ${dataLength} values for ${p.variable.name}; its shape holds ${expected}`);
    }
  }

  const sink = new ByteSink();
  sink.raw(new Uint8Array([0x43, 0x44, 0x46, 0x01])); // "CDF" version 1 (classic)
  sink.uint32(recordCount);

  if (spec.dimensions.length === 0) {
    sink.uint32(0);
    sink.uint32(0);
  } else {
    sink.uint32(NC_DIMENSION);
    sink.uint32(spec.dimensions.length);
    for (const d of spec.dimensions) {
      writeName(sink, d.name);
      sink.uint32(d.size === 'unlimited' ? 0 : d.size);
    }
  }

  writeAttributes(sink, spec.attributes);

  if (planned.length === 0) {
    sink.uint32(0);
    sink.uint32(0);
  } else {
    sink.uint32(NC_VARIABLE);
    sink.uint32(planned.length);
    for (const p of planned) {
      writeName(sink, p.variable.name);
      sink.uint32(p.dimensionIds.length);
      for (const id of p.dimensionIds) sink.uint32(id);
      writeAttributes(sink, p.variable.attributes);
      sink.uint32(typeCode[p.variable.type]);
      sink.uint32(p.vsize);
      p.beginFieldOffset = sink.length;
      sink.uint32(0); // begin, filled in below
    }
  }

  // Fixed-size variables, each padded to four bytes.
  const recordVariables = planned.filter((p) => p.isRecord);
  for (const p of planned) {
    if (p.isRecord) continue;
    p.begin = sink.length;
    const bytes = new Uint8Array(p.slabBytes);
    bytes.set(encodeValues(p.variable.type, p.variable.data));
    sink.raw(bytes);
    sink.pad();
  }

  // Records: one slab of every record variable per record. With a single record variable the
  // classic format stores records unpadded.
  const single = recordVariables.length === 1;
  const encoded = recordVariables.map((p) => encodeValues(p.variable.type, p.variable.data));
  const recordStart = sink.length;
  let offsetInRecord = 0;
  for (const p of recordVariables) {
    p.begin = recordStart + offsetInRecord;
    offsetInRecord += single ? p.slabBytes : p.vsize;
  }
  for (let r = 0; r < recordCount; r++) {
    recordVariables.forEach((p, k) => {
      const slab = new Uint8Array(single ? p.slabBytes : p.vsize);
      const source = encoded[k] ?? new Uint8Array(0);
      const from = r * p.slabBytes;
      slab.set(source.subarray(Math.min(from, source.length), Math.min(from + p.slabBytes, source.length)));
      sink.raw(slab);
    });
  }

  for (const p of planned) sink.setUint32At(p.beginFieldOffset, p.begin);
  if (sink.length > 0x7fffffff) throw new Error('writeNetcdf3 supports files below 2 GiB (classic offsets)');
  return sink.result();
}
