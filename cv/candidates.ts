import { SMALLEST_COLONY_RADIUS_MM } from './colony-size.ts';
import { deltaE76 } from './colour.ts';
import { type ComponentStats, elongationOf, type RegionStats } from './measure.ts';
import { PointGrid } from './point-grid.ts';
import {
  darkInkUsable,
  hasPenColour,
  isDarkInk,
  isPenPiece,
  type Pen,
  pensFromStrokes,
} from './writing.ts';

/**
 * Turns measured regions into colony candidates: drops what is not a colony by size and shape,
 * and estimates how many colonies an unsplittable clump holds.
 *
 * - Specks (dust, agar flaws, noise): blobs smaller than a disc of SMALLEST_COLONY_RADIUS_MM (a
 *   colony 0.45 mm across is still kept), and small blobs whose contrast barely clears the
 *   detection threshold: a real colony that small is a crisp dome, noise is not. A dome is what
 *   the contrast bumps (blob-seeds.ts) find, at scales of SMALLEST_COLONY_RADIUS_MM and up, so a
 *   region holding one is kept however faint, and in a blob the watershed split it needs only
 *   SPLIT_DOME_AREA of that disc (in a crowded clump a neighbour's basin takes part of a
 *   colony's flank).
 * - Chroma noise: a faint region (its mean colour within SMALL_CONTRAST thresholds of the agar's)
 *   that differs from the agar in tint but hardly in lightness (within GHOST_L). JPEG keeps colour
 *   at half resolution and quantises it more coarsely than lightness, so its noise comes in
 *   blotches a colony's size; a colony that faint is lighter or darker than the agar too.
 * - Chroma ghosts: JPEG keeps colour at half resolution (4:2:0) and codes it in 8×8 blocks of
 *   that plane, so a saturated colony bleeds a faint tint, or rings with the opposite one, into
 *   the agar up to a block (16 photo pixels) beside it. A small blob that differs from the agar in
 *   tint but not in lightness, next to a region at least 1/GHOST_SHARE times as tinted, is such a
 *   ghost (averaging over 2×2 pixels leaves at most half of a neighbour's tint). A tinted spot of
 *   the agar's own lightness with no stronger tint beside it is a colony (blue-grey colonies on
 *   yellow agar can match its lightness).
 * - Slivers and satellites: thin pieces the watershed cuts off the edge of a colony in a touching
 *   group (unless the piece is a dome of its own), and small blobs hugging a bigger colony (its
 *   blurred rim, cut loose by thresholding).
 * - Junctions: where three or more colonies touch, the foreground is thick between them, so the
 *   distance map has a peak there and the watershed a region: a small concave piece bounded by
 *   the colonies round it. It meets at least JUNCTION_NEIGHBOURS other regions, holds no dome,
 *   and fills less than JUNCTION_FILL of the disc of its own thickness (a colony cut by its
 *   neighbours still fills most of its disc; elongationOf). On plates-dev and its four altered
 *   copies this took 0.004–0.007 off the false share at the cost of 0.001–0.003 of recall.
 * - Strokes (marker-pen writing on the lid or the base, scratches, a lamp's line reflection):
 *   blobs far longer than they are thick and of even thickness, recognised by their shape, not
 *   their colour (pens come in every colour, and so do colonies). Even thickness is read from the
 *   ridge of the distance map (its local maxima, the medial axis): along a band of even width the
 *   ridge holds one value, so its coefficient of variation is near 0 (corners and junctions of
 *   writing add a little); along a chain of touching discs of radius R it follows
 *   √(R² − x²), whose coefficient of variation is about 0.28, and a single disc's ridge is one
 *   point. A long blob whose ridge varies less than STROKE_RIDGE_VARIATION is a band (a very long
 *   one, less than LONG_STROKE_RIDGE_VARIATION). The
 *   pieces of the same writing that shape cannot tell are found by the pen's colour and
 *   thickness, learned from those bands, or as dark, colourless ink where the plate's own round
 *   colonies are not of that colour (writing.ts). Inside a stroke's own blob, a piece of the
 *   blob's ink thinner than a colony is the line even when the plate's colonies share the ink's
 *   colour (blue writing on a plate of blue colonies), and so is a piece as thick as the line
 *   that is no dome, on the line's side of the agar's lightness (isColonyOnStroke). A
 *   stroke-shaped blob with a dome for every other region is a row of colonies (isChainOfDomes).
 *   A round blob that touches nothing is never taken for writing.
 * - Grey shades: regions darker than the agar with hardly any tint of their own against it (the
 *   soft edge of an ink stroke, the shadowed side of a droplet, shading under condensation, the
 *   dim rim round lid glare). A colony of the agar's own hue, only darker (deep red on pink
 *   agar), is as large as a colony and far darker than any shading, and is kept: size and
 *   contrast, not tint, tell it from a shade. So is a smaller one that is a dome, a round bump
 *   in ΔE (blob-seeds.ts): shading, a droplet's dark side and an ink edge are crescents, bands
 *   and smears, which the bumps' curvature test turns away.
 * - Glare fringes: regions next to lid glare that are lighter than the agar but not tinted: the
 *   fainter edge of the glare, beyond the patch that glare.ts takes out. The same light, untinted
 *   look in a stroke's blob is a lamp's arc reflected by the lid, not a colony on a stroke.
 * - Wall glints: blobs on the rim of the counting area thinner than WALL_THINNESS typical colony
 *   radii, and regions within WALL_ZONE_MM of the wall smaller than a third of a typical colony
 *   and thinner than WALL_CRUMB_THICKNESS of its radius (a colony the wall half hides is small
 *   but as thick as half a colony, and is kept).
 *   Reflections and the wall's inner face show as thin arcs and crumbs there; a colony growing
 *   against the wall is as thick as any other and is kept.
 * - Clumps: a region the watershed could not split, recognised by not being round: its area is
 *   more than CLUMP_ELONGATION times the largest disc it holds (π·halfWidth², about 1 for any
 *   single colony, big or small, about 2 for a fused pair). It is counted as that ratio rounded,
 *   and at most as many typical single colonies as its area holds; it is marked as estimated.
 * Sizes are in working pixels; `mmPerPx` converts the millimetre limits.
 */
/** A dome's region in a split blob needs this share of the smallest colony's disc. */
const SPLIT_DOME_AREA = 0.5;
/** Below 2× the minimum area, a region must stand this many thresholds above the agar. */
const SMALL_CONTRAST = 1.3;
/** The region's mean colour must stand this many thresholds from the agar's. */
const MEAN_DIFFERENCE = 0.8;
/** Chroma ghosts: smaller than GHOST_AREA minimum colonies and within GHOST_L of the agar's L*
 * (GHOST_L bounds chroma noise's lightness too). */
const GHOST_AREA = 3;
const GHOST_L = 1.5;
/** ... at most GHOST_SHARE of the tint of a region within CHROMA_BLOCK_PX photo pixels. */
const GHOST_SHARE = 0.5;
const CHROMA_BLOCK_PX = 16;
/** Slivers: split-off pieces smaller than this share of a typical colony's disc. */
const SLIVER = 0.15;
/** Junctions: a domeless piece meeting this many regions and filling less than this of its disc. */
const JUNCTION_NEIGHBOURS = 3;
const JUNCTION_FILL = 0.5;
/** Satellites: smaller than SATELLITE_AREA minimum colonies, within SATELLITE_GAP_MM of a bigger one. */
const SATELLITE_AREA = 3;
const SATELLITE_GAP_MM = 0.3;
const STROKE_ELONGATION = 3;
/** Between a band's ridge variation (≈ 0) and a chain of colonies' (≈ 0.28). */
const STROKE_RIDGE_VARIATION = 0.2;
/**
 * A blob more than LONG_BLOB times its widest disc is a stroke unless its ridge varies more than
 * LONG_STROKE_RIDGE_VARIATION. Writing and lamp reflections are that long on any plate, and their
 * thickness varies more than a band's (a letter's curves and joins, a reflection's taper); a row
 * of eight colonies or more happens only on a crowded plate, and each of its colonies is as thick
 * as a colony, so it is kept as a colony on the stroke (isColonyOnStroke).
 */
const LONG_BLOB = 8;
const LONG_STROKE_RIDGE_VARIATION = 0.4;
const STROKE_THINNESS = 0.7;
/** A region of a stroke's blob this many times thicker than the stroke is a colony under it. */
const COLONY_ON_STROKE = 1.6;
/** ... or this many times as thick and not of the writing's colour. */
const OTHER_COLOUR_ON_STROKE = 0.8;
/** A grey shade: darker than the agar and within this colour difference of it in a*, b*. */
const GREY_SHADE_CHROMA = 6;
/**
 * ... unless it is at least this many minimum colonies and stands this many thresholds above the
 * agar (and is not next to glare): shading and condensation are faint, a colony is not.
 */
const SHADE_AREA = 3;
const SHADE_CONTRAST = 3;
/** Glare fringe: within this colour difference of the agar in a*, b*. */
const GLARE_FRINGE_TINT = 3;
const CLUMP_ELONGATION = 2.0;
/** A faint disc is at least this many minimum colonies (about 0.8 mm across). */
const FAINT_AREA = 3;
/** A blob whose area is at most this many times its largest disc is round (one colony or a pair). */
const ROUND_BLOB = 2.2;
const WALL_THINNESS = 0.35;
const WALL_CRUMB = 0.35;
/** A region near the wall at least this many typical radii thick is a colony the wall cuts. */
const WALL_CRUMB_THICKNESS = 0.45;

export interface Candidate {
  region: RegionStats;
  split: boolean;
  count: number;
}

export interface CandidateResult {
  candidates: Candidate[];
  rejected: { specks: number; strokes: number; wall: number; shades: number };
  typicalArea: number;
}

/** What the rules need to know of the plate besides its regions. */
export interface PlateContext {
  typicalRadius: number;
  mmPerPx: number;
  /** Working pixels per pixel of the photo as decoded (frame.ts): JPEG's blocks are in the latter. */
  scale: number;
  threshold: number;
  faintThreshold: number;
  nearWall: (r: RegionStats) => boolean;
  nearGlare: (r: RegionStats) => boolean;
}

export function selectCandidates(
  regions: RegionStats[],
  components: ComponentStats[],
  plate: PlateContext,
): CandidateResult {
  const { typicalRadius, mmPerPx, threshold, faintThreshold, nearWall, nearGlare } = plate;
  const minArea = Math.PI * (SMALLEST_COLONY_RADIUS_MM / mmPerPx) ** 2;
  const byId = new Map(components.map((c) => [c.id, c]));
  const rejected = { specks: 0, strokes: 0, wall: 0, shades: 0 };
  const verdict = new Map<number, 'keep' | 'specks' | 'strokes' | 'wall'>();
  for (const c of components) {
    const v = componentVerdict(c, minArea, typicalRadius);
    verdict.set(c.id, v);
    // A blob too thin to hold a single seed region could never have been counted: no rejection.
    if (v !== 'keep' && c.regions > 0) rejected[v]++;
  }
  const roundIds = new Set(components.filter(isRound).map((c) => c.id));
  const roundBlobs = regions.filter((r) => roundIds.has(r.component));
  // The ink's colour is read away from the wall, where the meniscus's shading and the wall's
  // reflections join writing that crosses them into one blob.
  const { usable: pens, byStroke } = pensFromStrokes(
    components.filter((c) => verdict.get(c.id) === 'strokes'),
    regions.filter((r) => !nearWall(r)),
    roundBlobs,
  );
  const darkInk = darkInkUsable(roundBlobs, typicalRadius);
  // A blob's own pen, even one the round blobs share, tells its pieces thinner than a colony
  // (the line) from the colony-thick ones (colonies the line touches, or a chain of colonies).
  const inkOf = (r: RegionStats) => {
    const own = byStroke.get(r.component);
    return own && r.halfWidth < STROKE_THINNESS * typicalRadius ? [...pens, own] : pens;
  };
  const isChromaGhost = chromaGhostTest(regions, CHROMA_BLOCK_PX * plate.scale);
  const kept = regions.filter((r) => {
    const v = verdict.get(r.component);
    // A colony touching a pen stroke or a glint on the wall shares its blob; it is as thick as a
    // colony, the stroke and the glint are not.
    const comp = byId.get(r.component);
    const fatInThin =
      comp !== undefined &&
      ((v === 'strokes' &&
        isColonyOnStroke(r, strokeHalfWidth(comp), inkOf(r), darkInk, byStroke.get(r.component))) ||
        (v === 'wall' && r.halfWidth >= STROKE_THINNESS * typicalRadius));
    const splitDome = r.bumps > 0 && (comp?.regions ?? 1) > 1;
    if ((v !== 'keep' && !fatInThin) || r.area < (splitDome ? SPLIT_DOME_AREA : 1) * minArea)
      return false;
    // A light, untinted piece of a stroke's blob is the line itself where a lamp or ring light
    // reflects off the lid (a bright arc), not a colony on it.
    if (v === 'strokes' && isGlareFringe(r)) {
      rejected.strokes++;
      return false;
    }
    // A region no different from the agar on average is agar enclosed by something else (the
    // inside of a pen letter, a filled ring) or a fringe of ringing round a dark colony, whose
    // pixels stray both ways: its mean colour must differ from the agar as much as its pixels do.
    const needed = isFaintDisc(r, minArea) ? faintThreshold : threshold;
    if (
      r.contrast < needed ||
      deltaE76(r.lab, r.backgroundLab) < MEAN_DIFFERENCE * needed ||
      (r.area < 2 * minArea && r.contrast < SMALL_CONTRAST * threshold && r.bumps === 0) ||
      isChromaNoise(r, threshold)
    ) {
      rejected.specks++;
      return false;
    }
    if (r.area < GHOST_AREA * minArea && isChromaGhost(r)) {
      rejected.specks++;
      return false;
    }
    if (
      comp &&
      comp.regions > 1 &&
      r.area < SLIVER * Math.PI * typicalRadius ** 2 &&
      r.bumps === 0
    ) {
      rejected.specks++; // a sliver the watershed cut off a colony's edge
      return false;
    }
    if (comp && comp.regions > 1 && isJunction(r)) {
      rejected.specks++;
      return false;
    }
    if (comp && !isRound(comp) && (isPenPiece(r, pens) || (darkInk && isDarkInk(r)))) {
      rejected.strokes++;
      return false;
    }
    if (nearGlare(r) && isGlareFringe(r)) {
      rejected.shades++;
      return false;
    }
    // ... or as large and round, alone in its blob: a colony darker than its agar in soft focus;
    // or a dome whatever its size (it holds a round contrast bump): a small colony of the agar's
    // hue, only darker, whose tint the blur has washed out.
    const colonySized =
      r.area >= SHADE_AREA * minArea &&
      (r.contrast >= SHADE_CONTRAST * threshold || (comp !== undefined && isRoundAlone(r, comp)));
    if (!isGreyShade(r) || (colonySized && !nearGlare(r)) || r.bumps > 0) return true;
    rejected.shades++;
    return false;
  });
  const typicalArea = typicalSingleArea(kept, byId) || Math.PI * typicalRadius ** 2;
  const inside = kept.filter((r) => {
    // A colony the wall cuts in half is small but still thick; a crumb of the wall is neither.
    if (r.area >= WALL_CRUMB * typicalArea || !nearWall(r)) return true;
    if (r.halfWidth >= WALL_CRUMB_THICKNESS * typicalRadius) return true;
    rejected.wall++;
    return false;
  });
  const alone = dropSatellites(inside, minArea, SATELLITE_GAP_MM / mmPerPx);
  rejected.specks += inside.length - alone.length;
  const candidates = alone.map((region) => ({
    region,
    split: (byId.get(region.component)?.regions ?? 1) > 1,
    count: clumpCount(region, typicalArea),
  }));
  return { candidates, rejected, typicalArea };
}

/** Faint, and different from the agar in tint only: JPEG's chroma noise (see above). */
function isChromaNoise(r: RegionStats, threshold: number): boolean {
  return (
    deltaE76(r.lab, r.backgroundLab) < SMALL_CONTRAST * threshold &&
    Math.abs(lightness(r)) < GHOST_L
  );
}

/** A tester for chroma ghosts (see above) among `regions`, reaching `reachPx` working pixels. */
function chromaGhostTest(
  regions: readonly RegionStats[],
  reachPx: number,
): (r: RegionStats) => boolean {
  const grid = new PointGrid<RegionStats>(Math.max(8, reachPx));
  let widest = 0;
  for (const r of regions) {
    grid.add(r);
    widest = Math.max(widest, radiusOf(r));
  }
  return (r) => {
    if (Math.abs(lightness(r)) >= GHOST_L) return false;
    const own = tint(r);
    const rs = radiusOf(r);
    return grid.some(
      r.x,
      r.y,
      reachPx + rs + widest,
      (q) =>
        q !== r &&
        Math.hypot(q.x - r.x, q.y - r.y) - radiusOf(q) - rs <= reachPx &&
        own <= GHOST_SHARE * tint(q),
    );
  };
}

/**
 * Drops small regions hugging a bigger one and coloured like a faint copy of it: the blurred or
 * JPEG-smeared rim of a colony that thresholding cut loose. A small colony of the other colour,
 * or a full-strength one of the same colour, touching a big one is kept. n is a few hundred, so
 * trying every pair is cheap.
 */
function dropSatellites(regions: RegionStats[], minArea: number, gapPx: number): RegionStats[] {
  const delta = (r: RegionStats) => [0, 1, 2].map((k) => r.lab[k]! - r.backgroundLab[k]!);
  const fainterCopy = (small: RegionStats, big: RegionStats) => {
    const a = delta(small);
    const b = delta(big);
    const na = Math.hypot(a[0]!, a[1]!, a[2]!);
    const nb = Math.hypot(b[0]!, b[1]!, b[2]!);
    const cos = (a[0]! * b[0]! + a[1]! * b[1]! + a[2]! * b[2]!) / (na * nb || 1);
    return cos > 0.8 && na < 0.5 * nb;
  };
  return regions.filter((small) => {
    if (small.area >= SATELLITE_AREA * minArea) return true;
    const rs = radiusOf(small);
    return !regions.some(
      (big) =>
        big !== small &&
        big.area > 2 * small.area &&
        Math.hypot(big.x - small.x, big.y - small.y) - radiusOf(big) - rs < gapPx &&
        fainterCopy(small, big),
    );
  });
}

function clumpCount(region: RegionStats, typicalArea: number): number {
  const elongation = elongationOf(region);
  if (elongation <= CLUMP_ELONGATION) return 1;
  return Math.max(2, Math.min(Math.round(elongation), Math.round(region.area / typicalArea)));
}

function componentVerdict(
  c: ComponentStats,
  minArea: number,
  typicalRadius: number,
): 'keep' | 'specks' | 'strokes' | 'wall' {
  if (c.area < minArea) return 'specks';
  const elongation = elongationOf(c);
  const variation = elongation > LONG_BLOB ? LONG_STROKE_RIDGE_VARIATION : STROKE_RIDGE_VARIATION;
  if (elongation > STROKE_ELONGATION && c.ridgeVariation < variation && !isChainOfDomes(c)) {
    return 'strokes';
  }
  if (elongation > STROKE_ELONGATION && isDomeless(c)) return 'strokes';
  if (c.rimPixels > 0 && c.halfWidth < WALL_THINNESS * typicalRadius) return 'wall';
  return 'keep';
}

/**
 * A stroke-shaped blob that is a row or clump of colonies: it holds a round contrast bump
 * (blob-seeds.ts) for at least DOMES_PER_REGION of its regions, and at least MIN_DOMES. Each
 * colony is a dome in ΔE; a pen line is a ridge along its length, which the bumps' curvature test
 * (Lowe 2004) turns away, so writing shows bumps only at a few ends, corners and blots.
 */
const DOMES_PER_REGION = 0.5;
const MIN_DOMES = 3;
function isChainOfDomes(c: ComponentStats): boolean {
  return c.bumps >= Math.max(MIN_DOMES, DOMES_PER_REGION * c.regions);
}

/**
 * A long blob the watershed cut into many pieces of which fewer than one in DOMELESS_PIECES holds
 * a dome is writing whatever its ridge: a letter's corners and joins vary its thickness as much
 * as a chain of discs does (its ridge's coefficient of variation reaches 0.25–0.27), but each
 * colony in a row is a dome of its own. Rows and clumps of touching colonies on crowded plates
 * show one dome in six pieces or more (the watershed cuts a clump into more pieces than
 * colonies); writing shows one in ten or fewer (a letter's ends, corners and blots): one in
 * eight lies between. There is no floor on the domes: the words "LB XGAL" on a plates-dev photo
 * showed 3 domes in 32 pieces or 5 in 50 as the photo moved by a pixel, and with three domes
 * they were kept, up to 25 pieces counted as colonies on an empty plate.
 */
const DOMELESS_PIECES = 8;
function isDomeless(c: ComponentStats): boolean {
  return c.bumps * DOMELESS_PIECES < c.regions;
}

/**
 * A blob that is one round colony (or a round pair) and touches nothing: never taken for a piece
 * of writing, whatever its colour.
 */
function isRound(c: ComponentStats): boolean {
  return c.rimPixels === 0 && elongationOf(c) <= ROUND_BLOB;
}

/** A round region that is the whole of a round blob touching nothing. */
function isRoundAlone(r: RegionStats, c: ComponentStats): boolean {
  return c.regions === 1 && isRound(c) && elongationOf(r) <= CLUMP_ELONGATION;
}

/**
 * A region in a stroke's blob is a colony the writing touches when it is clearly thicker than
 * the line, or nearly as thick and of neither a pen's colour nor dark ink (a pale colony against
 * dark writing, whose blob it shares). But a piece as thick as the line that holds no round
 * contrast bump (blob-seeds.ts) and lies on the same side of the agar's lightness as the line
 * (both darker, or both lighter) is the line: a thick marker stroke, or a lamp's arc reflected by
 * the lid, whose colour along it fades too much for one pen colour to hold it. A colony there is
 * a dome; a pale colony against dark writing may show no bump of its own beside the line's strong
 * contrast, and is told by its lightness. A domeless piece of the line's own colour is the line
 * too, whatever its lightness: a band of reflected tint along the wall differs from the agar in
 * hue alone, so the sign of its lightness is noise.
 */
function isColonyOnStroke(
  r: RegionStats,
  lineHalfWidth: number,
  pens: readonly Pen[],
  darkInk: boolean,
  line: Pen | undefined,
): boolean {
  if (r.halfWidth >= COLONY_ON_STROKE * lineHalfWidth) return true;
  if (r.bumps === 0 && line && (sameSideOfAgar(r, line) || hasPenColour(r, line))) return false;
  const inky = pens.some((p) => hasPenColour(r, p)) || (darkInk && isDarkInk(r));
  return !inky && r.halfWidth >= OTHER_COLOUR_ON_STROKE * lineHalfWidth;
}

/** The piece between three or more touching colonies (see Junctions above). */
function isJunction(r: RegionStats): boolean {
  return r.bumps === 0 && r.neighbours >= JUNCTION_NEIGHBOURS && elongationOf(r) < JUNCTION_FILL;
}

/** Lighter than the agar like the line, or darker like it: not a pale colony on dark ink. */
function sameSideOfAgar(r: RegionStats, line: Pen): boolean {
  return Math.sign(lightness(r)) === Math.sign(line.delta[0]);
}

/**
 * Half the thickness of a band-shaped blob: twice its mean distance-map value (across a band the
 * distance rises linearly from the edge to the middle, so its mean is half the maximum).
 */
function strokeHalfWidth(c: ComponentStats): number {
  return 2 * c.meanDistance;
}

/** A region big and round enough to be judged against the faint threshold (foreground.ts). */
function isFaintDisc(r: RegionStats, minArea: number): boolean {
  return r.area >= FAINT_AREA * minArea && r.area <= ROUND_BLOB * Math.PI * r.halfWidth ** 2;
}

/** Lighter than the agar and untinted: the fading edge of lid glare, next to a glare patch. */
function isGlareFringe(r: RegionStats): boolean {
  return lightness(r) > 0 && tint(r) < GLARE_FRINGE_TINT;
}

function isGreyShade(r: RegionStats): boolean {
  return lightness(r) < 0 && tint(r) < GREY_SHADE_CHROMA;
}

/** Median area of regions that were alone in their blob: the size of one colony on this plate. */
function typicalSingleArea(regions: RegionStats[], comps: Map<number, ComponentStats>): number {
  const singles = regions
    .filter((r) => comps.get(r.component)?.regions === 1)
    .map((r) => r.area)
    .sort((a, b) => a - b);
  const pool = singles.length >= 3 ? singles : regions.map((r) => r.area).sort((a, b) => a - b);
  return pool.length ? pool[pool.length >> 1]! : 0;
}

/** ΔL* of a region from the agar under it. */
function lightness(r: RegionStats): number {
  return r.lab[0] - r.backgroundLab[0];
}

/** How far a region's tint lies from the agar's: the distance in a*, b*. */
function tint(r: RegionStats): number {
  return Math.hypot(r.lab[1] - r.backgroundLab[1], r.lab[2] - r.backgroundLab[2]);
}

/** The radius of the disc of a region's area. */
function radiusOf(r: RegionStats): number {
  return Math.sqrt(r.area / Math.PI);
}
