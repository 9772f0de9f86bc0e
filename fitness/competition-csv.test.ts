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
        'row 3 (assay A1): volume_ul must be a volume from 0.001 to 1000000 µL, got "-5"',
        'row 4 (assay A1): fold_dilution_since_start is missing',
        'row 5 (assay A1): test_colonies must be a whole number from 0 to 10000000 (colonies on one plate), got "8.5"',
        'row 6 (assay A1): sample must be "start" or "end", got "middle"',
        'row 7: has 10 field(s), the header has 11',
        'row 8 (assay A3): generation must be a number from 0 to 10000000, got "x"',
        'row 8 (assay A3): dilution_fold must be a fold ≥ 1 (1000, 1e3, 10^3 or 1:1000 for a 10⁻³ dilution), got "0.001"',
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

describe('odd files', () => {
  it('refuses a 306-digit count by row and field, without a crash', () => {
    const huge = '9'.repeat(306);
    const found = problems(ok.replace('80,50,1', `${huge},50,1`));
    expect(found).toEqual([
      `row 4 (assay A1): test_colonies must be a whole number from 0 to 10000000 (colonies on one plate), got "999999999999…" (306 characters)`,
      'assay A1 (rows 2, 3): no end plate',
    ]);
  });

  it('skips trailing rows of empty cells, as spreadsheets export them', () => {
    const table = readCompetitionCsv(`${ok}\n,,,,,,,,,,\n ,,,,,,,,,,\r\n,,,,,,,,,,\n`);
    expect(table.assays).toHaveLength(1);
    expect(problems(`${HEADER}\n,,,,,,,,,,\n`)).toEqual(['no data row after the header']);
  });

  it('reads a semicolon-separated file with decimal commas and says so', () => {
    const semicolons = ok.replace(/,/g, ';').replace('100;58', '100,0;58');
    const table = readCompetitionCsv(semicolons);
    expect(table.separator).toBe(';');
    expect(table.assays[0]!.start[1]!.volumeMl).toBe(0.1);
    const tabs = readCompetitionCsv(ok.replace(/,/g, '\t'));
    expect(tabs.separator).toBe('\t');
    expect(tabs.assays[0]!.end[0]!.testColonies).toBe(80);
  });

  it('names the separator when the header is read as one column', () => {
    const [message] = problems(ok.replace(/,/g, '|'));
    expect(message).toMatch(/^header \(line 1\): missing column\(s\) assay, group, line/);
    expect(message).toContain(
      'The header was read as one column: the file must separate its columns with commas',
    );
  });

  it('refuses a column the engine reads when it appears twice, naming both positions', () => {
    const twice = ok.replace(HEADER, `${HEADER},test_colonies`).replace(/\n(A1.*)/g, '\n$1,7');
    expect(problems(twice)).toEqual([
      'header (line 1): column "test_colonies" appears twice (columns 9 and 12); keep one',
    ]);
    // A repeated column the engine does not read is only listed as unused.
    const notes = ok.replace(HEADER, `${HEADER},note,Note`).replace(/\n(A1.*)/g, '\n$1,a,b');
    expect(readCompetitionCsv(notes).ignoredColumns).toEqual(['note', 'note']);
  });

  it('reads dilutions written the bench ways, as the app does (fold-text.ts)', () => {
    for (const written of ['1000000', '1e6', '10^6', '10^-6', '1:1000000', '10-6']) {
      const table = readCompetitionCsv(ok.replace('end,1000000', `end,${written}`));
      expect(table.assays[0]!.end[0]!.dilutionFold).toBe(1e6);
    }
    const D = readCompetitionCsv(ok.replace(/,1$/, ',10^2'));
    expect(D.assays[0]!.foldDilutionSinceStart).toBe(100);
    // In a comma file a quoted "1,5" is never read as 1.5.
    expect(problems(ok.replace('end,1000000', 'end,"1,5"'))[0]).toEqual(
      'row 4 (assay A1): dilution_fold must be a fold ≥ 1 (1000, 1e3, 10^3 or 1:1000 for a 10⁻³ dilution), got "1,5"',
    );
  });

  it('bounds every number so nothing downstream can overflow', () => {
    expect(problems(ok.replace('end,1000000', 'end,1e300'))[0]).toMatch(
      /^row 4 \(assay A1\): dilution_fold must be a fold ≥ 1/,
    );
    expect(problems(ok.replace('end,1000000,100', 'end,1000000,1e-300'))[0]).toEqual(
      'row 4 (assay A1): volume_ul must be a volume from 0.001 to 1000000 µL, got "1e-300"',
    );
    expect(problems(ok.replace(/,1$/, ',1e999'))[0]).toEqual(
      'row 4 (assay A1): fold_dilution_since_start must be a fold ≥ 1 (1 when both samples come from the same flask), got "1e999"',
    );
  });
});

describe('block column', () => {
  it('reads the block of each assay and checks it is the same on all its rows', () => {
    const withBlock = ok.replace(HEADER, `${HEADER},block`).replace(/\n(A1.*)/g, '\n$1,day2');
    expect(readCompetitionCsv(withBlock).assays[0]!.block).toBe('day2');
    const mixed = withBlock.replace(/day2$/, 'day3');
    expect(problems(mixed)).toEqual(['row 4: assay A1 has block "day3" here but "day2" on row 2']);
  });
});
