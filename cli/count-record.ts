import type { PlateAnalysis } from '../cv/index.ts';
import {
  type CountableRange,
  type CountableStatus,
  countableStatus,
} from '../fitness/countable-range.ts';

/** One line of `rivalplate count` output: an analysis in the photo's own upright pixels. */
export interface CountRecord {
  file: string;
  width: number;
  height: number;
  dish: { cx: number; cy: number; r: number; rx: number; ry: number; angleDeg: number } | null;
  colonies: {
    x: number;
    y: number;
    r: number;
    cls: number;
    confidence: number;
    count: number;
    glareLit?: true;
  }[];
  counts: Record<string, number>;
  classes: { cls: number; name: string; hex: string }[];
  total: number;
  countable: { status: CountableStatus; range: string };
  flags: PlateAnalysis['flags'];
  /** The learned model that decided the plate (count --model), absent for the default rules. */
  model?: { plates: number };
  ms: number;
}

export function countRecord(
  file: string,
  a: PlateAnalysis,
  ms: number,
  range: CountableRange,
): CountRecord {
  const r1 = (v: number) => Math.round(v * 10) / 10;
  const total = a.colonies.reduce((s, c) => s + c.count, 0);
  return {
    file,
    width: a.width,
    height: a.height,
    dish: a.dish && {
      cx: r1(a.dish.cx),
      cy: r1(a.dish.cy),
      r: r1(a.dish.r),
      rx: r1(a.dish.rx),
      ry: r1(a.dish.ry),
      angleDeg: r1(a.dish.angleDeg),
    },
    colonies: a.colonies.map((c) => ({
      x: r1(c.x),
      y: r1(c.y),
      r: r1(c.r),
      cls: c.cls,
      confidence: c.confidence,
      count: c.count,
      ...(c.glareLit ? { glareLit: true as const } : {}),
    })),
    counts: a.counts,
    classes: a.classes.map((c) => ({ cls: c.cls, name: c.name, hex: c.hex })),
    total,
    countable: { status: countableStatus(total, range), range: range.source },
    flags: a.flags,
    ...(a.model ? { model: a.model } : {}),
    ms: Math.round(ms),
  };
}

/** Colonies of colour class 0 and 1 (a clump counts for the colonies it stands for). */
export function classCounts(r: CountRecord): [number, number] {
  const n: [number, number] = [0, 0];
  for (const c of r.colonies) if (c.cls === 0 || c.cls === 1) n[c.cls] += c.count;
  return n;
}

/**
 * CSV (RFC 4180): one row per photo, a count column per colour class, class 0 then class 1,
 * named by `classNames` (never by a colour measured on the photos, so the columns are the same
 * from one batch to the next).
 */
export function csvHeader(classNames: readonly [string, string]): string {
  return [
    'file',
    'width',
    'height',
    'dish_cx',
    'dish_cy',
    'dish_r',
    'total',
    ...classNames.map((n) => `count_${n.replace(/\s+/g, '_')}`),
    'countable',
    'countable_range',
    'flags',
    'ms',
    'error',
  ].join(',');
}

/** The row under csvHeader: the counts of class 0 and 1 in that order. */
export function csvRow(r: CountRecord): string {
  const byClass = classCounts(r);
  return [
    r.file,
    r.width,
    r.height,
    r.dish?.cx ?? '',
    r.dish?.cy ?? '',
    r.dish?.r ?? '',
    r.total,
    ...byClass,
    r.countable.status,
    r.countable.range,
    r.flags.map((f) => f.kind).join(' '),
    r.ms,
    '',
  ]
    .map(csvField)
    .join(',');
}

export function csvErrorRow(
  file: string,
  message: string,
  classNames: readonly [string, string],
): string {
  const blanks = Array.from({ length: 10 + classNames.length }, () => '');
  return [file, ...blanks, message].map(csvField).join(',');
}

function csvField(v: string | number): string {
  const s = String(v);
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}
