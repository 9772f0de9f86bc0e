import { describe, expect, it } from 'vitest';
import { newAssay, nextAssayDraft } from './assays.ts';
import type { ExperimentData } from './experiment-data.ts';
import { newExperiment } from './experiments.ts';
import { nextPlateNeeded } from './next-plate.ts';

const e = newExperiment({
  name: 'Run',
  lines: ['L1'],
  referenceName: 'anc',
  transferDilution: 100,
  defaultDilutionFold: 1e5,
  defaultVolumeUl: 100,
});
const a1 = newAssay(e, { ...nextAssayDraft(e, [], [], []), replicate: 1 });
const a2 = newAssay(e, { ...nextAssayDraft(e, [], [], []), replicate: 2 });
const data = (): ExperimentData => ({
  experiment: e,
  assays: [a1.assay, a2.assay],
  samples: [...a1.samples, ...a2.samples],
  plates: [...a1.plates, ...a2.plates],
  analyses: new Map(),
  corrections: new Map(),
});

describe('a run of plates: the next plate the experiment needs', () => {
  it('after the start plate comes its end plate, then the next assay', () => {
    const d = data();
    expect(nextPlateNeeded(d, a1.plates[0].id)?.plate.id).toBe(a1.plates[1].id);
    expect(nextPlateNeeded(d, a1.plates[1].id)?.plate.id).toBe(a2.plates[0].id);
  });

  it('plates already checked or typed in are passed over; the last plate goes back to the first waiting', () => {
    const d = data();
    d.plates[1] = { ...d.plates[1]!, reviewed: true };
    d.plates[2] = { ...d.plates[2]!, typedCounts: { test: 1, reference: 1 } };
    expect(nextPlateNeeded(d, a1.plates[0].id)?.plate.id).toBe(a2.plates[1].id);
    expect(nextPlateNeeded(d, a2.plates[1].id)?.plate.id).toBe(a1.plates[0].id);
    d.plates[0] = { ...d.plates[0]!, reviewed: true };
    expect(nextPlateNeeded(d, a2.plates[1].id)).toBeNull();
  });
});
