/** CF decoding: one coder per rule, their order fixed in decode.ts, dataset decoding. */
export { toSI, parseUnits, type SiTarget, type SiConversion, type ParsedUnits, type UnitsContext } from './units.js';
export { recogniseQuantity, QUANTITIES, type QuantityMatch } from './quantity.js';
export { inferRhConvention } from './rh-convention.js';
export { decodeValues, valueCodec, type ValueCodec } from './decode.js';
export { decodeDataset, type DecodeOptions } from './dataset.js';
export { decodeTimeCoordinate, isTimeUnits } from './time.js';
export { NETCDF_DEFAULT_FILL } from './default-fill.js';
