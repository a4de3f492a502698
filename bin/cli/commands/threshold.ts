/** `frostgrid threshold`: the Schmidt–Appleman threshold at one pressure, for one humidity. */
import {
  flightLevelFromPressure,
  mixingLineSlope,
  thresholdTemperature,
  thresholdTemperatureApprox,
  criticalTemperature,
  contrailFactor,
} from '../../../lib/index.js';
import { UsageError, type CliIo } from '../io.js';
import { CRITERION_OPTIONS, criterionFromOptions, flag, num, parse } from '../options.js';

export const THRESHOLD_HELP = `Usage: frostgrid threshold --pressure HPA [--rh-water U] [--fuel NAME | --ei-h2o X --lhv Y]
                          [--efficiency ETA] [--saturation NAME] [--json]

The Schmidt–Appleman criterion at one pressure: the slope G of the exhaust mixing line, the
threshold temperature T_LM (contrails can form only below it) and the critical temperature T_LC
for ambient relative humidity over water U (contrails form where T <= T_LC).

Options:
  --pressure HPA          ambient pressure in hPa (required)
  --rh-water U            relative humidity over liquid water as a fraction 0..1 (default 0)
  --fuel NAME             kerosene (default), synthetic-kerosene, hydrogen
  --ei-h2o KG_PER_KG      water emission index of a fuel of your own (with --lhv)
  --hydrogen-fraction X   hydrogen mass fraction of a fuel of your own (with --lhv)
  --lhv MJ_PER_KG         lower heating value of a fuel of your own
  --efficiency ETA        overall propulsion efficiency, 0 <= ETA < 1 (default 0.3)
  --saturation NAME       saturation vapour pressure formulation: murphy-koop (default),
                          sonntag, goff-gratch, iapws, magnus
  --json                  print JSON instead of text

Example:
  frostgrid threshold --pressure 250 --rh-water 0.6 --efficiency 0.35
`;

export async function thresholdCommand(args: readonly string[], io: CliIo): Promise<number> {
  const p = parse(args, {
    ...CRITERION_OPTIONS,
    pressure: { type: 'string' },
    'rh-water': { type: 'string' },
    json: { type: 'boolean' },
    help: { type: 'boolean', short: 'h' },
  });
  if (flag(p, 'help')) {
    io.stdout(THRESHOLD_HELP);
    return 0;
  }
  if (p.positionals.length > 0) throw new UsageError(`threshold takes no file, got "${p.positionals[0]}"`);
  const pressureHPa = num(p, 'pressure');
  if (pressureHPa === undefined) throw new UsageError('threshold needs --pressure HPA');
  if (!(pressureHPa > 0 && pressureHPa <= 1100)) throw new UsageError(`--pressure must lie in (0, 1100] hPa, got ${pressureHPa}`);
  const u = num(p, 'rh-water') ?? 0;
  if (!(u >= 0 && u <= 1.5)) throw new UsageError(`--rh-water is a fraction 0..1 (not percent), got ${u}`);
  const params = criterionFromOptions(p);

  const pPa = pressureHPa * 100;
  const g = mixingLineSlope(pPa, params.fuel, params.efficiency);
  const tlm = thresholdTemperature(g, params.saturation);
  const tlc = criticalTemperature(g, u, params.saturation);
  const approx = g > 0.053 ? thresholdTemperatureApprox(g) : Number.NaN;
  const result = {
    pressure_hPa: pressureHPa,
    flight_level: round(flightLevelFromPressure(pPa), 1),
    rh_water: u,
    fuel: params.fuel.name,
    ei_h2o_kg_per_kg: params.fuel.eiH2O,
    lhv_MJ_per_kg: params.fuel.lhvJPerKg / 1e6,
    efficiency: params.efficiency,
    saturation: params.saturation,
    contrail_factor_g_per_kg_per_K: contrailFactor(params.fuel, params.efficiency) * 1000,
    mixing_line_slope_Pa_per_K: g,
    threshold_temperature_K: tlm,
    threshold_temperature_approx_K: Number.isFinite(approx) ? approx : null,
    critical_temperature_K: tlc,
  };
  if (flag(p, 'json')) {
    io.stdout(JSON.stringify(result, null, 2) + '\n');
    return 0;
  }
  const c = (k: number) => `${k.toFixed(2)} K (${(k - 273.15).toFixed(2)} °C)`;
  io.stdout(
    [
      `pressure                 ${pressureHPa} hPa (FL${result.flight_level.toFixed(0)} in the ISA)`,
      `fuel                     ${params.fuel.name}: EI_H2O ${params.fuel.eiH2O} kg/kg, LHV ${(params.fuel.lhvJPerKg / 1e6).toFixed(2)} MJ/kg`,
      `efficiency               ${params.efficiency}`,
      `saturation formulation   ${params.saturation}`,
      `mixing-line slope G      ${g.toFixed(4)} Pa/K`,
      `threshold T_LM           ${c(tlm)}`,
      `critical T_LC at U=${u}    ${c(tlc)}`,
      '',
    ].join('\n'),
  );
  return 0;
}

function round(x: number, digits: number): number {
  const f = 10 ** digits;
  return Math.round(x * f) / f;
}
