import { describe, expect, it } from 'vitest';
import {
  type Frame,
  frameFor,
  initialView,
  MAX_ZOOM,
  viewAfterPinch,
  viewAfterWheel,
} from './view.ts';

const W = 4000;
const H = 3000;
/** A frame as large as the photo's height, so zoom 1 shows its middle 3000 × 3000. */
const F: Frame = { size: 3000, width: W, height: H };
const image = (v: { s: number; tx: number; ty: number }, p: { x: number; y: number }) => ({
  x: (p.x - v.tx) / v.s,
  y: (p.y - v.ty) / v.s,
});

describe('the frame the review opens on', () => {
  it('holds the dish, with a thin margin, centred on it', () => {
    const dish = { cx: 2100, cy: 1400, rx: 1000, ry: 1000, angleDeg: 0 };
    const frame = frameFor(dish, W, H);
    expect(frame.size).toBeCloseTo(2080, 6);
    const v = initialView(frame, dish);
    expect(v.s).toBe(1);
    const centre = image(v, { x: frame.size / 2, y: frame.size / 2 });
    expect(centre.x).toBeCloseTo(2100, 6);
    expect(centre.y).toBeCloseTo(1400, 6);
  });

  it('a turned oval dish is framed by its widest extent', () => {
    const frame = frameFor({ cx: 2000, cy: 1500, rx: 1000, ry: 500, angleDeg: 90 }, W, H);
    expect(frame.size).toBeCloseTo(2080, 6);
  });

  it('with no dish found, the largest square of the photo, centred', () => {
    const frame = frameFor(null, W, H);
    expect(frame.size).toBe(3000);
    expect(initialView(frame, null)).toEqual({ s: 1, tx: -500, ty: 0 });
  });
});

describe('pinch zoom of the review picture', () => {
  it('keeps the photo point under the fingers under them', () => {
    const v0 = { s: 1, tx: -500, ty: 0 };
    const mid = { x: 1500, y: 1200 };
    const v = viewAfterPinch(v0, mid, mid, 3, F);
    expect(v.s).toBe(3);
    const p = image(v, mid);
    expect(p.x).toBeCloseTo(2000, 9);
    expect(p.y).toBeCloseTo(1200, 9);
  });

  it('moving fingers pan, and zoom stays between the whole photo and the maximum', () => {
    const v = viewAfterPinch(
      { s: 2, tx: -1000, ty: -500 },
      { x: 1000, y: 1000 },
      { x: 1200, y: 1000 },
      1,
      F,
    );
    expect(v.tx).toBe(-800);
    // Zoomed right out, the whole photo fits the frame and is centred in it.
    const out = viewAfterPinch({ s: 1, tx: 0, ty: 0 }, { x: 0, y: 0 }, { x: 0, y: 0 }, 0.2, F);
    expect(out.s).toBeCloseTo(0.75, 9);
    expect(out.tx).toBeCloseTo(0, 9);
    expect(out.ty).toBeCloseTo((3000 - H * 0.75) / 2, 9);
    expect(viewAfterPinch({ s: 1, tx: 0, ty: 0 }, { x: 0, y: 0 }, { x: 0, y: 0 }, 50, F).s).toBe(
      MAX_ZOOM,
    );
  });

  it('never uncovers the frame: the photo edge stays at or beyond the frame edge', () => {
    const v = viewAfterPinch({ s: 2, tx: 0, ty: 0 }, { x: 10, y: 10 }, { x: 3000, y: 2500 }, 1, F);
    expect(v.tx).toBe(0);
    expect(v.ty).toBe(0);
    const far = viewAfterPinch(
      { s: 2, tx: 0, ty: 0 },
      { x: 3000, y: 2500 },
      { x: -5000, y: -5000 },
      1,
      F,
    );
    expect(far.tx).toBe(F.size - 2 * W);
    expect(far.ty).toBe(F.size - 2 * H);
  });

  it('the mouse wheel zooms in for a negative delta, out for a positive one', () => {
    const at = { x: 1500, y: 1500 };
    const zin = viewAfterWheel({ s: 1, tx: -500, ty: 0 }, at, -400, F);
    expect(zin.s).toBeCloseTo(Math.E, 9);
    expect(viewAfterWheel(zin, at, 400, F).s).toBeCloseTo(1, 9);
  });
});
