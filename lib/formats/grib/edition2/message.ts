/**
 * GRIB2 message structure (WMO-No. 306, Vol. I.2, Part B, GRIB2 regulations 92.1–92.3): section 0
 * (indicator, 16 octets), 1 (identification), optionally 2 (local use), 3 (grid), 4 (product),
 * 5 (data representation), 6 (bitmap), 7 (data), 8 ("7777"). Sections 2–7, 3–7 or 4–7 may repeat
 * within a message; each section 7 closes one field.
 *
 * Parsing reads sections 1–5 and the bitmap indicator only; bitmaps and data are read by
 * decode(), so a file source reads them on demand.
 */
import type { GribFieldInfo, GribGridDefinition, GribLevel, GribMessageLocation, GribParameterId } from '../types.js';
import { memorySource, type ByteSource } from '../source.js';
import { addTimeUnits, dateFromEpochMs, dateFromParts } from '../time.js';
import { applyBitmap, countBitmap } from './bitmap.js';
import { u16, u32, u64, u8 } from './bytes.js';
import { decodeError, formatError, unsupported, type MessageContext } from './errors.js';
import { GRID_TEMPLATES, TemplateProblem, readPointsList } from './grid-templates.js';
import { DATA_TEMPLATES, PackingProblem, type DataTemplate, type PackingParameters } from './packing/index.js';
import { PRODUCT_TEMPLATES, type ProductInfo } from './product-templates.js';

/** Largest number of grid points a field may declare (2^30; a 0.01° global grid has 6.5·10^8). */
export const MAX_POINTS = 2 ** 30;

/** Code table 4.5 type of isobaric surfaces (Pa). */
const ISOBARIC_SURFACE = 100;

/** A GRIB2 field: the shared GribFieldInfo plus what only GRIB2 says. */
export interface Grib2FieldInfo extends GribFieldInfo {
  readonly discipline: number;
  readonly centre: number;
  readonly subCentre: number;
  readonly masterTablesVersion: number;
  readonly localTablesVersion: number;
  /** Second fixed surface of the product (code table 4.5), when given. */
  readonly level2?: { readonly code: number; readonly value: number };
  /** Statistical process (code table 4.10) for 4.8/4.11 products. */
  readonly statisticalProcess?: number;
  readonly packingParameters: PackingParameters;
}

interface Section {
  readonly start: number;
  readonly length: number;
}

function text(b: Uint8Array): string {
  return String.fromCharCode(b[0], b[1], b[2], b[3]);
}

/** Parses a GRIB2 message held in memory. */
export function parseGrib2Message(file: string, bytes: Uint8Array, location: GribMessageLocation): Grib2FieldInfo[] {
  return parseGrib2(memorySource(file, location, bytes));
}

/** Parses a GRIB2 message from a byte source into its fields (one per section 7). */
export function parseGrib2(src: ByteSource): Grib2FieldInfo[] {
  const ctx: MessageContext = { file: src.file, location: src.location };
  const total = src.location.length;
  if (total < 16 + 4) throw formatError(ctx, 0, `a GRIB2 message of ${total} bytes is too short`);
  const s0 = src.read(0, 16);
  if (text(s0) !== 'GRIB') throw formatError(ctx, 0, 'the message does not start with "GRIB"');
  if (s0[7] !== 2) throw formatError(ctx, 7, `edition ${s0[7]} is not 2`);
  const discipline = s0[6];
  const declared = u64(s0, 8);
  if (declared !== total) throw formatError(ctx, 8, `section 0 declares ${declared} bytes, the scan found ${total}`);
  const end = src.read(total - 4, 4);
  if (text(end) !== '7777') throw formatError(ctx, total - 4, 'the message does not end with "7777" (truncated or a wrong length)');

  let sec1: Uint8Array | undefined;
  let grid: { def: GribGridDefinition; npoints: number; start: number } | undefined;
  let product: { info: ProductInfo; template: number; start: number } | undefined;
  let data: { template: DataTemplate; params: PackingParameters; count: number; start: number } | undefined;
  let bitmap: { kind: 'none' } | { kind: 'here' | 'previous'; section: Section; indicatorAt: number } | undefined;
  let lastDefinedBitmap: Section | undefined;
  let last = 0;
  const fields: Grib2FieldInfo[] = [];

  let pos = 16;
  for (;;) {
    if (pos + 4 > total) throw formatError(ctx, pos, 'the sections run past the end of the message');
    const head4 = src.read(pos, 4);
    if (text(head4) === '7777') {
      if (pos + 4 !== total) throw formatError(ctx, pos, `"7777" found ${total - pos - 4} bytes before the declared end`);
      break;
    }
    if (pos + 5 > total - 4) throw formatError(ctx, pos, 'a section header runs into the end section');
    const head = src.read(pos, 5);
    const len = u32(head, 0);
    const num = head[4];
    if (len < 5 || pos + len > total - 4) {
      throw formatError(ctx, pos, `section ${num} declares ${len} bytes, which ${len < 5 ? 'is less than its header' : 'runs past the end of the message'}`);
    }
    const order = num === 1 ? last === 0 : num === 2 ? last === 1 || last === 7 : num === 3 ? last === 1 || last === 2 || last === 7 : num === 4 ? last === 3 || last === 7 : num === last + 1 && num <= 7;
    if (!order) throw formatError(ctx, pos, `section ${num} follows section ${last}`);
    try {
      switch (num) {
        case 1: {
          if (len < 21) throw new TemplateProblem(1, `section 1 of ${len} bytes is shorter than 21`);
          sec1 = src.read(pos, len);
          break;
        }
        case 2:
          break;
        case 3: {
          const sec = src.read(pos, len);
          if (len < 14) throw new TemplateProblem(1, `section 3 of ${len} bytes is shorter than 14`);
          const tnum = u16(sec, 12);
          const t = GRID_TEMPLATES.get(tnum);
          if (!t) throw unsupported(ctx, pos + 12, 'grid definition template', `3.${tnum}`);
          if (len < t.length) throw new TemplateProblem(1, `section 3 of ${len} bytes is shorter than template 3.${tnum} (${t.length})`);
          if (u8(sec, 5) !== 0) throw unsupported(ctx, pos + 5, 'source of grid definition (code table 3.0)', String(u8(sec, 5)));
          let def = t.read(sec, tnum);
          const npoints = u32(sec, 6);
          if (def.type === 'gaussian') {
            const pl = readPointsList(sec, t.length);
            if (pl && pl.length !== def.nj) throw new TemplateProblem(11, `the list has ${pl.length} rows, Nj is ${def.nj}`);
            def = { ...def, pl };
            if (!pl && def.ni === undefined) throw new TemplateProblem(31, 'Ni is missing and there is no list of points per row');
          }
          const expected = gridPoints(def);
          if (expected !== npoints) {
            throw new TemplateProblem(7, `section 3 declares ${npoints} data points, the grid has ${expected}`);
          }
          if (npoints > MAX_POINTS) throw new TemplateProblem(7, `${npoints} data points is more than frostgrid accepts (${MAX_POINTS})`);
          grid = { def, npoints, start: pos };
          break;
        }
        case 4: {
          const sec = src.read(pos, len);
          if (len < 9) throw new TemplateProblem(1, `section 4 of ${len} bytes is shorter than 9`);
          const tnum = u16(sec, 7);
          const t = PRODUCT_TEMPLATES.get(tnum);
          if (!t) throw unsupported(ctx, pos + 7, 'product definition template', `4.${tnum}`);
          if (len < t.length) throw new TemplateProblem(1, `section 4 of ${len} bytes is shorter than template 4.${tnum} (${t.length})`);
          product = { info: t.read(sec), template: tnum, start: pos };
          break;
        }
        case 5: {
          const sec = src.read(pos, len);
          if (len < 11) throw new TemplateProblem(1, `section 5 of ${len} bytes is shorter than 11`);
          const tnum = u16(sec, 9);
          const t = DATA_TEMPLATES.get(tnum);
          if (!t) throw unsupported(ctx, pos + 9, 'data representation template', `5.${tnum}`);
          if (len < t.length) throw new TemplateProblem(1, `section 5 of ${len} bytes is shorter than template 5.${tnum} (${t.length})`);
          data = { template: t, params: t.read(sec, tnum), count: u32(sec, 5), start: pos };
          break;
        }
        case 6: {
          if (len < 6) throw new TemplateProblem(1, 'section 6 is shorter than 6 bytes');
          const indicator = src.read(pos + 5, 1)[0];
          const section = { start: pos, length: len };
          if (indicator === 255) bitmap = { kind: 'none' };
          else if (indicator === 0) {
            bitmap = { kind: 'here', section, indicatorAt: pos + 5 };
            lastDefinedBitmap = section;
          } else if (indicator === 254) {
            if (!lastDefinedBitmap) throw new TemplateProblem(6, 'bitmap indicator 254 (previous bitmap) with no earlier bitmap in the message');
            bitmap = { kind: 'previous', section: lastDefinedBitmap, indicatorAt: pos + 5 };
          } else throw unsupported(ctx, pos + 5, 'predefined bitmap (bitmap indicator)', String(indicator));
          break;
        }
        case 7: {
          if (!sec1 || !grid || !product || !data || !bitmap) throw new TemplateProblem(5, 'section 7 before sections 1, 3, 4, 5 and 6');
          fields.push(makeField(src, ctx, fields.length, discipline, sec1, grid, product, data, bitmap, { start: pos, length: len }));
          break;
        }
        default:
          throw formatError(ctx, pos + 4, `section number ${num} is not a GRIB2 section`);
      }
    } catch (e) {
      if (e instanceof TemplateProblem) throw formatError(ctx, pos + e.octet - 1, `section ${num} octet ${e.octet}: ${e.why}`);
      if (e instanceof PackingProblem) throw formatError(ctx, pos, `section ${num}: ${e.why}`);
      throw e;
    }
    last = num;
    pos += len;
  }
  if (fields.length === 0) throw formatError(ctx, 16, 'the message holds no data section');
  return fields;
}

/** Number of points the grid definition describes. */
function gridPoints(def: GribGridDefinition): number {
  switch (def.type) {
    case 'regular_ll':
    case 'rotated_ll':
      return def.ni * def.nj;
    case 'gaussian':
      if (def.pl) return def.pl.reduce((a, b) => a + b, 0);
      return (def.ni ?? 0) * def.nj;
    case 'lambert_conformal':
    case 'polar_stereographic':
      return def.nx * def.ny;
  }
}

function makeField(
  src: ByteSource,
  ctx: MessageContext,
  fieldIndex: number,
  discipline: number,
  sec1: Uint8Array,
  grid: { def: GribGridDefinition; npoints: number; start: number },
  product: { info: ProductInfo; template: number; start: number },
  data: { template: DataTemplate; params: PackingParameters; count: number; start: number },
  bitmap: { kind: 'none' } | { kind: 'here' | 'previous'; section: Section; indicatorAt: number },
  sec7: Section,
): Grib2FieldInfo {
  const centre = u16(sec1, 5);
  const reference = dateFromParts(u16(sec1, 12), sec1[14], sec1[15], sec1[16], sec1[17], sec1[18]);
  if (!Number.isFinite(reference.epochMs)) throw new TemplateProblem(13, 'the reference time is not a date');
  const p = product.info;
  let validMs: number;
  if (p.intervalEnd) {
    const e = p.intervalEnd;
    validMs = dateFromParts(e.year, e.month, e.day, e.hour, e.minute, e.second).epochMs!;
  } else {
    const v = addTimeUnits(reference.epochMs!, p.forecastTime, p.timeUnit);
    if (v === undefined) throw unsupported(ctx, product.start + 17, 'unit of time range (code table 4.4)', String(p.timeUnit));
    validMs = v;
  }
  const validTime = dateFromEpochMs(validMs);
  const level: GribLevel =
    p.surface1.type === ISOBARIC_SURFACE ? { type: 'isobaric', code: 100, value: p.surface1.value } : { type: 'other', code: p.surface1.type, value: p.surface1.value };
  const parameter: GribParameterId = { edition: 2, discipline, category: p.category, number: p.number, centre };
  const hasBitmap = bitmap.kind !== 'none';
  const npoints = grid.npoints;
  const count = data.count;
  if (!hasBitmap && count !== npoints) {
    throw new TemplateProblem(6, `section 5 declares ${count} packed values, the grid has ${npoints} points and there is no bitmap`);
  }
  if (hasBitmap && count > npoints) {
    throw new TemplateProblem(6, `section 5 declares ${count} packed values, more than the grid's ${npoints} points`);
  }
  if (hasBitmap && bitmap.section.length - 6 < Math.ceil(npoints / 8)) {
    throw new TemplateProblem(6, `the bitmap holds ${(bitmap.section.length - 6) * 8} bits, the grid has ${npoints} points`);
  }
  const params = data.params;
  const info: Grib2FieldInfo = {
    location: src.location,
    fieldIndex,
    parameter,
    level,
    referenceTime: reference,
    stepHours: (validMs - reference.epochMs!) / 3600000,
    validTime,
    member: p.member,
    productTemplate: `4.${product.template}`,
    grid: grid.def,
    packing: `5.${params.template}`,
    bitsPerValue: params.bitsPerValue,
    binaryScale: params.binaryScale,
    decimalScale: params.decimalScale,
    referenceValue: params.referenceValue,
    numberOfPoints: npoints,
    hasBitmap,
    discipline,
    centre,
    subCentre: u16(sec1, 7),
    masterTablesVersion: sec1[9],
    localTablesVersion: sec1[10],
    level2: p.surface2.type === 255 ? undefined : { code: p.surface2.type, value: p.surface2.value },
    statisticalProcess: p.statisticalProcess,
    packingParameters: params,
    decode() {
      const r = unpack();
      if (r instanceof Promise) {
        throw unsupported(ctx, data.start + 9, 'synchronous decoding of data representation template', `5.${params.template} (use decodeAsync)`);
      }
      return r;
    },
    decodeAsync: async () => unpack(),
  };
  const finish = (packed: Float64Array): Float64Array => {
    if (!hasBitmap) return packed;
    const bits = src.read(bitmap.section.start + 6, bitmap.section.length - 6);
    const set = countBitmap(bits, npoints);
    if (set !== count) {
      throw decodeError(ctx, bitmap.indicatorAt, `the bitmap marks ${set} points present, section 5 declares ${count} packed values`);
    }
    return applyBitmap(bits, npoints, packed);
  };
  const fail = (e: unknown): never => {
    if (e instanceof PackingProblem) throw decodeError(ctx, sec7.start, `template 5.${params.template}, ${e.where}: ${e.why}`, e);
    throw e;
  };
  function unpack(): Float64Array | Promise<Float64Array> {
    try {
      const payload = src.read(sec7.start + 5, sec7.length - 5);
      const r = data.template.decode(params, payload, count, npoints);
      if (r instanceof Promise) return r.then(finish, fail);
      return finish(r);
    } catch (e) {
      return fail(e);
    }
  }
  return info;
}
