import type {
  Analysis,
  CandidateRecord,
  ClassRecord,
  ColonyRecord,
  PaletteRecord,
  Stamp,
} from '../../schema/records.ts';
import type { CandidateFeatures, Colony, Palette, PlateAnalysis } from '../../worker/types.ts';
import { NEUTRAL_LOOKS } from '../bench/colours.ts';

/** The stored record of one analysis (original photo pixels), colonies numbered in found order. */
export function analysisRecord(
  a: PlateAnalysis,
  stamp: Stamp,
  plateId: string,
  photoId: string,
  paletteUsed: boolean,
): Analysis {
  const colonies: ColonyRecord[] = a.colonies.map((c, i) => ({
    id: `c${i}`,
    x: c.x,
    y: c.y,
    r: c.r,
    cls: c.cls,
    confidence: c.confidence,
    count: c.count,
    area: c.area,
    split: c.split,
    lab: [...c.lab],
    deltaLab: [...c.deltaLab],
    ...(c.glareLit ? { glareLit: true } : {}),
  }));
  const cls = (i: 0 | 1): ClassRecord => {
    const k = a.classes.find((c) => c.cls === i);
    return k
      ? { cls: i, name: k.name, hex: k.hex, deltaLab: [...k.deltaLab] }
      : { cls: i, ...NEUTRAL_LOOKS[i], deltaLab: [0, 0, 0] };
  };
  return {
    ...stamp,
    plateId,
    photoId,
    width: a.width,
    height: a.height,
    agarLab: [...a.agarLab],
    dish: a.dish && {
      cx: a.dish.cx,
      cy: a.dish.cy,
      rx: a.dish.rx,
      ry: a.dish.ry,
      angleDeg: a.dish.angleDeg,
    },
    colonies,
    classes: [cls(0), cls(1)],
    flags: a.flags.map(({ kind, ...values }) => ({ kind, values, detail: null })),
    paletteUsed,
    ms: Object.values(a.timings).reduce((s, t) => s + t, 0),
    learnedFrom: a.model?.plates ?? null,
    candidates: a.candidates?.map(candidateRecord) ?? null,
  };
}

function candidateRecord(f: CandidateFeatures): CandidateRecord {
  const { x, y, r, dL, da, db, dE, radiusMm, elongation, ridgeVariation, wallMm } = f;
  return {
    x,
    y,
    r,
    dL,
    da,
    db,
    dE,
    radiusMm,
    elongation,
    ridgeVariation,
    wallMm,
    colony: f.verdict === 'colony',
    plateColonies: f.plateColonies,
  };
}

/** The analysis core's view of stored candidates; ids number them in stored order. */
export function candidateFeaturesOf(records: readonly CandidateRecord[]): CandidateFeatures[] {
  return records.map(({ colony, ...f }, id) => ({
    ...f,
    id,
    verdict: colony ? 'colony' : 'rejected',
  }));
}

/** The analysis core's view of a stored colony; null for one added by hand (no measured colour). */
export function colonyOf(c: ColonyRecord): Colony | null {
  if (!c.lab || !c.deltaLab) return null;
  const { x, y, r, area, cls, confidence, split, count, lab, deltaLab } = c;
  return {
    x,
    y,
    r,
    area,
    cls,
    confidence,
    split,
    count,
    lab,
    deltaLab,
    ...(c.glareLit ? { glareLit: true as const } : {}),
  };
}

/**
 * The analysis core's view of a stored analysis, for re-classifying against a palette or
 * learning one. Colonies added by hand have no measured colour and are left out.
 */
export function plateAnalysisOf(r: Analysis): PlateAnalysis {
  const colonies = r.colonies.flatMap((c) => colonyOf(c) ?? []);
  const counts: Record<string, number> = {};
  for (const k of r.classes) counts[k.name] = 0;
  for (const c of colonies) {
    const name = r.classes[c.cls].name;
    counts[name] = (counts[name] ?? 0) + c.count;
  }
  return {
    width: r.width,
    height: r.height,
    scale: 1,
    dish: r.dish && { ...r.dish, r: (r.dish.rx + r.dish.ry) / 2, agarFraction: 1, source: 'given' },
    colonies,
    counts,
    classes: r.classes.map((k) => ({ cls: k.cls, name: k.name, hex: k.hex, deltaLab: k.deltaLab })),
    agarLab: r.agarLab,
    flags: [],
    timings: {},
    ...notStored,
  };
}

/**
 * Image measures the stored record does not keep (they play no part in classifying). Spread in
 * from a separate object, so this compiles whether or not the core's result type has them yet.
 */
const notStored = { edgeWidthMm: null };

export function paletteRecord(p: Palette, source: PaletteRecord['source']): PaletteRecord {
  const colour = (i: 0 | 1) => {
    const c = p.colours[i];
    return {
      name: c.name,
      hex: c.hex,
      deltaLab: [...c.deltaLab] as [number, number, number],
      spread: c.spread,
    };
  };
  return { version: 1, colours: [colour(0), colour(1)], source };
}

export function paletteOf(r: PaletteRecord): Palette {
  return { version: 1, colours: r.colours };
}
