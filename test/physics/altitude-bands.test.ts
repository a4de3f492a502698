/**
 * Schumann (2005), C. R. Physique 6: in the standard atmosphere with η = 0.3, contrails form in
 * saturated air from about 8.2 km upwards and in dry air between about 10.2 and 14 km (F2: quoted
 * from the paper's figure, check-values §3.2). Reproduced from our ISA and criterion code.
 */
import { describe, expect, it } from 'vitest';
import {
  FUEL_PRESETS,
  criticalTemperature,
  isaPressureFromAltitude,
  isaTemperatureAtAltitude,
  mixingLineSlope,
} from '../../lib/physics/index.js';

/** margin T_LC(U) − T_ISA at geopotential altitude h (m). */
function margin(h: number, U: number, eta: number): number {
  const G = mixingLineSlope(isaPressureFromAltitude(h), FUEL_PRESETS.kerosene, eta);
  return criticalTemperature(G, U) - isaTemperatureAtAltitude(h);
}

/** altitude in [a, b] where margin changes sign (bisection to 1 m). */
function crossing(a: number, b: number, U: number, eta: number): number {
  let fa = margin(a, U, eta);
  for (let k = 0; k < 60 && b - a > 1; k++) {
    const m = 0.5 * (a + b);
    const fm = margin(m, U, eta);
    if (Math.sign(fm) === Math.sign(fa)) {
      a = m;
      fa = fm;
    } else b = m;
  }
  return 0.5 * (a + b);
}

describe('Schumann (2005) standard-atmosphere altitude bands, kerosene, η = 0.3', () => {
  it.each([
    { input: { U: 1, a: 6000, b: 11000 }, expected: 8200, tol: 200, source: 'Schumann 2005, C. R. Physique 6 (F2 via check-values §3.2): saturated air from ≈ 8.2 km' },
    { input: { U: 0, a: 8000, b: 12000 }, expected: 10200, tol: 200, source: 'Schumann 2005 (F2): dry air from ≈ 10.2 km' },
    { input: { U: 0, a: 12000, b: 17000 }, expected: 14000, tol: 200, source: 'Schumann 2005 (F2): dry air up to ≈ 14 km' },
  ])('U = $input.U: boundary at $expected ± $tol m ($source)', ({ input, expected, tol }) => {
    const h = crossing(input.a, input.b, input.U, 0.3);
    expect(Math.abs(h - expected)).toBeLessThanOrEqual(tol);
  });
  it('saturated air stays contrail-forming from 8.5 km up to 19 km (Schumann 2005 (F2): 8.2–19 km)', () => {
    for (let h = 8500; h <= 19000; h += 250) expect(margin(h, 1, 0.3)).toBeGreaterThan(0);
    expect(margin(7500, 1, 0.3)).toBeLessThan(0);
  });
  it('dry air: no contrails at 9.5 km and at 15 km, contrails at 12 km (Schumann 2005 (F2))', () => {
    expect(margin(9500, 0, 0.3)).toBeLessThan(0);
    expect(margin(12000, 0, 0.3)).toBeGreaterThan(0);
    expect(margin(15000, 0, 0.3)).toBeLessThan(0);
  });
});
