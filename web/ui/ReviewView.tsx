import { useRef } from 'react';
import type { ColonyRecord, DishRecord } from '../../schema/records.ts';
import type { ClassLook } from '../bench/colours.ts';
import { DISH_HANDLES, handleAt } from '../review/dish-handles.ts';
import { isUnsure } from '../review/unsure.ts';
import { useReviewGestures } from '../review/use-review-gestures.ts';
import type { Frame } from '../review/view.ts';

/** Halo behind a class outline: light on dark class colours, dark on light ones. */
function halo(hex: string): string {
  const n = Number.parseInt(hex.slice(1), 16);
  const luma = 0.299 * (n >> 16) + 0.587 * ((n >> 8) & 255) + 0.114 * (n & 255);
  return luma > 140 ? '#1b1b1b' : '#ffffff';
}

/** Added by hand: dashed; a colour the analysis was unsure of: broken. */
function markClass(c: ColonyRecord): string {
  if (!c.lab) return 'colony added';
  return isUnsure(c) ? 'colony unsure' : 'colony';
}

export interface ReviewViewProps {
  previewUrl: string;
  /** The square the picture opens on (the dish), and the photo's size. */
  frame: Frame;
  colonies: readonly ColonyRecord[];
  looks: [ClassLook, ClassLook];
  dish: DishRecord | null;
  /** A tap at a point of the photo (original pixels), with the tap's tolerance in those pixels. */
  onTap: (x: number, y: number, slack: number) => void;
  onDishMove: (dish: DishRecord) => void;
}

/**
 * The photo with every colony outlined in its class colour, and the dish outline with its
 * centre and rim handles, opened on the dish; the gestures are in useReviewGestures.
 */
export function ReviewView(p: ReviewViewProps) {
  const svg = useRef<SVGSVGElement>(null);
  const { view, dragDish, handlers } = useReviewGestures(svg, p);
  const dish = dragDish ?? p.dish;

  return (
    <div className="review">
      <svg
        ref={svg}
        viewBox={`0 0 ${p.frame.size} ${p.frame.size}`}
        data-testid="review"
        {...handlers}
        role="img"
        aria-label={`Plate photo with ${p.colonies.length} colonies outlined`}
      >
        <g transform={`translate(${view.tx} ${view.ty}) scale(${view.s})`}>
          <image href={p.previewUrl} width={p.frame.width} height={p.frame.height} />
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
              {DISH_HANDLES.map((h) => {
                const at = handleAt(dish, h);
                return (
                  <circle
                    key={h}
                    className="dish-handle"
                    data-handle={h}
                    cx={at.x}
                    cy={at.y}
                    r={p.frame.size / (h === 'centre' ? 40 : 48) / view.s}
                  />
                );
              })}
            </g>
          )}
        </g>
      </svg>
    </div>
  );
}
