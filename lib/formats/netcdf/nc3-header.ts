/**
 * NetCDF classic header parsing (CDF-1 classic, CDF-2 64-bit offset, CDF-5 64-bit data).
 *
 * Grammar (NetCDF "File Format Specifications"):
 *   header   = magic numrecs dim_list gatt_list var_list
 *   magic    = 'C' 'D' 'F' VERSION            VERSION = 1 | 2 | 5
 *   numrecs  = NON_NEG | STREAMING            4 bytes (8 in CDF-5)
 *   dim_list = ABSENT | NC_DIMENSION nelems [dim …]      dim = name dim_length
 *   att_list = ABSENT | NC_ATTRIBUTE nelems [attr …]     attr = name nc_type nelems [values] (padded to 4)
 *   var_list = ABSENT | NC_VARIABLE nelems [var …]
 *   var      = name nelems [dimid …] vatt_list nc_type vsize begin
 * Counts, lengths, dimids and vsize are 4 bytes (8 in CDF-5); begin is 4 bytes in CDF-1 and 8 in
 * CDF-2/CDF-5. Everything is big-endian.
 *
 * `parseNc3Header` is our own parser for all three versions. `netcdfjsHeader` asks netcdfjs for
 * CDF-1/CDF-2 headers, which it parses correctly; it cannot do CDF-5 or offsets past 4 GiB, and
 * it returns byte attributes unsigned, which the adapter corrects.
 */
import { NetCDFReader } from 'netcdfjs';
import type { AttrValue } from '../../grid/types.js';
import { NC3_TYPES, NC_ATTRIBUTE, NC_DIMENSION, NC_STREAMING, NC_VARIABLE, type Nc3Type } from './nc3-types.js';

export interface Nc3Attribute {
  readonly name: string;
  readonly type: Nc3Type;
  readonly value: AttrValue;
}

export interface Nc3Dimension {
  readonly name: string;
  /** Declared length; 0 for the record dimension (its length is numrecs). */
  readonly size: number;
  readonly unlimited: boolean;
}

export interface Nc3VariableEntry {
  readonly name: string;
  readonly dimIds: readonly number[];
  readonly attrs: readonly Nc3Attribute[];
  readonly type: Nc3Type;
  /** Bytes of the variable (one record of it for record variables), padded to 4, as written. */
  readonly vsize: number;
  /** Byte offset of the variable's data (of its first record for record variables). */
  readonly begin: number;
  readonly isRecord: boolean;
}

export interface Nc3Header {
  readonly version: 1 | 2 | 5;
  /** Number of records, or 'streaming' when the header says "count them from the file size". */
  readonly numrecs: number | 'streaming';
  readonly dims: readonly Nc3Dimension[];
  readonly attrs: readonly Nc3Attribute[];
  readonly vars: readonly Nc3VariableEntry[];
}

/** Raised (internally) when the bytes given end before the header does. */
export class HeaderNeedsMoreBytes extends Error {
  constructor(readonly at: number) {
    super(`header continues past byte ${at}`);
  }
}

/** Raised for bytes that break the header grammar; the caller adds the file name. */
export class HeaderGrammarError extends Error {
  constructor(
    message: string,
    readonly at: number,
  ) {
    super(message);
  }
}

class Cursor {
  pos = 0;
  constructor(
    private readonly b: Uint8Array,
    private readonly view: DataView,
  ) {}
  need(n: number): void {
    if (this.pos + n > this.b.length) throw new HeaderNeedsMoreBytes(this.pos + n);
  }
  u32(): number {
    this.need(4);
    const v = this.view.getUint32(this.pos, false);
    this.pos += 4;
    return v;
  }
  u64(): number {
    this.need(8);
    const v = this.view.getBigUint64(this.pos, false);
    if (v > BigInt(Number.MAX_SAFE_INTEGER)) throw new HeaderGrammarError(`64-bit value ${v} is too large`, this.pos);
    this.pos += 8;
    return Number(v);
  }
  bytes(n: number): Uint8Array {
    this.need(n);
    const out = this.b.subarray(this.pos, this.pos + n);
    this.pos += n;
    return out;
  }
  pad(n: number): void {
    const rem = n % 4;
    if (rem !== 0) this.bytes(4 - rem);
  }
}

const utf8 = new TextDecoder('utf-8');

function trimNul(s: string): string {
  let end = s.length;
  while (end > 0 && s.charCodeAt(end - 1) === 0) end--;
  return s.slice(0, end);
}

/** Decodes `n` big-endian values of `type` from `bytes` into an attribute value. */
export function decodeAttrValues(type: Nc3Type, bytes: Uint8Array, n: number): AttrValue {
  if (type.dtype === 'char') return trimNul(utf8.decode(bytes.subarray(0, n)));
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const nums: number[] = [];
  const bigs: bigint[] = [];
  for (let i = 0; i < n; i++) {
    const o = i * type.size;
    switch (type.dtype) {
      case 'int8': nums.push(dv.getInt8(o)); break;
      case 'uint8': nums.push(dv.getUint8(o)); break;
      case 'int16': nums.push(dv.getInt16(o, false)); break;
      case 'uint16': nums.push(dv.getUint16(o, false)); break;
      case 'int32': nums.push(dv.getInt32(o, false)); break;
      case 'uint32': nums.push(dv.getUint32(o, false)); break;
      case 'float32': nums.push(dv.getFloat32(o, false)); break;
      case 'float64': nums.push(dv.getFloat64(o, false)); break;
      case 'int64': bigs.push(dv.getBigInt64(o, false)); break;
      case 'uint64': bigs.push(dv.getBigUint64(o, false)); break;
      default: break;
    }
  }
  if (type.dtype === 'int64' || type.dtype === 'uint64') {
    const safe = bigs.every((b) => b >= BigInt(Number.MIN_SAFE_INTEGER) && b <= BigInt(Number.MAX_SAFE_INTEGER));
    if (safe) {
      const asNum = bigs.map(Number);
      return asNum.length === 1 ? asNum[0] : asNum;
    }
    return bigs.length === 1 ? bigs[0] : bigs;
  }
  return nums.length === 1 ? nums[0] : nums;
}

function typeOf(code: number, version: 1 | 2 | 5, at: number): Nc3Type {
  const t = NC3_TYPES[code];
  if (t === undefined || (t.cdf5Only && version !== 5)) {
    throw new HeaderGrammarError(`nc_type ${code} is not valid in CDF-${version}`, at);
  }
  return t;
}

/** The format version of a file from its first 4 bytes, or undefined when it is not CDF-1/2/5. */
export function nc3Version(head: Uint8Array): 1 | 2 | 5 | undefined {
  if (head.length < 4 || head[0] !== 0x43 || head[1] !== 0x44 || head[2] !== 0x46) return undefined;
  const v = head[3];
  return v === 1 || v === 2 || v === 5 ? v : undefined;
}

/** Parses a classic header from the first bytes of a file (throws HeaderNeedsMoreBytes if short). */
export function parseNc3Header(bytes: Uint8Array): Nc3Header {
  const version = nc3Version(bytes);
  if (version === undefined) throw new HeaderGrammarError('not a NetCDF classic file (magic is not CDF\\1, \\2 or \\5)', 0);
  const c = new Cursor(bytes, new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength));
  c.pos = 4;
  const big = version === 5;
  const count = (): number => (big ? c.u64() : c.u32());
  const name = (): string => {
    const n = count();
    const s = utf8.decode(c.bytes(n));
    c.pad(n);
    return s;
  };
  let numrecs: number | 'streaming';
  if (big) {
    c.need(8);
    const raw = new DataView(bytes.buffer, bytes.byteOffset + 4, 8).getBigUint64(0, false);
    numrecs = raw === 0xffffffffffffffffn ? 'streaming' : Number(raw);
    c.pos += 8;
  } else {
    const raw = c.u32();
    numrecs = raw === NC_STREAMING ? 'streaming' : raw;
  }
  const list = (tag: number, what: string): number => {
    const at = c.pos;
    const t = c.u32();
    const n = count();
    if (t === 0 && n === 0) return 0;
    if (t !== tag) throw new HeaderGrammarError(`expected the ${what} list tag ${tag}, found ${t}`, at);
    return n;
  };
  const attList = (): Nc3Attribute[] => {
    const n = list(NC_ATTRIBUTE, 'attribute');
    const out: Nc3Attribute[] = [];
    for (let i = 0; i < n; i++) {
      const an = name();
      const at = c.pos;
      const type = typeOf(c.u32(), version, at);
      const nelems = count();
      const nbytes = nelems * type.size;
      const value = decodeAttrValues(type, c.bytes(nbytes), nelems);
      c.pad(nbytes);
      out.push({ name: an, type, value });
    }
    return out;
  };
  const ndims = list(NC_DIMENSION, 'dimension');
  const dims: Nc3Dimension[] = [];
  for (let i = 0; i < ndims; i++) {
    const dn = name();
    const size = count();
    dims.push({ name: dn, size, unlimited: size === 0 });
  }
  const attrs = attList();
  const nvars = list(NC_VARIABLE, 'variable');
  const vars: Nc3VariableEntry[] = [];
  for (let i = 0; i < nvars; i++) {
    const vn = name();
    const nd = count();
    const dimIds: number[] = [];
    for (let d = 0; d < nd; d++) {
      const at = c.pos;
      const id = count();
      if (id >= dims.length) throw new HeaderGrammarError(`variable ${vn} refers to dimension id ${id} of ${dims.length}`, at);
      dimIds.push(id);
    }
    const vatts = attList();
    const at = c.pos;
    const type = typeOf(c.u32(), version, at);
    const vsize = count();
    const begin = version === 1 ? c.u32() : c.u64();
    vars.push({ name: vn, dimIds, attrs: vatts, type, vsize, begin, isRecord: nd > 0 && dims[dimIds[0]].unlimited });
  }
  return { version, numrecs, dims, attrs, vars };
}

interface NetcdfjsAttr {
  name: string;
  type: string;
  value: number | string | number[];
}

const NETCDFJS_TYPE: Readonly<Record<string, number>> = { byte: 1, char: 2, short: 3, int: 4, float: 5, double: 6 };

function fromNetcdfjsAttr(a: NetcdfjsAttr): Nc3Attribute {
  const type = NC3_TYPES[NETCDFJS_TYPE[a.type]];
  let value: AttrValue = a.value;
  if (type.dtype === 'int8') {
    // netcdfjs returns byte attributes as unsigned octets.
    const arr = (Array.isArray(a.value) ? a.value : [a.value as number]).map((x) => (x > 127 ? x - 256 : x));
    value = arr.length === 1 ? arr[0] : arr;
  }
  return { name: a.name, type, value };
}

/**
 * Parses a CDF-1/CDF-2 header with netcdfjs (given a prefix of the file: its constructor only
 * reads the header). Throws HeaderNeedsMoreBytes when the prefix is too short.
 */
export function netcdfjsHeader(bytes: Uint8Array): Nc3Header {
  const version = nc3Version(bytes);
  if (version !== 1 && version !== 2) throw new HeaderGrammarError('netcdfjs reads only CDF-1 and CDF-2 headers', 3);
  let r: NetCDFReader;
  try {
    r = new NetCDFReader(bytes);
  } catch (e) {
    if (e instanceof RangeError) throw new HeaderNeedsMoreBytes(bytes.length + 1);
    throw new HeaderGrammarError(e instanceof Error ? e.message : String(e), 0);
  }
  const h = r.header;
  const recId = h.recordDimension.id;
  const dims: Nc3Dimension[] = h.dimensions.map((d, i) => ({ name: d.name, size: i === recId ? 0 : d.size, unlimited: i === recId }));
  const vars: Nc3VariableEntry[] = h.variables.map((v) => ({
    name: v.name,
    dimIds: v.dimensions,
    attrs: (v.attributes as NetcdfjsAttr[]).map(fromNetcdfjsAttr),
    type: NC3_TYPES[NETCDFJS_TYPE[v.type]],
    vsize: v.size,
    begin: v.offset,
    isRecord: v.record,
  }));
  const numrecs = h.recordDimension.length === NC_STREAMING ? 'streaming' : h.recordDimension.length;
  return { version, numrecs, dims, attrs: (h.globalAttributes as NetcdfjsAttr[]).map(fromNetcdfjsAttr), vars };
}
