/**
 * Every GRIB1 fixture decoded by frostgrid against what ecCodes reports for the same bytes
 * (data-samples/fixtures/grib1/<name>.json, written by make_fixtures.py with python3-eccodes:
 * codes_get_values and the keys named below).
 */
import { describe, expect, it } from 'vitest';
import { describeGrib1Parameter, parseGrib1Message } from '../../../lib/formats/grib/edition1/index.js';
import { fixtureNames, isoOf, loadFixture, locationOf } from './fixtures.js';

const names = fixtureNames();

describe('GRIB1 fixtures against ecCodes', () => {
  it('has the fixtures the generator makes (one per grid type and packing)', () => {
    // Source: data-samples/fixtures/grib1/make_fixtures.py (the list of record(...) calls).
    const types = new Set(names.map((n) => loadFixture(n).ref.keys.dataRepresentationType));
    expect([...types].sort((a, b) => Number(a) - Number(b))).toEqual([0, 3, 4, 5, 10]);
  });

  it('covers each second-order form ecCodes reads, with and without a bitmap, on lat-lon and reduced Gaussian grids', () => {
    // Oracle: the packingType, gridType, bitmapPresent and boustrophedonicOrdering keys ecCodes
    // 2.28 reports for each fixture (forms: ecCodes grib1/section.4.def packingType concept).
    const seen = new Set(
      names.map((n) => {
        const k = loadFixture(n).ref.keys;
        return `${String(k.packingType)} ${String(k.gridType)} bitmap=${String(k.bitmapPresent)} boustrophedonic=${String(k.boustrophedonicOrdering ?? 0)}`;
      }),
    );
    const wanted: string[] = [];
    for (const form of ['grid_second_order_row_by_row', 'grid_second_order_constant_width', 'grid_second_order_general_grib1']) {
      for (const grid of ['regular_ll', 'reduced_gg']) for (const bitmap of [0, 1]) wanted.push(`${form} ${grid} bitmap=${bitmap} boustrophedonic=0`);
    }
    // Boustrophedonic: constant width with and without a bitmap, general with one (ecCodes 2.28
    // cannot decode general without a bitmap, and crashes on reduced grids: make_fixtures.py).
    wanted.push(
      'grid_second_order_constant_width regular_ll bitmap=0 boustrophedonic=1',
      'grid_second_order_constant_width regular_ll bitmap=1 boustrophedonic=1',
      'grid_second_order_general_grib1 regular_ll bitmap=1 boustrophedonic=1',
    );
    expect(wanted.filter((w) => !seen.has(w))).toEqual([]);
  });

  it.each(names)('%s: values equal ecCodes codes_get_values at every point (1e-6 relative)', (name) => {
    const fx = loadFixture(name);
    const info = parseGrib1Message(fx.path, fx.bytes, locationOf(fx.bytes));
    const values = info.decode();
    expect(values.length).toBe(fx.ref.values.length);
    const finite = fx.ref.values.filter((v): v is number => v !== null);
    const scale = Math.max(...finite.map(Math.abs));
    let bad = 0;
    let firstBad = '';
    for (let i = 0; i < values.length; i++) {
      const want = fx.ref.values[i];
      const got = values[i];
      const ok = want === null ? Number.isNaN(got) : Math.abs(got - want) <= 1e-6 * Math.abs(want) + 1e-12 * scale;
      if (!ok) {
        if (bad === 0) firstBad = `point ${i}: got ${got}, ecCodes ${want}`;
        bad++;
      }
    }
    expect(firstBad).toBe('');
    expect(bad).toBe(0);
    // Missing points exactly where the bitmap puts them (ecCodes numberOfMissing).
    const missing = values.reduce((n, v) => n + (Number.isNaN(v) ? 1 : 0), 0);
    expect(missing).toBe(fx.ref.keys.numberOfMissing);
    expect(info.hasBitmap).toBe(fx.ref.keys.bitmapPresent === 1);
  });

  it.each(names)('%s: product definition equals ecCodes keys', (name) => {
    const fx = loadFixture(name);
    const k = fx.ref.keys;
    const info = parseGrib1Message(fx.path, fx.bytes, locationOf(fx.bytes));
    expect(info.parameter).toEqual({ edition: 1, table: k.table2Version, number: k.indicatorOfParameter, centre: k.centre });
    expect(info.level.code).toBe(k.indicatorOfTypeOfLevel);
    expect(info.level.type).toBe(k.typeOfLevel === 'isobaricInhPa' ? 'isobaric' : 'other');
    // Isobaric levels (Code table 3, type 100) are hPa in the message and Pa in ours.
    expect(info.level.value).toBe(k.indicatorOfTypeOfLevel === 100 ? (k.level as number) * 100 : k.level);
    expect(info.referenceTime.iso).toBe(isoOf(k.dataDate as number, k.dataTime as number));
    expect(info.stepHours).toBe(k.endStep);
    expect(info.validTime.iso).toBe(isoOf(k.validityDate as number, k.validityTime as number));
    expect(info.validTime.epochMs! - info.referenceTime.epochMs!).toBe((k.endStep as number) * 3_600_000);
    const ensemble = typeof k.numberOfForecastsInEnsemble === 'number' && k.numberOfForecastsInEnsemble > 0;
    expect(info.member).toBe(ensemble ? k.perturbationNumber : undefined);
    expect(info.numberOfPoints).toBe(k.numberOfPoints);
    expect(info.binaryScale).toBe(k.binaryScaleFactor);
    expect(info.decimalScale).toBe(k.decimalScaleFactor);
    expect(info.referenceValue).toBe(k.referenceValue);
    const secondOrder = String(k.packingType).startsWith('grid_second_order');
    expect(info.packing).toBe(secondOrder ? 'grib1-second-order' : 'grib1-simple');
    if (secondOrder) expect(info.bitsPerValue).toBe(k.widthOfFirstOrderValues);
    else expect(info.bitsPerValue).toBe(k.bitsPerValue);
  });

  const secondOrderNames = names.filter((n) => String(loadFixture(n).ref.keys.packingType).startsWith('grid_second_order'));
  it.each(secondOrderNames)('%s: ecCodes bitsPerValue is the bits of the decoded range, not octet 11', (name) => {
    // ecCodes 2.28 second_order_bits_per_value: the number of bits of ceil(|max − min|·2^−E·10^D)
    // over the decoded values — coded values for general extended packing, the values with the
    // missing value (9999 in make_fixtures.py) in place for the other forms.
    const fx = loadFixture(name);
    const k = fx.ref.keys;
    const info = parseGrib1Message(fx.path, fx.bytes, locationOf(fx.bytes));
    const values = [...info.decode()];
    const extended = k.generalExtended2ordr === 1;
    const range = extended ? values.filter((v) => !Number.isNaN(v)) : values.map((v) => (Number.isNaN(v) ? 9999 : v));
    const span = Math.ceil(Math.abs(Math.max(...range) - Math.min(...range)) * 2 ** -info.binaryScale * 10 ** info.decimalScale);
    let bits = 0;
    while (span >= 2 ** bits) bits++;
    expect(bits).toBe(k.bitsPerValue);
    expect(info.bitsPerValue).toBe(k.widthOfFirstOrderValues);
  });

  it.each(names)('%s: parameter description equals ecCodes shortName, name and units', (name) => {
    const fx = loadFixture(name);
    const k = fx.ref.keys;
    const d = describeGrib1Parameter({ table: k.table2Version as number, number: k.indicatorOfParameter as number, centre: k.centre as number });
    expect(d?.shortName).toBe(k.shortName);
    expect(d?.units).toBe(k.units);
    // ecCodes takes `name` from its paramId concept, the table from 2.x.table: case may differ
    // ("Geopotential Height" in 2.98.128.table).
    expect(d?.name.toLowerCase()).toBe(String(k.name).toLowerCase());
  });

  it.each(names)('%s: grid definition equals ecCodes keys', (name) => {
    const fx = loadFixture(name);
    const k = fx.ref.keys;
    const g = parseGrib1Message(fx.path, fx.bytes, locationOf(fx.bytes)).grid;
    expect(g.template).toBe(`grib1-${k.dataRepresentationType}`);
    // Earth: ecCodes earthIsOblate (grib1/resolution_flags.def): IAU 1965 spheroid, else the
    // 6 367 470 m sphere (grib1/section.2.def "radius").
    if (k.earthIsOblate === 1) {
      expect(g.earth).toEqual({ kind: 'ellipsoid', semiMajorM: 6378160, inverseFlattening: 6378160 / (6378160 - 6356775) });
    } else {
      expect(g.earth).toEqual({ kind: 'sphere', radiusM: 6367470 });
    }
    expect(g.scanningMode).toBe(k.scanningMode);
    switch (g.type) {
      case 'regular_ll':
      case 'rotated_ll':
        expect(k.gridType).toBe(g.type);
        expect([g.ni, g.nj]).toEqual([k.Ni, k.Nj]);
        expect([g.lat1, g.lon1, g.lat2, g.lon2]).toEqual([
          k.latitudeOfFirstGridPointInDegrees,
          k.longitudeOfFirstGridPointInDegrees,
          k.latitudeOfLastGridPointInDegrees,
          k.longitudeOfLastGridPointInDegrees,
        ]);
        expect([g.di, g.dj]).toEqual([k.iDirectionIncrementInDegrees, k.jDirectionIncrementInDegrees]);
        if (g.type === 'rotated_ll') {
          expect([g.southPoleLat, g.southPoleLon, g.rotationAngle]).toEqual([
            k.latitudeOfSouthernPoleInDegrees,
            k.longitudeOfSouthernPoleInDegrees,
            k.angleOfRotationInDegrees,
          ]);
        }
        break;
      case 'gaussian':
        expect(k.gridType).toBe(g.pl ? 'reduced_gg' : 'regular_gg');
        expect([g.N, g.nj]).toEqual([k.N, k.Nj]);
        expect(g.ni).toBe(k.Ni);
        expect(g.di).toBe(k.iDirectionIncrementInDegrees);
        expect([g.lat1, g.lon1, g.lat2, g.lon2]).toEqual([
          k.latitudeOfFirstGridPointInDegrees,
          k.longitudeOfFirstGridPointInDegrees,
          k.latitudeOfLastGridPointInDegrees,
          k.longitudeOfLastGridPointInDegrees,
        ]);
        expect(g.pl === undefined ? undefined : [...g.pl]).toEqual(k.pl);
        break;
      case 'lambert_conformal':
        expect(k.gridType).toBe('lambert');
        expect([g.nx, g.ny, g.lat1, g.lon1]).toEqual([k.Nx, k.Ny, k.latitudeOfFirstGridPointInDegrees, k.longitudeOfFirstGridPointInDegrees]);
        expect([g.lov, g.lad, g.latin1, g.latin2]).toEqual([k.LoVInDegrees, k.LaDInDegrees, k.Latin1InDegrees, k.Latin2InDegrees]);
        expect([g.dx, g.dy, g.projectionCentre]).toEqual([k.DxInMetres, k.DyInMetres, k.projectionCentreFlag]);
        break;
      case 'polar_stereographic':
        expect(k.gridType).toBe('polar_stereographic');
        expect([g.nx, g.ny, g.lat1, g.lon1]).toEqual([k.Nx, k.Ny, k.latitudeOfFirstGridPointInDegrees, k.longitudeOfFirstGridPointInDegrees]);
        expect([g.lov, g.lad, g.dx, g.dy]).toEqual([k.orientationOfTheGridInDegrees, k.LaDInDegrees, k.DxInMetres, k.DyInMetres]);
        expect(g.southPole).toBe(k.southPoleOnProjectionPlane === 1);
        break;
    }
  });
});
