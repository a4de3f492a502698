/**
 * Colours of frostgrid quicklooks: a ramp of our own for continuous fields (dark blue through
 * teal to pale ice), a two-colour mask style, and the colours of nodata, coastlines and text.
 */
export type Rgb = readonly [number, number, number];

/** Colour stops of the continuous ramp "frostgrid glacier", position 0..1. */
export const GLACIER_RAMP: readonly { at: number; rgb: Rgb }[] = [
  { at: 0, rgb: [22, 27, 72] },
  { at: 0.25, rgb: [38, 84, 152] },
  { at: 0.5, rgb: [48, 150, 170] },
  { at: 0.75, rgb: [150, 212, 196] },
  { at: 1, rgb: [246, 246, 214] },
];

export const MASK_COLOURS = {
  /** Value 0: condition not met. */
  off: [226, 232, 238] as Rgb,
  /** Value 1: condition met. */
  on: [196, 38, 84] as Rgb,
};

export const NODATA_COLOUR: Rgb = [140, 140, 140];
export const COAST_COLOUR: Rgb = [20, 20, 20];
export const BACKGROUND: Rgb = [255, 255, 255];
export const TEXT_COLOUR: Rgb = [0, 0, 0];

/** Ramp colour at position t (clamped to 0..1), linear between stops. */
export function rampColour(t: number): Rgb {
  const u = Math.min(1, Math.max(0, t));
  for (let k = 1; k < GLACIER_RAMP.length; k++) {
    const a = GLACIER_RAMP[k - 1];
    const b = GLACIER_RAMP[k];
    if (u <= b.at) {
      const w = (u - a.at) / (b.at - a.at);
      return [0, 1, 2].map((c) => Math.round(a.rgb[c] + w * (b.rgb[c] - a.rgb[c]))) as unknown as Rgb;
    }
  }
  return GLACIER_RAMP[GLACIER_RAMP.length - 1].rgb;
}
