/**
 * Format drivers: each registers a sniff on the first bytes of a file and an open that yields the
 * grid model. `lib/open.ts` holds the list of drivers and picks the first whose sniff accepts.
 */
import type { GridDataset, Quantity, RhConvention, WarningSink } from '../grid/types.js';

export interface OpenOptions {
  /** Variable names the user gives explicitly, by quantity (overrides recognition). */
  readonly variables?: Partial<Record<Quantity, string>>;
  /** Phase convention of a relative-humidity variable when the file does not say. */
  readonly rhConvention?: RhConvention;
  /** Where decoding notes and warnings go; the library never prints. */
  readonly warn?: WarningSink;
}

export interface FormatDriver {
  /** Short name for messages ("netcdf3", "netcdf4", "grib"). */
  readonly name: string;
  /** True when the first bytes of a file (at least 512 when the file is that long) are this format's. */
  sniff(head: Uint8Array): boolean;
  open(path: string, options: OpenOptions): Promise<GridDataset>;
}
