/**
 * Products layer of frostgrid: per-level masks and statistics, column summaries, cell areas,
 * RHi uncertainty from quantisation, and the run summary. Pure: reads Field slices, writes no
 * files.
 *
 * @packageDocumentation
 */
export * from './area.js';
export * from './stats.js';
export * from './column.js';
export * from './humidity.js';
export * from './level.js';
export * from './uncertainty.js';
export * from './summary.js';
