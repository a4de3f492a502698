/**
 * Templates 5.2 (complex packing) and 5.3 (complex packing and spatial differencing), WMO-No. 306,
 * Vol. I.2, Part B, data templates 5.2/5.3 and 7.2/7.3, regulation 92.9.
 *
 * Section 7 holds, each part padded to a whole octet: (5.3 only) the first value(s) and the
 * overall minimum of the differences, sign-and-magnitude integers of `extraOctets` octets; NG group
 * reference values of `bitsPerValue` bits; NG group widths (+ reference width); NG scaled group
 * lengths (length = reference + scaled·increment; the last group's length is given
 * separately); then each group's values, `width` bits each, added to the group reference.
 * With missing-value management 1 (2), the all-ones value (all-ones − 1) of a group's width marks
 * a primary (secondary) missing value; a zero-width group whose reference is all ones (− 1) is
 * entirely missing. Spatial differencing is undone over the non-missing values only:
 * order 1: X[n] += min + X[n−1]; order 2: X[n] += min + 2X[n−1] − X[n−2].
 */
import { unpackUnsigned } from '../../../../codecs/bits.js';
import { s32, u32, u8 } from '../bytes.js';
import { readBitsInto } from './bitread.js';
import { constantField, readScale, scaleFactors } from './scale.js';
import { PackingProblem, type DataTemplate, type PackingParameters } from './types.js';

function readComplex(sec5: Uint8Array, template: number): PackingParameters {
  const extra: Record<string, number> = {
    groupSplitting: u8(sec5, 21),
    missingManagement: u8(sec5, 22),
    primaryMissing: u32(sec5, 23),
    secondaryMissing: u32(sec5, 27),
    groups: u32(sec5, 31),
    widthReference: u8(sec5, 35),
    widthBits: u8(sec5, 36),
    lengthReference: u32(sec5, 37),
    lengthIncrement: u8(sec5, 41),
    lastLength: u32(sec5, 42),
    lengthBits: u8(sec5, 46),
  };
  if (template === 3) {
    extra.order = u8(sec5, 47);
    extra.extraOctets = u8(sec5, 48);
  }
  return { ...readScale(sec5), template, extra };
}

/** Sign-and-magnitude integer of `n` octets. */
function signedOctets(b: Uint8Array, p: number, n: number): number {
  if (n === 4) return s32(b, p);
  let v = b[p] & 0x7f;
  for (let i = 1; i < n; i++) v = v * 256 + b[p + i];
  return b[p] & 0x80 ? -v : v;
}

const bytesFor = (bits: number) => Math.ceil(bits / 8);

function decodeComplex(p: PackingParameters, data: Uint8Array, count: number): Float64Array {
  const x = p.extra;
  const NG = x.groups;
  const mm = x.missingManagement;
  if (mm > 2) throw new PackingProblem('section 5 octet 23', `missing value management ${mm} is not defined (code table 5.5)`);
  if (NG === 0) return constantField(p, count);
  if (NG > count) throw new PackingProblem('section 5 octets 32–35', `${NG} groups for ${count} values`);
  if (p.bitsPerValue > 32 || x.widthBits > 32 || x.lengthBits > 32) {
    throw new PackingProblem('section 5', `bit counts (${p.bitsPerValue}, ${x.widthBits}, ${x.lengthBits}) exceed 32`);
  }
  let pos = 0; // byte position
  let ival1 = 0;
  let ival2 = 0;
  let minsd = 0;
  const order = p.template === 3 ? x.order : 0;
  if (p.template === 3) {
    if (order !== 1 && order !== 2) {
      throw new PackingProblem('section 5 octet 48', `order of spatial differencing ${order} is not 1 or 2`);
    }
    const n = x.extraOctets;
    if (n < 1 || n > 4) throw new PackingProblem('section 5 octet 49', `${n} octets for the extra descriptors`);
    if ((order + 1) * n > data.length) throw new PackingProblem('section 7', 'data too short for the spatial differencing descriptors');
    ival1 = signedOctets(data, 0, n);
    if (order === 2) ival2 = signedOctets(data, n, n);
    minsd = signedOctets(data, order * n, n);
    pos = (order + 1) * n;
  }
  const need = bytesFor(NG * p.bitsPerValue) + bytesFor(NG * x.widthBits) + bytesFor(NG * x.lengthBits);
  if (pos + need > data.length) {
    throw new PackingProblem('section 7', `${NG} group descriptors need ${need} bytes after byte ${pos}, the section holds ${data.length}`);
  }
  const refs = new Uint32Array(NG);
  unpackUnsigned(data, pos * 8, p.bitsPerValue, NG, refs);
  pos += bytesFor(NG * p.bitsPerValue);
  const widths = new Uint32Array(NG);
  unpackUnsigned(data, pos * 8, x.widthBits, NG, widths);
  pos += bytesFor(NG * x.widthBits);
  const lengths = new Uint32Array(NG);
  unpackUnsigned(data, pos * 8, x.lengthBits, NG, lengths);
  pos += bytesFor(NG * x.lengthBits);
  let total = 0;
  let bits = 0;
  for (let g = 0; g < NG; g++) {
    widths[g] += x.widthReference;
    lengths[g] = g === NG - 1 ? x.lastLength : x.lengthReference + lengths[g] * x.lengthIncrement;
    if (widths[g] > 32) throw new PackingProblem('section 7', `group ${g + 1} has width ${widths[g]} bits`);
    total += lengths[g];
    bits += lengths[g] * widths[g];
  }
  if (total !== count) {
    throw new PackingProblem('section 7', `group lengths add up to ${total} values, section 5 declares ${count}`);
  }
  if (pos + bytesFor(bits) > data.length) {
    throw new PackingProblem('section 7', `group values need ${bytesFor(bits)} bytes after byte ${pos}, the section holds ${data.length - pos}`);
  }
  const ints = new Float64Array(count);
  const missing = mm > 0 ? new Uint8Array(count) : undefined;
  const refMiss1 = 2 ** p.bitsPerValue - 1;
  const refMiss2 = refMiss1 - 1;
  let bitPos = pos * 8;
  let n = 0;
  for (let g = 0; g < NG; g++) {
    const len = lengths[g];
    const w = widths[g];
    const ref = refs[g];
    if (w === 0) {
      if (missing && (ref === refMiss1 || (mm === 2 && ref === refMiss2))) missing.fill(1, n, n + len);
      else ints.fill(ref, n, n + len);
      n += len;
      continue;
    }
    if (!missing) {
      readBitsInto(data, bitPos, w, len, ints, n, ref);
    } else {
      readBitsInto(data, bitPos, w, len, ints, n, 0);
      const m1 = 2 ** w - 1;
      const m2 = mm === 2 ? m1 - 1 : -1;
      for (let k = n; k < n + len; k++) {
        const v = ints[k];
        if (v === m1 || v === m2) missing[k] = 1;
        else ints[k] = v + ref;
      }
    }
    bitPos += w * len;
    n += len;
  }
  if (order > 0) undoSpatialDifferencing(ints, missing, count, order, ival1, ival2, minsd);
  const { bscale, dscale, ref } = scaleFactors(p);
  for (let i = 0; i < count; i++) ints[i] = (ints[i] * bscale + ref) * dscale;
  if (missing) for (let i = 0; i < count; i++) if (missing[i]) ints[i] = Number.NaN;
  return ints;
}

function undoSpatialDifferencing(
  v: Float64Array,
  missing: Uint8Array | undefined,
  count: number,
  order: number,
  ival1: number,
  ival2: number,
  minsd: number,
): void {
  let k = 0; // index among non-missing values
  let prev1 = 0;
  let prev2 = 0;
  for (let i = 0; i < count; i++) {
    if (missing && missing[i]) continue;
    let x: number;
    if (k === 0) x = ival1;
    else if (k === 1 && order === 2) x = ival2;
    else if (order === 1) x = v[i] + minsd + prev1;
    else x = v[i] + minsd + 2 * prev1 - prev2;
    v[i] = x;
    prev2 = prev1;
    prev1 = x;
    k++;
  }
}

export const complexPacking: DataTemplate = {
  name: 'complex',
  length: 47,
  read: readComplex,
  decode: decodeComplex,
};

export const complexSpatialPacking: DataTemplate = {
  name: 'complex-spatial-differencing',
  length: 49,
  read: readComplex,
  decode: decodeComplex,
};

