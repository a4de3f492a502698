/**
 * GRIB edition 1 message decoding: the entry points the file scan and dataset assembly call.
 */
export { parseGrib1Message, POINTS_PER_BYTE_LIMIT, POINTS_WITHOUT_DATA_LIMIT } from './message.js';
export { describeGrib1Parameter } from './describe.js';
export { grib1MessageLength, grib1Section4Offset, type LengthContext } from './length.js';
export { calendarDateFromEpochMs } from './time.js';
