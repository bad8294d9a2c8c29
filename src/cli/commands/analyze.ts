/**
 * `lagbench analyze <log…>`: find the steps, fit each settling response with honest uncertainties,
 * print a table in the trade's units or, with --json, the analysis JSON (README: "analyze JSON").
 */
import { readFile } from 'node:fs/promises';
import { resolve } from 'node:path';
import { analyzeRecording } from '../../core/analyze/analyze';
import type { AnalysisJson, AnalyzeOptions } from '../../core/analyze/types';
import { InputError } from '../../core/errors';
import { defaultFitter } from '../../core/analyze/default-fitter';
import type { ImportOptions } from '../../core/import/index';
import type { Recording } from '../../core/recording/types';
import { detectionChannel } from '../../core/steps/detect';
import { parseStepList } from '../../core/steps/step-list';
import { stepsFromProgram } from '../../core/steps/program';
import { chooseSetup, SETUP_QUANTITIES } from '../../core/steps/choose-channel';
import { writeFileAtomic } from '../../io/atomic-write';
import { readLogFile } from '../../io/read-log';
import { EXIT, UsageError, type CliIo, type Command } from '../io';
import { VERSION } from '../version';
import { parseAnalyzeArgs, type AnalyzeCliOptions } from './analyze-args';
import { renderAnalysisTable } from './analyze-table';

const HELP = `Usage: lagbench analyze <log…> [options]

Finds the setpoint steps in each log, fits the settling response after every step with 1–3
exponentials and reports τ with its 95 % confidence interval, the final value, whether the
window covers 5 τ (settled), t63/t95/t99 and the fit quality. Each log is analysed on its own.

Options:
  --setup <name>          flow-driven (a pump imposes the flow; response = pressure) or
                          pressure-driven (a regulator imposes the pressure; response = flow).
                          Default: from the setpoint channel in the log (said in the output)
  --steps <file>          step list instead of detection: CSV 'time_s,flow_setpoint[uL/min]'
                          (or pressure_setpoint[mbar], value[unit]); first row = initial level
  --terms <n>             1, 2, 3 or auto (default: auto, chosen by BIC)
  --dead-time             also fit a dead time before the response starts
  --drift                 also fit a linear drift of the response
  --robust <loss>         huber or tukey: down-weight spikes (default: plain least squares)
  --min-step <value>      smallest drive change counted as a step, with unit: 0.5uL/min, "2 mbar"
                          (default: 8 × the channel's noise σ)
  --min-dwell <s>         shortest time a level must hold, s (default 1 s on a drive channel,
                          5 s when steps are found on the response itself)
  --detect-on <channel>   channel to find the steps on (default: the setpoint, else the drive)
  --response <channel>    channel to fit (default: the setup's response quantity)
  --max-fit-points <n>    block-average windows longer than n samples before fitting
                          (default 5000; 0 = never; τ is unchanged by equal-block averaging)
  --no-shared             skip the shared-τ fits of steps with the same direction and levels
  --json                  print the analysis as JSON (SI units; field list in README.md);
                          one object for one log, an array for several
  --out <file>            write the output to <file> (atomically) instead of the terminal
Examples:
  lagbench analyze sample-logs/mixer-07-pump.csv
  lagbench analyze sample-logs/mixer-07-pump.csv --terms 1 --dead-time --json
  lagbench analyze sample-logs/mixer-03-pressure.csv --setup pressure-driven --robust huber
  lagbench analyze sample-logs/mixer-07-pressure-only.csv --steps sample-logs/mixer-07-program.csv

Exit codes: 0 success, 2 bad input or usage (message names the file, line and column).
`;

async function loadSteps(path: string, io: CliIo, recording: Recording, opts: AnalyzeCliOptions): Promise<AnalyzeOptions['steps']> {
  let text: string;
  try {
    text = await readFile(resolve(io.cwd, path), 'utf8');
  } catch {
    throw new InputError('file-not-found', 'The step list cannot be read', 'Check the path given to --steps', { file: path });
  }
  const list = parseStepList(text, path);
  const setup = chooseSetup(recording, opts.setup).setup;
  const quantity = list.quantity ?? SETUP_QUANTITIES[setup].setpoint;
  const endS = recording.timeS.length > 0 ? (recording.timeS[recording.timeS.length - 1] as number) : 0;
  return stepsFromProgram(list.entries, quantity, endS);
}

/** `--min-step` must be in a unit of the quantity the steps are found on. */
function checkMinStepKind(recording: Recording, opts: AnalyzeCliOptions): void {
  if (!opts.minStep) return;
  const channel = detectionChannel(recording, { setup: opts.setup, channel: opts.detectChannel });
  const kind = channel.quantity.startsWith('flow') ? 'flow' : 'pressure';
  const given = opts.minStep.kind === 'head' ? 'pressure' : opts.minStep.kind;
  if (given !== kind) {
    throw new UsageError(`--min-step ${opts.minStep.text} is a ${given}, but the steps are found on ${channel.name} (${kind}); give a ${kind} unit.`);
  }
}

async function analyzeOne(file: string, opts: AnalyzeCliOptions, importOptions: ImportOptions, io: CliIo): Promise<AnalysisJson> {
  const { recording } = await readLogFile(resolve(io.cwd, file), importOptions, undefined, file);
  checkMinStepKind(recording, opts);
  const steps = opts.stepsFile ? await loadSteps(opts.stepsFile, io, recording, opts) : undefined;
  return analyzeRecording(
    recording,
    {
      setup: opts.setup,
      responseChannel: opts.responseChannel,
      detection: { minStepSize: opts.minStep?.valueSi, minDwellS: opts.minDwellS, channel: opts.detectChannel },
      steps,
      fit: { terms: opts.terms, deadTime: opts.deadTime, drift: opts.drift, robust: opts.robust },
      maxFitPoints: opts.maxFitPoints,
      sharedFits: opts.shared,
      software: { name: 'lagbench', version: VERSION },
    },
    defaultFitter,
  );
}

export const analyzeCommand: Command = {
  name: 'analyze',
  summary: 'find the steps in pressure/flow logs and fit τ with 95 % confidence intervals',
  help: HELP,
  async run(args: string[], io: CliIo): Promise<number> {
    const importOptions: ImportOptions = {};
    const { options: opts, rest: unknown } = parseAnalyzeArgs(args);
    if (unknown.length > 0) throw new UsageError(`unknown option ${unknown[0]}.`);
    if (opts.files.length === 0) throw new UsageError('give at least one log file.');
    const results: AnalysisJson[] = [];
    for (const file of opts.files) results.push(await analyzeOne(file, opts, importOptions, io));
    const text = opts.json
      ? `${JSON.stringify(results.length === 1 ? results[0] : results, null, 2)}\n`
      : results.map(renderAnalysisTable).join('\n');
    if (opts.out) {
      writeFileAtomic(resolve(io.cwd, opts.out), text);
      io.stderr(`lagbench analyze: wrote ${opts.out}\n`);
    } else {
      io.stdout(text);
    }
    return EXIT.ok;
  },
};
