import { describe, expect, it } from 'vitest';
import { newAssay, nextAssayDraft, nextPlateOf } from './assays.ts';
import { newExperiment } from './experiments.ts';

const e = newExperiment({
  name: 'Drafts',
  lines: ['L4', 'L5'],
  referenceName: 'anc',
  transferDilution: 100,
  defaultDilutionFold: 1e4,
  defaultVolumeUl: 50,
});

describe('fast assay entry', () => {
  it('the first assay takes the experiment defaults; the end plate one transfer further diluted', () => {
    const d = nextAssayDraft(e, [], [], []);
    expect(d).toMatchObject({
      line: 'L4',
      replicate: 1,
      startDilutionFold: 1e4,
      endDilutionFold: 1e6,
      volumeUl: 50,
    });
    expect(d.foldDilutionSinceStart).toBe(100);
  });

  it('the next assay is the next replicate with the last assay’s settings', () => {
    const first = newAssay(e, {
      ...nextAssayDraft(e, [], [], []),
      line: 'L5',
      generation: 300,
      startDilutionFold: 2e4,
      endDilutionFold: 3e6,
      volumeUl: 80,
    });
    const d = nextAssayDraft(e, [first.assay], first.plates, first.samples);
    expect(d).toMatchObject({
      line: 'L5',
      generation: 300,
      replicate: 2,
      startDilutionFold: 2e4,
      endDilutionFold: 3e6,
      volumeUl: 80,
    });
  });

  it('an assay has a start and an end sample with one plate each, all tied to it', () => {
    const a = newAssay(e, nextAssayDraft(e, [], [], []));
    expect(a.samples.map((s) => s.timepoint)).toEqual(['start', 'end']);
    expect(a.plates.map((p) => p.sampleId)).toEqual(a.samples.map((s) => s.id));
    expect(new Set([...a.samples, ...a.plates].map((r) => r.assayId))).toEqual(
      new Set([a.assay.id]),
    );
  });

  it('another plate of a sample is prefilled one ten-fold step further', () => {
    const a = newAssay(e, nextAssayDraft(e, [], [], []));
    const next = nextPlateOf(a.samples[1], a.plates, e);
    expect(next.dilutionFold).toBe(1e7);
    expect(next.volumeUl).toBe(50);
  });
});
