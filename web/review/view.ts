/**
 * Zoom and pan of the review picture: viewBox point = image point × s + (tx, ty). Zoom stays
 * between 1 (the whole photo) and MAX_ZOOM, and the photo is kept covering the frame.
 */
export interface View {
  s: number;
  tx: number;
  ty: number;
}

export const MAX_ZOOM = 8;

function clamp(v: View, width: number, height: number): View {
  const s = Math.min(MAX_ZOOM, Math.max(1, v.s));
  return {
    s,
    tx: Math.min(0, Math.max(width - width * s, v.tx)),
    ty: Math.min(0, Math.max(height - height * s, v.ty)),
  };
}

/** Two fingers that started at `mid0` now at `mid`, spread by `ratio`: the point under them stays under them. */
export function viewAfterPinch(
  v0: View,
  mid0: { x: number; y: number },
  mid: { x: number; y: number },
  ratio: number,
  width: number,
  height: number,
): View {
  const s = Math.min(MAX_ZOOM, Math.max(1, v0.s * ratio));
  const ix = (mid0.x - v0.tx) / v0.s;
  const iy = (mid0.y - v0.ty) / v0.s;
  return clamp({ s, tx: mid.x - ix * s, ty: mid.y - iy * s }, width, height);
}

/** A mouse wheel step at `at` (viewBox units): zoom in for a negative delta, around that point. */
export function viewAfterWheel(
  v: View,
  at: { x: number; y: number },
  deltaY: number,
  width: number,
  height: number,
): View {
  return viewAfterPinch(v, at, at, Math.exp(-deltaY / 400), width, height);
}
