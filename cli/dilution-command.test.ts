import { describe, expect, it } from 'vitest';
import { capturedIo } from './captured-io.ts';
import { run } from './dilution-command.ts';

describe('rivalplate dilution', () => {
  it('names the plate to make, checked against a worked plate count', async () => {
    // Worked example N = C/(V·d): 68 colonies from 0.1 mL of 10⁻³ is 6.8×10⁵ CFU/mL (common
    // practice); turned round, that culture plated the same way gives about 68 colonies.
    const io = capturedIo('/');
    expect(await run(['--cfu-per-ml', '6.8e5'], io)).toBe(0);
    expect(io.stdout()).toBe(
      'Plate 100 µL of the 1:1,000 dilution: about 68 colonies (countable; FDA BAM ch. 3 (25–250)).\n',
    );
  });

  it('works from an OD and the lab calibration, and prints JSON on request', async () => {
    const io = capturedIo('/');
    const args = [
      '--od',
      '0.5',
      '--cfu-per-od',
      '8e8',
      '--volumes',
      '50,100',
      '--range',
      'iso7218',
    ];
    expect(await run([...args, '--json'], io)).toBe(0);
    expect(JSON.parse(io.stdout())).toMatchObject({
      cfuPerMl: 4e8,
      dilutionFold: 1e5,
      volumeUl: 50,
      expectedColonies: 200,
      status: 'countable',
    });
  });

  it('says what was wrong with the options, with exit status 2', async () => {
    for (const [args, message] of [
      [[], 'give --cfu-per-ml, or --od with --cfu-per-od'],
      [['--cfu-per-ml', 'lots'], '--cfu-per-ml: expected a number above 0, got "lots"'],
      [['--cfu-per-ml', '1e9', '--volumes', '100,-5'], '--volumes: expected a number above 0'],
      [['--cfu-per-ml', '1e9', '--range', 'pond'], '--range: expected bam'],
      [['--cfu-per-ml', '1e9', '--colour'], "Unknown option '--colour'"],
    ] as const) {
      const io = capturedIo('/');
      expect(await run([...args], io), args.join(' ')).toBe(2);
      expect(io.stderr()).toContain(message);
    }
  });

  it('says when even the best dilution is outside the range', async () => {
    const io = capturedIo('/');
    // 10 CFU/mL: undiluted 100 µL gives 1 colony, the most any plate can give.
    expect(await run(['--cfu-per-ml', '10'], io)).toBe(0);
    expect(io.stdout()).toContain('about 1 colony (too few even at the best dilution');
  });
});
