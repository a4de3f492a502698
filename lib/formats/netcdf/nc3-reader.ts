/**
 * NetCDF classic reader (CDF-1, CDF-2, CDF-5): header from netcdfjs or our own parser, data by
 * positioned reads of the byte ranges a hyperslab needs, decoded big-endian straight into typed
 * arrays. Never loads the whole file.
 *
 * Layout (NetCDF "File Format Specifications"): a non-record variable is stored contiguously at
 * `begin`; record r of a record variable is at `begin + r·recsize`, where recsize is the sum of
 * the record variables' vsize — except that a file with exactly one record variable stores its
 * records unpadded, back to back.
 */
import { open as openFile, type FileHandle } from 'node:fs/promises';
import { FormatError } from '../../errors.js';
import type { Attributes, AttrValue, Dimension, FormatName, RawDataset, RawVariable, TypedArray } from '../../grid/types.js';
import {
  HeaderGrammarError,
  HeaderNeedsMoreBytes,
  nc3Version,
  netcdfjsHeader,
  parseNc3Header,
  type Nc3Attribute,
  type Nc3Header,
  type Nc3VariableEntry,
} from './nc3-header.js';
import { hyperslabRuns } from './hyperslab.js';

const FORMAT_OF_VERSION: Readonly<Record<1 | 2 | 5, FormatName>> = {
  1: 'netcdf3-classic',
  2: 'netcdf3-64bit-offset',
  5: 'netcdf3-cdf5',
};

function attrsOf(list: readonly Nc3Attribute[]): Attributes {
  const out: Record<string, AttrValue> = {};
  for (const a of list) out[a.name] = a.value;
  return out;
}

/** The stored type of each attribute, kept in `storage.attributeTypes` (CF rules depend on it). */
function attrTypesOf(list: readonly Nc3Attribute[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (const a of list) out[a.name] = a.type.dtype;
  return out;
}

async function readHeader(fh: FileHandle, path: string, fileSize: number): Promise<{ header: Nc3Header; parser: string }> {
  let n = Math.min(4096, fileSize);
  for (;;) {
    const buf = new Uint8Array(n);
    await fh.read(buf, 0, n, 0);
    const version = nc3Version(buf);
    if (version === undefined) throw new FormatError(`${path}: not a NetCDF classic file (bad magic number)`, { file: path, offset: 0 });
    try {
      if (version !== 5) {
        try {
          return { header: netcdfjsHeader(buf), parser: 'netcdfjs' };
        } catch (e) {
          // netcdfjs cannot do offsets past 4 GiB; our parser can, and reports real grammar errors.
          if (!(e instanceof HeaderGrammarError)) throw e;
        }
      }
      return { header: parseNc3Header(buf), parser: 'frostgrid' };
    } catch (e) {
      if (e instanceof HeaderNeedsMoreBytes) {
        if (n >= fileSize) {
          throw new FormatError(`${path}: truncated file: the header continues past the end of the file (${fileSize} bytes)`, {
            file: path,
            offset: fileSize,
          });
        }
        n = Math.min(n * 2, fileSize);
        continue;
      }
      if (e instanceof HeaderGrammarError) {
        throw new FormatError(`${path}: bad NetCDF header at byte ${e.at}: ${e.message}`, { file: path, offset: e.at, cause: e });
      }
      throw e;
    }
  }
}

function elementCount(shape: readonly number[]): number {
  let n = 1;
  for (const s of shape) n *= s;
  return n;
}

function typedArrayFor(dtype: string, buf: Buffer, n: number): TypedArray {
  // `buf` is a fresh, unpooled Buffer (byteOffset 0), so every view below is aligned.
  switch (dtype) {
    case 'int8':
      return new Int8Array(buf.buffer, buf.byteOffset, n);
    case 'uint8':
    case 'char':
      return new Uint8Array(buf.buffer, buf.byteOffset, n);
    case 'int16':
      buf.swap16();
      return new Int16Array(buf.buffer, buf.byteOffset, n);
    case 'uint16':
      buf.swap16();
      return new Uint16Array(buf.buffer, buf.byteOffset, n);
    case 'int32':
      buf.swap32();
      return new Int32Array(buf.buffer, buf.byteOffset, n);
    case 'uint32':
      buf.swap32();
      return new Uint32Array(buf.buffer, buf.byteOffset, n);
    case 'float32':
      buf.swap32();
      return new Float32Array(buf.buffer, buf.byteOffset, n);
    case 'float64':
      buf.swap64();
      return new Float64Array(buf.buffer, buf.byteOffset, n);
    case 'int64':
      buf.swap64();
      return new BigInt64Array(buf.buffer, buf.byteOffset, n);
    case 'uint64':
      buf.swap64();
      return new BigUint64Array(buf.buffer, buf.byteOffset, n);
    default:
      throw new FormatError(`unknown stored type ${dtype}`);
  }
}

/** Opens a NetCDF classic file as a raw dataset (no CF decoding). */
export async function openNetcdf3Raw(path: string): Promise<RawDataset> {
  let fh: FileHandle;
  try {
    fh = await openFile(path, 'r');
  } catch (e) {
    throw new FormatError(`${path}: cannot open: ${(e as Error).message}`, { file: path, cause: e });
  }
  try {
    const fileSize = (await fh.stat()).size;
    const { header, parser } = await readHeader(fh, path, fileSize);
    return buildDataset(fh, path, fileSize, header, parser);
  } catch (e) {
    await fh.close();
    throw e;
  }
}

function buildDataset(fh: FileHandle, path: string, fileSize: number, h: Nc3Header, parser: string): RawDataset {
  const recVars = h.vars.filter((v) => v.isRecord);
  const recDimIndex = h.dims.findIndex((d) => d.unlimited);
  const unpaddedSize = (v: Nc3VariableEntry): number =>
    v.type.size * elementCount(v.dimIds.slice(v.isRecord ? 1 : 0).map((id) => h.dims[id].size));
  const recsize = recVars.length === 1 ? unpaddedSize(recVars[0]) : recVars.reduce((s, v) => s + v.vsize, 0);
  let numrecs: number;
  if (h.numrecs === 'streaming') {
    const first = recVars.length > 0 ? Math.min(...recVars.map((v) => v.begin)) : fileSize;
    numrecs = recsize > 0 ? Math.floor((fileSize - first) / recsize) : 0;
  } else {
    numrecs = h.numrecs;
  }
  const dims: Dimension[] = h.dims.map((d, i) => ({ name: d.name, size: i === recDimIndex ? numrecs : d.size, unlimited: d.unlimited }));

  // Every variable's bytes must lie inside the file.
  for (const v of h.vars) {
    const bytes = unpaddedSize(v);
    const count = v.isRecord ? numrecs : 1;
    if (bytes === 0 || count === 0) continue;
    if (v.begin >= fileSize) {
      throw new FormatError(
        `${path}: header points past the end of the file: variable ${v.name} begins at byte ${v.begin}, the file has ${fileSize} bytes`,
        { file: path, offset: v.begin, variable: v.name },
      );
    }
    const end = v.begin + (count - 1) * (v.isRecord ? recsize : 0) + bytes;
    if (end > fileSize) {
      throw new FormatError(
        `${path}: truncated file: variable ${v.name} needs bytes up to ${end}, the file has ${fileSize} bytes`,
        { file: path, offset: fileSize, variable: v.name },
      );
    }
  }

  const variables = new Map<string, RawVariable>();
  for (const v of h.vars) {
    const shape = v.dimIds.map((id) => dims[id].size);
    const dimNames = v.dimIds.map((id) => dims[id].name);
    const esize = v.type.size;
    // Byte stride of each dimension.
    const strides = new Array<number>(shape.length);
    let acc = esize;
    for (let i = shape.length - 1; i >= 0; i--) {
      if (i === 0 && v.isRecord) strides[i] = recsize;
      else {
        strides[i] = acc;
        acc *= shape[i];
      }
    }
    const read = async (start: readonly number[], count: readonly number[]): Promise<TypedArray> => {
      if (start.length !== shape.length || count.length !== shape.length) {
        throw new RangeError(`variable ${v.name} has ${shape.length} dimensions, got start/count of ${start.length}/${count.length}`);
      }
      for (let i = 0; i < shape.length; i++) {
        if (start[i] < 0 || count[i] < 0 || start[i] + count[i] > shape[i]) {
          throw new RangeError(`variable ${v.name}: index ${start[i]}+${count[i]} outside dimension ${dimNames[i]} of ${shape[i]}`);
        }
      }
      const n = elementCount(count);
      const buf = Buffer.allocUnsafeSlow(n * esize);
      if (n > 0) {
        const runs = hyperslabRuns(shape, strides, esize, start, count, v.isRecord);
        let pos = 0;
        for (const off of runs.offsets) {
          const at = v.begin + off;
          const { bytesRead } = await fh.read(buf, pos, runs.runBytes, at);
          if (bytesRead !== runs.runBytes) {
            throw new FormatError(`${path}: truncated file while reading variable ${v.name} at byte ${at}`, {
              file: path,
              offset: at,
              variable: v.name,
            });
          }
          pos += runs.runBytes;
        }
      }
      return typedArrayFor(v.type.dtype, buf, n);
    };
    const readText =
      v.type.dtype === 'char'
        ? async (): Promise<string[]> => {
            const all = (await read(shape.map(() => 0), shape)) as Uint8Array;
            const len = shape.length > 0 ? shape[shape.length - 1] : 1;
            const out: string[] = [];
            const dec = new TextDecoder('utf-8');
            for (let o = 0; o < all.length; o += len) {
              let e = o + len;
              while (e > o && all[e - 1] === 0) e--;
              out.push(dec.decode(all.subarray(o, e)));
            }
            return out;
          }
        : undefined;
    variables.set(v.name, {
      name: v.name,
      dims: dimNames,
      shape,
      dtype: v.type.dtype,
      attrs: attrsOf(v.attrs),
      storage: {
        byteOrder: 'big',
        begin: v.begin,
        vsize: v.vsize,
        record: v.isRecord,
        recordSize: v.isRecord ? recsize : undefined,
        attributeTypes: attrTypesOf(v.attrs),
        headerParser: parser,
      },
      read,
      readText,
    });
  }
  let closed = false;
  return {
    path,
    format: FORMAT_OF_VERSION[h.version],
    dims,
    variables,
    attrs: attrsOf(h.attrs),
    async close() {
      if (!closed) {
        closed = true;
        await fh.close();
      }
    },
  };
}
