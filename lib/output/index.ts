/**
 * Output layer: GeoTIFF / cloud-optimized GeoTIFF writing, raster layout of grids and PNG
 * quicklook maps.
 */
export type { RasterDtype, RasterProfile, RasterMetadata, EncodeOptions, WrittenRaster } from './geotiff/index.js';
export { DEFAULT_PROFILE, DEFAULT_DEFLATE_LEVEL, encodeGeoTiff, writeGeoTiff, overviewLevels } from './geotiff/index.js';
export { rasterLayout, type RasterLayout, type RasterLayoutOptions } from './raster-layout.js';
export {
  writeQuicklook,
  renderQuicklook,
  quicklookGeometry,
  GLACIER_RAMP,
  MASK_COLOURS,
  NODATA_COLOUR,
  COAST_COLOUR,
  rampColour,
  type QuicklookImage,
  type QuicklookGeometry,
} from './quicklook/index.js';
export { GeoTiffBandWriter, openGeoTiffWriter, type BandWriterOptions } from './geotiff/index.js';
