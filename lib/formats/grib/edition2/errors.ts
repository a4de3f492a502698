/** Typed errors of the GRIB2 decoder, located by file, message number and absolute byte offset. */
import { DecodeError, FormatError, UnsupportedError } from '../../../errors.js';
import type { GribMessageLocation } from '../types.js';

export interface MessageContext {
  readonly file: string;
  readonly location: GribMessageLocation;
}

function where(ctx: MessageContext, offsetInMessage: number): string {
  return `${ctx.file}: message ${ctx.location.number} at byte offset ${ctx.location.offset} (problem at byte ${ctx.location.offset + offsetInMessage})`;
}

export function formatError(ctx: MessageContext, offsetInMessage: number, what: string): FormatError {
  return new FormatError(`${where(ctx, offsetInMessage)}: ${what}`, {
    file: ctx.file,
    offset: ctx.location.offset + offsetInMessage,
    message: ctx.location.number,
  });
}

export function decodeError(ctx: MessageContext, offsetInMessage: number, what: string, cause?: unknown): DecodeError {
  return new DecodeError(`${where(ctx, offsetInMessage)}: ${what}`, {
    file: ctx.file,
    offset: ctx.location.offset + offsetInMessage,
    message: ctx.location.number,
    cause,
  });
}

export function unsupported(ctx: MessageContext, offsetInMessage: number, what: string, id: string): UnsupportedError {
  return new UnsupportedError(`${where(ctx, offsetInMessage)}: ${what} ${id} is not supported`, what, id, {
    file: ctx.file,
    offset: ctx.location.offset + offsetInMessage,
    message: ctx.location.number,
  });
}
