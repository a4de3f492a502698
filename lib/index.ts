/**
 * frostgrid public API. Re-exports by name; package.json#exports blocks deep imports.
 * (Maintained by the integrator: each layer has its own index under lib/<layer>/.)
 */
export * from './errors.js';
export type * from './grid/types.js';
export { WGS84 } from './grid/types.js';
