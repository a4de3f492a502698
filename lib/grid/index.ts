/** The grid model: calendars, axes, horizontal grids, slice views and field selection. */
export * from './calendar.js';
export { recogniseAxis, type AxisKind } from './axes.js';
export { regularLatLonGrid, type RegularGridBuild } from './horizontal.js';
export * from './view.js';
export * from './select.js';
