/**
 * CF coder 4 — units to SI (CF 1.11 §3.1: units are UDUNITS strings). A small UDUNITS-style
 * parser: products of terms separated by spaces, "*" or "."; a term is a symbol with an optional
 * prefix and an integer exponent ("m2", "m**2", "m^2", "s-2", "s**-2"); "/" inverts the term
 * after it. Offset units (degC, degF) are allowed alone only.
 *
 *   SI value = source value · unitScale + unitOffset
 *
 * `toSI` is the reusable entry point (GRIB table units such as "K", "%", "kg kg**-1", "gpm",
 * "m**2 s**-2" go through it too).
 */
import { UnitsError } from '../errors.js';
import type { Quantity } from '../grid/types.js';

/** Exponents of kg, m, s, K. */
type Dims = readonly [number, number, number, number];
const NONE: Dims = [0, 0, 0, 0];

interface UnitSymbol {
  readonly scale: number;
  readonly offset?: number;
  readonly dims: Dims;
  readonly prefixable?: boolean;
}

/** Symbols (UDUNITS names and common spellings). Scales to SI from the SI definitions. */
const SYMBOLS: Readonly<Record<string, UnitSymbol>> = {
  K: { scale: 1, dims: [0, 0, 0, 1] },
  kelvin: { scale: 1, dims: [0, 0, 0, 1] },
  degK: { scale: 1, dims: [0, 0, 0, 1] },
  degC: { scale: 1, offset: 273.15, dims: [0, 0, 0, 1] },
  deg_C: { scale: 1, offset: 273.15, dims: [0, 0, 0, 1] },
  degree_C: { scale: 1, offset: 273.15, dims: [0, 0, 0, 1] },
  degrees_C: { scale: 1, offset: 273.15, dims: [0, 0, 0, 1] },
  degree_Celsius: { scale: 1, offset: 273.15, dims: [0, 0, 0, 1] },
  degrees_Celsius: { scale: 1, offset: 273.15, dims: [0, 0, 0, 1] },
  celsius: { scale: 1, offset: 273.15, dims: [0, 0, 0, 1] },
  Celsius: { scale: 1, offset: 273.15, dims: [0, 0, 0, 1] },
  '°C': { scale: 1, offset: 273.15, dims: [0, 0, 0, 1] },
  C: { scale: 1, offset: 273.15, dims: [0, 0, 0, 1] },
  degF: { scale: 5 / 9, offset: (459.67 * 5) / 9, dims: [0, 0, 0, 1] },
  deg_F: { scale: 5 / 9, offset: (459.67 * 5) / 9, dims: [0, 0, 0, 1] },
  degrees_F: { scale: 5 / 9, offset: (459.67 * 5) / 9, dims: [0, 0, 0, 1] },
  fahrenheit: { scale: 5 / 9, offset: (459.67 * 5) / 9, dims: [0, 0, 0, 1] },
  Pa: { scale: 1, dims: [1, -1, -2, 0], prefixable: true },
  pascal: { scale: 1, dims: [1, -1, -2, 0] },
  bar: { scale: 1e5, dims: [1, -1, -2, 0], prefixable: true },
  mb: { scale: 100, dims: [1, -1, -2, 0] },
  millibar: { scale: 100, dims: [1, -1, -2, 0] },
  millibars: { scale: 100, dims: [1, -1, -2, 0] },
  g: { scale: 1e-3, dims: [1, 0, 0, 0], prefixable: true },
  gram: { scale: 1e-3, dims: [1, 0, 0, 0] },
  m: { scale: 1, dims: [0, 1, 0, 0], prefixable: true },
  meter: { scale: 1, dims: [0, 1, 0, 0] },
  metre: { scale: 1, dims: [0, 1, 0, 0] },
  meters: { scale: 1, dims: [0, 1, 0, 0] },
  metres: { scale: 1, dims: [0, 1, 0, 0] },
  // Geopotential metre: GRIB tables write "gpm" for geopotential height (common practice, no source).
  gpm: { scale: 1, dims: [0, 1, 0, 0] },
  s: { scale: 1, dims: [0, 0, 1, 0], prefixable: true },
  sec: { scale: 1, dims: [0, 0, 1, 0] },
  second: { scale: 1, dims: [0, 0, 1, 0] },
  seconds: { scale: 1, dims: [0, 0, 1, 0] },
  min: { scale: 60, dims: [0, 0, 1, 0] },
  h: { scale: 3600, dims: [0, 0, 1, 0] },
  hr: { scale: 3600, dims: [0, 0, 1, 0] },
  hour: { scale: 3600, dims: [0, 0, 1, 0] },
  hours: { scale: 3600, dims: [0, 0, 1, 0] },
  day: { scale: 86400, dims: [0, 0, 1, 0] },
  days: { scale: 86400, dims: [0, 0, 1, 0] },
  '%': { scale: 0.01, dims: NONE },
  percent: { scale: 0.01, dims: NONE },
  ppm: { scale: 1e-6, dims: NONE },
  '1': { scale: 1, dims: NONE },
};

/** Whole unit strings that mean "dimensionless fraction" (common practice, no source). */
const FRACTION_SPELLINGS = new Set(['', '1', '(0 - 1)', '0-1', '(0-1)', 'fraction', 'dimensionless', '-']);

const PREFIXES: Readonly<Record<string, number>> = {
  da: 1e1, h: 1e2, k: 1e3, M: 1e6, G: 1e9, d: 1e-1, c: 1e-2, m: 1e-3, u: 1e-6, µ: 1e-6, n: 1e-9,
};

export interface ParsedUnits {
  readonly scale: number;
  readonly offset: number;
  readonly dims: Dims;
}

function lookup(sym: string): UnitSymbol | undefined {
  const direct = SYMBOLS[sym];
  if (direct) return direct;
  for (const p of ['da', ...Object.keys(PREFIXES).filter((k) => k !== 'da')]) {
    if (sym.length > p.length && sym.startsWith(p)) {
      const base = SYMBOLS[sym.slice(p.length)];
      if (base?.prefixable) return { scale: base.scale * PREFIXES[p], dims: base.dims };
    }
  }
  return undefined;
}

/** Parses a units string; returns undefined when it cannot be understood. */
export function parseUnits(units: string): ParsedUnits | undefined {
  const u = units.trim();
  if (FRACTION_SPELLINGS.has(u)) return { scale: 1, offset: 0, dims: NONE };
  const text = u.replace(/\*\*/g, '^').replace(/\s*\^\s*/g, '^');
  const tokens = text.split(/(\/)|[\s*]+|(?<=[A-Za-z%])\.(?=[A-Za-z])/).filter((t) => t !== undefined && t !== '');
  let scale = 1;
  let offset = 0;
  const dims = [0, 0, 0, 0];
  let invertNext = false;
  let terms = 0;
  for (const tok of tokens) {
    if (tok === '/') {
      invertNext = true;
      continue;
    }
    const num = /^[+-]?(\d+\.?\d*(e[+-]?\d+)?|\d*\.\d+(e[+-]?\d+)?)$/i.exec(tok);
    if (num) {
      const v = Number(tok);
      scale *= invertNext ? 1 / v : v;
      invertNext = false;
      continue;
    }
    const m = /^([A-Za-z_°%µ]+)\^?([+-]?\d+)?$/.exec(tok);
    if (!m) return undefined;
    const sym = lookup(m[1]);
    if (!sym) return undefined;
    let exp = m[2] === undefined ? 1 : Number(m[2]);
    if (invertNext) exp = -exp;
    invertNext = false;
    if (sym.offset !== undefined) {
      if (tokens.length !== 1 || exp !== 1) return undefined;
      offset = sym.offset;
    }
    scale *= sym.scale ** exp;
    for (let i = 0; i < 4; i++) dims[i] += sym.dims[i] * exp;
    terms++;
  }
  if (terms === 0 && scale === 1) return undefined;
  return { scale, offset, dims: [dims[0], dims[1], dims[2], dims[3]] };
}

/** What a quantity is converted to: SI units and their dimensions. */
export type SiTarget = Quantity | 'air_pressure' | 'length' | 'dimensionless';

const TARGETS: Readonly<Record<SiTarget, { readonly units: string; readonly dims: Dims; readonly what: string }>> = {
  air_temperature: { units: 'K', dims: [0, 0, 0, 1], what: 'a temperature' },
  dew_point_temperature: { units: 'K', dims: [0, 0, 0, 1], what: 'a temperature' },
  specific_humidity: { units: 'kg kg-1', dims: NONE, what: 'a mass fraction' },
  humidity_mixing_ratio: { units: 'kg kg-1', dims: NONE, what: 'a mass ratio' },
  relative_humidity: { units: '1', dims: NONE, what: 'a fraction or percent' },
  geopotential: { units: 'm2 s-2', dims: [0, 2, -2, 0], what: 'a geopotential (m2 s-2)' },
  geopotential_height: { units: 'm', dims: [0, 1, 0, 0], what: 'a height (m)' },
  air_pressure: { units: 'Pa', dims: [1, -1, -2, 0], what: 'a pressure' },
  length: { units: 'm', dims: [0, 1, 0, 0], what: 'a length' },
  dimensionless: { units: '1', dims: NONE, what: 'a dimensionless number' },
};

export interface SiConversion {
  /** SI units of the converted values ('K', 'kg kg-1', '1', 'm2 s-2', 'm', 'Pa'). */
  readonly units: string;
  readonly unitScale: number;
  readonly unitOffset: number;
}

export interface UnitsContext {
  readonly file?: string;
  readonly variable?: string;
}

function sameDims(a: Dims, b: Dims): boolean {
  return a[0] === b[0] && a[1] === b[1] && a[2] === b[2] && a[3] === b[3];
}

/**
 * Converts units to the SI units of a quantity: SI = value·unitScale + unitOffset.
 * Throws UnitsError naming the variable, what was needed and what was found.
 */
export function toSI(units: string, target: SiTarget, ctx: UnitsContext = {}): SiConversion {
  const t = TARGETS[target];
  const where = `${ctx.file ? ctx.file + ': ' : ''}${ctx.variable ? `variable ${ctx.variable}: ` : ''}`;
  const p = parseUnits(units);
  if (p === undefined) {
    throw new UnitsError(`${where}units "${units}" cannot be understood (needed ${t.what}, ${t.units})`, t.units, units, {
      file: ctx.file,
      variable: ctx.variable,
      attribute: 'units',
    });
  }
  if (!sameDims(p.dims, t.dims)) {
    throw new UnitsError(`${where}units "${units}" are not ${t.what} (needed ${t.units}, found "${units}")`, t.units, units, {
      file: ctx.file,
      variable: ctx.variable,
      attribute: 'units',
    });
  }
  return { units: t.units, unitScale: p.scale, unitOffset: p.offset };
}
