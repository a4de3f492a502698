/**
 * GRIB2 product definition templates (section 4), registered by template number: 4.0 (analysis
 * or forecast at a point in time), 4.1 (individual ensemble member), 4.8 (statistically processed
 * over a time interval), 4.11 (4.1 and 4.8 together). Octet numbers are those of WMO-No. 306,
 * Vol. I.2, Part B (section-relative, 1-based).
 */
import { allOnes, s32, s8, u16, u8 } from './bytes.js';
import { TemplateProblem } from './grid-templates.js';

export interface FixedSurface {
  /** Code table 4.5 type, 255 when missing. */
  readonly type: number;
  /** Scaled value · 10^−scale, NaN when missing. */
  readonly value: number;
}

export interface ProductInfo {
  readonly category: number;
  readonly number: number;
  /** Code table 4.4 unit of the forecast time. */
  readonly timeUnit: number;
  readonly forecastTime: number;
  readonly surface1: FixedSurface;
  readonly surface2: FixedSurface;
  readonly member: number | undefined;
  /** End of the overall time interval (statistically processed products). */
  readonly intervalEnd?: { year: number; month: number; day: number; hour: number; minute: number; second: number };
  /** Statistical process (code table 4.10) of the first time range, when there is one. */
  readonly statisticalProcess?: number;
}

export interface ProductTemplate {
  /** Minimum section length the template needs. */
  readonly length: number;
  read(sec: Uint8Array): ProductInfo;
}

const o = (n: number) => n - 1;

function surface(sec: Uint8Array, typeOctet: number): FixedSurface {
  const type = u8(sec, o(typeOctet));
  if (type === 255 || allOnes(sec, o(typeOctet + 2), 4)) return { type, value: Number.NaN };
  const scale = sec[o(typeOctet + 1)] === 0xff ? 0 : s8(sec, o(typeOctet + 1));
  const raw = s32(sec, o(typeOctet + 2));
  const v = raw / 10 ** scale;
  return { type, value: scale > 0 ? Number(v.toPrecision(15)) : v };
}

/** Octets 10–34, common to 4.0, 4.1, 4.8 and 4.11. */
function pointInTime(sec: Uint8Array): Omit<ProductInfo, 'member'> {
  return {
    category: u8(sec, o(10)),
    number: u8(sec, o(11)),
    timeUnit: u8(sec, o(18)),
    forecastTime: s32(sec, o(19)),
    surface1: surface(sec, 23),
    surface2: surface(sec, 29),
  };
}

function ensembleMember(sec: Uint8Array, at: number): number | undefined {
  const m = u8(sec, o(at + 1));
  return m === 255 ? undefined : m;
}

/** Statistical-processing block starting at octet `at` (year of end of the overall interval). */
function statistical(sec: Uint8Array, at: number): Pick<ProductInfo, 'intervalEnd' | 'statisticalProcess'> {
  const n = u8(sec, o(at + 7));
  if (sec.length < o(at + 12) + 12 * Math.max(n, 1)) {
    throw new TemplateProblem(at + 7, `${n} time range specifications do not fit in the section`);
  }
  return {
    intervalEnd: {
      year: u16(sec, o(at)),
      month: u8(sec, o(at + 2)),
      day: u8(sec, o(at + 3)),
      hour: u8(sec, o(at + 4)),
      minute: u8(sec, o(at + 5)),
      second: u8(sec, o(at + 6)),
    },
    statisticalProcess: n > 0 ? u8(sec, o(at + 12)) : undefined,
  };
}

/** Product definition templates by number (code table 4.0). */
export const PRODUCT_TEMPLATES: ReadonlyMap<number, ProductTemplate> = new Map<number, ProductTemplate>([
  [0, { length: 34, read: (sec) => ({ ...pointInTime(sec), member: undefined }) }],
  [1, { length: 37, read: (sec) => ({ ...pointInTime(sec), member: ensembleMember(sec, 35) }) }],
  [8, { length: 58, read: (sec) => ({ ...pointInTime(sec), member: undefined, ...statistical(sec, 35) }) }],
  [11, { length: 61, read: (sec) => ({ ...pointInTime(sec), member: ensembleMember(sec, 35), ...statistical(sec, 38) }) }],
]);

