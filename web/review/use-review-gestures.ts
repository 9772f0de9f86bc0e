import { type PointerEvent, type RefObject, useRef, useState, type WheelEvent } from 'react';
import type { DishRecord } from '../../schema/records.ts';
import { type DishHandle, dragHandle, isDishHandle } from './dish-handles.ts';
import { type Frame, initialView, type View, viewAfterPinch, viewAfterWheel } from './view.ts';

/** A finger that moves less than this between down and up has tapped. */
const TAP_SLOP_PX = 10;

type Point = { x: number; y: number };
type Gesture =
  | { kind: 'none' }
  | { kind: 'tap' | 'pan'; x0: number; y0: number; at0: Point; view0: View }
  | { kind: 'pinch'; d0: number; mid0: Point; view0: View }
  | { kind: 'dish'; part: DishHandle; dish0: DishRecord };

export interface GestureTargets {
  frame: Frame;
  dish: DishRecord | null;
  /** A tap at a point of the photo (its pixels), with the tap's tolerance in those pixels. */
  onTap: (x: number, y: number, slack: number) => void;
  onDishMove: (dish: DishRecord) => void;
}

/**
 * Pointer gestures on the review picture: one finger taps, or pans where the photo reaches past the frame; two fingers
 * pinch-zoom; a finger on a dish handle (an element with data-handle="centre", "rim" or "side",
 * see dish-handles.ts) drags the dish, which is reported when the finger lifts. The mouse wheel zooms.
 */
export function useReviewGestures(svg: RefObject<SVGSVGElement | null>, t: GestureTargets) {
  const [view, setView] = useState<View>(() => initialView(t.frame, t.dish));
  const [dragDish, setDragDish] = useState<DishRecord | null>(null);
  const pointers = useRef(new Map<number, Point>());
  const gesture = useRef<Gesture>({ kind: 'none' });

  /** Client pixels → viewBox units (the frame, in the photo's pixels at zoom 1). */
  function toViewBox(x: number, y: number) {
    const m = svg.current!.getScreenCTM()!;
    return { x: (x - m.e) / m.a, y: (y - m.f) / m.d, perPx: 1 / m.a };
  }
  function toImage(x: number, y: number) {
    const b = toViewBox(x, y);
    return { x: (b.x - view.tx) / view.s, y: (b.y - view.ty) / view.s, perPx: b.perPx / view.s };
  }
  function twoFingers(): [Point, Point] {
    return [...pointers.current.values()] as [Point, Point];
  }

  function onPointerDown(e: PointerEvent) {
    svg.current!.setPointerCapture(e.pointerId);
    pointers.current.set(e.pointerId, { x: e.clientX, y: e.clientY });
    const handle = (e.target as Element).getAttribute('data-handle');
    if (pointers.current.size === 2) {
      const [a, b] = twoFingers();
      const mid0 = toViewBox((a.x + b.x) / 2, (a.y + b.y) / 2);
      gesture.current = { kind: 'pinch', d0: Math.hypot(a.x - b.x, a.y - b.y), mid0, view0: view };
    } else if (isDishHandle(handle) && (dragDish ?? t.dish)) {
      gesture.current = { kind: 'dish', part: handle, dish0: (dragDish ?? t.dish)! };
    } else {
      const at0 = toViewBox(e.clientX, e.clientY);
      gesture.current = { kind: 'tap', x0: e.clientX, y0: e.clientY, at0, view0: view };
    }
  }

  function onPointerMove(e: PointerEvent) {
    if (!pointers.current.has(e.pointerId)) return;
    pointers.current.set(e.pointerId, { x: e.clientX, y: e.clientY });
    const g = gesture.current;
    if (g.kind === 'pinch' && pointers.current.size === 2) {
      const [a, b] = twoFingers();
      const mid = toViewBox((a.x + b.x) / 2, (a.y + b.y) / 2);
      const ratio = Math.hypot(a.x - b.x, a.y - b.y) / g.d0;
      setView(viewAfterPinch(g.view0, g.mid0, mid, ratio, t.frame));
    } else if (g.kind === 'dish') {
      setDragDish(dragHandle(g.dish0, g.part, toImage(e.clientX, e.clientY)));
    } else if (
      (g.kind === 'tap' || g.kind === 'pan') &&
      Math.hypot(e.clientX - g.x0, e.clientY - g.y0) > TAP_SLOP_PX
    ) {
      gesture.current = { ...g, kind: 'pan' };
      // A pan is a pinch that does not spread: the same clamping keeps the photo in the frame.
      setView(viewAfterPinch(g.view0, g.at0, toViewBox(e.clientX, e.clientY), 1, t.frame));
    }
  }

  function onPointerUp(e: PointerEvent) {
    const g = gesture.current;
    pointers.current.delete(e.pointerId);
    if (g.kind === 'tap') {
      const at = toImage(e.clientX, e.clientY);
      t.onTap(at.x, at.y, TAP_SLOP_PX * at.perPx);
    } else if (g.kind === 'dish' && dragDish) {
      t.onDishMove(dragDish);
      setDragDish(null);
    }
    if (pointers.current.size === 0) gesture.current = { kind: 'none' };
  }

  function onPointerCancel(e: PointerEvent) {
    pointers.current.delete(e.pointerId);
    gesture.current = { kind: 'none' };
    setDragDish(null);
  }

  function onWheel(e: WheelEvent) {
    setView(viewAfterWheel(view, toViewBox(e.clientX, e.clientY), e.deltaY, t.frame));
  }

  return {
    view,
    dragDish,
    handlers: { onPointerDown, onPointerMove, onPointerUp, onPointerCancel, onWheel },
  };
}
