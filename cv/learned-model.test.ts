import { describe, expect, it } from 'vitest';
import { createRng } from '../fixtures/prng.ts';
import type { CandidateLabel } from './labels.ts';
import {
  colonyProbability,
  decidesColonies,
  isColony,
  learnModel,
  MIN_REACH,
  ModelError,
  searchReach,
} from './learned-model.ts';
import { fitLogistic } from './logistic.ts';
import { modelToJson, parseModel } from './model-file.ts';
import type { CandidateFeatures } from './types.ts';

function labelled(rng: () => number, colony: boolean, cls: string | null): CandidateLabel {
  const dark = cls === 'red';
  const features: CandidateFeatures = {
    id: 0,
    x: 0,
    y: 0,
    r: 5,
    dL: colony ? (dark ? -25 : 8) + 4 * rng() : -1 + 2 * rng(),
    da: colony ? (dark ? 20 : 1) + 3 * rng() : 2 * rng(),
    db: colony ? 3 * rng() : 2 * rng(),
    dE: colony ? 15 + 10 * rng() : 3 + 3 * rng(),
    radiusMm: colony ? 0.4 + 0.8 * rng() : 0.15 + 0.2 * rng(),
    elongation: 1 + 0.3 * rng(),
    ridgeVariation: 0.1 * rng(),
    wallMm: 40 * rng(),
    plateColonies: 100,
    verdict: colony ? (rng() < 0.8 ? 'colony' : 'rejected') : rng() < 0.1 ? 'colony' : 'rejected',
  };
  return { kind: colony ? 'kept' : 'rejected', colony, cls, features, x: 0, y: 0 };
}

function labels(seed: number): CandidateLabel[] {
  const random = createRng(seed);
  const rng = () => random.next();
  return Array.from({ length: 300 }, (_, i) =>
    labelled(rng, i % 3 !== 0, i % 3 === 0 ? null : i % 3 === 1 ? 'red' : 'white'),
  );
}

describe('ridge logistic regression by IRLS', () => {
  it('unpenalised, one ±1 feature: the fit reproduces each group’s log-odds (saturated model, common practice)', () => {
    // Group x = 1: 3 of 4 are 1; group x = −1: 1 of 4. Log-odds ln 3 and −ln 3.
    const rows = [1, 1, 1, 1, -1, -1, -1, -1].map((v) => [v]);
    const fit = fitLogistic(rows, [1, 1, 1, 0, 1, 0, 0, 0], 0);
    expect(fit.intercept).toBeCloseTo(0, 9);
    expect(fit.weights[0]).toBeCloseTo(Math.log(3), 9);
  });

  it('the penalty pulls the weight towards 0', () => {
    const rows = [1, 1, 1, 1, -1, -1, -1, -1].map((v) => [v]);
    const fit = fitLogistic(rows, [1, 1, 1, 0, 1, 0, 0, 0], 4);
    expect(fit.weights[0]).toBeGreaterThan(0);
    expect(fit.weights[0]).toBeLessThan(Math.log(3));
  });
});

describe('the learned model', () => {
  it('tells colonies from the rest on the labels it learned from', () => {
    const all = labels(1);
    const model = learnModel(all, 3, ['red', 'white']);
    const right = all.filter((l) => colonyProbability(model, l.features!) >= 0.5 === l.colony);
    expect(right.length / all.length).toBeGreaterThan(0.97);
    expect(model.palette?.colours.map((c) => c.name)).toEqual(['red', 'white']);
  });

  it('the same labels give the same bytes', () => {
    const a = modelToJson(learnModel(labels(7), 3, ['red', 'white']));
    const b = modelToJson(learnModel(labels(7), 3, ['red', 'white']));
    expect(a).toBe(b);
    expect(a.length).toBeLessThan(4096);
    expect(modelToJson(parseModel(a))).toBe(a);
  });

  it('refuses labels that cannot teach', () => {
    const colonies = labels(2).filter((l) => l.colony);
    expect(() => learnModel(colonies, 1, ['red', 'white'])).toThrow(ModelError);
    const none = labels(2).filter((l) => !l.colony);
    expect(() => learnModel(none, 1, ['red', 'white'])).toThrow(/no checked colony/);
  });

  it('from too few colonies it sorts colours only and leaves colony or not to the default rules', () => {
    const all = labels(4);
    const few = [...all.filter((l) => !l.colony), ...all.filter((l) => l.colony).slice(0, 30)];
    const model = learnModel(few, 1, ['red', 'white']);
    expect(decidesColonies(model)).toBe(false);
    for (const l of few)
      expect(isColony(model, l.features!)).toBe(l.features!.verdict === 'colony');
    expect(decidesColonies(learnModel(all, 3, ['red', 'white']))).toBe(true);
  });

  it('one colour name gives no palette: colours are sorted as by default', () => {
    expect(learnModel(labels(3), 1, ['red']).palette).toBeNull();
  });
});

describe('the model file', () => {
  const good = modelToJson(learnModel(labels(5), 3, ['red', 'white']));

  it('keeps how many colonies the default rules had rejected, and reads a file from before it', () => {
    const model = parseModel(good);
    const rescued = labels(5).filter((l) => l.colony && l.features!.verdict === 'rejected');
    expect(rescued.length).toBeGreaterThan(0);
    expect(model.examples.found).toBe(rescued.length);
    const older = JSON.parse(good) as { examples: Record<string, number> };
    delete older.examples.found;
    expect(parseModel(JSON.stringify(older)).examples.found).toBeUndefined();
  });

  it('keeps how many objects the default rules had kept were removed, and reads a file from before it', () => {
    const removed = labels(5).filter((l) => !l.colony && l.features!.verdict === 'colony');
    expect(removed.length).toBeGreaterThan(0);
    expect(parseModel(good).examples.removed).toBe(removed.length);
    const older = JSON.parse(good) as { examples: Record<string, number> };
    delete older.examples.removed;
    expect(parseModel(JSON.stringify(older)).examples.removed).toBeUndefined();
  });
  const edit = (f: (m: Record<string, unknown>) => void) => {
    const m = JSON.parse(good) as Record<string, unknown>;
    f(m);
    return JSON.stringify(m);
  };

  it.each([
    ['cut short', good.slice(0, 200), /not JSON/],
    ['another kind of file', '{"version": 1, "colours": []}', /"format" is not "rivalplate-model"/],
    ['a weight lost', edit((m) => (m.weights as number[]).pop()), /"weights" must hold 11 numbers/],
    [
      'a weight not a number',
      edit((m) => ((m.weights as unknown[])[2] = 'x')),
      /"weights\[2\]" is not a number/,
    ],
    [
      'a zero spread of a feature',
      edit((m) => ((m.sd as number[])[0] = 0)),
      /"sd" holds a value ≤ 0/,
    ],
    ['features renamed', edit((m) => ((m.features as string[])[0] = 'L')), /"features" must be/],
    [
      'a reach past the limit',
      edit((m) => (m.reach = 0.1)),
      /"reach" is not a number from 0.6 to 1/,
    ],
    [
      'a palette colour without a name',
      edit((m) => {
        (m.palette as { colours: { name: string }[] }).colours[1]!.name = '';
      }),
      /"palette.colours\[1\].name" is not a name/,
    ],
  ])('refuses a damaged file: %s', (_, text, message) => {
    expect(() => parseModel(text)).toThrow(ModelError);
    expect(() => parseModel(text)).toThrow(message);
  });

  it('keeps the reach, and reads a file from before the reach as searched with the defaults', () => {
    expect(parseModel(edit((m) => (m.reach = 0.8))).reach).toBe(0.8);
    expect(parseModel(edit((m) => delete m.reach)).reach).toBe(1);
  });

  it('refuses a newer version, saying so', () => {
    expect(() => parseModel(edit((m) => (m.version = 2)))).toThrow(
      /model version 2 was made by a newer Rivalplate; this one reads version 1/,
    );
  });
});

describe('how far the candidate search reaches', () => {
  const colony = (kind: CandidateLabel['kind']): CandidateLabel => ({
    kind,
    colony: true,
    cls: 'red',
    features: null,
    x: 0,
    y: 0,
  });
  const plate = (found: number, added: number) => [
    ...Array.from({ length: found }, () => colony('kept')),
    ...Array.from({ length: added }, () => colony('added')),
  ];

  it('lowers the thresholds by the share of colonies people had to add', () => {
    // 20 of 100 checked colonies were never considered: the thresholds go to 0.8 of the defaults.
    expect(searchReach(plate(80, 20))).toBe(0.8);
    // Read already at 0.8 and 10 % still missed: 0.8 × 0.9.
    expect(searchReach(plate(90, 10), 0.8)).toBe(0.72);
  });

  it('keeps the reach it was read with when nothing was added, and never goes past MIN_REACH', () => {
    expect(searchReach(plate(50, 0))).toBe(1);
    expect(searchReach(plate(50, 0), 0.9)).toBe(0.9);
    expect(searchReach(plate(10, 90))).toBe(MIN_REACH);
    expect(searchReach([])).toBe(1);
  });
});
