/** A tiny RGBA canvas: pixels, rectangles, lines and bitmap text. */
import type { Rgb } from './ramp.js';
import { GLYPH_HEIGHT, GLYPH_WIDTH, glyphFor } from './font.js';

export class Canvas {
  readonly data: Uint8Array;
  constructor(
    readonly width: number,
    readonly height: number,
    background: Rgb,
  ) {
    this.data = new Uint8Array(width * height * 4);
    for (let i = 0; i < width * height; i++) this.data.set([background[0], background[1], background[2], 255], i * 4);
  }

  set(x: number, y: number, c: Rgb): void {
    if (x < 0 || y < 0 || x >= this.width || y >= this.height) return;
    const i = (y * this.width + x) * 4;
    this.data[i] = c[0];
    this.data[i + 1] = c[1];
    this.data[i + 2] = c[2];
    this.data[i + 3] = 255;
  }

  rect(x: number, y: number, w: number, h: number, c: Rgb): void {
    for (let j = y; j < y + h; j++) for (let i = x; i < x + w; i++) this.set(i, j, c);
  }

  /** A line from (x0, y0) to (x1, y1) (Bresenham), clipped to `clip` when given. */
  line(x0: number, y0: number, x1: number, y1: number, c: Rgb, clip?: { x: number; y: number; w: number; h: number }): void {
    let x = Math.round(x0);
    let y = Math.round(y0);
    const xe = Math.round(x1);
    const ye = Math.round(y1);
    const dx = Math.abs(xe - x);
    const dy = -Math.abs(ye - y);
    const sx = x < xe ? 1 : -1;
    const sy = y < ye ? 1 : -1;
    let err = dx + dy;
    for (;;) {
      if (!clip || (x >= clip.x && y >= clip.y && x < clip.x + clip.w && y < clip.y + clip.h)) this.set(x, y, c);
      if (x === xe && y === ye) break;
      const e2 = 2 * err;
      if (e2 >= dy) {
        err += dy;
        x += sx;
      }
      if (e2 <= dx) {
        err += dx;
        y += sy;
      }
    }
  }

  /** Draws text with its top-left corner at (x, y); returns the x after the last glyph. */
  text(x: number, y: number, s: string, c: Rgb, scale = 1): number {
    let cx = x;
    for (const ch of s) {
      const g = glyphFor(ch);
      for (let r = 0; r < GLYPH_HEIGHT; r++) {
        for (let b = 0; b < GLYPH_WIDTH; b++) {
          if (g[r] & (1 << (GLYPH_WIDTH - 1 - b))) this.rect(cx + b * scale, y + r * scale, scale, scale, c);
        }
      }
      cx += (GLYPH_WIDTH + 1) * scale;
    }
    return cx;
  }
}

/** Width in pixels of a text at a scale. */
export function textWidth(s: string, scale = 1): number {
  return [...s].length * (GLYPH_WIDTH + 1) * scale;
}
