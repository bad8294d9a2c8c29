/** SHA-256 of files and texts (FIPS 180-4), lowercase hex — used to trace QC records to their inputs. */
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';

export function sha256Hex(data: string | Uint8Array): string {
  return createHash('sha256').update(data).digest('hex');
}

/** SHA-256 of a file's bytes (the file is read, never modified). */
export function sha256File(path: string): string {
  return sha256Hex(readFileSync(path));
}
