/**
 * Whole-file reads for the desktop shell (the renderer hashes and re-imports the raw bytes), with the
 * same located errors as the log reader. Input files are only read, never modified.
 */
import { readFile, stat } from 'node:fs/promises';
import { fileError } from './file-errors';

/** Size of the file at `path` in bytes; InputError when it is missing, a folder or unreadable. */
export async function fileSizeBytes(path: string): Promise<number> {
  try {
    const st = await stat(path);
    if (st.isDirectory()) throw Object.assign(new Error('directory'), { code: 'EISDIR' });
    return st.size;
  } catch (err) {
    throw fileError(path, err);
  }
}

/** The bytes of the file at `path`; InputError when it is missing, a folder or unreadable. */
export async function readFileBytes(path: string): Promise<Uint8Array> {
  try {
    return new Uint8Array(await readFile(path));
  } catch (err) {
    throw fileError(path, err);
  }
}
