import { describe, expect, it } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { InputError } from '../../src/core/errors';
import { fileSizeBytes, readFileBytes } from '../../src/io/read-bytes';

// Expected bytes and sizes are the test's own inputs; error codes and wording are our own (common practice, no source).
describe('readFileBytes / fileSizeBytes', () => {
  const dir = mkdtempSync(join(tmpdir(), 'lagbench-bytes-'));
  const file = join(dir, 'log.csv');
  writeFileSync(file, 'time_s,pressure_Pa\n0,1\n');

  it('readFileBytes returns the file bytes and fileSizeBytes their count', async () => {
    const bytes = await readFileBytes(file);
    expect(new TextDecoder().decode(bytes)).toBe('time_s,pressure_Pa\n0,1\n');
    expect(await fileSizeBytes(file)).toBe(bytes.length);
  });

  it('readFileBytes of a missing file throws a located InputError (file-not-found)', async () => {
    const missing = join(dir, 'nope.csv');
    await expect(readFileBytes(missing)).rejects.toBeInstanceOf(InputError);
    await expect(readFileBytes(missing)).rejects.toMatchObject({ code: 'file-not-found', location: { file: missing } });
  });

  it('fileSizeBytes of a folder throws is-a-directory', async () => {
    await expect(fileSizeBytes(dir)).rejects.toMatchObject({ code: 'is-a-directory' });
  });
});
