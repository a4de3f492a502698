/**
 * Physics core of frostgrid: saturation vapour pressure, humidity, the Schmidt–Appleman
 * criterion, fuels and the International Standard Atmosphere. Pure, SI, no I/O; imports nothing
 * from the rest of the project.
 *
 * @packageDocumentation
 */
export * from './constants.js';
export {
  SATURATION_FORMULATIONS,
  DEFAULT_SATURATION,
  saturationFormulationInfo,
  isExtrapolated,
  saturationPressureIce,
  saturationPressureWater,
  saturationPressureIceDerivative,
  saturationPressureWaterDerivative,
  saturationPressureIceArray,
  saturationPressureWaterArray,
} from './saturation.js';
export type { SaturationFormulation, SaturationFormulationInfo, SaturationPhaseInfo, SaturationPhase, FloatArray } from './saturation.js';
export * from './humidity.js';
export * from './fuels.js';
export {
  mixingLineSlope,
  contrailFactor,
  thresholdTemperature,
  thresholdTemperatureApprox,
  criticalTemperature,
  DEFAULT_CRITERION,
  validateCriterionParameters,
} from './criterion.js';
export type { CriterionParameters } from './criterion.js';
export { CRITICAL_TABLE_NODES, prepareLevel, evaluateLevel, criticalTemperatureFromTable } from './level.js';
export type { LevelCriterion, LevelOutputs, LevelCounts } from './level.js';
export * from './isa.js';
