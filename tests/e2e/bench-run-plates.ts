import { readFileSync } from 'node:fs';
import type { Page } from '@playwright/test';

/**
 * The person's side of a bench run, worked out from the generator's truth file for a photo (the
 * colonies that are really on the plate): which colonies the app's reading missed, which it saw
 * where there is none, and which it gave the other colour. The test then makes those
 * corrections by tapping, as a person comparing the screen with the plate would.
 */
export interface Correction {
  op: 'add' | 'remove' | 'switch';
  /** The colour the colony should have (for a removal, the one it had). */
  cls: 0 | 1;
  x: number;
  y: number;
}

interface Mark {
  x: number;
  y: number;
  r: number;
  cls: 0 | 1;
  count: number;
}

interface TruthColony {
  x: number;
  y: number;
  r: number;
  cls: 0 | 1;
}

/** The colonies on the review picture as drawn (photo pixels), and photo pixels → screen. */
export async function marksOnScreen(page: Page) {
  return page.evaluate(() => {
    const g = document.querySelector('[data-testid=review] > g') as SVGGElement;
    const m = g.getScreenCTM()!;
    const marks = [...g.querySelectorAll('.colony-mark')].map((el) => {
      const c = el.querySelector('circle:not(.halo)') as SVGCircleElement;
      return {
        x: Number(c.getAttribute('cx')),
        y: Number(c.getAttribute('cy')),
        r: Number(c.getAttribute('r')) / 1.25,
        cls: Number(el.getAttribute('data-cls')) as 0 | 1,
        count: Number(el.getAttribute('data-count')),
      };
    });
    return { marks, a: m.a, d: m.d, e: m.e, f: m.f };
  });
}

/**
 * Up to `most` corrections that make the reading agree with the truth, misses first. The truth
 * numbers its colours its own way: it is matched to the app's by the colonies both agree on.
 */
export function correctionsFromTruth(
  truthFile: string,
  marks: readonly Mark[],
  pxPerImage: number,
  most: number,
): Correction[] {
  const truth = (JSON.parse(readFileSync(truthFile, 'utf8')) as { colonies: TruthColony[] })
    .colonies;
  const near = (t: { x: number; y: number }, m: Mark, extra: number) =>
    Math.hypot(t.x - m.x, t.y - m.y) <= m.r + extra;
  // A tap lands within 10 screen pixels; keep added colonies clear of every mark by more.
  const slack = 14 / pxPerImage;
  let same = 0;
  let flipped = 0;
  const nearest = (t: TruthColony) => {
    let best: Mark | null = null;
    for (const m of marks)
      if (
        near(t, m, 3) &&
        (!best || Math.hypot(t.x - m.x, t.y - m.y) < Math.hypot(t.x - best.x, t.y - best.y))
      )
        best = m;
    return best;
  };
  for (const t of truth) {
    const m = nearest(t);
    if (m && m.count === 1) {
      if (m.cls === t.cls) same++;
      else flipped++;
    }
  }
  const appCls = (c: 0 | 1): 0 | 1 => (flipped > same ? (c === 0 ? 1 : 0) : c);
  const out: Correction[] = [];
  for (const t of truth) {
    if (
      !marks.some((m) => near(t, m, slack)) &&
      truth.filter((u) => Math.hypot(u.x - t.x, u.y - t.y) < slack + u.r).length === 1
    )
      out.push({ op: 'add', cls: appCls(t.cls), x: t.x, y: t.y });
  }
  for (const m of marks) {
    if (m.count === 1 && !truth.some((t) => near(t, m, 3)))
      out.push({ op: 'remove', cls: m.cls, x: m.x, y: m.y });
  }
  for (const m of marks) {
    if (m.count !== 1) continue;
    const on = truth.filter((t) => near(t, m, 0));
    if (on.length === 1 && appCls(on[0]!.cls) !== m.cls)
      out.push({ op: 'switch', cls: appCls(on[0]!.cls), x: m.x, y: m.y });
  }
  return out.slice(0, most);
}

/** The app's colour of the true colony under a point, or null when there is none there. */
export function truthColourAt(
  truthFile: string,
  marks: readonly Mark[],
  x: number,
  y: number,
): 0 | 1 | null {
  const truth = (JSON.parse(readFileSync(truthFile, 'utf8')) as { colonies: TruthColony[] })
    .colonies;
  let same = 0;
  let flipped = 0;
  for (const t of truth) {
    const m = marks.find((k) => k.count === 1 && Math.hypot(t.x - k.x, t.y - k.y) <= k.r + 3);
    if (m) m.cls === t.cls ? same++ : flipped++;
  }
  const t = truth.find((u) => Math.hypot(u.x - x, u.y - y) <= u.r + 3);
  if (!t) return null;
  return flipped > same ? (t.cls === 0 ? 1 : 0) : t.cls;
}
