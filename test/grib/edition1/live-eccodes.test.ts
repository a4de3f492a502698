/**
 * Live cross-checks with python3-eccodes (skipped locally when it is missing, required in CI):
 *   - time units, time range indicators and centuries: a fixture re-coded with codes_set, then
 *     ecCodes' endStep (stepUnits=s), dataDate/dataTime and validityDate/validityTime against ours;
 *   - the large-message length rule: a message of more than 8 MB written by ecCodes in GRIBEX
 *     mode (ECCODES_GRIBEX_MODE_ON=1), its length and values against ecCodes';
 *   - second-order forms ecCodes reads but cannot write: that it still refuses to write them (the
 *     reason the fixtures are hand-packed), and a row-by-row field of 720 × 361 points (more
 *     values than P2 can count), packed by make_fixtures.py's hand_packed, against ecCodes'
 *     decoding of the same bytes.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { grib1MessageLength, parseGrib1Message } from '../../../lib/formats/grib/edition1/index.js';
import { PYTHON, run, toolAvailable } from '../../support/tools.js';
import { FIXTURE_DIR, isoOf, locationOf } from './fixtures.js';

const dir = mkdtempSync(join(tmpdir(), 'frostgrid-grib1-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** Key settings, each applied to ll_t500_t128_16bit (reference 2026-03-04 00Z, TRI 0, P1 6 h). */
const TIME_CASES: Record<string, number>[] = [
  { unitOfTimeRange: 0, P1: 90 },
  { unitOfTimeRange: 254, P1: 240 },
  { unitOfTimeRange: 2, P1: 3 },
  { unitOfTimeRange: 10, timeRangeIndicator: 3, P1: 6, P2: 18 },
  { unitOfTimeRange: 12, timeRangeIndicator: 4, P1: 1, P2: 3 },
  { timeRangeIndicator: 5, P1: 0, P2: 7 },
  { timeRangeIndicator: 2, P1: 3, P2: 9 },
  { timeRangeIndicator: 1, P1: 0 },
  { timeRangeIndicator: 10, P1: 1, P2: 44 },
  { centuryOfReferenceTimeOfData: 20, yearOfCentury: 100 },
  { centuryOfReferenceTimeOfData: 20, yearOfCentury: 99, month: 12, day: 31, hour: 23, minute: 30 },
  { centuryOfReferenceTimeOfData: 21, yearOfCentury: 28, month: 2, day: 29, hour: 18 },
];

const TIME_SCRIPT = `
import eccodes as ec, json, sys
cases = json.loads(sys.argv[1]); out = sys.argv[2]
with open(sys.argv[3], 'rb') as f:
    h = ec.codes_grib_new_from_file(f)
res = []
for i, sets in enumerate(cases):
    c = ec.codes_clone(h)
    for k, v in sets.items():
        ec.codes_set(c, k, v)
    path = '%s/time%d.grib1' % (out, i)
    with open(path, 'wb') as f:
        ec.codes_write(c, f)
    ec.codes_set(c, 'stepUnits', 's')
    res.append({k: ec.codes_get(c, k) for k in ('endStep', 'dataDate', 'dataTime', 'validityDate', 'validityTime')})
print(json.dumps(res))
`;

describe('GRIB1 time decoding against ecCodes (live)', () => {
  it('reference time, step and valid time for time units, time range indicators and centuries', () => {
    if (!toolAvailable('python', 'eccodes')) return;
    const refs = JSON.parse(run(PYTHON, ['-c', TIME_SCRIPT, JSON.stringify(TIME_CASES), dir, join(FIXTURE_DIR, 'll_t500_t128_16bit.grib1')])) as {
      endStep: number;
      dataDate: number;
      dataTime: number;
      validityDate: number;
      validityTime: number;
    }[];
    expect(refs.length).toBe(TIME_CASES.length);
    refs.forEach((ref, i) => {
      const bytes = new Uint8Array(readFileSync(join(dir, `time${i}.grib1`)));
      const info = parseGrib1Message(`time${i}`, bytes, locationOf(bytes));
      const what = JSON.stringify(TIME_CASES[i]);
      expect(Math.round(info.stepHours * 3600), what).toBe(ref.endStep);
      expect(info.referenceTime.iso, what).toBe(isoOf(ref.dataDate, ref.dataTime));
      // ecCodes validityTime is hhmm: compare to the minute.
      expect(info.validTime.iso.slice(0, 17) + '00Z', what).toBe(isoOf(ref.validityDate, ref.validityTime));
      expect(info.validTime.epochMs! - info.referenceTime.epochMs!, what).toBe(ref.endStep * 1000);
    });
  });
});

const LARGE_SCRIPT = `
import eccodes as ec, numpy as np, sys, json
out = sys.argv[1]
h = ec.codes_grib_new_from_samples('GRIB1')
for k, v in (('Ni', 1500), ('Nj', 1500), ('iDirectionIncrementInDegrees', 0.2), ('jDirectionIncrementInDegrees', 0.1),
             ('latitudeOfFirstGridPointInDegrees', 75), ('latitudeOfLastGridPointInDegrees', -74.9),
             ('longitudeOfFirstGridPointInDegrees', 0), ('longitudeOfLastGridPointInDegrees', 299.8), ('bitsPerValue', 32)):
    ec.codes_set(h, k, v)
i = np.arange(1500 * 1500, dtype=np.float64)
ec.codes_set_values(h, 250 + 20 * np.sin(i * 0.001) + np.cos(i * 1.7))
with open(out + '/large.grib1', 'wb') as f:
    ec.codes_write(h, f)
with open(out + '/large.grib1', 'rb') as f:
    r = ec.codes_grib_new_from_file(f)
ec.codes_get_values(r).astype('<f8').tofile(out + '/large.f64')
print(json.dumps({'totalLength': ec.codes_get(r, 'totalLength'), 'section4Length': ec.codes_get(r, 'section4Length')}))
`;

describe('GRIB1 large messages (more than 8 MB) against ecCodes (live)', () => {
  it('length by the 120-octet rule, and values, equal ecCodes', () => {
    if (!toolAvailable('python', 'eccodes')) return;
    // GRIBEX mode makes ecCodes write the 120-octet large-message form.
    const ref = JSON.parse(run('env', ['ECCODES_GRIBEX_MODE_ON=1', PYTHON, '-c', LARGE_SCRIPT, dir])) as {
      totalLength: number;
      section4Length: number;
    };
    const bytes = new Uint8Array(readFileSync(join(dir, 'large.grib1')));
    // The coded length carries the large-message flag (ecCodes g1_message_length).
    expect(bytes[4] & 0x80).toBe(0x80);
    expect(ref.totalLength).toBe(bytes.length);
    expect(grib1MessageLength(bytes.subarray(0, 200))).toBe(ref.totalLength);
    const info = parseGrib1Message('large.grib1', bytes, locationOf(bytes));
    const values = info.decode();
    const want = new Float64Array(new Uint8Array(readFileSync(join(dir, 'large.f64'))).buffer);
    expect(values.length).toBe(want.length);
    let worst = 0;
    for (let i = 0; i < want.length; i++) worst = Math.max(worst, Math.abs(values[i] - want[i]) / Math.abs(want[i]));
    expect(worst).toBeLessThanOrEqual(1e-6);
  });

  it('a large-message head too short to reach section 4 is a FormatError saying how many bytes are needed', () => {
    if (!toolAvailable('python', 'eccodes')) return;
    const bytes = new Uint8Array(readFileSync(join(dir, 'large.grib1')));
    expect(() => grib1MessageLength(bytes.subarray(0, 70), { file: 'large.grib1', offset: 0, message: 1 })).toThrow(
      /^large\.grib1: GRIB1 message 1 at byte 0: needs at least 95 bytes to read the section 4 length, has 70$/,
    );
  });
});

const SECOND_ORDER_SCRIPT = `
import importlib.util, json, sys
import numpy as np
spec = importlib.util.spec_from_file_location('make_fixtures', sys.argv[1])
mf = importlib.util.module_from_spec(spec)
spec.loader.exec_module(mf)
ec, out = mf.ec, sys.argv[2]
written = {}
for packing in ('grid_second_order_row_by_row', 'grid_second_order_constant_width', 'grid_second_order_general_grib1'):
    h = ec.codes_grib_new_from_samples('GRIB1')
    ec.codes_set_values(h, np.linspace(250.0, 260.0, ec.codes_get(h, 'numberOfPoints')))
    try:
        ec.codes_set(h, 'packingType', packing)
        written[packing] = ec.codes_get(h, 'packingType')
    except ec.GribInternalError as e:
        written[packing] = 'error: ' + type(e).__name__
    ec.codes_release(h)
for name, bitmap in (('rbr', False), ('rbr_bitmap', True)):
    h = ec.codes_grib_new_from_samples('GRIB1')
    mf.latlon(h, 720, 361, 90, 0, -90, 359.5, 0.5, 0.5)
    n = 720 * 361
    miss = None
    if bitmap:
        miss = np.zeros(n, dtype=bool)
        miss[(np.arange(n) * 7919) % 23 == 5] = True
        miss[720 * 100:720 * 101] = True
    mf.pack(h, mf.invented(n, 250, 20, 3), bits=16, missing=miss)
    rows = [720] * 361
    lengths = mf.present_per_row(rows, miss)
    widths = [w if k else 0 for w, k in zip(mf.cycle([0, 4, 9, 13, 17, 24], 361), lengths)]
    c = mf.hand_packed(h, ext=0x10, lengths=lengths, widths=widths, width_first=12, E=-16, seed=7, missing=miss)
    with open('%s/%s.grib1' % (out, name), 'wb') as f:
        ec.codes_write(c, f)
    v = ec.codes_get_values(c)
    if bitmap:
        v[miss] = np.nan
    v.astype('<f8').tofile('%s/%s.f64' % (out, name))
print(json.dumps(written))
`;

describe('GRIB1 second-order forms ecCodes reads but cannot write (live)', () => {
  it('ecCodes still refuses to write them; a 720 × 361 row-by-row field, with and without a bitmap, decodes to ecCodes values', () => {
    if (!toolAvailable('python', 'eccodes')) return;
    const written = JSON.parse(run(PYTHON, ['-c', SECOND_ORDER_SCRIPT, join(FIXTURE_DIR, 'make_fixtures.py'), dir])) as Record<string, string>;
    // ecCodes 2.28: codes_set(packingType) fails for all three (README of the fixtures).
    for (const [packing, result] of Object.entries(written)) expect(result, packing).toMatch(/^error: /);
    for (const name of ['rbr', 'rbr_bitmap']) {
      const bytes = new Uint8Array(readFileSync(join(dir, `${name}.grib1`)));
      // Layout: FM 92 GRIB edition 1, section 4 octets 19-20 (P2) cannot hold 259 920 values.
      const info = parseGrib1Message(`${name}.grib1`, bytes, locationOf(bytes));
      expect(info.packing).toBe('grib1-second-order');
      const values = info.decode();
      // Oracle: ecCodes 2.28 codes_get_values of the same bytes (NaN where it reports missing).
      const want = new Float64Array(new Uint8Array(readFileSync(join(dir, `${name}.f64`))).buffer);
      expect(values.length).toBe(720 * 361);
      let bad = -1;
      for (let i = 0; i < want.length && bad < 0; i++) {
        const ok = Number.isNaN(want[i]) ? Number.isNaN(values[i]) : Math.abs(values[i] - want[i]) <= 1e-6 * Math.abs(want[i]);
        if (!ok) bad = i;
      }
      expect(bad, bad >= 0 ? `${name} point ${bad}: ${values[bad]} vs ecCodes ${want[bad]}` : '').toBe(-1);
      expect(values.reduce((n, v) => n + (Number.isNaN(v) ? 1 : 0), 0)).toBe(want.reduce((n, v) => n + (Number.isNaN(v) ? 1 : 0), 0));
    }
  });
});
