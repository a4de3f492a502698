/**
 * TIFF and BigTIFF constants used by the encoder.
 *
 * Sources: TIFF Revision 6.0 (Adobe, 1992) sections 2, 8, 14, 15, 19; Adobe Photoshop TIFF
 * Technical Note 3 (floating-point predictor); BigTIFF proposal (AWare Systems, 2004);
 * GDAL GTiff driver documentation for the private tags 42112 (GDAL_METADATA) and
 * 42113 (GDAL_NODATA). Tag names are the standards' own and stay inside this encoder.
 */

/** Field types (TIFF 6.0 §2, BigTIFF adds 16–18). */
export const FieldType = {
  BYTE: 1,
  ASCII: 2,
  SHORT: 3,
  LONG: 4,
  DOUBLE: 12,
  LONG8: 16,
} as const;
export type FieldTypeCode = (typeof FieldType)[keyof typeof FieldType];

/** Size in bytes of one value of each field type. */
export const FIELD_TYPE_SIZE: Readonly<Record<FieldTypeCode, number>> = {
  1: 1,
  2: 1,
  3: 2,
  4: 4,
  12: 8,
  16: 8,
};

/** Tag codes (TIFF 6.0 Appendix A; GeoTIFF 1.1 §7; GDAL private tags). */
export const Tag = {
  NewSubfileType: 254,
  ImageWidth: 256,
  ImageLength: 257,
  BitsPerSample: 258,
  Compression: 259,
  PhotometricInterpretation: 262,
  StripOffsets: 273,
  SamplesPerPixel: 277,
  RowsPerStrip: 278,
  StripByteCounts: 279,
  PlanarConfiguration: 284,
  Predictor: 317,
  TileWidth: 322,
  TileLength: 323,
  TileOffsets: 324,
  TileByteCounts: 325,
  ExtraSamples: 338,
  SampleFormat: 339,
  ModelPixelScaleTag: 33550,
  ModelTiepointTag: 33922,
  ModelTransformationTag: 34264,
  GeoKeyDirectoryTag: 34735,
  GeoDoubleParamsTag: 34736,
  GeoAsciiParamsTag: 34737,
  GDAL_METADATA: 42112,
  GDAL_NODATA: 42113,
} as const;

/** Compression codes (TIFF 6.0 §3; Adobe Deflate = 8, zlib stream, TIFF Technical Note 2). */
export const Compression = { none: 1, deflate: 8 } as const;

/** Predictor codes (TIFF 6.0 §14; Technical Note 3 for 3). */
export const PredictorCode = { none: 1, horizontal: 2, float: 3 } as const;

/** SampleFormat codes (TIFF 6.0 §19). */
export const SampleFormat = { uint: 1, int: 2, ieeeFloat: 3 } as const;

export const PhotometricMinIsBlack = 1;
export const PlanarContig = 1;
export const PlanarSeparate = 2;
/** NewSubfileType bit 0: reduced-resolution version of another image. */
export const ReducedResolution = 1;
/** ExtraSamples value 0: unspecified data. */
export const ExtraSampleUnspecified = 0;

/** Classic TIFF magic 42 and BigTIFF magic 43, little-endian byte order mark "II". */
export const CLASSIC_MAGIC = 42;
export const BIGTIFF_MAGIC = 43;
export const LITTLE_ENDIAN_MARK = 0x4949;

/** Largest file a classic TIFF can address (32-bit offsets). */
export const CLASSIC_MAX_BYTES = 0xffffffff;
