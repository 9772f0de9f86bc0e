import 'fake-indexeddb/auto';
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyse } from '../../fitness/analysis.ts';
import { REQUIRED_COLUMNS, readCompetitionCsv } from '../../fitness/competition-csv.ts';
import type { ExperimentData } from '../bench/experiment-data.ts';
import { newExperiment } from '../bench/experiments.ts';
import { fitnessInputs } from '../results/assay-inputs.ts';
import { platesCsv } from './competition-csv.ts';
import { assaysFromCsv } from './import-csv.ts';

const EXAMPLE = resolve(import.meta.dirname, '../../fixtures/example-competition.csv');

const experiment = newExperiment({
  name: 'Round trip',
  lines: ['L1'],
  referenceName: 'ancestor',
  transferDilution: 100,
  defaultDilutionFold: 1e5,
  defaultVolumeUl: 100,
});

function dataOf(batch: ReturnType<typeof assaysFromCsv>['batch']): ExperimentData {
  return {
    experiment,
    assays: batch.assays ?? [],
    samples: batch.samples ?? [],
    plates: batch.plates ?? [],
    analyses: new Map(),
    corrections: new Map(),
  };
}

describe('plate CSV in the fitness engine format', () => {
  it('has exactly the columns the fitness engine requires, plus days, test_marker and block', () => {
    const header = platesCsv([]).trim().split(',');
    expect(header).toEqual([...REQUIRED_COLUMNS, 'days', 'test_marker', 'block']);
  });

  it('round-trips the shipped example: import, export, and the fitness reader sees the same plates', () => {
    // Outside reference: the fitness engine's own reader of its own example file.
    const text = readFileSync(EXAMPLE, 'utf8');
    const original = readCompetitionCsv(text).assays;
    const imported = assaysFromCsv(text, 'example-competition.csv', experiment);
    expect(imported.assays).toBe(original.length);
    const exported = readCompetitionCsv(
      platesCsv(fitnessInputs(dataOf(imported.batch)).inputs),
    ).assays;
    const plates = (a: (typeof original)[number]) =>
      [...a.start.map((p) => ['start', p] as const), ...a.end.map((p) => ['end', p] as const)]
        .map(
          ([s, p]) =>
            `${s} ${p.dilutionFold} ${p.volumeMl} ${p.testColonies} ${p.referenceColonies}`,
        )
        .sort();
    const key = (a: (typeof original)[number]) =>
      `${a.group} ${a.line} ${a.generation} ${a.replicate}`;
    const byKey = new Map(exported.map((a) => [key(a), a]));
    for (const a of original) {
      const back = byKey.get(key(a));
      expect(back, key(a)).toBeDefined();
      expect(plates(back!)).toEqual(plates(a));
      expect(back!.foldDilutionSinceStart).toBe(a.foldDilutionSinceStart);
      expect(back!.days).toBe(a.days);
      expect(back!.group).toBe(a.group);
    }
    // The example's markers (white, red) are not this experiment's colour names: each is taken
    // as one of its two colours, so the two halves of the reciprocal assays stay apart.
    expect(imported.notes).toEqual([
      'test_marker "white" was taken as colour 2.',
      'test_marker "red" was taken as colour 1.',
    ]);
    const marker = new Map(original.map((a) => [a.testMarker, byKey.get(key(a))!.testMarker]));
    expect(marker).toEqual(
      new Map([
        ['white', 'colour 2'],
        ['red', 'colour 1'],
      ]),
    );
  });

  it('carries the block column through import, storage records and export into the blocked analysis', () => {
    // The shipped example with a block per replicate (an invented two-day schedule).
    const [head, ...rows] = readFileSync(EXAMPLE, 'utf8').trim().split('\n');
    const replicateAt = head!.split(',').indexOf('replicate');
    const text = [
      `${head},block`,
      ...rows.map((r) => `${r},day ${r.split(',')[replicateAt]}`),
    ].join('\n');
    const imported = assaysFromCsv(text, 'blocks.csv', experiment);
    const blocks = new Set(imported.batch.assays!.map((a) => a.block));
    expect(blocks).toEqual(new Set(['day 1', 'day 2', 'day 3', 'day 4']));
    const inputs = fitnessInputs(dataOf(imported.batch)).inputs;
    const exported = readCompetitionCsv(platesCsv(inputs)).assays;
    expect(exported.map((a) => a.block)).toEqual(inputs.map((a) => a.block));
    // The app's inputs give the blocked analysis the command gives from the file itself.
    const fromApp = analyse(inputs).comparisons.byGeneration;
    const fromFile = analyse(readCompetitionCsv(text).assays).comparisons.byGeneration;
    expect(fromApp.length).toBeGreaterThan(0);
    expect(fromApp.every((g) => g.blocked !== null)).toBe(true);
    for (const [i, g] of fromApp.entries()) {
      const a = g.blocked!.anova;
      const b = fromFile[i]!.blocked!.anova;
      if ('reason' in a || 'reason' in b) throw new Error(`generation ${g.generation}: no aov`);
      expect(a.line.f).toBeCloseTo(b.line.f, 10);
      expect(a.block.ss).toBeCloseTo(b.block.ss, 12);
    }
  });

  it('a malformed CSV is refused whole, naming the file and the row', () => {
    const bad = `${REQUIRED_COLUMNS.join(',')}\nA1,g,L1,0,1,start,1000,100,12,x,,\n`;
    expect(() => assaysFromCsv(bad, 'counts.csv', experiment)).toThrow(/counts\.csv, .*row 2/);
  });
});
