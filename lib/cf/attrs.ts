/** Reading CF attributes with the checks every coder needs (typed errors naming the attribute). */
import { DecodeError } from '../errors.js';
import type { Attributes, AttrValue } from '../grid/types.js';

export interface AttrContext {
  readonly file?: string;
  readonly variable: string;
}

function numbersOf(v: AttrValue): number[] | undefined {
  if (typeof v === 'number') return [v];
  if (typeof v === 'bigint') return [Number(v)];
  if (Array.isArray(v) && v.every((x) => typeof x === 'number' || typeof x === 'bigint')) return v.map(Number);
  return undefined;
}

/** A numeric attribute as an array of numbers, or undefined when absent. */
export function numericAttr(attrs: Attributes, name: string, ctx: AttrContext): number[] | undefined {
  const v = attrs[name];
  if (v === undefined) return undefined;
  const nums = numbersOf(v);
  if (nums === undefined) {
    throw new DecodeError(`${ctx.file ? ctx.file + ': ' : ''}variable ${ctx.variable}: attribute ${name} must be numeric, found ${JSON.stringify(v)}`, {
      file: ctx.file,
      variable: ctx.variable,
      attribute: name,
    });
  }
  return nums;
}

/** A single-valued numeric attribute, or undefined when absent. */
export function scalarAttr(attrs: Attributes, name: string, ctx: AttrContext): number | undefined {
  const nums = numericAttr(attrs, name, ctx);
  if (nums === undefined) return undefined;
  if (nums.length !== 1) {
    throw new DecodeError(`${ctx.file ? ctx.file + ': ' : ''}variable ${ctx.variable}: attribute ${name} must hold one value, found ${nums.length}`, {
      file: ctx.file,
      variable: ctx.variable,
      attribute: name,
    });
  }
  return nums[0];
}

/** A text attribute, trimmed, or undefined when absent or not text. */
export function textAttr(attrs: Attributes, name: string): string | undefined {
  const v = attrs[name];
  if (typeof v === 'string') return v.trim();
  if (Array.isArray(v) && v.length > 0 && v.every((x) => typeof x === 'string')) return (v as string[]).join(' ').trim();
  return undefined;
}
