import { beforeAll, describe, expect, it } from 'vitest';
import {
  analyzePlate,
  type LearnedModel,
  labelsFromCorrections,
  learnModel,
  type PlateAnalysis,
} from '../cv/index.ts';
import { generatePlate } from '../fixtures/plate-generator.ts';
import type { GeneratedImage, PlateScene, PlateTruth } from '../fixtures/plate-types.ts';
import { varietyScene } from '../fixtures/scene-variety.ts';
import { scoreAnalysis } from './support/plate-scoring.ts';

/**
 * Learning from a lab's corrections on generated plates (fixtures/, which shares no code with
 * cv/): three plates of a medium are corrected from their truth (every true colony left on the
 * plate with its colour), a model is learned from them, and the medium's other plates are
 * counted with it. The pinpoint medium grows colonies 0.3–0.5 mm across, under the size the
 * default rules take for a colony, so they read it poorly; the ordinary medium is the generator's
 * usual plate, which they read well.
 */
type Medium = Omit<PlateScene, 'seed'>;
const PINPOINT: Medium = { colonyRadiusMm: [0.16, 0.26], colours: 'pink-yellow', glare: 0 };
const ORDINARY: Medium = { glare: 0 };

interface Plate {
  image: GeneratedImage;
  truth: PlateTruth;
}

function plate(seed: number, medium: Medium, colonies: number): Plate {
  return generatePlate(varietyScene(seed, { ...medium, colonies, fractionClass1: 0.4 }));
}

async function learnFrom(plates: readonly Plate[]): Promise<LearnedModel> {
  const labels = [];
  for (const p of plates) {
    const a = await analyzePlate(p.image, { withCandidates: true });
    const final = p.truth.colonies.map((c) => ({
      x: c.x,
      y: c.y,
      cls: p.truth.classes[c.cls].name,
    }));
    labels.push(...labelsFromCorrections(a.candidates!, final));
  }
  return learnModel(
    labels,
    plates.length,
    plates[0]!.truth.classes.map((c) => c.name),
  );
}

async function f1(plates: readonly Plate[], model?: LearnedModel): Promise<number> {
  let tp = 0;
  let fp = 0;
  let fn = 0;
  for (const p of plates) {
    const analysis: PlateAnalysis = await analyzePlate(p.image, model ? { model } : {});
    const s = scoreAnalysis(p.truth, analysis);
    tp += s.truePositives;
    fp += s.falsePositives;
    fn += s.falseNegatives;
  }
  return (2 * tp) / (2 * tp + fp + fn);
}

describe('learning from three corrected plates', () => {
  const teach = (medium: Medium) => [1, 2, 3].map((i) => plate(500 + i, medium, 60 + 30 * i));
  const later = (medium: Medium) => [4, 5, 6].map((i) => plate(500 + i, medium, 50 + 40 * i));
  let pinpointModel: LearnedModel;
  let ordinaryModel: LearnedModel;
  beforeAll(async () => {
    pinpointModel = await learnFrom(teach(PINPOINT));
    ordinaryModel = await learnFrom(teach(ORDINARY));
  }, 180_000);

  it('improves a medium the default rules read poorly by a clear margin', async () => {
    const plates = later(PINPOINT);
    const before = await f1(plates);
    const after = await f1(plates, pinpointModel);
    console.log(`pinpoint medium F1: default ${before.toFixed(3)}, learned ${after.toFixed(3)}`);
    expect(after - before).toBeGreaterThan(0.3);
  }, 180_000);

  it('does not damage a medium the default rules read well, with its own model or another’s', async () => {
    const plates = later(ORDINARY);
    const before = await f1(plates);
    const own = await f1(plates, ordinaryModel);
    const other = await f1(plates, pinpointModel);
    console.log(
      `ordinary medium F1: default ${before.toFixed(3)}, own model ${own.toFixed(3)}, pinpoint model ${other.toFixed(3)}`,
    );
    expect(own).toBeGreaterThan(before - 0.01);
    expect(other).toBeGreaterThan(before - 0.02);
  }, 180_000);

  it('a wider search adds objects for the model and leaves the default reading as it was', async () => {
    // The property the analysis keeps by splitting and measuring the wider search's objects on
    // their own (cv/analyze.ts). Its breach was seen on photos the generator does not draw (the
    // extra objects changed the plate's typical colony, and the default rules kept some of them);
    // on these plates it held before too, so this guards it and does not reproduce it. The plate is
    // one where the wider search finds something (4 objects); since the background follows the
    // wall's rings (cv/wall-background.ts), most of these plates give it nothing more to find.
    const p = plate(509, PINPOINT, 120);
    const key = (c: { x: number; y: number }) => `${c.x},${c.y}`;
    const colonies = (a: PlateAnalysis) =>
      a.candidates!.filter((c) => c.verdict === 'colony').map(key);
    const plain = await analyzePlate(p.image, { withCandidates: true });
    const wide = await analyzePlate(p.image, { withCandidates: true, searchReach: 0.6 });
    expect(wide.candidates!.length).toBeGreaterThan(plain.candidates!.length);
    expect(colonies(wide)).toEqual(colonies(plain));
    expect(wide.colonies).toEqual(plain.colonies);
  }, 60_000);

  it('asking for the candidates changes nothing else, and without it none are computed', async () => {
    const p = plate(510, ORDINARY, 80);
    const plain = await analyzePlate(p.image);
    const withCandidates = await analyzePlate(p.image, { withCandidates: true });
    expect(plain.candidates).toBeUndefined();
    expect(withCandidates.colonies).toEqual(plain.colonies);
    expect(withCandidates.candidates!.filter((c) => c.verdict === 'colony')).toHaveLength(
      plain.colonies.length + (plain.neither?.length ?? 0),
    );
  }, 60_000);
});
