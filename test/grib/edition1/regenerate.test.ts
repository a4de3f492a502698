/**
 * Live re-creation of the fixtures: make_fixtures.py (python3-eccodes) writes every fixture into
 * a temporary directory; our decoder must agree with what ecCodes reports for those fresh files,
 * and with the same ecCodes version the files must be byte-identical to the committed ones.
 */
import { mkdtempSync, readFileSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { parseGrib1Message } from '../../../lib/formats/grib/edition1/index.js';
import { PYTHON, run, toolAvailable } from '../../support/tools.js';
import { FIXTURE_DIR, fixtureNames, loadFixture, locationOf, type EccodesReference } from './fixtures.js';

const dir = mkdtempSync(join(tmpdir(), 'frostgrid-grib1-regen-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('GRIB1 fixtures re-created with ecCodes (live)', () => {
  it('fresh fixtures decode to ecCodes values; same ecCodes version gives the same bytes', () => {
    if (!toolAvailable('python', 'eccodes')) return;
    run(PYTHON, [join(FIXTURE_DIR, 'make_fixtures.py'), dir]);
    const fresh = readdirSync(dir).filter((f) => f.endsWith('.grib1')).map((f) => f.slice(0, -6)).sort();
    expect(fresh).toEqual(fixtureNames());
    for (const name of fresh) {
      const bytes = new Uint8Array(readFileSync(join(dir, `${name}.grib1`)));
      const ref = JSON.parse(readFileSync(join(dir, `${name}.json`), 'utf8')) as EccodesReference;
      const values = parseGrib1Message(name, bytes, locationOf(bytes)).decode();
      expect(values.length, name).toBe(ref.values.length);
      for (let i = 0; i < values.length; i++) {
        const want = ref.values[i];
        if (want === null) expect(Number.isNaN(values[i]), `${name}[${i}]`).toBe(true);
        else expect(Math.abs(values[i] - want), `${name}[${i}]`).toBeLessThanOrEqual(1e-6 * Math.abs(want) + 1e-30);
      }
      const committed = loadFixture(name);
      if (committed.ref.eccodes === ref.eccodes) expect(Buffer.from(bytes).equals(Buffer.from(committed.bytes)), name).toBe(true);
    }
  });
});
