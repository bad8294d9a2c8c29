/**
 * Chip IDs from file names or log metadata.
 * `filename:<regex>`: the first capture group (or the whole match) of the regex on the file's base name.
 * `metadata:<key>`: the value of a `key: value` line before the log's header (key matched case-insensitively).
 * No source: the file name without its extension.
 */
import { InputError } from '../errors';
import { checkChipIdSource } from './spec';

/** The base name without folders and without the last extension. */
export function fileStem(path: string): string {
  const base = path.split(/[\\/]/).pop() ?? path;
  const dot = base.lastIndexOf('.');
  return dot > 0 ? base.slice(0, dot) : base;
}

export function chipIdFor(source: string | null, path: string, metadata: Record<string, string>): string {
  const base = path.split(/[\\/]/).pop() ?? path;
  if (source === null) return fileStem(path);
  const problem = checkChipIdSource(source);
  if (problem) throw new InputError('bad-chip-id-source', `The chip-ID source "${source}" ${problem}`, 'Write filename:<regular expression with one (group)> or metadata:<key>');
  if (source.startsWith('metadata:')) {
    const key = source.slice('metadata:'.length).trim().toLowerCase();
    const hit = Object.entries(metadata).find(([k]) => k.trim().toLowerCase() === key);
    const value = hit?.[1].trim();
    if (!value) {
      throw new InputError('chip-id-missing', `The log has no metadata line "${key}: …" to take the chip ID from`, `Add "${key}: <chip ID>" above the header, or use --chip-id-from filename:<pattern>`, { file: path });
    }
    return value;
  }
  const m = new RegExp(source.slice('filename:'.length)).exec(base);
  const id = m ? (m[1] ?? m[0]) : '';
  if (!id) {
    throw new InputError('chip-id-missing', `The file name "${base}" does not match the chip-ID pattern ${source.slice('filename:'.length)}`, 'Rename the file or give another --chip-id-from pattern', { file: path });
  }
  return id;
}
