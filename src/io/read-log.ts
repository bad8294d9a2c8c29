/**
 * Reads a log file from disk in chunks and feeds the pure importer (src/core/import). Handles the byte level:
 * missing or unreadable files, UTF-8 / UTF-16 byte-order marks, and progress reporting. Never writes.
 * UTF-8 files go to the importer as bytes (its tokenizer reads numbers from bytes, no decoding); UTF-16 files
 * are decoded here.
 */
import { fileError } from './file-errors';
import { open, stat } from 'node:fs/promises';
import { InputError } from '../core/errors';
import { createLogParser, type ImportOptions, type ImportResult } from '../core/import/index';

/** Called after each chunk with the bytes read so far and the file size. */
export type ProgressCallback = (bytesDone: number, bytesTotal: number) => void;

/** Bytes read per chunk (papaparse's streaming default is similar; 4 MB measured well here). */
export const CHUNK_BYTES = 4 * 1024 * 1024;

/** The text encoding announced by a byte-order mark, or UTF-8. */
function encodingOf(head: Uint8Array): 'utf-8' | 'utf-16le' | 'utf-16be' {
  if (head[0] === 0xff && head[1] === 0xfe) return 'utf-16le';
  if (head[0] === 0xfe && head[1] === 0xff) return 'utf-16be';
  return 'utf-8';
}

/**
 * Reads and imports one log. `displayName` (default: the path as given) names the file in messages.
 * Throws InputError for missing, unreadable, binary or malformed files.
 */
export async function readLogFile(path: string, options: ImportOptions = {}, onProgress?: ProgressCallback, displayName: string = path): Promise<ImportResult> {
  let size: number;
  try {
    const st = await stat(path);
    if (st.isDirectory()) throw Object.assign(new Error('directory'), { code: 'EISDIR' });
    size = st.size;
  } catch (err) {
    throw fileError(displayName, err);
  }
  let handle;
  try {
    handle = await open(path, 'r');
  } catch (err) {
    throw fileError(displayName, err);
  }
  const parser = createLogParser({ ...options, sourceName: displayName, sizeHintChars: size });
  try {
    const buffer = Buffer.allocUnsafe(CHUNK_BYTES);
    let decoder: TextDecoder | null = null;
    let encoding: 'utf-8' | 'utf-16le' | 'utf-16be' = 'utf-8';
    let done = 0;
    for (;;) {
      let n: number;
      try {
        ({ bytesRead: n } = await handle.read(buffer, 0, CHUNK_BYTES, null));
      } catch (err) {
        throw fileError(displayName, err);
      }
      if (n === 0) break;
      const bytes = buffer.subarray(0, n);
      if (done === 0) encoding = encodingOf(bytes);
      // the parser copies what it keeps of a chunk, so the buffer can be reused
      if (encoding === 'utf-8') {
        parser.push(bytes);
      } else {
        // ignoreBOM keeps a BOM in the text, so that the importer can report it (and strips it itself)
        decoder ??= new TextDecoder(encoding, { ignoreBOM: true });
        parser.push(decoder.decode(bytes, { stream: true }));
      }
      done += n;
      onProgress?.(done, size);
    }
    if (decoder) parser.push(decoder.decode());
    const result = parser.finish();
    result.report.bytes = done;
    return result;
  } catch (err) {
    throw err instanceof InputError ? err.withFile(displayName) : err;
  } finally {
    await handle.close();
  }
}
