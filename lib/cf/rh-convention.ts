/**
 * Phase convention of a relative-humidity variable, inferred from the file's attributes.
 *  - ECMWF output (GRIB_centre = "ecmf", or an institution / history naming ECMWF): ECMWF's
 *    mixed-phase convention (IFS documentation, Part IV Physical processes: saturation over
 *    water above 0 °C, over ice below −23 °C, a quadratic blend between — from memory).
 *  - CMIP-style files (mip_era / project_id / a Conventions or table naming CMIP) and the
 *    `hur` variable: CMIP's convention (CMIP6 data request: over water above 0 °C, over ice
 *    below — from memory).
 *  - Otherwise undefined: the user must name the convention.
 * The user's choice always wins.
 */
import type { Attributes, RhConvention, RhConventionRecord } from '../grid/types.js';
import { textAttr } from './attrs.js';

const ECMWF_PATTERNS = [/european centre for medium-range weather forecasts/i, /\bECMWF\b/];

export function inferRhConvention(
  variable: string,
  varAttrs: Attributes,
  globalAttrs: Attributes,
  userChoice?: RhConvention,
): RhConventionRecord | undefined {
  if (userChoice !== undefined) return { convention: userChoice, source: 'user' };
  for (const [scope, attrs] of [['variable', varAttrs], ['global', globalAttrs]] as const) {
    const centre = textAttr(attrs, 'GRIB_centre');
    if (centre !== undefined && centre.toLowerCase() === 'ecmf') {
      return { convention: 'ecmwf-mixed', source: `${scope} attribute GRIB_centre=${centre}` };
    }
  }
  for (const key of ['institution', 'source', 'history']) {
    const v = textAttr(globalAttrs, key);
    if (v !== undefined && ECMWF_PATTERNS.some((p) => p.test(v))) {
      return { convention: 'ecmwf-mixed', source: `global attribute ${key}=${v}` };
    }
  }
  for (const key of ['mip_era', 'project_id', 'Conventions', 'table_id']) {
    const v = textAttr(globalAttrs, key);
    if (v !== undefined && /CMIP/i.test(v)) return { convention: 'cmip', source: `global attribute ${key}=${v}` };
  }
  if (variable === 'hur' && textAttr(globalAttrs, 'activity_id') !== undefined) {
    return { convention: 'cmip', source: 'variable name hur with attribute activity_id' };
  }
  return undefined;
}
