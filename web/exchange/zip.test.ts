import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { crc32, zipStore } from './zip.ts';

describe('zipStore', () => {
  it('CRC-32 gives the standard check value', () => {
    // The check value of CRC-32/ISO-HDLC for the ASCII digits "123456789" is 0xCBF43926
    // (from memory; the value every CRC catalogue lists for this polynomial).
    expect(crc32(new TextEncoder().encode('123456789'))).toBe(0xcbf43926);
  });

  it('lays out local headers, data, central directory and end record', () => {
    const zip = zipStore([
      { name: 'a.csv', text: 'x,y\r\n1,2\r\n' },
      { name: 'b.csv', text: 'é\r\n' },
    ]);
    const view = new DataView(zip.buffer);
    expect(view.getUint32(0, true)).toBe(0x04034b50);
    const end = zip.length - 22;
    expect(view.getUint32(end, true)).toBe(0x06054b50);
    expect(view.getUint16(end + 10, true)).toBe(2);
    const centralAt = view.getUint32(end + 16, true);
    expect(view.getUint32(centralAt, true)).toBe(0x02014b50);
    // The second file's data is its UTF-8 bytes, stored as they are.
    const second = 30 + 5 + 10;
    expect(view.getUint32(second, true)).toBe(0x04034b50);
    expect([...zip.slice(second + 35, second + 39)]).toEqual([0xc3, 0xa9, 13, 10]);
  });

  it('is read back by unzip where the system has it', () => {
    let hasUnzip = true;
    try {
      execFileSync('unzip', ['-v'], { stdio: 'ignore' });
    } catch {
      hasUnzip = false;
    }
    if (!hasUnzip) return;
    const dir = mkdtempSync(join(tmpdir(), 'rivalplate-zip-'));
    try {
      const file = join(dir, 't.zip');
      writeFileSync(file, zipStore([{ name: 'groups.csv', text: 'g,n\r\nL1,3\r\n' }]));
      expect(execFileSync('unzip', ['-p', file, 'groups.csv']).toString()).toBe('g,n\r\nL1,3\r\n');
      execFileSync('unzip', ['-t', file]);
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  });
});
