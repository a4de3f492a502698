/**
 * Section 1 of GRIB edition 1, the product definition section (PDS).
 * Octets (FM 92 GRIB edition 1, section 1): 1–3 length, 4 parameter table version, 5 centre,
 * 6 generating process, 7 grid definition, 8 flags (bit 1 GDS present, bit 2 BMS present),
 * 9 parameter (Code table 2), 10 level type (Code table 3), 11–12 level, 13–17 reference time,
 * 18 time unit, 19 P1, 20 P2, 21 time range indicator, 22–23 number in average, 24 number missing,
 * 25 century, 26 sub-centre, 27–28 decimal scale factor D (sign and magnitude), 29–40 reserved,
 * 41… local use.
 *
 * ECMWF local use (centre 98, or sub-centre 98; ecCodes definitions grib1/section.1.def and
 * local.98.1.def): octet 41 local definition number; definition 1 ("MARS labelling or ensemble
 * forecast data") carries class (42), type (43), stream (44–45), experiment version (46–49),
 * perturbation number (50) and number of forecasts in the ensemble (51).
 */
import type { GribLevel } from '../types.js';
import type { MessageContext } from './context.js';
import { s16, u16, u24 } from './octets.js';
import { readTime, type Grib1Time } from './time.js';

export const ECMWF_CENTRE = 98;
/** Level type 100: isobaric surface, level in hPa (Code table 3). */
export const LEVEL_ISOBARIC_HPA = 100;
/** Level types whose octets 11 and 12 hold the top and bottom of a layer (Code table 3). */
const LAYER_TYPES = new Set([101, 104, 106, 108, 110, 112, 114, 116, 120, 121, 128, 141]);

export interface Section1 {
  readonly length: number;
  readonly tableVersion: number;
  readonly centre: number;
  readonly subCentre: number;
  readonly process: number;
  readonly gridNumber: number;
  readonly hasGds: boolean;
  readonly hasBms: boolean;
  readonly parameter: number;
  readonly level: GribLevel;
  readonly time: Grib1Time;
  readonly timeRangeIndicator: number;
  readonly decimalScale: number;
  readonly localDefinition: number | undefined;
  /** Ensemble perturbation number (ECMWF local definition 1 with a non-zero ensemble size). */
  readonly member: number | undefined;
}

/** Parses section 1 starting at message offset `p`; `end` is the end of the message. */
export function readSection1(msg: Uint8Array, p: number, end: number, ctx: MessageContext): Section1 {
  if (p + 28 > end) throw ctx.format(p, `section 1 needs 28 bytes, ${end - p} remain`);
  const length = u24(msg, p);
  if (length < 28) throw ctx.format(p, `section 1 length ${length} is less than 28`);
  if (p + length > end) throw ctx.format(p, `section 1 length ${length} runs past the end of the message (${end - p} bytes remain)`);
  const s = msg.subarray(p, p + length);
  const centre = s[4];
  const subCentre = s[25];
  const levelType = s[9];
  const level: GribLevel =
    levelType === LEVEL_ISOBARIC_HPA
      ? { type: 'isobaric', code: levelType, value: u16(s, 10) * 100 }
      : { type: 'other', code: levelType, value: LAYER_TYPES.has(levelType) ? s[10] : u16(s, 10) };
  let localDefinition: number | undefined;
  let member: number | undefined;
  if (length > 40 && (centre === ECMWF_CENTRE || subCentre === ECMWF_CENTRE)) {
    localDefinition = s[40];
    if (localDefinition === 1 && length >= 51 && s[50] !== 0) member = s[49];
  }
  return {
    length,
    tableVersion: s[3],
    centre,
    subCentre,
    process: s[5],
    gridNumber: s[6],
    hasGds: (s[7] & 0x80) !== 0,
    hasBms: (s[7] & 0x40) !== 0,
    parameter: s[8],
    level,
    time: readTime(s, p, ctx),
    timeRangeIndicator: s[20],
    decimalScale: s16(s, 26),
    localDefinition,
    member,
  };
}
