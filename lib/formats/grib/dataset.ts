/**
 * GRIB fields assembled into the grid model: messages with the same parameter, level type and
 * grid become one Field whose levels (isobaric, Pa, ascending pressure) and times (valid time,
 * reference time, step, member; sorted) index its messages. Values are converted to SI units once
 * (lib/cf/units.ts), reordered into frostgrid's point order (grids.ts), and missing points are
 * NaN. A slice is decoded when it is read.
 */
import { open } from 'node:fs/promises';
import { toSI } from '../../cf/units.js';
import { DecodeError, FormatError, FrostgridError } from '../../errors.js';
import type { Attributes, Encoding, Field, FormatName, GridDataset, RhConventionRecord, TimeCoordinate } from '../../grid/types.js';
import type { OpenOptions } from '../registry.js';
import { loadEdition1 } from './edition1-bridge.js';
import { buildGrid, reorder, type GribGrid } from './grids.js';
import { describeParameter, parameterKey, parameterNumbers } from './parameters.js';
import { parseMessage, readGribIndex, readMessage, type GribIndex } from './read-index.js';
import type { GribFieldInfo, GribGridDefinition, GribParameterDescription } from './types.js';

interface Group {
  readonly key: string;
  readonly infos: GribFieldInfo[];
}

function gridSignature(g: GribGridDefinition): string {
  const { earth, ...rest } = g as GribGridDefinition & { pl?: Int32Array };
  const plain: Record<string, unknown> = { ...rest, earth: JSON.stringify(earth) };
  if ('pl' in plain && plain.pl) plain.pl = Array.from(plain.pl as Int32Array).join(',');
  return JSON.stringify(plain);
}

function levelKey(info: GribFieldInfo): string {
  return info.level.type === 'isobaric' ? 'isobaric' : `level${info.level.code}:${info.level.value}`;
}

function groupKey(info: GribFieldInfo): string {
  return `${parameterKey(info.parameter)}|c${info.parameter.centre}|${levelKey(info)}|${gridSignature(info.grid)}`;
}

const GRIB_UNIT_SPELLINGS: Readonly<Record<string, string>> = {
  'kg/kg': 'kg kg-1',
  gpm: 'm',
  '(0 - 1)': '1',
  '-': '1',
} as const;

function timeKey(info: GribFieldInfo): string {
  return `${info.validTime.epochMs}|${info.referenceTime.epochMs}|${info.member ?? ''}`;
}

function compareTimes(a: GribFieldInfo, b: GribFieldInfo): number {
  return (
    (a.validTime.epochMs ?? 0) - (b.validTime.epochMs ?? 0) ||
    (a.referenceTime.epochMs ?? 0) - (b.referenceTime.epochMs ?? 0) ||
    (a.member ?? -1) - (b.member ?? -1)
  );
}

function rhRecord(desc: GribParameterDescription | undefined, info: GribFieldInfo): RhConventionRecord | undefined {
  if (!desc?.rhConvention) return undefined;
  const p = info.parameter;
  const source =
    p.edition === 2
      ? desc.rhConvention === 'ecmwf-mixed'
        ? `GRIB2 parameter ${p.discipline}/${p.category}/${p.number} from centre ${p.centre}`
        : `GRIB2 parameter ${p.discipline}/${p.category}/${p.number}`
      : `GRIB1 table ${p.table} parameter ${p.number} from centre ${p.centre}`;
  return { convention: desc.rhConvention, source };
}

/** Opens a GRIB file as a GridDataset. */
export async function openGribDataset(path: string, options: OpenOptions = {}): Promise<GridDataset> {
  await loadEdition1();
  const index = await readGribIndex(path);
  return datasetFromIndex(index, options);
}

/** Assembles the fields of an index into a GridDataset (the file is opened for slice reads). */
export async function datasetFromIndex(index: GribIndex, options: OpenOptions = {}): Promise<GridDataset> {
  const path = index.path;
  const notes: string[] = [];
  for (const p of index.problems) {
    notes.push(`skipped: ${p.message}`);
    options.warn?.(p.message);
  }
  if (index.fields.length === 0) {
    throw new FormatError(`${path}: no readable GRIB message${index.problems.length ? ` (${index.problems.length} unreadable)` : ''}`, {
      file: path,
      cause: index.problems[0],
    });
  }
  const groups = new Map<string, Group>();
  for (const info of index.fields) {
    const k = groupKey(info);
    let g = groups.get(k);
    if (!g) groups.set(k, (g = { key: k, infos: [] }));
    g.infos.push(info);
  }
  const fh = await open(path, 'r');
  const used = new Set<string>();
  const fields: Field[] = [];
  try {
    for (const g of groups.values()) fields.push(makeField(g, path, fh, used, notes, options));
  } catch (e) {
    await fh.close();
    throw e;
  }
  const editions = new Set(index.messages.map((m) => m.edition));
  const format: FormatName = editions.size > 1 ? 'grib-mixed' : editions.has(1) ? 'grib1' : 'grib2';
  const attrs: Attributes = { messages: index.messages.length, unreadable_messages: index.problems.length };
  let closed = false;
  return {
    path,
    format,
    attrs,
    fields,
    notes,
    async close() {
      if (!closed) {
        closed = true;
        await fh.close();
      }
    },
  };
}

function makeField(
  g: Group,
  path: string,
  fh: import('node:fs/promises').FileHandle,
  used: Set<string>,
  notes: string[],
  options: OpenOptions,
): Field {
  const first = g.infos[0];
  const desc = describeParameter(first.parameter);
  const isobaric = first.level.type === 'isobaric';
  // Name: the table's short name, made unique with the level type and a counter when needed.
  let name = desc?.shortName ?? parameterKey(first.parameter);
  if (!isobaric) name = `${name}_l${first.level.code}${Number.isFinite(first.level.value) ? `_${first.level.value}` : ''}`;
  for (let n = 2, base = name; used.has(name); n++) name = `${base}_${n}`;
  used.add(name);
  if (!desc) notes.push(`${name}: unknown parameter, ${parameterNumbers(first.parameter)}`);

  const levels = isobaric ? [...new Set(g.infos.map((i) => i.level.value))].sort((a, b) => a - b) : [0];
  const levelIndex = new Map(levels.map((v, k) => [v, k]));
  const sorted = [...g.infos].sort(compareTimes);
  const timeIndex = new Map<string, number>();
  const times: TimeCoordinate[] = [];
  for (const i of sorted) {
    const k = timeKey(i);
    if (timeIndex.has(k)) continue;
    timeIndex.set(k, times.length);
    times.push({ valid: i.validTime, reference: i.referenceTime, stepHours: i.stepHours, ...(i.member !== undefined ? { member: i.member } : {}) });
  }
  const table: (GribFieldInfo | undefined)[] = new Array(times.length * levels.length);
  for (const i of g.infos) {
    const slot = timeIndex.get(timeKey(i))! * levels.length + levelIndex.get(isobaric ? i.level.value : 0)!;
    if (table[slot]) {
      const msg = `${name}: messages ${table[slot]!.location.number} and ${i.location.number} hold the same time and level; the first is used`;
      notes.push(msg);
      options.warn?.(msg);
      continue;
    }
    table[slot] = i;
  }

  const sourceUnits = desc?.units ?? '';
  const quantity = desc?.quantity;
  let units = sourceUnits;
  let unitScale = 1;
  let unitOffset = 0;
  if (quantity) {
    const si = toSI(GRIB_UNIT_SPELLINGS[sourceUnits] ?? sourceUnits, quantity, { file: path, variable: name });
    units = si.units;
    unitScale = si.unitScale;
    unitOffset = si.unitOffset;
  }
  const gg: GribGrid = buildGrid(first.grid, path);
  const ieee = first.packing === '5.4';
  const encoding: Encoding = {
    storedType: `grib${first.location.edition}-${first.packing}`,
    sourceUnits,
    unitScale,
    unitOffset,
    quantizationStep: ieee ? 0 : 2 ** first.binaryScale * 10 ** -first.decimalScale * Math.abs(unitScale),
    extra: {
      packing: first.packing,
      bitsPerValue: first.bitsPerValue,
      binaryScale: first.binaryScale,
      decimalScale: first.decimalScale,
      productTemplate: first.productTemplate,
      gridTemplate: first.grid.template,
      centre: first.parameter.centre,
      parameter: parameterNumbers(first.parameter),
    },
  };
  const levelsPa = isobaric ? Float64Array.from(levels) : new Float64Array(0);
  const rh = rhRecord(desc, first);
  return {
    name,
    quantity,
    units,
    longName: desc?.name ?? `unknown parameter (${parameterNumbers(first.parameter)})`,
    grid: gg.grid,
    levelsPa,
    times,
    ...(rh ? { rhConvention: rh } : {}),
    encoding,
    attrs: {
      grib_edition: first.location.edition,
      grib_parameter: parameterNumbers(first.parameter),
      grib_level_type: first.level.code,
      grib_packing: first.packing,
      grib_product_template: first.productTemplate,
      grib_grid_template: first.grid.template,
    },
    async readSlice(t, l, out) {
      if (!(t >= 0 && t < times.length) || !(l >= 0 && l < levels.length) || !Number.isInteger(t) || !Number.isInteger(l)) {
        throw new RangeError(`${name}: slice (${t}, ${l}) outside ${times.length} times × ${levels.length} levels`);
      }
      const info = table[t * levels.length + l];
      const what = `${name}${isobaric ? ` at ${levels[l] / 100} hPa` : ''}, ${times[t].valid.iso}${times[t].member !== undefined ? ` member ${times[t].member}` : ''}`;
      if (!info) throw new DecodeError(`${path}: no message holds ${what}`, { file: path, variable: name });
      const target = out ?? new Float32Array(gg.grid.npoints);
      if (target.length !== gg.grid.npoints) throw new RangeError(`${name}: output holds ${target.length} values, the grid has ${gg.grid.npoints}`);
      try {
        const bytes = await readMessage(fh, info.location);
        const parsed = (await parseMessage(path, info.location, bytes))[info.fieldIndex];
        if (!parsed) throw new FormatError(`${path}: message ${info.location.number} no longer holds field ${info.fieldIndex + 1}`, { file: path, offset: info.location.offset, message: info.location.number });
        const values = parsed.decodeAsync ? await parsed.decodeAsync() : parsed.decode();
        if (values.length !== gg.grid.npoints) {
          throw new DecodeError(`${path}: message ${info.location.number}: ${values.length} values decoded, the grid has ${gg.grid.npoints} points`, { file: path, message: info.location.number, offset: info.location.offset });
        }
        reorder(values, gg.order, target);
        if (unitScale !== 1 || unitOffset !== 0) for (let k = 0; k < target.length; k++) target[k] = target[k] * unitScale + unitOffset;
        return target;
      } catch (e) {
        if (e instanceof FrostgridError) {
          throw new DecodeError(`while reading ${what}: ${e.message}`, { file: path, variable: name, message: e.messageNumber, offset: e.offset, cause: e });
        }
        throw e;
      }
    },
  };
}
