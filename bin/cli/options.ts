/**
 * Command-line parsing shared by the subcommands: option tables for node:util parseArgs, number
 * and list parsers that raise UsageError with the option's name, and the fuel/criterion options
 * that `masks` and `threshold` share.
 */
import { parseArgs, type ParseArgsConfig } from 'node:util';
import {
  DEFAULT_CRITERION,
  FUEL_PRESETS,
  SATURATION_FORMULATIONS,
  fuelFromComposition,
  fuelFromEmissionIndex,
  parseBoundingBox,
  validateCriterionParameters,
  type BoundingBox,
  type CriterionParameters,
  type Fuel,
  type SaturationFormulation,
} from '../../lib/index.js';
import { UsageError } from './io.js';

export type OptionSpec = NonNullable<ParseArgsConfig['options']>;

export interface Parsed {
  values: Record<string, string | boolean | string[] | undefined>;
  positionals: string[];
}

/** parseArgs with usage errors instead of TypeErrors. */
export function parse(args: readonly string[], options: OptionSpec): Parsed {
  // Values may be negative numbers ("--at -33.9,151.2", "--bbox -10,30,20,60"): glue them to a
  // string option so parseArgs does not take them for options.
  const glued: string[] = [];
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    const spec = a.startsWith('--') && !a.includes('=') ? options[a.slice(2)] : undefined;
    const next = args[i + 1];
    if (spec?.type === 'string' && next !== undefined && /^-[\d.]/.test(next)) {
      glued.push(`${a}=${next}`);
      i++;
    } else {
      glued.push(a);
    }
  }
  try {
    const r = parseArgs({ args: glued, options, allowPositionals: true, strict: true });
    return { values: r.values as Parsed['values'], positionals: r.positionals };
  } catch (e) {
    const msg = e instanceof Error ? e.message : String(e);
    throw new UsageError(msg.replace(/\. To specify a positional argument.*$/s, ''));
  }
}

export function str(p: Parsed, name: string): string | undefined {
  const v = p.values[name];
  return typeof v === 'string' ? v : undefined;
}

export function flag(p: Parsed, name: string): boolean {
  return p.values[name] === true;
}

export function list(p: Parsed, name: string): string[] {
  const v = p.values[name];
  if (v === undefined) return [];
  const items = Array.isArray(v) ? v : [String(v)];
  return items.flatMap((s) => s.split(',')).map((s) => s.trim()).filter((s) => s.length > 0);
}

/** A finite number for --name, or undefined when the option is absent. */
export function num(p: Parsed, name: string): number | undefined {
  const s = str(p, name);
  if (s === undefined) return undefined;
  const v = Number(s);
  if (s.trim() === '' || !Number.isFinite(v)) throw new UsageError(`--${name} needs a number, got "${s}"`);
  return v;
}

/** "200,250,300" or "150-300" (inclusive range) or a mix, in hPa. */
export interface LevelSelection {
  readonly values: readonly number[];
  readonly ranges: readonly (readonly [number, number])[];
}

export function parseLevels(p: Parsed, name = 'levels'): LevelSelection | undefined {
  const items = list(p, name);
  if (items.length === 0) return undefined;
  const values: number[] = [];
  const ranges: [number, number][] = [];
  for (const item of items) {
    const m = /^(\d+(?:\.\d+)?)\s*(?:-|\.\.)\s*(\d+(?:\.\d+)?)$/.exec(item);
    if (m) {
      const a = Number(m[1]);
      const b = Number(m[2]);
      ranges.push([Math.min(a, b), Math.max(a, b)]);
      continue;
    }
    const v = Number(item);
    if (!Number.isFinite(v) || v <= 0) {
      throw new UsageError(`--${name} takes pressures in hPa as a list (200,250) or a range (150-300), got "${item}"`);
    }
    values.push(v);
  }
  return { values, ranges };
}

/** --bbox W,S,E,N in degrees (the library's parser; its errors become usage errors). */
export function parseBbox(p: Parsed): BoundingBox | undefined {
  const s = str(p, 'bbox');
  if (s === undefined) return undefined;
  try {
    return parseBoundingBox(s);
  } catch (e) {
    throw new UsageError(e instanceof Error ? e.message : String(e));
  }
}

/** Options the criterion subcommands share. */
export const CRITERION_OPTIONS: OptionSpec = {
  fuel: { type: 'string' },
  'ei-h2o': { type: 'string' },
  'hydrogen-fraction': { type: 'string' },
  lhv: { type: 'string' },
  efficiency: { type: 'string' },
  saturation: { type: 'string' },
};

/** Library parameter names as the command line spells them. */
const OPTION_OF_PARAMETER: Readonly<Record<string, string>> = {
  eiH2O: '--ei-h2o',
  lhvMJPerKg: '--lhv',
  hydrogenMassFraction: '--hydrogen-fraction',
  efficiency: '--efficiency',
  iceThresholdPercent: '--ice-threshold',
  freezingTemperatureK: '--freezing-temperature',
  humidityScale: '--humidity-scale',
};

/** A library range error as a usage error that names the option the user typed. */
function optionError(e: unknown): UsageError {
  const text = e instanceof Error ? e.message : String(e);
  const m = /^(\w+) must be in (.*)$/.exec(text);
  const option = m ? OPTION_OF_PARAMETER[m[1]] : undefined;
  return new UsageError(option ? `${option} must be in ${m![2]}` : text);
}

/** The fuel from --fuel, or a user fuel from --ei-h2o / --hydrogen-fraction with --lhv. */
export function fuelFromOptions(p: Parsed): Fuel {
  const name = str(p, 'fuel');
  const ei = num(p, 'ei-h2o');
  const xh = num(p, 'hydrogen-fraction');
  const lhv = num(p, 'lhv');
  if (ei !== undefined && xh !== undefined) throw new UsageError('give either --ei-h2o or --hydrogen-fraction, not both');
  if (ei !== undefined || xh !== undefined) {
    if (name !== undefined) throw new UsageError('--fuel names a preset; a fuel of your own takes --ei-h2o or --hydrogen-fraction with --lhv instead');
    if (lhv === undefined) throw new UsageError(`a fuel of your own needs --lhv (lower heating value, MJ/kg) with ${ei !== undefined ? '--ei-h2o' : '--hydrogen-fraction'}`);
    try {
      return ei !== undefined
        ? fuelFromEmissionIndex({ name: 'user', eiH2O: ei, lhvMJPerKg: lhv })
        : fuelFromComposition({ name: 'user', hydrogenMassFraction: xh as number, lhvMJPerKg: lhv });
    } catch (e) {
      throw optionError(e);
    }
  }
  if (lhv !== undefined) {
    if (name === undefined) throw new UsageError('--lhv goes with --ei-h2o or --hydrogen-fraction');
    throw new UsageError('--lhv defines a fuel of your own with --ei-h2o or --hydrogen-fraction; it cannot change the preset --fuel');
  }
  const key = name ?? 'kerosene';
  const preset = (FUEL_PRESETS as Readonly<Record<string, Fuel>>)[key];
  if (preset === undefined) {
    throw new UsageError(`unknown --fuel "${key}"; known fuels: ${Object.keys(FUEL_PRESETS).join(', ')}`);
  }
  return preset;
}

export function saturationFromOptions(p: Parsed): SaturationFormulation {
  const s = str(p, 'saturation') ?? DEFAULT_CRITERION.saturation;
  if (!(SATURATION_FORMULATIONS as readonly string[]).includes(s)) {
    throw new UsageError(`unknown --saturation "${s}"; known formulations: ${SATURATION_FORMULATIONS.join(', ')}`);
  }
  return s as SaturationFormulation;
}

/** Full criterion parameters from the command line, validated (usage error naming the option). */
export function criterionFromOptions(p: Parsed): CriterionParameters {
  const efficiency = num(p, 'efficiency') ?? DEFAULT_CRITERION.efficiency;
  if (!(efficiency >= 0 && efficiency < 1)) {
    throw new UsageError(`--efficiency must lie in [0, 1), got ${efficiency}`);
  }
  const params: CriterionParameters = {
    fuel: fuelFromOptions(p),
    efficiency,
    saturation: saturationFromOptions(p),
    iceThresholdPercent: num(p, 'ice-threshold') ?? DEFAULT_CRITERION.iceThresholdPercent,
    freezingTemperatureK: num(p, 'freezing-temperature') ?? DEFAULT_CRITERION.freezingTemperatureK,
    humidityScale: num(p, 'humidity-scale') ?? DEFAULT_CRITERION.humidityScale,
  };
  try {
    validateCriterionParameters(params);
  } catch (e) {
    throw optionError(e);
  }
  return params;
}
