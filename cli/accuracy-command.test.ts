import { describe, expect, it } from 'vitest';
import { run } from './accuracy-command.ts';
import { capturedIo } from './captured-io.ts';

describe('rivalplate accuracy: options', () => {
  it('refuses a dish scale outside 0.9 to 1.1, naming the option, with status 2', async () => {
    for (const bad of ['2', '0.5', 'x', '-1']) {
      const io = capturedIo('.');
      expect(await run([`--dish-scale=${bad}`, 'photos'], io)).toBe(2);
      expect(io.stderr()).toContain(
        `--dish-scale: expected a number from 0.9 to 1.1, got "${bad}"`,
      );
    }
  });
});
