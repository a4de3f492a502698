/**
 * CF coder 5 — time (CF 1.11 §4.4): a time coordinate's numbers decode with its `units`
 * ("<unit> since <reference>") and `calendar` to calendar dates (lib/grid/calendar.ts).
 */
import { DecodeError } from '../errors.js';
import { decodeTimes } from '../grid/calendar.js';
import type { Attributes, CalendarDate } from '../grid/types.js';
import { textAttr } from './attrs.js';

export function isTimeUnits(units: string | undefined): boolean {
  return units !== undefined && /^\s*[A-Za-z]+\s+since\s+/i.test(units);
}

export function decodeTimeCoordinate(values: ArrayLike<number>, attrs: Attributes, variable: string, file?: string): CalendarDate[] {
  const units = textAttr(attrs, 'units');
  const where = `${file ? file + ': ' : ''}variable ${variable}: `;
  if (units === undefined) throw new DecodeError(`${where}time coordinate has no units`, { file, variable, attribute: 'units' });
  return decodeTimes(values, units, textAttr(attrs, 'calendar'), where);
}
