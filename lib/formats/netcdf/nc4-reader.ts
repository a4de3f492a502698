/**
 * NetCDF-4 / HDF5 reader on h5wasm's Node build: opens the path without loading the file and
 * reads hyperslabs with `slice`, which inflates only the chunks needed. NetCDF-4 dimensions are
 * HDF5 dimension scales; the netCDF-4 bookkeeping attributes are hidden from the raw attributes.
 * Flat files (root group) only. h5wasm is loaded on first use (importing it costs ~600 MB of
 * RSS), so reading NetCDF3 never pays for it.
 */
import type H5 from 'h5wasm/node';
import { FormatError, UnsupportedError } from '../../errors.js';
import type { Attributes, AttrValue, Dimension, Dtype, RawDataset, RawVariable, TypedArray } from '../../grid/types.js';
import { HDF5_FILTERS } from './hdf5-filters.js';
import { hdf5Superblock } from './hdf5-superblock.js';
import { open as openFile } from 'node:fs/promises';

/** Offsets where an HDF5 superblock may start (0, 512, 1024, 2048 …). */
async function checkSuperblock(path: string): Promise<void> {
  let fh;
  try {
    fh = await openFile(path, 'r');
  } catch (e) {
    throw new FormatError(`${path}: cannot open: ${(e as Error).message}`, { file: path, cause: e });
  }
  try {
    const size = (await fh.stat()).size;
    for (let at = 0; at + 8 <= size && at <= 1 << 20; at = at === 0 ? 512 : at * 2) {
      const head = new Uint8Array(96);
      const { bytesRead } = await fh.read(head, 0, 96, at);
      const sig = [0x89, 0x48, 0x44, 0x46, 0x0d, 0x0a, 0x1a, 0x0a];
      if (bytesRead < 8 || !sig.every((b, i) => head[i] === b)) continue;
      const sb = hdf5Superblock(head.subarray(0, bytesRead), 0);
      if (sb !== undefined && at + sb.endOfFile > size) {
        throw new FormatError(
          `${path}: truncated file: the HDF5 superblock says the file ends at byte ${at + sb.endOfFile}, it has ${size} bytes`,
          { file: path, offset: size },
        );
      }
      return;
    }
    throw new FormatError(`${path}: no HDF5 signature found`, { file: path, offset: 0 });
  } finally {
    await fh.close();
  }
}

type H5Api = typeof H5;
type H5File = InstanceType<H5Api['File']>;
type H5Dataset = InstanceType<H5Api['Dataset']>;
type H5Metadata = H5Dataset['metadata'];

let readyApi: Promise<H5Api> | undefined;
/** h5wasm, ready, with the compression plugins of h5wasm-plugins on its search path (once). */
export function h5wasmReady(): Promise<H5Api> {
  readyApi ??= (async () => {
    const h5wasm = (await import('h5wasm/node')).default;
    const { install_local_plugins } = await import('h5wasm-plugins');
    install_local_plugins(await h5wasm.ready);
    return h5wasm;
  })();
  return readyApi;
}

/** Attributes that are netCDF-4 / HDF5 dimension-scale bookkeeping, not user attributes. */
const HIDDEN_ATTRIBUTES = new Set([
  'CLASS',
  'NAME',
  'REFERENCE_LIST',
  'DIMENSION_LIST',
  '_Netcdf4Coordinates',
  '_Netcdf4Dimid',
  '_nc3_strict',
  '_NCProperties',
  '_SuperblockVersion',
  '_IsNetcdf4',
]);
const NOT_A_VARIABLE = 'This is a netCDF dimension but not a netCDF variable';
/** A single read must stay well under h5wasm's 2 GiB wasm heap. */
const MAX_READ_BYTES = 512 * 1024 * 1024;
/** HDF5 reports an unlimited maxshape as H5S_UNLIMITED (2^64 − 1). */
const UNLIMITED_THRESHOLD = 2 ** 53;

function dtypeOf(m: H5Metadata): Dtype | undefined {
  if (m.type === 0) {
    const bits = m.size * 8;
    if (![8, 16, 32, 64].includes(bits)) return undefined;
    return `${m.signed ? 'int' : 'uint'}${bits}` as Dtype;
  }
  if (m.type === 1) return m.size === 4 ? 'float32' : m.size === 8 ? 'float64' : undefined;
  if (m.type === 3) return m.size === 1 && !m.vlen ? 'char' : 'string';
  return undefined;
}

function attrValue(v: unknown): AttrValue | undefined {
  if (typeof v === 'string' || typeof v === 'number' || typeof v === 'bigint') return v;
  if (typeof v === 'boolean') return v ? 1 : 0;
  if (ArrayBuffer.isView(v)) {
    if (v instanceof BigInt64Array || v instanceof BigUint64Array) {
      const arr = Array.from(v as BigInt64Array);
      const safe = arr.every((b) => b >= BigInt(Number.MIN_SAFE_INTEGER) && b <= BigInt(Number.MAX_SAFE_INTEGER));
      if (safe) return arr.length === 1 ? Number(arr[0]) : arr.map(Number);
      return arr.length === 1 ? arr[0] : arr;
    }
    const arr = Array.from(v as unknown as ArrayLike<number>);
    return arr.length === 1 ? arr[0] : arr;
  }
  if (Array.isArray(v) && v.every((x) => typeof x === 'string')) return v.length === 1 ? (v[0] as string) : (v as string[]);
  if (Array.isArray(v) && v.every((x) => typeof x === 'number')) return v.length === 1 ? (v[0] as number) : (v as number[]);
  return undefined;
}

function attrsOf(obj: { attrs: Record<string, { value: unknown; metadata: H5Metadata }> }): {
  attrs: Attributes;
  types: Record<string, string>;
} {
  const out: Record<string, AttrValue> = {};
  const types: Record<string, string> = {};
  for (const [name, a] of Object.entries(obj.attrs)) {
    if (HIDDEN_ATTRIBUTES.has(name)) continue;
    let value: unknown;
    try {
      value = a.value;
    } catch {
      continue;
    }
    const v = attrValue(value);
    if (v !== undefined) {
      out[name] = v;
      types[name] = dtypeOf(a.metadata) ?? 'unknown';
    }
  }
  return { attrs: out, types };
}

function baseName(p: string): string {
  const i = p.lastIndexOf('/');
  return i >= 0 ? p.slice(i + 1) : p;
}

function isDimensionScale(d: H5Dataset): boolean {
  const cls = d.attrs.CLASS;
  if (cls === undefined) return false;
  try {
    return String(cls.value) === 'DIMENSION_SCALE';
  } catch {
    return false;
  }
}

/** Opens a NetCDF-4 (HDF5) file as a raw dataset (no CF decoding). */
export async function openNetcdf4Raw(path: string): Promise<RawDataset> {
  await checkSuperblock(path);
  const h5wasm = await h5wasmReady();
  let f: H5File;
  try {
    f = new h5wasm.File(path, 'r');
  } catch (e) {
    throw new FormatError(`${path}: cannot open as NetCDF-4/HDF5: ${(e as Error).message}`, { file: path, cause: e });
  }
  try {
    return buildDataset(h5wasm, f, path);
  } catch (e) {
    f.close();
    if (e instanceof FormatError || e instanceof UnsupportedError) throw e;
    throw new FormatError(`${path}: cannot read the NetCDF-4/HDF5 structure (damaged file?): ${(e as Error).message}`, { file: path, cause: e });
  }
}

function buildDataset(h5wasm: H5Api, f: H5File, path: string): RawDataset {
  const rootAttrs = attrsOf(f as unknown as Parameters<typeof attrsOf>[0]);
  const classic = f.attrs._nc3_strict !== undefined;
  const datasets: H5Dataset[] = [];
  for (const key of f.keys()) {
    let e: unknown;
    try {
      e = f.get(key);
    } catch {
      continue;
    }
    if (e instanceof h5wasm.Dataset) datasets.push(e);
  }
  const dims = new Map<string, Dimension>();
  for (const d of datasets) {
    if (!isDimensionScale(d)) continue;
    const shape = d.shape ?? [];
    const max = d.metadata.maxshape ?? shape;
    dims.set(baseName(d.path), { name: baseName(d.path), size: shape[0] ?? 0, unlimited: (max[0] ?? 0) > UNLIMITED_THRESHOLD });
  }
  const variables = new Map<string, RawVariable>();
  for (const d of datasets) {
    const name = baseName(d.path);
    if (isDimensionScale(d)) {
      const nameAttr = d.attrs.NAME;
      let label = '';
      try {
        label = nameAttr ? String(nameAttr.value) : '';
      } catch {
        label = '';
      }
      if (label.startsWith(NOT_A_VARIABLE)) continue;
    }
    const m = d.metadata;
    const dtype = dtypeOf(m);
    const shape = (d.shape ?? []).slice();
    const dimNames: string[] = [];
    for (let i = 0; i < shape.length; i++) {
      let scales: string[] = [];
      if (isDimensionScale(d) && shape.length === 1) scales = [d.path];
      else {
        try {
          scales = d.get_attached_scales(i);
        } catch {
          scales = [];
        }
      }
      const dn = scales.length > 0 ? baseName(scales[0]) : `phony_dim_${i}_${shape[i]}`;
      if (!dims.has(dn)) dims.set(dn, { name: dn, size: shape[i], unlimited: false });
      dimNames.push(dn);
    }
    const { attrs, types } = attrsOf(d as unknown as Parameters<typeof attrsOf>[0]);
    const filters = d.filters.map((x) => ({ id: x.id, name: x.name }));
    const checkFilters = (): void => {
      for (const flt of filters) {
        if (HDF5_FILTERS[flt.id] === undefined) {
          throw new UnsupportedError(
            `${path}: variable ${name} is compressed with HDF5 filter ${flt.id} (${flt.name || 'unnamed'}), which frostgrid cannot decode`,
            'HDF5 filter',
            flt.id,
            { file: path, variable: name },
          );
        }
      }
    };
    const esize = m.size;
    const read = async (start: readonly number[], count: readonly number[]): Promise<TypedArray> => {
      if (dtype === undefined || dtype === 'string' || dtype === 'char') {
        throw new UnsupportedError(`${path}: variable ${name} has an HDF5 type frostgrid does not read numerically`, 'HDF5 type', m.type, {
          file: path,
          variable: name,
        });
      }
      checkFilters();
      if (start.length !== shape.length || count.length !== shape.length) {
        throw new RangeError(`variable ${name} has ${shape.length} dimensions, got start/count of ${start.length}/${count.length}`);
      }
      let n = 1;
      for (let i = 0; i < shape.length; i++) {
        if (start[i] < 0 || count[i] < 0 || start[i] + count[i] > shape[i]) {
          throw new RangeError(`variable ${name}: index ${start[i]}+${count[i]} outside dimension ${dimNames[i]} of ${shape[i]}`);
        }
        n *= count[i];
      }
      if (n * esize > MAX_READ_BYTES) {
        throw new RangeError(`variable ${name}: a read of ${n * esize} bytes is too large for one h5wasm call; read smaller slices`);
      }
      if (n === 0) return emptyOf(dtype);
      const ranges = start.map((s, i) => [s, s + count[i]] as [number, number]);
      const out = shape.length === 0 ? d.value : d.slice(ranges);
      if (!ArrayBuffer.isView(out)) {
        throw new FormatError(`${path}: h5wasm returned no numeric data for variable ${name}`, { file: path, variable: name });
      }
      return out as TypedArray;
    };
    const readText =
      dtype === 'string' || dtype === 'char'
        ? async (): Promise<string[]> => {
            const v = d.value;
            if (typeof v === 'string') return [v];
            if (Array.isArray(v)) return v.map(String);
            return [];
          }
        : undefined;
    variables.set(name, {
      name,
      dims: dimNames,
      shape,
      dtype: dtype ?? 'string',
      attrs,
      storage: {
        byteOrder: m.littleEndian ? 'little' : 'big',
        chunks: m.chunks ?? undefined,
        filters: filters.map((x) => x.name || String(x.id)),
        filterIds: filters.map((x) => x.id),
        attributeTypes: types,
        hdf5Path: d.path,
      },
      read,
      readText,
    });
  }
  let closed = false;
  return {
    path,
    format: classic ? 'netcdf4-classic' : 'netcdf4',
    dims: [...dims.values()],
    variables,
    attrs: rootAttrs.attrs,
    async close() {
      if (!closed) {
        closed = true;
        f.close();
      }
    },
  };
}

function emptyOf(dtype: Dtype): TypedArray {
  switch (dtype) {
    case 'int8': return new Int8Array(0);
    case 'uint8': return new Uint8Array(0);
    case 'int16': return new Int16Array(0);
    case 'uint16': return new Uint16Array(0);
    case 'int32': return new Int32Array(0);
    case 'uint32': return new Uint32Array(0);
    case 'int64': return new BigInt64Array(0);
    case 'uint64': return new BigUint64Array(0);
    case 'float64': return new Float64Array(0);
    default: return new Float32Array(0);
  }
}
