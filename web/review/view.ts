import type { DishRecord } from '../../schema/records.ts';

/**
 * Zoom and pan of the review picture. The picture is shown in a square frame (the SVG viewBox
 * `0 0 size size`) that, at zoom 1, holds the dish and nothing more, so the agar fills the
 * screen's width. frame point = image point × s + (tx, ty).
 */
export interface View {
  s: number;
  tx: number;
  ty: number;
}

export interface Frame {
  /** Side of the square frame, in the photo's pixels at zoom 1. */
  size: number;
  /** The photo's size in pixels. */
  width: number;
  height: number;
}

/** Zoom past the dish-filling view, at most. */
export const MAX_ZOOM = 8;

/** A little agar-coloured margin around the dish, so its rim and handles stay in the frame. */
const DISH_MARGIN = 1.04;

/** The frame that holds the dish (or, with no dish found, the largest square of the photo). */
export function frameFor(dish: DishRecord | null, width: number, height: number): Frame {
  if (!dish) return { size: Math.min(width, height), width, height };
  const a = (dish.angleDeg * Math.PI) / 180;
  const halfX = Math.hypot(dish.rx * Math.cos(a), dish.ry * Math.sin(a));
  const halfY = Math.hypot(dish.rx * Math.sin(a), dish.ry * Math.cos(a));
  return { size: 2 * Math.max(halfX, halfY) * DISH_MARGIN, width, height };
}

/** The view the review opens on: the dish (or the photo's middle) filling the frame. */
export function initialView(frame: Frame, dish: DishRecord | null): View {
  const cx = dish?.cx ?? frame.width / 2;
  const cy = dish?.cy ?? frame.height / 2;
  return clamp({ s: 1, tx: frame.size / 2 - cx, ty: frame.size / 2 - cy }, frame);
}

/** Smallest zoom: the whole photo fits in the frame. */
function minZoom(f: Frame): number {
  return Math.min(1, f.size / Math.max(f.width, f.height));
}

/** One axis: the photo covers the frame where it can, and is centred where it cannot. */
function clampAxis(t: number, extent: number, size: number): number {
  if (extent <= size) return (size - extent) / 2;
  return Math.min(0, Math.max(size - extent, t));
}

function clamp(v: View, f: Frame): View {
  const s = Math.min(MAX_ZOOM, Math.max(minZoom(f), v.s));
  return { s, tx: clampAxis(v.tx, f.width * s, f.size), ty: clampAxis(v.ty, f.height * s, f.size) };
}

/** Two fingers that started at `mid0` now at `mid`, spread by `ratio`: the point under them stays under them. */
export function viewAfterPinch(
  v0: View,
  mid0: { x: number; y: number },
  mid: { x: number; y: number },
  ratio: number,
  frame: Frame,
): View {
  const s = Math.min(MAX_ZOOM, Math.max(minZoom(frame), v0.s * ratio));
  const ix = (mid0.x - v0.tx) / v0.s;
  const iy = (mid0.y - v0.ty) / v0.s;
  return clamp({ s, tx: mid.x - ix * s, ty: mid.y - iy * s }, frame);
}

/** A mouse wheel step at `at` (frame units): zoom in for a negative delta, around that point. */
export function viewAfterWheel(
  v: View,
  at: { x: number; y: number },
  deltaY: number,
  frame: Frame,
): View {
  return viewAfterPinch(v, at, at, Math.exp(-deltaY / 400), frame);
}
