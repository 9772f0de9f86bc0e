import { describe, expect, it } from 'vitest';
import { groupProblem, newAssay, nextAssayDraft, nextPlateOf, nextReplicate } from './assays.ts';
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

  it('an assay keeps the block it was run in, blank as none; the next assay carries it over', () => {
    expect(newAssay(e, nextAssayDraft(e, [], [], [])).assay.block).toBeNull();
    expect(newAssay(e, { ...nextAssayDraft(e, [], [], []), block: '   ' }).assay.block).toBeNull();
    const run = newAssay(e, { ...nextAssayDraft(e, [], [], []), block: ' day 3 ' });
    expect(run.assay.block).toBe('day 3');
    expect(nextAssayDraft(e, [run.assay], run.plates, run.samples).block).toBe('day 3');
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

describe('groups and replicate numbers', () => {
  const draft = (line: string, generation: number, group = '') => ({
    ...nextAssayDraft(e, [], [], []),
    line,
    generation,
    group,
  });

  it('the group defaults to line and generation; replicate numbers restart in every group', () => {
    const a = newAssay(e, draft('L4', 500)).assay;
    const b = newAssay(e, { ...draft('L4', 500), replicate: 2 }).assay;
    expect(a.group).toBe('L4 g500');
    expect(nextReplicate([a, b], draft('L4', 500))).toBe(3);
    expect(nextReplicate([a, b], draft('L4', 1000))).toBe(1);
    expect(nextReplicate([a, b], draft('L5', 500))).toBe(1);
    // The next assay's prefill does not carry the default group to another generation.
    expect(nextAssayDraft(e, [a, b], [], []).group).toBe('');
  });

  it('a group that would mix generations is refused with a message', () => {
    const a = newAssay(e, draft('L4', 500, 'pond')).assay;
    expect(groupProblem([a], draft('L4', 1000, 'pond'))).toBe(
      'Group "pond" holds generation 500; a group is one generation. Give this assay another group.',
    );
    expect(groupProblem([a], draft('L4', 1000))).toBeNull();
    expect(groupProblem([a], draft('L5', 500, 'pond'))).toBeNull();
  });
});
