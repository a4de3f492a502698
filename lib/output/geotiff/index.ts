export type { RasterDtype, RasterProfile, RasterMetadata } from './profile.js';
export { DEFAULT_PROFILE, DEFAULT_DEFLATE_LEVEL } from './profile.js';
export { encodeGeoTiff, type EncodeOptions } from './encoder.js';
export { writeGeoTiff, type WrittenRaster } from './write.js';
export { overviewLevels } from './overviews.js';
export { GeoTiffBandWriter, openGeoTiffWriter, type BandWriterOptions } from './band-writer.js';
