/**
 * Error context of one GRIB edition 1 message: every error names the file, the message number and
 * the byte offset in the file where the problem was found.
 */
import { DecodeError, FormatError, UnsupportedError, withFile } from '../../../errors.js';
import type { GribMessageLocation } from '../types.js';

export class MessageContext {
  constructor(
    readonly file: string,
    readonly location: GribMessageLocation,
  ) {}

  private text(relOffset: number, message: string): string {
    return withFile(this.file, `GRIB1 message ${this.location.number} at byte ${this.location.offset + relOffset}: ${message}`);
  }

  private ctx(relOffset: number, cause?: unknown) {
    return { file: this.file, offset: this.location.offset + relOffset, message: this.location.number, cause };
  }

  /** The bytes are not a well-formed GRIB1 message (lengths, truncation, markers). */
  format(relOffset: number, message: string): FormatError {
    return new FormatError(this.text(relOffset, message), this.ctx(relOffset));
  }

  /** The message is well formed but its packing parameters are inconsistent. */
  decode(relOffset: number, message: string, attribute?: string): DecodeError {
    return new DecodeError(this.text(relOffset, message), { ...this.ctx(relOffset), attribute });
  }

  /** A feature of GRIB1 that this decoder does not implement; `id` is the code the message uses. */
  unsupported(relOffset: number, what: string, id: string | number, detail = ''): UnsupportedError {
    const message = `${what} ${id} is not supported${detail === '' ? '' : ` (${detail})`}`;
    return new UnsupportedError(this.text(relOffset, message), what, id, this.ctx(relOffset));
  }
}
