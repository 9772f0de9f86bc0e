import { centroid, isTwoColours, kmeans2, type Point, type TwoClusters } from './cluster.ts';
import { labToHex } from './colour.ts';
import { colourName, distinctNames } from './colour-name.ts';
import type { ColonyClass, ColourClass, Lab, Palette, PaletteColour } from './types.ts';

/**
 * Sorting colonies into the two marker colours.
 *
 * Each colony's colour is taken relative to the agar right around it (ΔL*, Δa*, Δb*), which
 * cancels most of the lighting and the agar's own tint. The feature halves ΔL* against the
 * chromatic axes: marker colours differ mainly in hue and chroma, while residual shading moves
 * lightness. Without a palette a plate is clustered on its own (cluster.ts decides one colour or
 * two); with a palette every colony goes to the nearer palette colour, distances scaled by each
 * colour's own spread and measured to the colour's density line (fromDensityLine: a weaker
 * shade of the same pigment), so a 97:3 or 100:0 plate is classified like any other.
 */
export interface ColourSample {
  lab: Lab;
  deltaLab: Lab;
}

export interface Classification {
  cls: ColonyClass[];
  confidence: number[];
  /** Against a palette: samples further than OUTLIER_SPREADS spreads from both colours. */
  outlier: boolean[];
  classes: ColourClass[];
  /** Why a plate was taken as one colour (no palette and no second colour found). */
  oneColour: string | null;
}

/** Below this confidence a colony's class is doubtful. */
export const LOW_CONFIDENCE = 0.75;
/**
 * Against a palette, a colony further than this many spreads from both colours is neither marker
 * (a tinted droplet, a JPEG ghost) and is left out. Colonies of a colour sit within about 2.
 */
export const OUTLIER_SPREADS = 4;
/** Smallest spread used to scale distances, in feature units: real colours always vary this much. */
const MIN_SPREAD = 2;
/** A plate's own cluster needs this many colonies before the plate is sorted by its own split. */
const MIN_OWN_CLUSTER = 3;

export function colourFeature(d: Lab): Point {
  return [0.5 * d[0], d[1], d[2]];
}

export function classify(samples: readonly ColourSample[], palette?: Palette): Classification {
  return sortBy(samples, palette, palette ?? paletteFrom(samples));
}

/** classify with the colours to sort by already known: `palette`, or the plate's own (`model`). */
function sortBy(
  samples: readonly ColourSample[],
  palette: Palette | undefined,
  model: Palette | null,
): Classification {
  if (samples.length === 0) {
    return {
      cls: [],
      confidence: [],
      outlier: [],
      classes: palette ? paletteClasses(palette) : [],
      oneColour: null,
    };
  }
  const features = samples.map((s) => colourFeature(s.deltaLab));
  if (!model) {
    const lab = meanLab(samples.map((s) => s.lab));
    const delta = meanLab(samples.map((s) => s.deltaLab));
    return {
      cls: samples.map(() => 0),
      confidence: samples.map(() => 1),
      outlier: samples.map(() => false),
      classes: [{ cls: 0, name: colourName(lab), hex: labToHex(lab), deltaLab: delta }],
      oneColour: 'no second colony colour stands apart from the spread of the first',
    };
  }
  const own = palette ? twoColoursOf(features) : null;
  if (palette && own && agrees(own, palette)) return byOwnClusters(features, own, palette);
  const centres = model.colours.map((c) => colourFeature(c.deltaLab));
  const spreads = model.colours.map((c) => Math.max(MIN_SPREAD, c.spread));
  const cls: ColonyClass[] = [];
  const confidence: number[] = [];
  const outlier: boolean[] = [];
  for (const f of features) {
    // Which pigment, by the density line (a colony may be a weaker shade of the palette's colour);
    // whether it is either marker at all, by the palette colours themselves.
    const d0 = fromDensityLine(f, centres[0]!) / spreads[0]!;
    const d1 = fromDensityLine(f, centres[1]!) / spreads[1]!;
    const k: ColonyClass = d0 <= d1 ? 0 : 1;
    cls.push(k);
    const total = d0 + d1;
    confidence.push(total === 0 ? 0.5 : (k === 0 ? d1 : d0) / total);
    outlier.push(palette !== undefined && isNeither(f, palette));
  }
  return { cls, confidence, outlier, classes: paletteClasses(model), oneColour: null };
}

/**
 * Sorting when some colonies (`aside`) are seen through lid glare: the reflection adds its own
 * light to their colour, so they are left out of what decides the plate's colours (its own
 * clusters, or which palette colour its clusters are) and are then sorted against those colours
 * like any other colony, a washed-out colony being a weaker shade of its colour (fromDensityLine).
 */
export function classifyAside(
  samples: readonly ColourSample[],
  aside: readonly boolean[],
  palette?: Palette,
): Classification {
  const lit = samples.filter((_, i) => aside[i]);
  const clear = samples.filter((_, i) => !aside[i]);
  // With nothing clear to decide by, the plate is sorted as it is.
  if (lit.length === 0 || clear.length === 0) return classify(samples, palette);
  const against = palette ?? paletteFrom(clear);
  const main = sortBy(clear, palette, against);
  const side: Sorted = against
    ? classify(lit, against)
    : { cls: lit.map(() => 0), confidence: lit.map(() => 1), outlier: lit.map(() => false) };
  const next = { clear: 0, lit: 0 };
  const from = samples.map((_, i) =>
    aside[i] ? { s: side, j: next.lit++ } : { s: main, j: next.clear++ },
  );
  return {
    cls: from.map(({ s, j }) => s.cls[j]!),
    confidence: from.map(({ s, j }) => s.confidence[j]!),
    outlier: from.map(({ s, j }) => s.outlier[j]!),
    classes: main.classes,
    oneColour: main.oneColour,
  };
}

type Sorted = Pick<Classification, 'cls' | 'confidence' | 'outlier'>;

/**
 * Further than OUTLIER_SPREADS spreads from every shade of both palette colours: of neither marker
 * colour. A weaker or stronger shade of a colour (younger or older colonies of the strain) is
 * sorted to that colour (fromDensityLine) and is that colour, not an outlier.
 */
function isNeither(f: Point, palette: Palette): boolean {
  return palette.colours.every((c) => spreadsFromShade(f, c) > OUTLIER_SPREADS);
}

/**
 * How far a plate's colour lies from a weaker or stronger shade of a palette colour
 * (fromDensityLine), in that colour's spreads.
 */
export function spreadsFromShade(f: Point, c: PaletteColour): number {
  return shadeDistance(f, colourFeature(c.deltaLab)) / Math.max(MIN_SPREAD, c.spread);
}

/** This plate's own two colours, when its colonies show two (cluster.ts), else null. */
function twoColoursOf(features: readonly Point[]): TwoClusters | null {
  const clusters = kmeans2(features);
  if (!clusters || !isTwoColours(clusters)) return null;
  return Math.min(...clusters.sizes) >= MIN_OWN_CLUSTER ? clusters : null;
}

/**
 * The plate's own two colours are the palette's two: each is nearer to a different palette colour
 * and lies within OUTLIER_SPREADS of it or of a weaker or stronger shade of it (fromDensityLine).
 * A plate of one colour split by shade (a 194:6 plate whose blue colonies vary) has both its
 * clusters nearest the same palette colour, and is sorted by the palette instead.
 */
function agrees(own: TwoClusters, palette: Palette): boolean {
  const scaled = (o: Point, k: number) => spreadsFromShade(o, palette.colours[k]!);
  const nearest = (o: Point) => (scaled(o, 0) <= scaled(o, 1) ? 0 : 1);
  const [a, b] = own.centres;
  const ka = nearest(a);
  const kb = nearest(b);
  return ka !== kb && scaled(a, ka) <= OUTLIER_SPREADS && scaled(b, kb) <= OUTLIER_SPREADS;
}

/**
 * A plate whose colonies show two colours of their own is sorted by its own clusters, and the
 * palette only says which cluster is which colour (the pairing of centres with the smaller total
 * distance). Lighting, white balance and the agar's batch shift both colours of a plate alike, so
 * the plate's own split is sharper than the distance to colours learned on other plates.
 * Each colony goes to the own colour it is fewer spreads from, measured to that colour's shades
 * (fromDensityLine), as against a palette: k-means's plain nearer-centre split put small, weak
 * colonies of a wide, strong colour (a thinner layer of the same pigment) with a tight pale one
 * whose centre lies nearer the agar.
 * A colony far from both palette colours is marked as an outlier for the person to judge.
 */
function byOwnClusters(
  features: readonly Point[],
  own: TwoClusters,
  palette: Palette,
): Classification {
  const p = palette.colours.map((c) => colourFeature(c.deltaLab));
  const straight = distance(own.centres[0], p[0]!) + distance(own.centres[1], p[1]!);
  const swapped = distance(own.centres[0], p[1]!) + distance(own.centres[1], p[0]!);
  const classOf = (k: 0 | 1): ColonyClass => (straight <= swapped ? k : ((1 - k) as ColonyClass));
  const spreads = own.spreads.map((s) => Math.max(MIN_SPREAD, s));
  const cls: ColonyClass[] = [];
  const confidence: number[] = [];
  const outlier: boolean[] = [];
  for (const f of features) {
    const d0 = shadeDistance(f, own.centres[0]) / spreads[0]!;
    const d1 = shadeDistance(f, own.centres[1]) / spreads[1]!;
    const k: 0 | 1 = d0 <= d1 ? 0 : 1;
    cls.push(classOf(k));
    const total = d0 + d1;
    confidence.push(total === 0 ? 0.5 : (k === 0 ? d1 : d0) / total);
    outlier.push(isNeither(f, palette));
  }
  return { cls, confidence, outlier, classes: paletteClasses(palette), oneColour: null };
}

/**
 * Learns two marker colours from colonies (of one plate or pooled over a batch), or null when they
 * show only one colour. Class 0 is the darker colour relative to the agar.
 */
export function paletteFrom(samples: readonly ColourSample[], minShare = 0): Palette | null {
  const groups = twoGroups(samples, minShare);
  if (!groups) return null;
  const colours = groups.map(({ members, spread }) => ({
    lab: meanLab(members.map((s) => s.lab)),
    deltaLab: meanLab(members.map((s) => s.deltaLab)),
    spread,
  }));
  colours.sort((a, b) => a.deltaLab[0] - b.deltaLab[0]);
  const [c0, c1] = colours as [(typeof colours)[0], (typeof colours)[0]];
  const [n0, n1] = distinctNames(c0.lab, c1.lab);
  return {
    version: 1,
    colours: [
      { name: n0, hex: labToHex(c0.lab), deltaLab: c0.deltaLab, spread: c0.spread },
      { name: n1, hex: labToHex(c1.lab), deltaLab: c1.deltaLab, spread: c1.spread },
    ],
  };
}

/**
 * The plate's colonies in two colour groups with their spreads, or null when they show one colour.
 * With `minShare`, each group must hold that share of the colonies (see palette.ts); a split that
 * leaves fewer in one group is as likely a few strays as a rare strain (blobs of ink, the wall's
 * tinted crumbs, far off in colour and alike, so more than kmeans2's strays), which are set aside
 * and the rest split again, up to STRAY_SPLITS times: two colours behind them still teach.
 */
const STRAY_SPLITS = 3;
function twoGroups(samples: readonly ColourSample[], minShare: number) {
  let kept = samples;
  for (let round = 0; round < STRAY_SPLITS; round++) {
    const clusters = kmeans2(kept.map((s) => colourFeature(s.deltaLab)));
    if (!clusters || !isTwoColours(clusters)) return null;
    const small = clusters.sizes[0] <= clusters.sizes[1] ? 0 : 1;
    if (clusters.sizes[small] >= minShare * kept.length) {
      return ([0, 1] as const).map((k) => ({
        members: kept.filter((_, i) => clusters.assignment[i] === k),
        spread: clusters.spreads[k],
      }));
    }
    kept = kept.filter((_, i) => clusters.assignment[i] !== small);
  }
  return null;
}

/** A palette taught by pointing at one colony of each colour. */
export function paletteFromSamples(
  a: ColourSample,
  b: ColourSample,
  names?: [string, string],
): Palette {
  const [na, nb] = names ?? distinctNames(a.lab, b.lab);
  const colour = (s: ColourSample, name: string): PaletteColour => ({
    name,
    hex: labToHex(s.lab),
    deltaLab: s.deltaLab,
    // One example says nothing about spread; assume the typical colony-to-colony variation.
    spread: 3,
  });
  return { version: 1, colours: [colour(a, na), colour(b, nb)] };
}

function paletteClasses(p: Palette): ColourClass[] {
  return p.colours.map((c, k) => ({
    cls: k as ColonyClass,
    name: c.name,
    hex: c.hex,
    deltaLab: c.deltaLab,
  }));
}

/**
 * Distance from f to the colour c or a shade of it, from 1/DENSITY_RANGE to `strongest` times as
 * far from the agar. A colony's difference from the agar grows with its optical density
 * (Beer–Lambert): the same strain reads weaker on a plate of young colonies than on one of big,
 * old ones, and lighting moves all colonies of a plate alike. A colony is sorted against the
 * palette colour and its weaker shades only: the palette is learned from the clearest colonies,
 * and what is stronger still is more often ink than a colony. Two plates' colours are compared
 * both ways (either may be the stronger).
 */
/** Distance from f to the nearest shade of the colour c, over the palettes' range of shades. */
function shadeDistance(f: Point, c: Point): number {
  return fromDensityLine(f, c, DENSITY_RANGE);
}

function fromDensityLine(f: Point, c: Point, strongest = 1): number {
  const cc = c[0] * c[0] + c[1] * c[1] + c[2] * c[2];
  const t = cc === 0 ? 1 : (f[0] * c[0] + f[1] * c[1] + f[2] * c[2]) / cc;
  const k = Math.min(strongest, Math.max(1 / DENSITY_RANGE, t));
  return distance(f, [k * c[0], k * c[1], k * c[2]]);
}
const DENSITY_RANGE = 2;

function distance(p: Point, q: Point): number {
  return Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]);
}

function meanLab(labs: readonly Lab[]): Lab {
  return centroid(labs);
}
