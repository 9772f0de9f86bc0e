import { describe, expect, it } from 'vitest';
import { MAX_ZOOM, viewAfterPinch, viewAfterWheel } from './view.ts';

const W = 4000;
const H = 3000;
const image = (v: { s: number; tx: number; ty: number }, p: { x: number; y: number }) => ({
  x: (p.x - v.tx) / v.s,
  y: (p.y - v.ty) / v.s,
});

describe('pinch zoom of the review picture', () => {
  it('keeps the photo point under the fingers under them', () => {
    const v0 = { s: 1, tx: 0, ty: 0 };
    const mid = { x: 1500, y: 1200 };
    const v = viewAfterPinch(v0, mid, mid, 3, W, H);
    expect(v.s).toBe(3);
    const p = image(v, mid);
    expect(p.x).toBeCloseTo(1500, 9);
    expect(p.y).toBeCloseTo(1200, 9);
  });

  it('moving fingers pan, and zoom stays between 1 and the maximum', () => {
    const v = viewAfterPinch(
      { s: 2, tx: -1000, ty: -500 },
      { x: 1000, y: 1000 },
      { x: 1200, y: 1000 },
      1,
      W,
      H,
    );
    expect(v.tx).toBe(-800);
    expect(
      viewAfterPinch({ s: 1, tx: 0, ty: 0 }, { x: 0, y: 0 }, { x: 0, y: 0 }, 0.2, W, H).s,
    ).toBe(1);
    expect(viewAfterPinch({ s: 1, tx: 0, ty: 0 }, { x: 0, y: 0 }, { x: 0, y: 0 }, 50, W, H).s).toBe(
      MAX_ZOOM,
    );
  });

  it('never uncovers the frame: the photo edge stays at or beyond the frame edge', () => {
    const v = viewAfterPinch(
      { s: 2, tx: 0, ty: 0 },
      { x: 10, y: 10 },
      { x: 3000, y: 2500 },
      1,
      W,
      H,
    );
    expect(v.tx).toBe(0);
    expect(v.ty).toBe(0);
    const far = viewAfterPinch(
      { s: 2, tx: 0, ty: 0 },
      { x: 3000, y: 2500 },
      { x: -5000, y: -5000 },
      1,
      W,
      H,
    );
    expect(far.tx).toBe(W - 2 * W);
    expect(far.ty).toBe(H - 2 * H);
  });

  it('the mouse wheel zooms in for a negative delta, out for a positive one', () => {
    const at = { x: 2000, y: 1500 };
    const zin = viewAfterWheel({ s: 1, tx: 0, ty: 0 }, at, -400, W, H);
    expect(zin.s).toBeCloseTo(Math.E, 9);
    expect(viewAfterWheel(zin, at, 400, W, H).s).toBeCloseTo(1, 9);
  });
});
