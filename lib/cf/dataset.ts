/**
 * From a raw dataset to decoded fields: axes are recognised, coordinates read and converted
 * (pressure to Pa, time to calendar dates), every data variable on a (time?, expver?, level?,
 * lat, lon) grid becomes a Field whose values go through the CF coders (decode.ts) one
 * (time, level) slice at a time. Quantities are recognised (quantity.ts), units converted to SI
 * (units.ts) and relative humidity's phase convention inferred (rh-convention.ts).
 */
import { DecodeError } from '../errors.js';
import type { FormatName } from '../grid/types.js';
import { recogniseAxis, type AxisKind } from '../grid/axes.js';
import { regularLatLonGrid } from '../grid/horizontal.js';
import type {
  Attributes,
  Field,
  GridDataset,
  Quantity,
  RawDataset,
  RawVariable,
  RhConvention,
  TimeCoordinate,
  TypedArray,
  WarningSink,
} from '../grid/types.js';
import { textAttr } from './attrs.js';
import { decodeValues, valueCodec, type ValueCodec } from './decode.js';
import { recogniseQuantity } from './quantity.js';
import { inferRhConvention } from './rh-convention.js';
import { decodeTimeCoordinate, isTimeUnits } from './time.js';
import { toSI, type SiConversion } from './units.js';

export interface DecodeOptions {
  /** Variable names the user gives explicitly, by quantity (overrides recognition). */
  readonly variables?: Partial<Record<Quantity, string>>;
  readonly rhConvention?: RhConvention;
  readonly warn?: WarningSink;
}

interface Axis {
  readonly kind: AxisKind;
  readonly dim: string;
  readonly size: number;
  readonly variable?: RawVariable;
}

const NUMERIC = new Set(['int8', 'uint8', 'int16', 'uint16', 'int32', 'uint32', 'int64', 'uint64', 'float32', 'float64']);

async function readWhole(v: RawVariable): Promise<Float64Array> {
  const data = await v.read(
    v.shape.map(() => 0),
    v.shape,
  );
  const out = new Float64Array(data.length);
  if (data instanceof BigInt64Array || data instanceof BigUint64Array) for (let i = 0; i < data.length; i++) out[i] = Number(data[i]);
  else out.set(data as Exclude<TypedArray, BigInt64Array | BigUint64Array>);
  return out;
}

/** Coordinate values decoded with the CF coders (a packed coordinate is rare but legal). */
async function readCoordinate(v: RawVariable, file: string): Promise<Float64Array> {
  const { codec } = valueCodec(v, { file, variable: v.name }, () => ({ units: '', unitScale: 1, unitOffset: 0 }));
  if (!codec.scaleOffset.packed) return readWhole(v);
  const stored = await v.read(
    v.shape.map(() => 0),
    v.shape,
  );
  const f32 = new Float32Array(stored.length);
  decodeValues(stored, codec, f32);
  return Float64Array.from(f32);
}

export async function decodeDataset(raw: RawDataset, options: DecodeOptions = {}): Promise<GridDataset> {
  const file = raw.path;
  const notes: string[] = [];
  const note = (s: string): void => {
    notes.push(s);
    options.warn?.(s);
  };
  // --- axes: one per dimension, from its coordinate variable ---------------------------------
  const axes = new Map<string, Axis>();
  for (const d of raw.dims) {
    const cv = raw.variables.get(d.name);
    if (cv !== undefined && cv.dims.length === 1 && cv.dims[0] === d.name) {
      axes.set(d.name, { kind: recogniseAxis(d.name, cv.attrs, isTimeUnits), dim: d.name, size: d.size, variable: cv });
    } else {
      axes.set(d.name, { kind: d.name.toLowerCase() === 'expver' ? 'expver' : 'other', dim: d.name, size: d.size });
    }
  }
  const coordCache = new Map<string, Float64Array>();
  const coord = async (a: Axis): Promise<Float64Array> => {
    let c = coordCache.get(a.dim);
    if (c === undefined) {
      c = await readCoordinate(a.variable!, file);
      coordCache.set(a.dim, c);
    }
    return c;
  };
  const timeCache = new Map<string, TimeCoordinate[]>();
  const times = async (a: Axis): Promise<TimeCoordinate[]> => {
    let t = timeCache.get(a.dim);
    if (t === undefined) {
      const values = await coord(a);
      t = decodeTimeCoordinate(values, a.variable!.attrs, a.variable!.name, file).map((valid) => ({ valid }));
      timeCache.set(a.dim, t);
    }
    return t;
  };
  // A scalar time variable (no dimension) applies to every field without a time axis.
  let scalarTime: TimeCoordinate[] = [];
  for (const v of raw.variables.values()) {
    if (v.dims.length === 0 && NUMERIC.has(v.dtype) && isTimeUnits(textAttr(v.attrs, 'units'))) {
      const vals = await readWhole(v);
      scalarTime = decodeTimeCoordinate(vals, v.attrs, v.name, file).map((valid) => ({ valid }));
      break;
    }
  }

  // --- user-named variables ------------------------------------------------------------------
  const userNamed = new Map<string, Quantity>();
  for (const [q, name] of Object.entries(options.variables ?? {}) as [Quantity, string][]) {
    if (!raw.variables.has(name)) {
      throw new DecodeError(`${file}: variable ${name} named for ${q} is not in the file (it has: ${[...raw.variables.keys()].join(', ')})`, {
        file,
        variable: name,
      });
    }
    userNamed.set(name, q);
  }
  const userQuantities = new Set(userNamed.values());

  // --- fields ----------------------------------------------------------------------------------
  const fields: Field[] = [];
  for (const v of raw.variables.values()) {
    if (axes.has(v.name) && v.dims.length === 1 && v.dims[0] === v.name) continue; // a coordinate
    if (!NUMERIC.has(v.dtype) || v.dims.length < 2) continue;
    const nd = v.dims.length;
    const latAxis = axes.get(v.dims[nd - 2])!;
    const lonAxis = axes.get(v.dims[nd - 1])!;
    if (latAxis.kind !== 'latitude' || lonAxis.kind !== 'longitude') continue;
    let timeDim = -1;
    let levelDim = -1;
    let expverDim = -1;
    let levelKind: AxisKind | undefined;
    let skip: string | undefined;
    for (let i = 0; i < nd - 2; i++) {
      const a = axes.get(v.dims[i])!;
      if (a.kind === 'time' && timeDim < 0) timeDim = i;
      else if ((a.kind === 'pressure' || a.kind === 'vertical') && levelDim < 0 && a.variable !== undefined) {
        levelDim = i;
        levelKind = a.kind;
      } else if (a.kind === 'expver' && expverDim < 0) expverDim = i;
      else if (a.size !== 1) skip = `dimension ${a.dim} (size ${a.size}) is neither time nor a vertical axis`;
    }
    let match = recogniseQuantity(v.name, v.attrs);
    const named = userNamed.get(v.name);
    if (named !== undefined) match = { quantity: named, by: 'name' };
    else if (match !== undefined && userQuantities.has(match.quantity)) {
      note(`variable ${v.name} looks like ${match.quantity}, but ${options.variables?.[match.quantity]} was named for it`);
      match = undefined;
    }
    if (skip !== undefined) {
      note(`variable ${v.name} is not read as a field: ${skip}`);
      continue;
    }
    const quantity = match?.quantity;
    const ctx = { file, variable: v.name };
    const toSi = (u: string | undefined): SiConversion => {
      if (quantity === undefined) {
        // Not a quantity frostgrid uses: values stay in the file's units when those are not plain SI.
        return { units: u ?? '', unitScale: 1, unitOffset: 0 };
      }
      if (u === undefined) {
        const dimless = quantity === 'specific_humidity' || quantity === 'humidity_mixing_ratio' || quantity === 'relative_humidity';
        if (!dimless) {
          return toSI('(no units attribute)', quantity, ctx);
        }
        note(`variable ${v.name} has no units attribute; read as dimensionless (CF 1.11 §3.1)`);
        return toSI('1', quantity, ctx);
      }
      return toSI(u, quantity, ctx);
    };
    const { codec, encoding: enc0 } = valueCodec(v, ctx, toSi);
    const lat = await coord(latAxis);
    const lon = await coord(lonAxis);
    const hg = regularLatLonGrid(lat, lon);
    for (const n of hg.notes) note(`variable ${v.name}: ${n}`);
    let levelsPa = new Float64Array(0);
    const extra: Record<string, unknown> = { ...(enc0.extra ?? {}) };
    if (levelDim >= 0) {
      const la = axes.get(v.dims[levelDim])!;
      if (levelKind === 'pressure') {
        const lu = textAttr(la.variable!.attrs, 'units') ?? 'Pa';
        const conv = toSI(lu, 'air_pressure', { file, variable: la.variable!.name });
        const vals = await coord(la);
        levelsPa = vals.map((x) => x * conv.unitScale + conv.unitOffset);
        extra.levelAxis = la.dim;
      } else {
        extra.verticalAxis = {
          name: la.dim,
          size: la.size,
          standardName: textAttr(la.variable!.attrs, 'standard_name'),
          units: textAttr(la.variable!.attrs, 'units'),
        };
      }
    }
    let fieldTimes: TimeCoordinate[] = scalarTime;
    if (timeDim >= 0) {
      const ta = axes.get(v.dims[timeDim])!;
      fieldTimes = ta.variable !== undefined ? await times(ta) : [];
      extra.timeAxis = ta.dim;
    }
    const nExp = expverDim >= 0 ? v.shape[expverDim] : 1;
    if (expverDim >= 0) {
      extra.expverMerged = nExp;
      note(`variable ${v.name}: merged the ${nExp} expver versions, taking the non-missing value per cell`);
    }
    const encoding = { ...enc0, extra: Object.keys(extra).length > 0 ? extra : undefined };
    const rhConvention = quantity === 'relative_humidity' ? inferRhConvention(v.name, v.attrs, raw.attrs, options.rhConvention) : undefined;
    fields.push(makeField(v, codec, {
      quantity,
      units: codec.units.units,
      grid: hg.grid,
      levelsPa,
      times: fieldTimes,
      rhConvention,
      encoding,
      timeDim,
      levelDim,
      expverDim,
      nExp,
    }));
  }
  return {
    path: file,
    format: raw.format as FormatName,
    attrs: raw.attrs,
    fields,
    notes,
    close: () => raw.close(),
  };
}

interface FieldParts {
  readonly quantity: Quantity | undefined;
  readonly units: string;
  readonly grid: Field['grid'];
  readonly levelsPa: Float64Array;
  readonly times: readonly TimeCoordinate[];
  readonly rhConvention: Field['rhConvention'];
  readonly encoding: Field['encoding'];
  readonly timeDim: number;
  readonly levelDim: number;
  readonly expverDim: number;
  readonly nExp: number;
}

function makeField(v: RawVariable, codec: ValueCodec, p: FieldParts): Field {
  const nd = v.dims.length;
  const npoints = p.grid.npoints;
  const ntime = p.timeDim >= 0 ? v.shape[p.timeDim] : 1;
  const nlev = p.levelDim >= 0 ? v.shape[p.levelDim] : 1;
  const attrs: Attributes = v.attrs;
  return {
    name: v.name,
    quantity: p.quantity,
    units: p.units,
    longName: textAttr(v.attrs, 'long_name'),
    grid: p.grid,
    levelsPa: p.levelsPa,
    times: p.times,
    rhConvention: p.rhConvention,
    encoding: p.encoding,
    attrs,
    async readSlice(timeIndex: number, levelIndex: number, out?: Float32Array): Promise<Float32Array> {
      if (!(timeIndex >= 0 && timeIndex < ntime) || !Number.isInteger(timeIndex)) {
        throw new RangeError(`variable ${v.name}: time index ${timeIndex} is outside 0..${ntime - 1}`);
      }
      if (!(levelIndex >= 0 && levelIndex < nlev) || !Number.isInteger(levelIndex)) {
        throw new RangeError(`variable ${v.name}: level index ${levelIndex} is outside 0..${nlev - 1}`);
      }
      const result = out ?? new Float32Array(npoints);
      if (result.length !== npoints) throw new RangeError(`variable ${v.name}: out holds ${result.length} values, the slice has ${npoints}`);
      const start = new Array<number>(nd).fill(0);
      const count = v.shape.slice();
      for (let i = 0; i < nd - 2; i++) {
        if (i === p.timeDim) {
          start[i] = timeIndex;
          count[i] = 1;
        } else if (i === p.levelDim) {
          start[i] = levelIndex;
          count[i] = 1;
        } else if (i !== p.expverDim) {
          count[i] = 1;
        }
      }
      const stored = await v.read(start, count);
      if (p.nExp <= 1) {
        decodeValues(stored, codec, result, 0, 0, npoints);
        return result;
      }
      // expver: the versions are consecutive blocks when expver is the only dimension read in
      // full besides lat/lon; take, per cell, the first version that is not missing.
      decodeValues(stored, codec, result, 0, 0, npoints);
      const tmp = new Float32Array(npoints);
      for (let e = 1; e < p.nExp; e++) {
        decodeValues(stored, codec, tmp, 0, e * npoints, npoints);
        for (let i = 0; i < npoints; i++) if (result[i] !== result[i]) result[i] = tmp[i];
      }
      return result;
    },
  };
}

