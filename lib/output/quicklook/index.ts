export { writeQuicklook, renderQuicklook, quicklookGeometry, type QuicklookImage, type QuicklookGeometry } from './quicklook.js';
export { GLACIER_RAMP, MASK_COLOURS, NODATA_COLOUR, COAST_COLOUR, rampColour } from './ramp.js';
