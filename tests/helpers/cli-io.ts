import type { CliIo } from '../../src/cli/io';

/** A CliIo that records what a command prints, for in-process CLI tests. */
export function captureIo(cwd = process.cwd()): CliIo & { out: string[]; err: string[]; stdoutText: () => string; stderrText: () => string } {
  const out: string[] = [];
  const err: string[] = [];
  return {
    out,
    err,
    cwd,
    isTty: false,
    stdout: (t) => void out.push(t),
    stderr: (t) => void err.push(t),
    stdoutText: () => out.join(''),
    stderrText: () => err.join(''),
  };
}
