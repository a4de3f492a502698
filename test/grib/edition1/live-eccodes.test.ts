/**
 * Live cross-checks with python3-eccodes (skipped locally when it is missing, required in CI):
 *   - time units, time range indicators and centuries: a fixture re-coded with codes_set, then
 *     ecCodes' endStep (stepUnits=s), dataDate/dataTime and validityDate/validityTime against ours;
 *   - the large-message length rule: a message of more than 8 MB written by ecCodes in GRIBEX
 *     mode (ECCODES_GRIBEX_MODE_ON=1), its length and values against ecCodes'.
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
