/**
 * GRIB1 parameter tables against outside sources:
 *   - the quantities frostgrid relies on, from /work/shared/notes/check-values.md §6 (which cites
 *     ecCodes grib1/2.0.3.table and 2.98.128.table);
 *   - live, every code of WMO table 2 version 3 and of ECMWF table 128 against the shortName,
 *     name and units keys python3-eccodes reports for a message carrying it.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { describeGrib1Parameter } from '../../../lib/formats/grib/edition1/index.js';
import { PYTHON, run, toolAvailable } from '../../support/tools.js';

const dir = mkdtempSync(join(tmpdir(), 'frostgrid-grib1-tables-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const SECTION6 = 'check-values.md §6 (ecCodes grib1/2.0.3.table, 2.98.128.table)';

describe('GRIB1 parameters frostgrid uses', () => {
  it.each([
    { table: 3, centre: 255, number: 11, shortName: 't', units: 'K', quantity: 'air_temperature', rh: undefined },
    { table: 3, centre: 255, number: 51, shortName: 'q', units: 'kg kg**-1', quantity: 'specific_humidity', rh: undefined },
    { table: 3, centre: 255, number: 52, shortName: 'r', units: '%', quantity: 'relative_humidity', rh: undefined },
    { table: 3, centre: 255, number: 6, shortName: 'z', units: 'm**2 s**-2', quantity: 'geopotential', rh: undefined },
    { table: 3, centre: 255, number: 7, shortName: 'gh', units: 'gpm', quantity: 'geopotential_height', rh: undefined },
    { table: 128, centre: 98, number: 130, shortName: 't', units: 'K', quantity: 'air_temperature', rh: undefined },
    { table: 128, centre: 98, number: 133, shortName: 'q', units: 'kg kg**-1', quantity: 'specific_humidity', rh: undefined },
    { table: 128, centre: 98, number: 157, shortName: 'r', units: '%', quantity: 'relative_humidity', rh: 'ecmwf-mixed' },
    { table: 128, centre: 98, number: 129, shortName: 'z', units: 'm**2 s**-2', quantity: 'geopotential', rh: undefined },
    { table: 128, centre: 98, number: 156, shortName: 'gh', units: 'gpm', quantity: 'geopotential_height', rh: undefined },
  ])('table $table parameter $number is $shortName ($quantity) — ' + SECTION6, (row) => {
    const d = describeGrib1Parameter(row);
    expect(d?.shortName).toBe(row.shortName);
    expect(d?.units).toBe(row.units);
    expect(d?.quantity).toBe(row.quantity);
    expect(d?.rhConvention).toBe(row.rh);
  });

  it('applies table 128 only to centre 98 and WMO table 2 only to versions 1–3 (ecCodes grib1/section.1.def)', () => {
    expect(describeGrib1Parameter({ table: 128, number: 130, centre: 7 })).toBeUndefined();
    expect(describeGrib1Parameter({ table: 200, number: 11, centre: 98 })).toBeUndefined();
    expect(describeGrib1Parameter({ table: 2, number: 11, centre: 34 })?.shortName).toBe('t');
    expect(describeGrib1Parameter({ table: 3, number: 200, centre: 34 })).toBeUndefined();
  });
});

const SCRIPT = `
import eccodes as ec, json, sys
path = sys.argv[1] + '/params.grib1'
with open(path, 'wb') as f:
    for table, centre, codes in ((3, 255, range(1, 128)), (128, 98, range(1, 255))):
        for p in codes:
            h = ec.codes_grib_new_from_samples('GRIB1')
            if centre != 98:
                ec.codes_set(h, 'deleteLocalDefinition', 1)
                ec.codes_set(h, 'centre', centre)
            ec.codes_set(h, 'table2Version', table)
            ec.codes_set(h, 'indicatorOfParameter', p)
            ec.codes_write(h, f)
            ec.codes_release(h)
out = []
with open(path, 'rb') as f:
    while True:
        h = ec.codes_grib_new_from_file(f)
        if h is None:
            break
        out.append({k: ec.codes_get(h, k) for k in ('table2Version', 'indicatorOfParameter', 'centre', 'shortName', 'name', 'units')})
        ec.codes_release(h)
print(json.dumps(out))
`;

describe('GRIB1 parameter tables against ecCodes (live)', () => {
  it('every code ecCodes names has our shortName and units (and name, for WMO table 2)', () => {
    if (!toolAvailable('python', 'eccodes')) return;
    const rows = JSON.parse(run(PYTHON, ['-c', SCRIPT, dir])) as {
      table2Version: number;
      indicatorOfParameter: number;
      centre: string;
      shortName: string;
      name: string;
      units: string;
    }[];
    expect(rows.length).toBe(127 + 254);
    const wrong: string[] = [];
    let named = 0;
    for (const r of rows) {
      const d = describeGrib1Parameter({ table: r.table2Version, number: r.indicatorOfParameter, centre: r.table2Version === 128 ? 98 : 255 });
      if (r.shortName === 'unknown') continue;
      named++;
      const nameOk = r.table2Version === 128 || d?.name === r.name;
      if (d?.shortName !== r.shortName || d.units !== r.units || !nameOk) {
        wrong.push(`${r.table2Version}/${r.indicatorOfParameter}: ecCodes ${r.shortName} "${r.name}" ${r.units}, ours ${JSON.stringify(d)}`);
      }
    }
    expect(wrong).toEqual([]);
    expect(named).toBeGreaterThan(300);
  });
});
