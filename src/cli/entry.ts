/** Process entry for the bundled CLI: wires real stdout/stderr into runCli and sets the exit code. */
import { runCli } from './main';

const io = {
  stdout: (t: string) => void process.stdout.write(t),
  stderr: (t: string) => void process.stderr.write(t),
  cwd: process.cwd(),
  isTty: Boolean(process.stdout.isTTY),
};

runCli(process.argv.slice(2), io).then(
  (code) => {
    process.exitCode = code;
  },
  (err: unknown) => {
    process.stderr.write(`lagbench: internal error: ${String(err)}\nPlease report this as a bug.\n`);
    process.exitCode = 1;
  },
);
