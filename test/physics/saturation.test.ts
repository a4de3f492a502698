import { describe, expect, it } from 'vitest';
import {
  SATURATION_FORMULATIONS,
  isExtrapolated,
  saturationFormulationInfo,
  saturationPressureIce,
  saturationPressureIceArray,
  saturationPressureIceDerivative,
  saturationPressureWater,
  saturationPressureWaterArray,
  saturationPressureWaterDerivative,
  type SaturationFormulation,
} from '../../lib/physics/index.js';
import { REFERENCE, loadPsychrolib, relErr } from './references.js';

const CV11 = 'check-values.md §1.1 (C: own transcription of the published formula; IAPWS column = python3-iapws 1.5.2)';

interface Row {
  input: { tK: number; f: SaturationFormulation; phase: 'ice' | 'water' };
  expected: number;
  tol: number;
  source: string;
}

function sat(phase: 'ice' | 'water', tK: number, f: SaturationFormulation): number {
  return phase === 'ice' ? saturationPressureIce(tK, f) : saturationPressureWater(tK, f);
}

// check-values.md §1.1: same formula, rtol 1e-9 (§7).
const table11: [number, number, number, number, number, number][] = [
  // T, IAPWS ice, MK ice, MK liquid, Sonntag ice, Sonntag liquid
  [273.16, 611.657, 611.6570688, 611.6570436, 611.6569653, 611.6570802],
  [263.15, 259.8738108, 259.8921638, 286.452971, 259.8928295, 286.5207465],
  [253.15, 103.239029, 103.2524633, 125.5041694, 103.2390525, 125.586503],
  [243.15, 38.00513949, 38.01217278, 50.93561538, 37.9993627, 51.03160324],
  [233.15, 12.84117177, 12.84428138, 18.91214943, 12.83696816, 19.03265177],
  [223.15, 3.93770602, 3.938920724, 6.316777294, 3.93579342, 6.438806878],
  [213.15, 1.081347545, 1.081770686, NaN, 1.080687439, NaN],
  [203.15, 0.2617287104, 0.2618590474, NaN, 0.261540578, NaN],
  [193.15, 0.05477299084, 0.05480780606, NaN, 0.05472498059, NaN],
];
const primary: Row[] = [];
for (const [tK, iapws, mkI, mkW, soI, soW] of table11) {
  primary.push({ input: { tK, f: 'iapws', phase: 'ice' }, expected: iapws, tol: 1e-9, source: CV11 });
  primary.push({ input: { tK, f: 'murphy-koop', phase: 'ice' }, expected: mkI, tol: 1e-9, source: CV11 });
  primary.push({ input: { tK, f: 'sonntag', phase: 'ice' }, expected: soI, tol: 1e-9, source: CV11 });
  if (!Number.isNaN(mkW)) primary.push({ input: { tK, f: 'murphy-koop', phase: 'water' }, expected: mkW, tol: 1e-9, source: CV11 });
  if (!Number.isNaN(soW)) primary.push({ input: { tK, f: 'sonntag', phase: 'water' }, expected: soW, tol: 1e-9, source: CV11 });
}
// Extra anchors of §1.1 and the release's own check values.
primary.push(
  { input: { tK: 230, f: 'iapws', phase: 'ice' }, expected: 8.94735, tol: 1e-6, source: 'IAPWS R14-08(2011) check value p_subl(230 K) = 8.94735e-6 MPa (F2, check-values §1.1)' },
  { input: { tK: 273.16, f: 'iapws', phase: 'ice' }, expected: 611.657, tol: 1e-12, source: 'IAPWS R14-08(2011): p_t = 611.657 Pa at T_t = 273.16 K' },
  { input: { tK: 180, f: 'iapws', phase: 'ice' }, expected: 0.00539278, tol: 1e-6, source: 'IAPWS R14-08 eq. 6 at 180 K, 6 digits (F2, check-values §1.1)' },
  { input: { tK: 250, f: 'iapws', phase: 'ice' }, expected: 76.0127, tol: 1e-6, source: 'IAPWS R14-08 eq. 6 at 250 K, 6 digits (F2, check-values §1.1)' },
  { input: { tK: 273, f: 'iapws', phase: 'ice' }, expected: 603.646, tol: 1e-6, source: 'IAPWS R14-08 eq. 6 at 273 K, 6 digits (F2, check-values §1.1)' },
  { input: { tK: 273.15, f: 'murphy-koop', phase: 'ice' }, expected: 611.1535914, tol: 1e-9, source: 'check-values §1.1 extra anchors (C)' },
  { input: { tK: 273.15, f: 'murphy-koop', phase: 'water' }, expected: 611.2126978, tol: 1e-9, source: 'check-values §1.1 extra anchors (C)' },
  { input: { tK: 220, f: 'murphy-koop', phase: 'ice' }, expected: 2.65495471, tol: 1e-9, source: 'check-values §1.1 extra anchors (C)' },
  { input: { tK: 225, f: 'murphy-koop', phase: 'ice' }, expected: 4.940482679, tol: 1e-9, source: 'check-values §1.1 extra anchors (C)' },
  { input: { tK: 230, f: 'murphy-koop', phase: 'ice' }, expected: 8.949694386, tol: 1e-9, source: 'check-values §1.1 extra anchors (C)' },
  { input: { tK: 220, f: 'murphy-koop', phase: 'water' }, expected: 4.36165648, tol: 1e-9, source: 'check-values §1.1 extra anchors (C)' },
  { input: { tK: 225, f: 'murphy-koop', phase: 'water' }, expected: 7.806250871, tol: 1e-9, source: 'check-values §1.1 extra anchors (C)' },
  { input: { tK: 230, f: 'murphy-koop', phase: 'water' }, expected: 13.55413543, tol: 1e-9, source: 'check-values §1.1 extra anchors (C)' },
  { input: { tK: 275, f: 'iapws', phase: 'water' }, expected: 698.451167, tol: 2e-4, source: 'IAPWS-95 Table 8 p_s(275 K) (F2, check-values §1.1); our liquid form is the IAPWS 1992 auxiliary equation, which the release states agrees with IAPWS-95 to its uncertainty' },
  // Goff–Gratch ice (Smithsonian form, e_i0 = 6.1071 hPa) column of check-values §1.2, 7 digits.
  { input: { tK: 273.16, f: 'goff-gratch', phase: 'ice' }, expected: 610.71, tol: 1e-9, source: 'SMT1984 definition e_i(273.16 K) = 6.1071 hPa (check-values §1.2)' },
  { input: { tK: 263.15, f: 'goff-gratch', phase: 'ice' }, expected: 259.4714, tol: 5e-7, source: 'check-values §1.2 Goff–Gratch column (C)' },
  { input: { tK: 233.15, f: 'goff-gratch', phase: 'ice' }, expected: 12.81782, tol: 5e-7, source: 'check-values §1.2 Goff–Gratch column (C)' },
  { input: { tK: 193.15, f: 'goff-gratch', phase: 'ice' }, expected: 0.05462781, tol: 5e-7, source: 'check-values §1.2 Goff–Gratch column (C)' },
  // Magnus forms at 0 °C reduce to their prefactors (AlduchovEskridge1996, coefficients from memory).
  { input: { tK: 273.15, f: 'magnus', phase: 'water' }, expected: 610.94, tol: 1e-12, source: 'Alduchov & Eskridge 1996 AERK prefactor 6.1094 hPa at 0 °C (from memory)' },
  { input: { tK: 273.15, f: 'magnus', phase: 'ice' }, expected: 611.21, tol: 1e-12, source: 'Alduchov & Eskridge 1996 AERKi prefactor 6.1121 hPa at 0 °C (from memory)' },
  // Goff–Gratch liquid: e_w(Ts = 373.16 K) = 1013.246 hPa by construction of the formula.
  { input: { tK: 373.15, f: 'goff-gratch', phase: 'water' }, expected: 101324.6 * (1 - 3.62e-4), tol: 2e-4, source: 'SMT1984: e_w(373.16 K) = 1013.246 hPa; at 373.15 K lower by ≈ 0.036 % (slope 3.6 %/K, common practice, no source)' },
);

describe('saturation vapour pressure: published and same-formula check values', () => {
  it.each(primary)('$input.f $input.phase at $input.tK K → $expected Pa ($source)', ({ input, expected, tol }) => {
    expect(relErr(sat(input.phase, input.tK, input.f), expected)).toBeLessThanOrEqual(tol);
  });
});

describe('IAPWS formulations against python3-iapws (data-samples/physics/reference.json)', () => {
  const src = `python3-iapws ${REFERENCE.versions.iapws}`;
  it.each(REFERENCE.iapwsSublimation.map((p) => ({ input: p.tK, expected: p.pPa, tol: 1e-12, source: `${src} _Sublimation_Pressure (IAPWS R14-08 eq. 6)` })))(
    'ice, iapws, $input K ($source)',
    ({ input, expected, tol }) => {
      expect(relErr(saturationPressureIce(input, 'iapws'), expected)).toBeLessThanOrEqual(tol);
    },
  );
  it.each(REFERENCE.iapwsAuxiliary.map((p) => ({ input: p.tK, expected: p.pPa, tol: 1e-12, source: `${src} IAPWS95._Vapor_Pressure (IAPWS 1992 supplementary release eq. 1)` })))(
    'water, iapws, $input K ($source)',
    ({ input, expected, tol }) => {
      expect(relErr(saturationPressureWater(input, 'iapws'), expected)).toBeLessThanOrEqual(tol);
    },
  );
});

// check-values §7: bands relative to IAPWS R14-08 over ice, 193–273 K.
const ICE_BAND: Record<SaturationFormulation, number> = {
  'murphy-koop': 1e-3,
  sonntag: 1e-3,
  'goff-gratch': 3e-3,
  iapws: 1e-12,
  magnus: 1e-2,
};

describe('ice formulations agree with IAPWS R14-08 (python3-iapws) over 193–273.16 K', () => {
  const rows = SATURATION_FORMULATIONS.flatMap((f) =>
    REFERENCE.iapwsSublimation
      .filter((p) => p.tK >= 193)
      .map((p) => ({ input: { f, tK: p.tK }, expected: p.pPa, tol: ICE_BAND[f], source: 'python3-iapws R14-08; band from check-values §1.2/§7 (issue: 0.1 % MK, Sonntag; 0.3 % Goff–Gratch; 1 % Magnus)' })),
  );
  it.each(rows)('$input.f at $input.tK K within $tol ($source)', ({ input, expected, tol }) => {
    expect(relErr(saturationPressureIce(input.tK, input.f), expected)).toBeLessThanOrEqual(tol);
  });
});

describe('psychrolib 1.1.1 (ASHRAE 2017 ch. 1, Hyland–Wexler) as an outside reference', () => {
  const psy = loadPsychrolib();
  // Pairwise bands between two non-IAPWS forms are doubled (check-values §7).
  const iceTol: Record<SaturationFormulation, number> = { 'murphy-koop': 2e-3, sonntag: 2e-3, 'goff-gratch': 6e-3, iapws: 1e-3, magnus: 2e-2 };
  const waterTol: Record<SaturationFormulation, number> = { 'murphy-koop': 2e-3, sonntag: 4e-3, 'goff-gratch': 4e-3, iapws: 4e-3, magnus: 1e-2 };
  const iceRows = SATURATION_FORMULATIONS.flatMap((f) =>
    Array.from({ length: 80 }, (_, k) => -80 + k).map((tC) => ({ input: { f, tC }, tol: iceTol[f], source: 'psychrolib GetSatVapPres (ASHRAE 2017 ch. 1 eq. 5), band check-values §7' })),
  );
  it.each(iceRows)('ice $input.f at $input.tC °C within $tol ($source)', ({ input, tol }) => {
    const expected = psy.GetSatVapPres(input.tC);
    expect(relErr(saturationPressureIce(input.tC + 273.15, input.f), expected)).toBeLessThanOrEqual(tol);
  });
  it('IAPWS R14-08 within 1e-3 of psychrolib over the whole −100…0 °C ice range (check-values §1.2: HW − IAPWS ≤ 0.033 %)', () => {
    let worst = 0;
    for (let tC = -99.9; tC < 0; tC += 0.1) worst = Math.max(worst, relErr(saturationPressureIce(tC + 273.15, 'iapws'), psy.GetSatVapPres(tC)));
    expect(worst).toBeLessThanOrEqual(1e-3);
    expect(worst).toBeGreaterThan(0); // two different equations: they must not coincide
  });
  const waterRows = SATURATION_FORMULATIONS.flatMap((f) =>
    Array.from({ length: 50 }, (_, k) => 1 + k).map((tC) => ({ input: { f, tC }, tol: waterTol[f], source: 'psychrolib GetSatVapPres (ASHRAE 2017 ch. 1 eq. 6), band check-values §7 (liquid, T ≥ 253 K)' })),
  );
  it.each(waterRows)('water $input.f at $input.tC °C within $tol ($source)', ({ input, tol }) => {
    const expected = psy.GetSatVapPres(input.tC);
    expect(relErr(saturationPressureWater(input.tC + 273.15, input.f), expected)).toBeLessThanOrEqual(tol);
  });
});

// Supercooled water: IAPWS-95 (python3-iapws, only ≥ 238 K) and the cross-formulation bands of §1.3/§7.
function waterBand(f: SaturationFormulation, tK: number): number {
  const wide = f === 'magnus';
  if (tK >= 253) return wide ? 5e-3 : 2e-3;
  if (tK >= 243) return wide ? 6e-3 : 3e-3;
  if (tK >= 233) return 1e-2;
  return 2.5e-2;
}

describe('supercooled water', () => {
  const rows = SATURATION_FORMULATIONS.flatMap((f) =>
    REFERENCE.iapws95Saturation.map((p) => ({
      input: { f, tK: p.tK },
      expected: p.pPa,
      // pairwise against IAPWS-95 (not MK): bands doubled, except MK itself (check-values §7)
      tol: (f === 'murphy-koop' ? 1 : 2) * waterBand(f, p.tK),
      source: `python3-iapws ${REFERENCE.versions.iapws} IAPWS-95 phase equilibrium; band check-values §7`,
    })),
  );
  it.each(rows)('$input.f at $input.tK K within $tol of IAPWS-95 ($source)', ({ input, expected, tol }) => {
    expect(relErr(saturationPressureWater(input.tK, input.f), expected)).toBeLessThanOrEqual(tol);
  });

  const mkBands = SATURATION_FORMULATIONS.filter((f) => f !== 'murphy-koop').flatMap((f) =>
    [263.15, 253.15, 243.15, 233.15, 223.15].map((tK) => ({ input: { f, tK }, tol: waterBand(f, tK), source: 'check-values §1.3 table and §7 liquid bands relative to Murphy–Koop' })),
  );
  it.each(mkBands)('$input.f within $tol of Murphy–Koop at $input.tK K ($source)', ({ input, tol }) => {
    expect(relErr(saturationPressureWater(input.tK, input.f), saturationPressureWater(input.tK, 'murphy-koop'))).toBeLessThanOrEqual(tol);
  });

  it('every liquid formulation serves down to 200 K, and only Murphy–Koop is valid there (issue §1)', () => {
    for (const f of SATURATION_FORMULATIONS) {
      // supercooled liquid is metastable with respect to ice, so e_w > e_i (thermodynamics; MurphyKoop2005)
      expect(saturationPressureWater(200, f)).toBeGreaterThan(saturationPressureIce(200, f));
      expect(isExtrapolated(f, 'water', 200, 260)).toBe(f !== 'murphy-koop');
    }
  });
});

describe('derivatives', () => {
  const rows = SATURATION_FORMULATIONS.flatMap((f) => [200, 220, 240, 260, 280].map((tK) => ({ input: { f, tK }, tol: 1e-7, source: 'definition: central difference of e_w with h = 1e-3 K (truncation ~1e-8)' })));
  it.each(rows)('de/dT of $input.f at $input.tK K ($source)', ({ input, tol }) => {
    const h = 1e-3;
    const fdW = (saturationPressureWater(input.tK + h, input.f) - saturationPressureWater(input.tK - h, input.f)) / (2 * h);
    expect(relErr(saturationPressureWaterDerivative(input.tK, input.f), fdW)).toBeLessThanOrEqual(tol);
    const fdI = (saturationPressureIce(input.tK + h, input.f) - saturationPressureIce(input.tK - h, input.f)) / (2 * h);
    expect(relErr(saturationPressureIceDerivative(input.tK, input.f), fdI)).toBeLessThanOrEqual(tol);
  });
});

describe('ranges, errors and array forms', () => {
  it('throws a RangeError naming formulation and range outside the extrapolation range', () => {
    expect(() => saturationPressureIce(50, 'sonntag')).toThrow(RangeError);
    expect(() => saturationPressureIce(50, 'sonntag')).toThrow(/100–330 K of saturation formulation "sonntag"/);
    expect(() => saturationPressureWater(100, 'murphy-koop')).toThrow(/water extrapolation range 123–373.15 K of saturation formulation "murphy-koop"/);
    expect(() => saturationPressureWater(250, 'bogus' as SaturationFormulation)).toThrow(/unknown saturation formulation "bogus"; valid: murphy-koop, sonntag, goff-gratch, iapws, magnus/);
  });
  it('NaN in, NaN out (scalar)', () => {
    expect(saturationPressureIce(NaN)).toBeNaN();
  });
  it('info is immutable', () => {
    const info = saturationFormulationInfo('sonntag');
    expect(Object.isFrozen(info.water.validK)).toBe(true);
    expect(() => {
      (info.water as unknown as { validK: number[] }).validK = [0, 1];
    }).toThrow(TypeError);
  });
  it('info lists validity inside extrapolation for every formulation, and isExtrapolated follows validK', () => {
    for (const f of SATURATION_FORMULATIONS) {
      const info = saturationFormulationInfo(f);
      expect(info.name).toBe(f);
      for (const ph of [info.ice, info.water]) {
        expect(ph.extrapolationK[0]).toBeLessThanOrEqual(ph.validK[0]);
        expect(ph.extrapolationK[1]).toBeGreaterThanOrEqual(ph.validK[1]);
        expect(ph.source.length).toBeGreaterThan(5);
      }
    }
    expect(isExtrapolated('iapws', 'ice', 180, 273.16)).toBe(false);
    expect(isExtrapolated('magnus', 'ice', 180, 273)).toBe(true);
    expect(isExtrapolated('sonntag', 'water', 280, 300)).toBe(false);
  });
  it('array forms equal the scalar forms, write NaN outside the range and count those cells', () => {
    const t = Float32Array.from([200, 230, NaN, 60, 260, 400]);
    for (const f of SATURATION_FORMULATIONS) {
      const out32 = new Float32Array(t.length);
      const out64 = new Float64Array(t.length);
      expect(saturationPressureIceArray(out32, t, f)).toBe(f === 'iapws' ? 1 : 2);
      expect(saturationPressureWaterArray(out64, t, f)).toBe(f === 'iapws' ? 1 : 2);
      for (const i of [0, 1, 4]) {
        expect(out32[i]).toBe(Math.fround(saturationPressureIce(t[i], f)));
        expect(out64[i]).toBe(saturationPressureWater(t[i], f));
      }
      expect(out32[2]).toBeNaN();
      if (f !== 'iapws') expect(out32[3]).toBeNaN();
      expect(out32[5]).toBeNaN();
    }
  });
});
