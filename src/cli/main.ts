/**
 * `lagbench` entry point: dispatches to a subcommand, maps errors to exit codes
 * (0 ok, 2 bad input or usage, 1 internal error) and never prints a stack trace
 * for the user's mistakes.
 */
import { InputError } from '../core/errors';
import { commands } from './commands/index';
import { EXIT, UsageError, type CliIo } from './io';
import { VERSION } from './version';

function topHelp(): string {
  const width = Math.max(...commands.map((c) => c.name.length), 4);
  const list = commands.map((c) => `  ${c.name.padEnd(width)}  ${c.summary}`).join('\n');
  return `lagbench ${VERSION} — how slowly does this microfluidic device settle, and why?

Usage: lagbench <command> [options]

Commands:
${list}

Run 'lagbench <command> --help' for a command's options and examples.
Exit codes: 0 success, 1 internal error, 2 bad input or usage, 3 QC failure, 4 QC inconclusive.
`;
}

/** Runs the CLI with the given arguments (without `node` and script). */
export async function runCli(argv: string[], io: CliIo): Promise<number> {
  const [name, ...rest] = argv;
  if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
    io.stdout(topHelp());
    return name === undefined ? EXIT.badInput : EXIT.ok;
  }
  if (name === '--version' || name === '-V') {
    io.stdout(`${VERSION}\n`);
    return EXIT.ok;
  }
  const command = commands.find((c) => c.name === name);
  if (!command) {
    io.stderr(`lagbench: unknown command '${name}'. Known commands: ${commands.map((c) => c.name).join(', ')}.\n`);
    return EXIT.badInput;
  }
  if (rest.includes('--help') || rest.includes('-h')) {
    io.stdout(command.help.endsWith('\n') ? command.help : `${command.help}\n`);
    return EXIT.ok;
  }
  try {
    return await command.run(rest, io);
  } catch (err) {
    if (err instanceof InputError) {
      io.stderr(`lagbench ${name}: ${err.message}\n`);
      return EXIT.badInput;
    }
    if (err instanceof UsageError) {
      io.stderr(`lagbench ${name}: ${err.message}\nRun 'lagbench ${name} --help' for usage.\n`);
      return EXIT.badInput;
    }
    const detail = err instanceof Error ? (err.stack ?? err.message) : String(err);
    io.stderr(
      `lagbench ${name}: internal error: ${err instanceof Error ? err.message : String(err)}\n` +
        `This is a bug in Lagbench, not in your data. Please report it with the command you ran and this text:\n${detail}\n`,
    );
    return EXIT.internalError;
  }
}
