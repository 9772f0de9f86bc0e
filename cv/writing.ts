import { deltaE76 } from './colour.ts';
import type { ComponentStats, RegionStats } from './measure.ts';
import type { Lab } from './types.ts';
import { weightedMedian } from './weighted-median.ts';

/**
 * The plate's own writing: once some blobs are recognised as strokes by their shape
 * (candidates.ts), their colour and thickness say what this plate's pen looks like, and the
 * pieces of the same writing that shape alone cannot tell (letters cut by the dish edge, strokes
 * joined to the wall's arc or to each other) are recognised by being of that colour and no
 * thicker than that pen. The pen's colour is learned on each plate; the only prior is for the
 * usual dark, colourless marker (isDarkInk), which the plate's own colonies can veto.
 * A colony of the pen's colour is kept when it is clearly thicker than the pen's line. When the
 * plate's round blobs (colonies beyond doubt) share the pen's colour, colour cannot tell writing
 * from colonies on this plate (or the "strokes" were chains of colonies), and no pen is learned.
 */
export interface Pen {
  /** Colour of the writing relative to the agar under it (L*a*b*): the area-weighted median. */
  delta: Lab;
  /** Area-weighted median ΔE*ab of the stroke's regions from that colour. */
  spread: number;
  /** Half the line's thickness in working pixels. */
  halfWidth: number;
}

/**
 * A region matches the pen within PEN_SPREADS spreads of its colour, or PEN_DEPTH of the pen's
 * own difference from the agar if that is more, taken between PEN_MIN_DELTA_E and
 * PEN_MAX_DELTA_E: a just-noticeable difference is a few ΔE*ab units (common practice), and
 * writing mixed up with other things must not grow a match wide enough to take in a colony colour.
 * The depth term is Beer–Lambert: ink absorbs in proportion to the layer's thickness, which a
 * pen varies along its line (pressure, crossings, the end of a stroke), so the ink's difference
 * from the agar scales with it; a fifth is a judgement. A stroke's spread, a median, says little
 * of that: on one plates-dev photo red writing measured a spread of 2 and its thicker pieces lay
 * 8 ΔE*ab from its colour.
 */
const PEN_SPREADS = 2.5;
const PEN_DEPTH = 0.2;
const PEN_MIN_DELTA_E = 6;
const PEN_MAX_DELTA_E = 12;
/** A region up to this many times the pen's half thickness can be a piece of its line. */
const PEN_THICKNESS = 1.4;

/** No pen is learned when more than this share of the round blobs have its colour. */
const AMBIGUOUS_SHARE = 0.1;

/**
 * The pens of a plate, one per stroke blob (a plate may be labelled with more than one pen, and
 * each blob's colour is measured on its own so a lamp's line reflection cannot blur a pen's).
 * `usable` keeps only the pens that can tell writing from colonies elsewhere on the plate: not
 * one whose colour the round blobs share, nor one that cannot tell anything (isTelling).
 * `byStroke` keeps every blob's own pen, which still tells the writing's pieces inside that blob
 * from a colony of another colour touching it.
 */
export function pensFromStrokes(
  strokes: readonly ComponentStats[],
  regions: readonly RegionStats[],
  roundBlobs: readonly RegionStats[],
): { usable: Pen[]; byStroke: Map<number, Pen> } {
  const byStroke = new Map<number, Pen>();
  for (const stroke of strokes) {
    const pen = penOf(
      stroke,
      regions.filter((r) => r.component === stroke.id),
    );
    if (pen) byStroke.set(stroke.id, pen);
  }
  const usable = [...byStroke.values()].filter(
    (pen) =>
      isTelling(pen) &&
      roundBlobs.filter((r) => hasPenColour(r, pen)).length <= AMBIGUOUS_SHARE * roundBlobs.length,
  );
  return { usable, byStroke };
}

/**
 * The pen's colour is the area-weighted median of its stroke's pieces, channel by channel, and
 * its spread their median distance from it: a stroke's blob often holds a few colonies the line
 * touches, and a mean would be pulled towards their colour, a colour no ink on the plate has
 * (on one plates-dev photo a blob of blue ink and red colonies gave a purple "pen" that took
 * 40 red colonies in clumps for writing, or not, as the photo moved by a pixel).
 */
function penOf(stroke: ComponentStats, pieces: readonly RegionStats[]): Pen | null {
  if (pieces.reduce((s, r) => s + r.area, 0) === 0) return null;
  const weighted = (value: (r: RegionStats) => number) =>
    weightedMedian(pieces.map((r) => ({ value: value(r), weight: r.area })));
  const delta = [0, 1, 2].map((k) => weighted((r) => deltaOf(r)[k]!)) as unknown as Lab;
  const spread = weighted((r) => deltaE76(deltaOf(r), delta));
  return { delta, spread, halfWidth: 2 * stroke.meanDistance };
}

/**
 * Whether a pen can tell writing from anything else: its colour stands farther from the agar
 * than its match reaches (else the agar's own colour matches it, and with it every faint object:
 * the faint grey "strokes" of shading or a shadow), and it matches at least half of its own
 * stroke (its spread within its reach; else the blob is of no one colour and its median a mix).
 */
function isTelling(pen: Pen): boolean {
  const reach = penReach(pen);
  return Math.hypot(...pen.delta) > reach && pen.spread <= reach;
}

export function isPenPiece(r: RegionStats, pens: readonly Pen[]): boolean {
  return pens.some((pen) => hasPenColour(r, pen) && r.halfWidth <= PEN_THICKNESS * pen.halfWidth);
}

export function hasPenColour(r: RegionStats, pen: Pen): boolean {
  return deltaE76(deltaOf(r), pen.delta) <= penReach(pen);
}

function penReach(pen: Pen): number {
  const own = Math.max(PEN_SPREADS * pen.spread, PEN_DEPTH * Math.hypot(...pen.delta));
  return Math.min(PEN_MAX_DELTA_E, Math.max(PEN_MIN_DELTA_E, own));
}

function deltaOf(r: RegionStats): Lab {
  return [
    r.lab[0] - r.backgroundLab[0],
    r.lab[1] - r.backgroundLab[1],
    r.lab[2] - r.backgroundLab[2],
  ];
}

/**
 * Ink of the usual marker colours (black, dark grey, dark blue-black): much darker than the agar
 * and nearly colourless. This prior covers writing too broken up for any stroke of it to be
 * recognised by shape; like a learned pen it is used only when the plate's round blobs do not
 * share it (a plate of blue-grey colonies turns it off).
 */
const INK_DARKER = 15;
const INK_CHROMA = 12;
export function isDarkInk(r: RegionStats): boolean {
  return r.backgroundLab[0] - r.lab[0] > INK_DARKER && Math.hypot(r.lab[1], r.lab[2]) < INK_CHROMA;
}

/**
 * Whether the prior for dark ink may be used on a plate with these round blobs: not when they
 * share it, counted over all of them and over those at least a typical colony thick
 * (`typicalRadius`). A colony's colour deepens with its thickness (Beer–Lambert): on a crowded
 * plate of blue-grey colonies the many small ones read lighter, and only the large ones, a small
 * share of all, are as dark as ink, yet large colonies are the ones that touch and so the ones
 * the prior would judge.
 */
export function darkInkUsable(roundBlobs: readonly RegionStats[], typicalRadius: number): boolean {
  const thick = roundBlobs.filter((r) => r.halfWidth >= typicalRadius);
  return [roundBlobs, thick].every(
    (blobs) => blobs.filter(isDarkInk).length <= AMBIGUOUS_SHARE * blobs.length,
  );
}
