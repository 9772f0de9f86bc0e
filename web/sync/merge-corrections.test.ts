/**
 * The corrections merge by a table of cases; every case is also merged the other way round
 * (commutativity) and merged again with its own result (idempotence), then the same for three
 * phones in every order, and seeded random property tests over shuffled edit histories.
 */
import { describe, expect, it } from 'vitest';
import type { Corrections, Edit } from '../../schema/records.ts';
import { at, colony, corrections } from '../../tests/sync/marrowfield.ts';
import { mergeCorrections } from './merge-corrections.ts';

const add = (i: number, cls: 0 | 1 = 0): Edit => ({
  op: 'add',
  colony: { ...colony(100 + i, cls), lab: null, deltaLab: null },
});
const remove = (id: string): Edit => ({ op: 'remove', colonyId: id });
const reclass = (id: string, cls: 0 | 1): Edit => ({ op: 'reclass', colonyId: id, cls });
const side = (edits: Edit[], minutes: number, extra: Partial<Corrections> = {}): Corrections => ({
  ...corrections('mf-corr-1', edits),
  revision: 2,
  updatedAt: at(minutes),
  ...extra,
});

/** What the merged edits do, as the plate would show it: colonies added, removed, reclassified. */
function summary(edits: Edit[]): string[] {
  return edits.map((e) =>
    e.op === 'add'
      ? `+${e.colony.id}:${e.colony.cls}`
      : e.op === 'remove'
        ? `-${e.colonyId}`
        : `${e.colonyId}→${e.cls}`,
  );
}

const cases: {
  name: string;
  a: Corrections;
  b: Corrections;
  edits: string[];
  disagreements: number;
}[] = [
  { name: 'nothing on either side', a: side([], 10), b: side([], 11), edits: [], disagreements: 0 },
  {
    name: 'taps on one side only',
    a: side([add(1), remove('c3')], 10),
    b: side([], 11),
    edits: ['+c101:0', '-c3'],
    disagreements: 0,
  },
  {
    name: 'different taps on each side are all kept',
    a: side([add(1), reclass('c4', 1)], 10),
    b: side([add(2, 1), remove('c7')], 11),
    edits: ['+c101:0', '+c102:1', '-c7', 'c4→1'],
    disagreements: 0,
  },
  {
    name: 'the same taps on both sides count once',
    a: side([add(1), remove('c3')], 10),
    b: side([add(1), remove('c3')], 11),
    edits: ['+c101:0', '-c3'],
    disagreements: 0,
  },
  {
    name: 'a removal wins over a reclassification of the same colony',
    a: side([remove('c5')], 10),
    b: side([reclass('c5', 1)], 11),
    edits: ['-c5'],
    disagreements: 0,
  },
  {
    name: 'two different classes for one colony: the later is kept and the clash reported',
    a: side([reclass('c6', 0)], 10),
    b: side([reclass('c6', 1)], 11),
    edits: ['c6→1'],
    disagreements: 1,
  },
  {
    name: 'an added colony reclassified on the other phone: the later class, reported',
    a: side([add(1, 0)], 12),
    b: side([add(1, 0), reclass('c101', 1)], 11),
    edits: ['+c101:0'],
    disagreements: 1,
  },
  {
    name: 'added and removed again on one phone leaves nothing',
    a: side([add(1), remove('c101')], 10),
    b: side([add(2)], 11),
    edits: ['+c102:0'],
    disagreements: 0,
  },
];

describe('mergeCorrections', () => {
  it.each(cases)('$name', ({ a, b, edits, disagreements }) => {
    const ab = mergeCorrections(a, b);
    const ba = mergeCorrections(b, a);
    if (!ab.ok || !ba.ok) throw new Error('expected a merge');
    expect(summary(ab.edits)).toEqual(edits);
    expect(ab.disagreements).toHaveLength(disagreements);
    // Commutative: the other way round gives the same.
    expect(ba).toEqual(ab);
    // Idempotent: merging the result with either side again changes nothing.
    const merged = { ...(a.updatedAt > b.updatedAt ? a : b), edits: ab.edits };
    for (const again of [
      mergeCorrections(merged, a),
      mergeCorrections(merged, b),
      mergeCorrections(merged, merged),
    ]) {
      if (!again.ok) throw new Error('expected a merge');
      expect(again.edits).toEqual(ab.edits);
    }
  });

  it('refuses to merge taps made on different analyses of the plate', () => {
    const r = mergeCorrections(side([add(1)], 10), side([add(2)], 11, { analysisId: 'mf-an-2' }));
    expect(r).toMatchObject({ ok: false, problem: 'different-analyses' });
  });

  it('is commutative and idempotent over random tap histories (seeded)', () => {
    let seed = 20260302;
    const random = () => {
      seed = (seed * 1103515245 + 12345) % 2 ** 31;
      return seed / 2 ** 31;
    };
    const randomEdits = (): Edit[] =>
      Array.from({ length: Math.floor(random() * 8) }, () => {
        const i = Math.floor(random() * 6);
        const r = random();
        const cls = (r > 0.5 ? 1 : 0) as 0 | 1;
        return r < 0.33 ? add(i, cls) : r < 0.66 ? remove(`c${100 + i}`) : reclass(`c${i}`, cls);
      });
    for (let trial = 0; trial < 200; trial++) {
      const a = side(randomEdits(), Math.floor(random() * 3));
      const b = side(randomEdits(), Math.floor(random() * 3));
      const ab = mergeCorrections(a, b);
      const ba = mergeCorrections(b, a);
      expect(ba).toEqual(ab);
      if (!ab.ok) throw new Error('expected a merge');
      const again = mergeCorrections({ ...a, edits: ab.edits, updatedAt: at(5) }, b);
      if (!again.ok) throw new Error('expected a merge');
      expect(again.edits).toEqual(ab.edits);
    }
  });

  const permutations = <T>(items: T[]): T[][] =>
    items.length <= 1
      ? [items]
      : items.flatMap((item, i) =>
          permutations([...items.slice(0, i), ...items.slice(i + 1)]).map((rest) => [
            item,
            ...rest,
          ]),
        );

  const threeWay: {
    name: string;
    versions: Corrections[];
    edits: string[];
    disagreements: string[];
  }[] = [
    {
      name: 'three phones, different taps: all kept',
      versions: [side([add(1)], 10), side([remove('c3')], 11), side([reclass('c4', 1)], 12)],
      edits: ['+c101:0', '-c3', 'c4→1'],
      disagreements: [],
    },
    {
      name: 'three classes given one colony: the latest kept, one clash reported',
      versions: [
        side([reclass('c6', 0)], 10),
        side([reclass('c6', 1)], 11),
        side([reclass('c6', 0)], 12),
      ],
      edits: ['c6→0'],
      disagreements: ['c6:0/1'],
    },
    {
      name: 'a removal on one phone wins over the other two',
      versions: [side([reclass('c5', 1)], 10), side([remove('c5')], 11), side([add(2)], 12)],
      edits: ['+c102:0', '-c5'],
      disagreements: [],
    },
    {
      name: 'one time on all three: the order comes from their content, not their arrival',
      versions: [side([reclass('c6', 1)], 10), side([reclass('c6', 0)], 10), side([], 10)],
      edits: ['c6→1'],
      disagreements: ['c6:1/0'],
    },
  ];

  it.each(threeWay)('$name, in every order', ({ versions, edits, disagreements }) => {
    const results = permutations(versions).map((order) => mergeCorrections(...order));
    const first = results[0]!;
    if (!first.ok) throw new Error('expected a merge');
    expect(summary(first.edits)).toEqual(edits);
    expect(first.disagreements.map((d) => `${d.colonyId}:${d.kept}/${d.dropped}`)).toEqual(
      disagreements,
    );
    for (const r of results) expect(r).toEqual(first);
    // Idempotent: the result merged again with any of the versions, as the latest, is unchanged.
    const merged = { ...side(first.edits, 20) };
    for (const v of [...versions, merged]) {
      const again = mergeCorrections(merged, v);
      if (!again.ok) throw new Error('expected a merge');
      expect(again.edits).toEqual(first.edits);
    }
  });

  it('is the same in every order for three and four phones over random histories (seeded)', () => {
    let seed = 4021;
    const random = () => {
      seed = (seed * 1103515245 + 12345) % 2 ** 31;
      return seed / 2 ** 31;
    };
    const randomEdits = (): Edit[] =>
      Array.from({ length: Math.floor(random() * 6) }, () => {
        const i = Math.floor(random() * 5);
        const r = random();
        const cls = (r > 0.5 ? 1 : 0) as 0 | 1;
        return r < 0.33 ? add(i, cls) : r < 0.66 ? remove(`c${100 + i}`) : reclass(`c${i}`, cls);
      });
    for (let trial = 0; trial < 60; trial++) {
      const versions = Array.from({ length: 3 + (trial % 2) }, () =>
        side(randomEdits(), Math.floor(random() * 3)),
      );
      const [first, ...rest] = permutations(versions).map((order) => mergeCorrections(...order));
      for (const r of rest) expect(r).toEqual(first);
    }
  });
});
