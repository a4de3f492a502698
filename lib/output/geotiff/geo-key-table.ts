/**
 * GeoKey identifiers and code values used by the encoder.
 *
 * Source: OGC GeoTIFF Standard 1.1 (OGC 19-008r4), §7 (key directory) and Annex C/D (key and
 * code values); EPSG codes from the EPSG Geodetic Parameter Dataset. Key names follow GeoTIFF 1.1;
 * the 1.0 names are given in comments where they differ.
 */

export const GeoKey = {
  GTModelTypeGeoKey: 1024,
  GTRasterTypeGeoKey: 1025,
  GTCitationGeoKey: 1026,
  /** GeographicTypeGeoKey in GeoTIFF 1.0. */
  GeodeticCRSGeoKey: 2048,
  /** GeogCitationGeoKey in 1.0. */
  GeodeticCitationGeoKey: 2049,
  /** GeogGeodeticDatumGeoKey in 1.0. */
  GeodeticDatumGeoKey: 2050,
  /** GeogPrimeMeridianGeoKey in 1.0. */
  PrimeMeridianGeoKey: 2051,
  GeogAngularUnitsGeoKey: 2054,
  /** GeogEllipsoidGeoKey in 1.0. */
  EllipsoidGeoKey: 2056,
  EllipsoidSemiMajorAxisGeoKey: 2057,
  EllipsoidSemiMinorAxisGeoKey: 2058,
  EllipsoidInvFlatteningGeoKey: 2059,
  PrimeMeridianLongitudeGeoKey: 2061,
  /** ProjectedCSTypeGeoKey in 1.0. */
  ProjectedCRSGeoKey: 3072,
  PCSCitationGeoKey: 3073,
  ProjectionGeoKey: 3074,
  /** ProjCoordTransGeoKey in 1.0. */
  ProjMethodGeoKey: 3075,
  ProjLinearUnitsGeoKey: 3076,
  ProjStdParallel1GeoKey: 3078,
  ProjStdParallel2GeoKey: 3079,
  ProjNatOriginLongGeoKey: 3080,
  ProjNatOriginLatGeoKey: 3081,
  ProjFalseEastingGeoKey: 3082,
  ProjFalseNorthingGeoKey: 3083,
  ProjFalseOriginLongGeoKey: 3084,
  ProjFalseOriginLatGeoKey: 3085,
  ProjFalseOriginEastingGeoKey: 3086,
  ProjFalseOriginNorthingGeoKey: 3087,
  ProjScaleAtNatOriginGeoKey: 3092,
  ProjStraightVertPoleLongGeoKey: 3095,
} as const;

/** Key directory header: KeyDirectoryVersion 1, KeyRevision 1, MinorRevision 1 (GeoTIFF 1.1). */
export const KEY_DIRECTORY_VERSION = [1, 1, 1] as const;

export const ModelType = { projected: 1, geographic: 2 } as const;
export const RasterType = { pixelIsArea: 1, pixelIsPoint: 2 } as const;
/** Code for "user-defined" in every code-valued key. */
export const USER_DEFINED = 32767;

/** Coordinate operation methods (GeoTIFF 1.1 Annex C, ProjMethodGeoKey values). */
export const ProjMethod = {
  lambertConformalConic2SP: 8,
  lambertConformalConic1SP: 9,
  polarStereographic: 15,
} as const;

/** EPSG codes. */
export const Epsg = {
  wgs84Geographic2D: 4326,
  greenwich: 8901,
  degree: 9102,
  metre: 9001,
} as const;
