import { describe, expect, it } from 'vitest';
import { CsvInputError, readCompetitionCsv } from './competition-csv.ts';
import { parseCsv } from './csv.ts';

const HEADER =
  'assay,group,line,generation,replicate,sample,dilution_fold,volume_ul,test_colonies,reference_colonies,fold_dilution_since_start';

const ok = [
  HEADER,
  'A1,L1-500,L1,500,1,start,10000,100,60,55,',
  'A1,L1-500,L1,500,1,start,10000,100,58,61,',
  'A1,L1-500,L1,500,1,end,1000000,100,80,50,1',
].join('\n');

function problems(text: string): string[] {
  try {
    readCompetitionCsv(text);
  } catch (e) {
    if (e instanceof CsvInputError) return e.problems;
    throw e;
  }
  throw new Error('expected a CsvInputError');
}

describe('parseCsv', () => {
  it('reads quoted fields, doubled quotes, CRLF and a byte-order mark, with record lines', () => {
    const records = parseCsv('\ufeffa,b\r\n"x, y","say ""hi"""\r\n\r\n"two\nlines",z\n');
    expect(records).toEqual([
      { line: 1, fields: ['a', 'b'] },
      { line: 2, fields: ['x, y', 'say "hi"'] },
      { line: 4, fields: ['two\nlines', 'z'] },
    ]);
    expect(() => parseCsv('a,"b\n')).toThrow(/never closed/);
    expect(() => parseCsv('a,b"c\n')).toThrow(/line 1/);
  });
});

describe('readCompetitionCsv', () => {
  it('groups plates into assays, converting µL to mL and keeping unknown columns aside', () => {
    const table = readCompetitionCsv(
      ok.replace(HEADER, `${HEADER},days,notes`).replace(/\n(A1.*)/g, '\n$1,2,x'),
    );
    expect(table.ignoredColumns).toEqual(['notes']);
    const [a] = table.assays;
    expect(a).toMatchObject({
      assay: 'A1',
      group: 'L1-500',
      line: 'L1',
      generation: 500,
      days: 2,
      foldDilutionSinceStart: 1,
    });
    expect(a!.start).toHaveLength(2);
    expect(a!.end[0]).toEqual({
      label: 'row 4',
      dilutionFold: 1e6,
      volumeMl: 0.1,
      testColonies: 80,
      referenceColonies: 50,
    });
  });

  it('takes columns in any order and any case', () => {
    const cols = HEADER.split(',');
    const rows = ok.split('\n').map((l) => l.split(',').reverse().join(','));
    rows[0] = cols
      .reverse()
      .map((c) => c.toUpperCase())
      .join(',');
    expect(readCompetitionCsv(rows.join('\n')).assays[0]!.end[0]!.testColonies).toBe(80);
  });

  it('names the row of every problem', () => {
    const bad = [
      HEADER,
      'A1,g,L1,500,1,start,,100,60,55,', // missing dilution
      'A1,g,L1,500,1,start,100,-5,60,55,', // negative volume
      'A1,g,L1,500,1,end,1000000,100,80,50,', // blank fold on an end row
      'A1,g,L1,500,1,end,1000000,100,8.5,50,1', // fractional count
      'A1,g,L1,500,1,middle,1000000,100,8,50,1', // unknown sample
      'A2,g,L1,500,1,start,100,100,60,55', // short row
      'A3,g,L1,x,1,start,0.001,100,60,55,', // bad generation, dilution written as a fraction
    ].join('\n');
    const found = problems(bad);
    expect(found).toEqual(
      expect.arrayContaining([
        'row 2 (assay A1): dilution_fold is missing',
        'row 3 (assay A1): volume_ul must be a volume > 0 µL, got "-5"',
        'row 4 (assay A1): fold_dilution_since_start is missing',
        'row 5 (assay A1): test_colonies must be a whole number ≥ 0, got "8.5"',
        'row 6 (assay A1): sample must be "start" or "end", got "middle"',
        'row 7: has 10 field(s), the header has 11',
        'row 8 (assay A3): generation must be a number ≥ 0, got "x"',
        'row 8 (assay A3): dilution_fold must be a fold ≥ 1 (1000 for a 10⁻³ dilution), got "0.001"',
      ]),
    );
  });

  it('checks each assay is whole and consistent', () => {
    expect(problems([HEADER, 'A1,g,L1,500,1,start,100,100,60,55,'].join('\n'))).toEqual([
      'assay A1 (rows 2): no end plate',
    ]);
    expect(
      problems(
        [
          HEADER,
          'A1,g,L1,500,1,start,100,100,60,55,',
          'A1,g,L2,500,1,end,100,100,60,55,1',
          'A1,g,L1,500,1,end,100,100,6,5,100',
        ].join('\n'),
      ),
    ).toEqual([
      'row 3: assay A1 has line "L2" here but "L1" on row 2',
      'row 4: assay A1 has fold_dilution_since_start 100 here but 1 on row 3',
    ]);
    expect(problems('assay,group\nA1,g\n')[0]).toMatch(
      /header \(line 1\): missing column\(s\) line, generation/,
    );
    expect(problems('')).toEqual(['the file is empty: expected a header row']);
    expect(problems(HEADER)).toEqual(['no data row after the header']);
  });
});
