/**
 * The app's side of learning from checked plates, as plain functions over the analysis core: the
 * worker runs `fitExperimentModel` after each checked plate, and the app reads a stored model with
 * `readModelText` before handing it to a reading. Nothing here touches opencv, so the app may
 * also call `readModelText` on its own thread to say what a stored model is.
 */
// The modules themselves, not the core's index: the app's thread must not pull in opencv.js.
import { type FinalColony, labelsFromCorrections } from '../cv/labels.ts';
import {
  coloniesNeeded,
  decidesColonies,
  learnModel,
  ModelError,
  searchReach,
} from '../cv/learned-model.ts';
import { modelToJson, parseModel } from '../cv/model-file.ts';
import type { CandidateFeatures, LearnedModel } from '../cv/types.ts';

/** One checked plate as learning needs it: what the analysis considered, and what the person kept. */
export interface TeachingPlate {
  /** Read by the default analysis (no learned model, so with the default search). */
  readByDefaults: boolean;
  candidates: CandidateFeatures[];
  /** The colonies after the person's corrections, original photo pixels, colour by the lab's name. */
  final: FinalColony[];
}

export type FitResult =
  | { ok: true; model: string; plates: number; colonies: number; other: number }
  | { ok: false; reason: string };

/**
 * The experiment's model from every checked plate (labels from corrections, then the L2-regularised
 * logistic regression of cv/learned-model.ts), as the text of a model file. Its search reach comes
 * from the plates the default analysis read (cv searchReach); with none of those, the experiment's
 * current reach is kept. Labels that teach
 * nothing (no colony on a measured object, or nothing that was not one) give a reason instead of
 * throwing across the worker boundary.
 */
export function fitExperimentModel(
  plates: readonly TeachingPlate[],
  names: readonly [string, string],
  currentReach = 1,
): FitResult {
  const labelsOf = (p: TeachingPlate) => labelsFromCorrections(p.candidates, p.final);
  const labels = plates.flatMap(labelsOf);
  // Only plates the default search read say how far it falls short; with none, the reach stays.
  const byDefaults = plates.filter((p) => p.readByDefaults).flatMap(labelsOf);
  const reach = byDefaults.length > 0 ? searchReach(byDefaults) : currentReach;
  try {
    const model = learnModel(labels, plates.length, names, reach);
    return {
      ok: true,
      model: modelToJson(model),
      plates: model.plates,
      colonies: model.examples.colonies,
      other: model.examples.other,
    };
  } catch (e) {
    if (e instanceof ModelError) return { ok: false, reason: e.message };
    throw e;
  }
}

export type ReadModel =
  | {
      ok: true;
      model: LearnedModel;
      /** It decides which objects are colonies; until then it only names and sorts the colours. */
      decides: boolean;
      /** Labelled colonies it needs to decide which objects are colonies. */
      coloniesNeeded: number;
    }
  | { ok: false; error: string };

/** A stored model file, checked by the core's reader; a damaged or newer one says why. */
export function readModelText(text: string): ReadModel {
  try {
    const model = parseModel(text);
    return {
      ok: true,
      model,
      decides: decidesColonies(model),
      coloniesNeeded: coloniesNeeded(model),
    };
  } catch (e) {
    if (e instanceof ModelError) return { ok: false, error: e.message };
    throw e;
  }
}
