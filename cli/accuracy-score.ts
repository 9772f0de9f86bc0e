import { nearestPairs } from '../cv/nearest-pairs.ts';
import type { TruthColony } from './labelled-folder.ts';

/**
 * Scores a counter's detections on labelled photos. Pure: no files, no opencv.
 *
 * Matching: one to one, closest pairs first, a detection within max(MATCH_REACH · r, MATCH_MIN_PX)
 * of a true colony's centre. A detection matched to a colony the labeller marked invisible counts
 * neither way. Count error is against the visible colonies, on plates whose full truth lies in
 * the countable range (25–300, the common-practice range for pour and spread plates). Colour
 * names are mapped to the truth's once per batch (the pairing that agrees best over the batch),
 * as a lab maps its marker colours once per experiment.
 */
const MATCH_REACH = 0.6;
const MATCH_MIN_PX = 3;
export const COUNTABLE: readonly [number, number] = [25, 300];

export interface Detected {
  x: number;
  y: number;
  cls: string;
}

export interface PlateScore {
  truePositives: number;
  falsePositives: number;
  falseNegatives: number;
  visible: number;
  total: number;
  detected: number;
  /** [detected class, true class] of each matched visible colony. */
  pairs: [string, string][];
  /** Detections per class and visible truth per class. */
  detectedByClass: Record<string, number>;
  visibleByClass: Record<string, number>;
}

export function scorePlate(
  truth: readonly TruthColony[],
  detections: readonly Detected[],
): PlateScore {
  const matched = nearestPairs(truth, detections, MATCH_REACH, MATCH_MIN_PX);
  const pairs: [string, string][] = [];
  let invisibleMatches = 0;
  for (const [t, d] of matched) {
    const c = truth[t]!;
    if (c.visible) pairs.push([detections[d]!.cls, c.cls]);
    else invisibleMatches++;
  }
  const visible = truth.filter((c) => c.visible);
  return {
    truePositives: pairs.length,
    falsePositives: detections.length - pairs.length - invisibleMatches,
    falseNegatives: visible.length - pairs.length,
    visible: visible.length,
    total: truth.length,
    detected: detections.length,
    pairs,
    detectedByClass: tally(detections.map((d) => d.cls)),
    visibleByClass: tally(visible.map((c) => c.cls)),
  };
}

export interface Summary {
  plates: number;
  precision: number;
  recall: number;
  f1: number;
  /** Median |detected − visible| / visible over countable plates; null without one. */
  medianCountError: number | null;
  /** Matched colonies whose colour agrees after one mapping for the batch. */
  colourAccuracy: number;
  /** Mean |ln(ratio detected) − ln(ratio true)| over plates with both colours visible. */
  logRatioError: number | null;
  /** Colonies reported on plates with no visible colony. */
  emptyPlateColonies: number;
}

/** Scores of one batch (one mapping of colour names) summarised. */
export function summarise(scores: readonly PlateScore[]): Summary {
  const tp = sum(scores.map((s) => s.truePositives));
  const fp = sum(scores.map((s) => s.falsePositives));
  const fn = sum(scores.map((s) => s.falseNegatives));
  const precision = tp + fp === 0 ? 1 : tp / (tp + fp);
  const recall = tp + fn === 0 ? 1 : tp / (tp + fn);
  const mapping = bestMapping(scores.flatMap((s) => s.pairs));
  const pairs = scores.flatMap((s) => s.pairs);
  const agree = pairs.filter(([d, t]) => mapping.get(d) === t).length;
  const errors = scores
    .filter((s) => s.total >= COUNTABLE[0] && s.total <= COUNTABLE[1] && s.visible > 0)
    .map((s) => Math.abs(s.detected - s.visible) / s.visible);
  const ratios = scores.flatMap((s) => logRatioError(s, mapping));
  return {
    plates: scores.length,
    precision,
    recall,
    f1: precision + recall === 0 ? 0 : (2 * precision * recall) / (precision + recall),
    medianCountError: errors.length ? median(errors) : null,
    colourAccuracy: pairs.length ? agree / pairs.length : 1,
    logRatioError: ratios.length ? sum(ratios) / ratios.length : null,
    emptyPlateColonies: sum(scores.filter((s) => s.visible === 0).map((s) => s.detected)),
  };
}

/**
 * Detected class name → true class name, one to one: the most frequent (detected, true) pairs are
 * taken first. With two colours a side that is the pairing with the most agreements.
 */
export function bestMapping(pairs: readonly [string, string][]): Map<string, string> {
  const counts = new Map<string, { d: string; t: string; n: number }>();
  for (const [d, t] of pairs) {
    const key = JSON.stringify([d, t]);
    const entry = counts.get(key) ?? { d, t, n: 0 };
    entry.n++;
    counts.set(key, entry);
  }
  const mapping = new Map<string, string>();
  const taken = new Set<string>();
  for (const { d, t } of [...counts.values()].sort(
    (a, b) => b.n - a.n || (a.d + a.t < b.d + b.t ? -1 : 1),
  )) {
    if (mapping.has(d) || taken.has(t)) continue;
    mapping.set(d, t);
    taken.add(t);
  }
  return mapping;
}

function logRatioError(s: PlateScore, mapping: Map<string, string>): number[] {
  const names = Object.keys(s.visibleByClass);
  if (names.length !== 2) return [];
  const mapped: Record<string, number> = {};
  for (const [d, n] of Object.entries(s.detectedByClass)) {
    const t = mapping.get(d);
    if (t !== undefined) mapped[t] = (mapped[t] ?? 0) + n;
  }
  // +0.5 on each count (the usual continuity correction) keeps a zero from giving ±∞.
  const ratio = (a: number, b: number) => Math.log((a + 0.5) / (b + 0.5));
  const [x, y] = names as [string, string];
  return [
    Math.abs(
      ratio(mapped[x] ?? 0, mapped[y] ?? 0) - ratio(s.visibleByClass[x]!, s.visibleByClass[y]!),
    ),
  ];
}

function tally(names: readonly string[]): Record<string, number> {
  const out: Record<string, number> = {};
  for (const n of names) out[n] = (out[n] ?? 0) + 1;
  return out;
}

function sum(v: readonly number[]): number {
  return v.reduce((a, b) => a + b, 0);
}

function median(v: readonly number[]): number {
  const s = [...v].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}
