import { chmodSync, mkdtempSync, readFileSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/core/errors';
import { readLogFile, CHUNK_BYTES } from '../../src/io/read-log';
import { readLogs } from '../../src/io/read-logs';

const dir = mkdtempSync(join(tmpdir(), 'lagbench-read-'));

async function failure(path: string): Promise<InputError> {
  try {
    await readLogFile(path);
  } catch (err) {
    if (err instanceof InputError) return err;
    throw err;
  }
  throw new Error('expected an InputError');
}

describe('readLogFile', () => {
  it('readLogFile(missing file) → file-not-found naming the file', async () => {
    const e = await failure(join(dir, 'nope.csv'));
    expect(e.code).toBe('file-not-found');
    expect(e.message).toContain('nope.csv');
  });

  it('readLogFile(a folder) → is-a-directory', async () => {
    expect((await failure(dir)).code).toBe('is-a-directory');
  });

  // root can read a file without permissions, so this check only means something for other users
  it.skipIf(process.getuid?.() === 0)('readLogFile(unreadable file) → file-unreadable', async () => {
    const path = join(dir, 'locked.csv');
    writeFileSync(path, 'Time [s],P [Pa]\n0,1\n1,2\n');
    chmodSync(path, 0o000);
    expect((await failure(path)).code).toBe('file-unreadable');
  });

  it('readLogFile(µ in the header, several chunks, a µ split across a chunk boundary) reads every row', async () => {
    const path = join(dir, 'micro.csv');
    const head = '# Sensor: µ-flow (invented)\nTime [s],Flow [µL/min]\n';
    const lines: string[] = [];
    let bytes = Buffer.byteLength(head);
    let i = 0;
    while (bytes < CHUNK_BYTES * 2.2) {
      // a comment whose 2-byte µ straddles the first chunk boundary (comments in the body are skipped)
      const comment = bytes < CHUNK_BYTES && bytes + 40 > CHUNK_BYTES ? `#${'x'.repeat(CHUNK_BYTES - bytes - 2)}µ\n` : '';
      const line = `${comment}${i / 1000},${i % 7}\n`;
      lines.push(line);
      bytes += Buffer.byteLength(line);
      i++;
    }
    writeFileSync(path, head + lines.join(''));
    const { recording, report } = await readLogFile(path);
    expect(report.rows).toBe(i);
    expect(recording.channels[0]!.originalUnit).toBe('µL/min');
    expect(recording.channels[0]!.values[i - 1]).toBeCloseTo((((i - 1) % 7) * 1e-9) / 60, 22); // 1 µL/min = 1e-9/60 m³/s
  });

  it('readLogFile(binary file) → binary-file with the file name', async () => {
    const path = join(dir, 'data.bin');
    writeFileSync(path, Buffer.from([0x50, 0x4b, 3, 4, 0, 0, 0, 1, 2, 3, 0xff, 0xfe, 0]));
    const e = await failure(path);
    expect(e.code).toBe('binary-file');
    expect(e.location.file).toBe(path);
  });

  it('readLogFile(UTF-8 with BOM and µ) reports the BOM and reads the unit', async () => {
    const path = join(dir, 'bom.csv');
    writeFileSync(path, '\uFEFFTime [s];Flow [µL/min]\r\n0;1,5\r\n1;2,5\r\n', 'utf8');
    const { recording, report } = await readLogFile(path);
    expect(report.dialect.hadBom).toBe(true);
    expect(recording.channels[0]!.originalUnit).toBe('µL/min');
    expect(recording.channels[0]!.values[1]).toBeCloseTo(2.5e-9 / 60, 22); // 2,5 µL/min (decimal comma); 1 µL/min = 1e-9/60 m³/s
    expect(report.bytes).toBe(statSync(path).size);
  });

  it('readLogFile(UTF-16 LE with BOM) decodes it', async () => {
    const path = join(dir, 'utf16.csv');
    writeFileSync(path, Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from('Time [s],P [mbar]\n0,1\n1,2\n', 'utf16le')]));
    const { recording, report } = await readLogFile(path);
    expect(report.dialect.hadBom).toBe(true);
    expect(Array.from(recording.channels[0]!.values)).toEqual([100, 200]); // 1 mbar = 100 Pa (physics.md §5, exact)
  });

  it('readLogFile(file larger than one chunk) reports progress up to the size and reads every row', async () => {
    const path = join(dir, 'big.csv');
    const lines = ['Time [s],P [mbar]'];
    let bytes = 0;
    for (let i = 0; bytes < CHUNK_BYTES * 1.5; i++) {
      const line = `${i / 1000},${(i % 1000) / 10}`;
      lines.push(line);
      bytes += line.length + 1;
    }
    const rows = lines.length - 1;
    writeFileSync(path, `${lines.join('\n')}\n`);
    const size = statSync(path).size;
    const calls: [number, number][] = [];
    const { recording } = await readLogFile(path, {}, (done, total) => calls.push([done, total]));
    expect(recording.timeS.length).toBe(rows);
    expect(calls.length).toBe(2); // a file of 1.5 chunks is read in 2 chunks
    expect(calls[calls.length - 1]).toEqual([size, size]);
    expect(recording.channels[0]!.values[rows - 1]).toBe(((rows - 1) % 1000) * 10); // x/10 mbar × 100 Pa/mbar
  });

  it('readLogFile never modifies its input', async () => {
    const path = join(dir, 'keep.csv');
    const text = 'Time [s],P [Pa]\n0,1\n1,x\n';
    writeFileSync(path, text);
    const before = statSync(path).mtimeMs;
    await expect(readLogFile(path)).rejects.toThrow(InputError);
    await readLogFile(path, { skipBadRows: true });
    expect(readFileSync(path, 'utf8')).toBe(text);
    expect(statSync(path).mtimeMs).toBe(before);
  });

  it('readLogs(two files) merges them', async () => {
    const a = join(dir, 'a.csv');
    const b = join(dir, 'b.csv');
    writeFileSync(a, 'Time [s],P [Pa]\n0,0\n0.5,1\n1,2\n');
    writeFileSync(b, 'Time [s],Q [nL/s]\n0,4\n1,6\n');
    const { recording, parts } = await readLogs([a, b], {}, { offsetsS: [0] });
    expect(parts).toHaveLength(2);
    expect(recording.channels[1]!.values[1]).toBeCloseTo(5e-12, 24); // halfway between 4 and 6 nL/s
  });
});
