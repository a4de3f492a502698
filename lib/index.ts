/**
 * frostgrid public API. Re-exports by name; package.json#exports blocks deep imports.
 * Layers: grid model and formats (open), physics, products, output, jobs (what the command runs).
 */
export * from './errors.js';
export type * from './grid/types.js';
export { WGS84 } from './grid/types.js';
export type { OpenOptions, FormatDriver } from './formats/registry.js';
export { open, openRaw, DRIVERS } from './open.js';
export { VERSION } from './version.js';

// Physics: pure kernels over typed arrays, SI units.
export * from './physics/index.js';

// Products: per-level masks and statistics, columns, areas, summaries.
export * from './products/index.js';

// Output: GeoTIFF / COG writer, raster layout, quicklooks.
export * from './output/index.js';

// Jobs: what the command line runs, usable from notebooks too.
export { describeDataset, describeField, describeGrid, describeCrs, timeLabel } from './jobs/describe.js';
export type { DatasetDescription, VariableDescription, GridDescription } from './jobs/describe.js';
export { probe, fieldByName, nodeLocator, parseIsoTime } from './jobs/probe.js';
export { regridToLatLon, rotatedToGeographic, geographicToRotated, type Regridder, type RegridMethod } from './grid/regrid.js';
export type { ProbePoint, ProbeRow, ProbeRequest } from './jobs/probe.js';
export { runMaskJob, selectLevels, selectTimes, timeFolderName, compactTime, OUTPUT_FILES } from './jobs/masks.js';
export type { MaskJobOptions, MaskJobResult, LevelSelection } from './jobs/masks.js';

// Grid model helpers: field selection, zero-copy slice views, calendars, CF units.
export { findField, findHumidity, type FindFieldOptions, type FindHumidityOptions, type HumidityQuantity } from './grid/select.js';
export { sliceView, flipLatitude, northToSouth, rotateColumns, toLongitudeConvention, subBox, viewGet, isContiguous, contiguous, type SliceView } from './grid/view.js';
export { decodeTimes, resolveCalendar, parseTimeUnits, calendarDate } from './grid/calendar.js';
export { toSI, parseUnits, type SiTarget, type SiConversion } from './cf/units.js';

// GRIB low-level access: message index, parameter tables, Gaussian latitudes.
export { scanGrib, readGribIndex, describeParameter, gaussianLatitudes, type GribScan, type GribIndex } from './formats/grib/index.js';
