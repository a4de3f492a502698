/**
 * `frostgrid threshold` in-process: numbers against the exact criterion tables and wording of
 * usage errors.
 */
import { describe, expect, it } from 'vitest';
import { cli } from './support.js';

describe('frostgrid threshold', () => {
  // Source: shared/notes/check-values.md §3.1 (exact T_LM/T_LC with Murphy–Koop liquid, Newton
  // cross-checked with scipy brentq; EI_H2O 1.25, Q 43.2 MJ/kg, cp 1004, ε 0.622 — Schumann 1996).
  it.each([
    { p: 200, eta: 0.3, u: 0, g: 1.33445, tlm: 229.1009, tlc: 219.8836 },
    { p: 250, eta: 0.3, u: 0.5, g: 1.66806, tlm: 231.4056, tlc: 224.0699 },
    { p: 300, eta: 0.4, u: 1, g: 2.33528, tlm: 234.9903, tlc: 234.9903 },
    { p: 250, eta: 0.4, u: 0, g: 1.94607, tlm: 233.0313, tlc: 223.4325 },
  ])('p=$p hPa η=$eta U=$u matches the exact tables', async ({ p, eta, u, g, tlm, tlc }) => {
    const r = await cli('threshold', '--pressure', String(p), '--efficiency', String(eta), '--rh-water', String(u), '--json');
    expect(r.code).toBe(0);
    expect(r.stderr).toBe('');
    const j = JSON.parse(r.stdout);
    expect(j.mixing_line_slope_Pa_per_K).toBeCloseTo(g, 4);
    expect(Math.abs(j.threshold_temperature_K - tlm)).toBeLessThan(1e-3);
    expect(Math.abs(j.critical_temperature_K - tlc)).toBeLessThan(1e-3);
  });

  it('hydrogen raises the threshold temperature (common practice, no source)', async () => {
    const k = JSON.parse((await cli('threshold', '--pressure', '250', '--json')).stdout);
    const h = JSON.parse((await cli('threshold', '--pressure', '250', '--fuel', 'hydrogen', '--json')).stdout);
    expect(h.mixing_line_slope_Pa_per_K).toBeGreaterThan(k.mixing_line_slope_Pa_per_K * 2);
    expect(h.threshold_temperature_K).toBeGreaterThan(k.threshold_temperature_K + 5);
  });

  it('a fuel of your own from EI_H2O and LHV equals the kerosene preset with the same numbers', async () => {
    const preset = JSON.parse((await cli('threshold', '--pressure', '250', '--json')).stdout);
    const own = JSON.parse((await cli('threshold', '--pressure', '250', '--ei-h2o', '1.25', '--lhv', '43.2', '--json')).stdout);
    expect(own.mixing_line_slope_Pa_per_K).toBeCloseTo(preset.mixing_line_slope_Pa_per_K, 12);
    expect(own.fuel).toBe('user');
  });

  it('prints readable text without --json', async () => {
    const r = await cli('threshold', '--pressure', '250');
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/mixing-line slope G\s+1\.6681 Pa\/K/);
    expect(r.stdout).toMatch(/threshold T_LM\s+231\.41 K \(-41\.74 °C\)/);
  });

  it.each([
    { args: ['--pressure', '250', '--fuel', 'coal'], msg: 'unknown --fuel "coal"; known fuels: kerosene, synthetic-kerosene, hydrogen' },
    { args: ['--pressure', '250', '--efficiency', '1'], msg: '--efficiency must lie in [0, 1), got 1' },
    { args: ['--pressure', '250', '--efficiency', '-0.1'], msg: '--efficiency must lie in [0, 1), got -0.1' },
    { args: [], msg: 'threshold needs --pressure HPA' },
    { args: ['--pressure', 'high'], msg: '--pressure needs a number, got "high"' },
    { args: ['--pressure', '250', '--rh-water', '60'], msg: '--rh-water is a fraction 0..1 (not percent), got 60' },
    { args: ['--pressure', '250', '--ei-h2o', '1.3'], msg: 'a fuel of your own needs --lhv' },
    { args: ['--pressure', '250', '--saturation', 'tetens'], msg: 'unknown --saturation "tetens"' },
    { args: ['--pressure', '250', '--colour'], msg: "Unknown option '--colour'" },
    { args: ['--pressure', '250', '--ei-h2o', '20', '--lhv', '43'], msg: '--ei-h2o must be in (0, 10] kg/kg, got 20' },
    { args: ['--pressure', '250', '--ei-h2o', '1.25', '--lhv', '0'], msg: '--lhv must be in (0, 1000) MJ/kg, got 0' },
    { args: ['--pressure', '250', '--hydrogen-fraction', '2', '--lhv', '43'], msg: '--hydrogen-fraction must be in [0, 1], got 2' },
  ])('usage error: $msg', async ({ args, msg }) => {
    const r = await cli('threshold', ...args);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toContain(`frostgrid threshold: ${msg}`);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
  });

  it('--help prints usage with an example and exits 0', async () => {
    const r = await cli('threshold', '--help');
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('Usage: frostgrid threshold --pressure HPA');
    expect(r.stdout).toContain('Example:');
  });
});

describe('frostgrid (top level)', () => {
  it('lists the commands and the caution', async () => {
    const r = await cli('--help');
    expect(r.code).toBe(0);
    for (const c of ['info', 'probe', 'masks', 'threshold']) expect(r.stdout).toContain(`  ${c}`);
    expect(r.stdout).toContain('not an operational flight-planning');
  });
  it('an unknown command is a usage error', async () => {
    const r = await cli('paint');
    expect(r.code).toBe(2);
    expect(r.stderr).toBe('frostgrid: unknown command "paint"; commands: info, probe, masks, threshold (see frostgrid --help)\n');
  });
  it('every subcommand has --help with an example', async () => {
    for (const c of ['info', 'probe', 'masks', 'threshold']) {
      const r = await cli(c, '--help');
      expect(r.code).toBe(0);
      expect(r.stdout).toContain(`Usage: frostgrid ${c}`);
      expect(r.stdout).toContain('Example:');
    }
  });
});
