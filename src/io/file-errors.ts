/** Node file-system errors turned into the located, actionable InputErrors the user sees. */
import { InputError } from '../core/errors';

/** The InputError for a failed open/stat/read of `path` (ENOENT, EISDIR, EACCES, …). */
export function fileError(path: string, err: unknown): InputError {
  const code = (err as NodeJS.ErrnoException | undefined)?.code;
  if (code === 'ENOENT') return new InputError('file-not-found', 'The file does not exist', 'Check the path and the spelling of the file name', { file: path });
  if (code === 'EISDIR') return new InputError('is-a-directory', 'This is a folder, not a log file', 'Give the path of a log file inside it', { file: path });
  if (code === 'EACCES' || code === 'EPERM') return new InputError('file-unreadable', 'The file cannot be read (permission denied)', 'Check the file\'s permissions, or copy it somewhere you can read', { file: path });
  return new InputError('file-unreadable', `The file cannot be read (${code ?? String(err)})`, 'Check that the file is accessible and not locked by another program', { file: path });
}
