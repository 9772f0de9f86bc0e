import { useRef, useState } from 'react';
import type { ColonyRecord, DishRecord } from '../../schema/records.ts';
import type { ClassLook } from '../bench/colours.ts';
import { type View, viewAfterPinch, viewAfterWheel } from '../review/view.ts';

/** Halo behind a class outline: light on dark class colours, dark on light ones. */
function halo(hex: string): string {
  const n = Number.parseInt(hex.slice(1), 16);
  const luma = 0.299 * (n >> 16) + 0.587 * ((n >> 8) & 255) + 0.114 * (n & 255);
  return luma > 140 ? '#1b1b1b' : '#ffffff';
}

const TAP_SLOP_PX = 10;

/** Below this the analysis was unsure of a colony's colour: its ring is drawn broken. */
const UNSURE_CONFIDENCE = 0.75;

function markClass(c: ColonyRecord): string {
  if (!c.lab) return 'colony added';
  return c.confidence < UNSURE_CONFIDENCE ? 'colony unsure' : 'colony';
}

export interface ReviewViewProps {
  previewUrl: string;
  width: number;
  height: number;
  colonies: readonly ColonyRecord[];
  looks: [ClassLook, ClassLook];
  dish: DishRecord | null;
  /** A tap at a point of the photo (original pixels), with the tap's tolerance in those pixels. */
  onTap: (x: number, y: number, slack: number) => void;
  onDishMove: (dish: DishRecord) => void;
}

/**
 * The photo with every colony outlined in its class colour. One finger taps (or pans when
 * zoomed); two fingers pinch-zoom; the dish outline's centre and rim handles drag.
 */
export function ReviewView(p: ReviewViewProps) {
  const svg = useRef<SVGSVGElement>(null);
  const [view, setView] = useState<View>({ s: 1, tx: 0, ty: 0 });
  const pointers = useRef(new Map<number, { x: number; y: number }>());
  const gesture = useRef<
    | { kind: 'none' }
    | { kind: 'tap' | 'pan'; x0: number; y0: number; view0: View }
    | { kind: 'pinch'; d0: number; mid0: { x: number; y: number }; view0: View }
    | { kind: 'dish'; part: 'centre' | 'rim'; dish0: DishRecord }
  >({ kind: 'none' });
  const [dragDish, setDragDish] = useState<DishRecord | null>(null);
  const dish = dragDish ?? p.dish;

  /** Client pixels → viewBox units (the photo's pixels at zoom 1). */
  function toViewBox(x: number, y: number) {
    const m = svg.current!.getScreenCTM()!;
    return { x: (x - m.e) / m.a, y: (y - m.f) / m.d, perPx: 1 / m.a };
  }
  function toImage(x: number, y: number, v = view) {
    const b = toViewBox(x, y);
    return { x: (b.x - v.tx) / v.s, y: (b.y - v.ty) / v.s, perPx: b.perPx / v.s };
  }

  function down(e: React.PointerEvent) {
    svg.current!.setPointerCapture(e.pointerId);
    pointers.current.set(e.pointerId, { x: e.clientX, y: e.clientY });
    const handle = (e.target as Element).getAttribute('data-handle');
    if (pointers.current.size === 2) {
      const [a, b] = [...pointers.current.values()] as [
        { x: number; y: number },
        { x: number; y: number },
      ];
      gesture.current = {
        kind: 'pinch',
        d0: Math.hypot(a.x - b.x, a.y - b.y),
        mid0: toViewBox((a.x + b.x) / 2, (a.y + b.y) / 2),
        view0: view,
      };
    } else if (handle && dish) {
      gesture.current = { kind: 'dish', part: handle as 'centre' | 'rim', dish0: dish };
    } else {
      gesture.current = { kind: 'tap', x0: e.clientX, y0: e.clientY, view0: view };
    }
  }

  function move(e: React.PointerEvent) {
    if (!pointers.current.has(e.pointerId)) return;
    pointers.current.set(e.pointerId, { x: e.clientX, y: e.clientY });
    const g = gesture.current;
    if (g.kind === 'pinch' && pointers.current.size === 2) {
      const [a, b] = [...pointers.current.values()] as [
        { x: number; y: number },
        { x: number; y: number },
      ];
      const mid = toViewBox((a.x + b.x) / 2, (a.y + b.y) / 2);
      setView(
        viewAfterPinch(
          g.view0,
          g.mid0,
          mid,
          Math.hypot(a.x - b.x, a.y - b.y) / g.d0,
          p.width,
          p.height,
        ),
      );
    } else if (g.kind === 'dish') {
      const at = toImage(e.clientX, e.clientY);
      const d = g.dish0;
      if (g.part === 'centre') setDragDish({ ...d, cx: at.x, cy: at.y });
      else {
        const r = Math.max(20, Math.hypot(at.x - d.cx, at.y - d.cy));
        setDragDish({ ...d, rx: r, ry: r * (d.ry / d.rx) });
      }
    } else if (
      (g.kind === 'tap' || g.kind === 'pan') &&
      Math.hypot(e.clientX - g.x0, e.clientY - g.y0) > TAP_SLOP_PX
    ) {
      const perPx = toViewBox(0, 0).perPx;
      gesture.current = { ...g, kind: 'pan' };
      if (g.view0.s > 1)
        setView({
          ...g.view0,
          tx: g.view0.tx + (e.clientX - g.x0) * perPx,
          ty: g.view0.ty + (e.clientY - g.y0) * perPx,
        });
    }
  }

  function up(e: React.PointerEvent) {
    const g = gesture.current;
    pointers.current.delete(e.pointerId);
    if (g.kind === 'tap') {
      const at = toImage(e.clientX, e.clientY);
      p.onTap(at.x, at.y, TAP_SLOP_PX * at.perPx);
    } else if (g.kind === 'dish' && dragDish) {
      p.onDishMove(dragDish);
      setDragDish(null);
    }
    gesture.current = pointers.current.size ? gesture.current : { kind: 'none' };
  }

  return (
    <div className="review">
      <svg
        ref={svg}
        viewBox={`0 0 ${p.width} ${p.height}`}
        data-testid="review"
        onPointerDown={down}
        onPointerMove={move}
        onPointerUp={up}
        onPointerCancel={(e) => {
          pointers.current.delete(e.pointerId);
          gesture.current = { kind: 'none' };
          setDragDish(null);
        }}
        onWheel={(e) => {
          const b = toViewBox(e.clientX, e.clientY);
          setView(viewAfterWheel(view, b, e.deltaY, p.width, p.height));
        }}
        role="img"
        aria-label={`Plate photo with ${p.colonies.length} colonies outlined`}
      >
        <g transform={`translate(${view.tx} ${view.ty}) scale(${view.s})`}>
          <image href={p.previewUrl} width={p.width} height={p.height} />
          {p.colonies.map((c) => {
            const hex = p.looks[c.cls].hex;
            const r = Math.max(c.r * 1.25, 3);
            return (
              <g key={c.id} data-cls={c.cls} data-count={c.count} className="colony-mark">
                <circle cx={c.x} cy={c.y} r={r} className="colony halo" stroke={halo(hex)} />
                <circle cx={c.x} cy={c.y} r={r} className={markClass(c)} stroke={hex} />
              </g>
            );
          })}
          {dish && (
            <g>
              <ellipse
                className="dish"
                cx={dish.cx}
                cy={dish.cy}
                rx={dish.rx}
                ry={dish.ry}
                transform={`rotate(${dish.angleDeg} ${dish.cx} ${dish.cy})`}
              />
              <circle
                className="dish-handle"
                data-handle="centre"
                cx={dish.cx}
                cy={dish.cy}
                r={p.width / 60 / view.s}
              />
              <circle
                className="dish-handle"
                data-handle="rim"
                cx={dish.cx + dish.rx}
                cy={dish.cy}
                r={p.width / 70 / view.s}
              />
            </g>
          )}
        </g>
      </svg>
    </div>
  );
}
