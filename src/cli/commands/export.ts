/** `lagbench export <log…> --out <file.csv>`: the recording as CSV in SI units, written atomically. */
import { resolve } from 'node:path';
import { formatSiCsv } from '../../core/logformat/si-csv';
import { PRESSURE_SAFETY_CAUTION } from '../../core/safety';
import { writeFileAtomic } from '../../io/atomic-write';
import { formatOptionHelp, parseCommandArgs, stringOption, type OptionSpecs } from '../args';
import { UsageError, type Command } from '../io';
import { importOptionSpecs, readLogsFromArgs } from '../log-args';

const specs: OptionSpecs = {
  out: { type: 'string', short: 'o', valueName: '<file.csv>', description: 'output CSV (required; written atomically, never one of the inputs)' },
  ...importOptionSpecs,
};

const help = `lagbench export <log…> --out <file.csv> [options]

Writes the recording as CSV in SI units: header 'time_s' (seconds from the first sample), then one column per
channel named <quantity>_<SI unit> — pressure_Pa, flow_m3_per_s, pressure_setpoint_Pa, flow_setpoint_m3_per_s,
hydrostatic_head_Pa (suffix _2, _3 for repeats) — at full precision (the shortest text that reads back to the
same number); missing samples are empty. A '# start:' line gives the absolute start time when known.
Two logs of one run are merged onto the time base of the faster one (linear interpolation, NaN outside a
log's span), aligned by their absolute timestamps or by --offset.

Options:
${formatOptionHelp(specs)}

Examples:
  lagbench export sample-logs/pressure-controller.csv --out pressure-si.csv
  lagbench export sample-logs/pressure-logger-iso.csv sample-logs/flow-logger-iso.tsv --out merged.csv
  lagbench export pump.csv sensor.csv --offset 2.5 --out merged.csv
`;

export const exportCommand: Command = {
  name: 'export',
  summary: 'write a log (or two merged logs) as CSV in SI units',
  help,
  async run(args, io) {
    const { values, positionals } = parseCommandArgs(args, specs, 'export');
    const outArg = stringOption(values, 'out');
    if (outArg === undefined) throw new UsageError('--out <file.csv> is required', 'export');
    const out = resolve(io.cwd, outArg);
    if (positionals.some((p) => resolve(io.cwd, p) === out)) {
      throw new UsageError(`--out ${outArg} is one of the input logs; inputs are never overwritten. Choose another file name`, 'export');
    }
    const { recording } = await readLogsFromArgs(positionals, values, io, 'export');
    writeFileAtomic(out, formatSiCsv(recording));
    io.stdout(`wrote ${outArg}: ${recording.timeS.length} rows; columns time_s, ${recording.channels.map((c) => c.name).join(', ')}\n`);
    if (recording.warnings.length) io.stdout(`warnings:\n${recording.warnings.map((w) => `  - ${w.message}`).join('\n')}\n`);
    if (recording.channels.some((c) => c.quantity !== 'flow' && c.quantity !== 'flow_setpoint' && c.quantity !== 'other')) io.stdout(`${PRESSURE_SAFETY_CAUTION}\n`);
    return 0;
  },
};
