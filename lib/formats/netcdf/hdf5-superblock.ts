/**
 * The end-of-file address of an HDF5 superblock, to tell a truncated file before h5wasm meets it
 * (h5wasm then fails with unhelpful messages). Layout: HDF5 File Format Specification 3.0,
 * §II.A "Disk Format: Level 0A — Format Signature and Superblock":
 *   versions 0 and 1: signature(8) version(1) … sizeOfOffsets at byte 13; the addresses (base,
 *     free-space, end-of-file, driver) start at byte 24 (version 0) or 28 (version 1);
 *   versions 2 and 3: signature(8) version(1) sizeOfOffsets(1) sizeOfLengths(1) flags(1), then
 *     base, superblock-extension and end-of-file addresses from byte 12.
 * The end-of-file address is relative to the base address.
 */
export interface SuperblockInfo {
  readonly version: number;
  /** Byte where the superblock (signature) starts. */
  readonly at: number;
  /** Absolute byte where the file must end at least (base + end-of-file address). */
  readonly endOfFile: number;
}

function readAddress(b: Uint8Array, pos: number, size: number): number | undefined {
  if (pos + size > b.length) return undefined;
  let v = 0;
  let allOnes = true;
  for (let i = size - 1; i >= 0; i--) {
    v = v * 256 + b[pos + i]; // little-endian
    if (b[pos + i] !== 0xff) allOnes = false;
  }
  return allOnes ? undefined : v; // all ones = undefined address
}

export function hdf5Superblock(head: Uint8Array, at: number): SuperblockInfo | undefined {
  const version = head[at + 8];
  let sizeOfOffsets: number;
  let first: number;
  if (version === 0 || version === 1) {
    sizeOfOffsets = head[at + 13];
    first = at + (version === 0 ? 24 : 28);
  } else if (version === 2 || version === 3) {
    sizeOfOffsets = head[at + 9];
    first = at + 12;
  } else return undefined;
  if (![2, 4, 8].includes(sizeOfOffsets)) return undefined;
  const base = readAddress(head, first, sizeOfOffsets) ?? 0;
  const eofField = first + 2 * sizeOfOffsets; // the third address in every version
  const eof = readAddress(head, eofField, sizeOfOffsets);
  if (eof === undefined) return undefined;
  return { version, at, endOfFile: base + eof };
}
