/**
 * `lagbench analyze <log…>`: find the steps, fit each settling response with honest uncertainties,
 * print a table in the trade's units or, with --json, the analysis JSON (README: "analyze JSON").
 */
import { readFile } from 'node:fs/promises';
import { resolve } from 'node:path';
import { analyzeRecording } from '../../core/analyze/analyze';
import type { AnalyzeOptions } from '../../core/analyze/types';
import { InputError } from '../../core/errors';
import { defaultFitter } from '../../core/analyze/default-fitter';
import type { Recording } from '../../core/recording/types';
import { detectionChannel } from '../../core/steps/detect';
import { parseStepList } from '../../core/steps/step-list';
import { rampsFromProgram, stepsFromProgram } from '../../core/steps/program';
import { chooseSetup, SETUP_QUANTITIES } from '../../core/steps/choose-channel';
import { writeFileAtomic } from '../../io/atomic-write';
import { EXIT, UsageError, type CliIo, type Command } from '../io';
import { VERSION } from '../version';
import { analyzeOptionSpecs, analyzeOptionsFromValues, type AnalyzeCliOptions } from './analyze-args';
import { formatOptionHelp, parseCommandArgs, type OptionSpecs } from '../args';
import { importOptionSpecs, readLogsFromArgs } from '../log-args';
import { renderAnalysisTable } from './analyze-table';
import { addPhysics, type AnalysisWithPhysicsJson } from '../../core/analyze/physics';
import { parseChipDescription } from '../../core/chip/parse';
import type { ChipDescription } from '../../core/chip/types';
import { withPhysicsSection } from './analyze-physics-table';

const specs: OptionSpecs = { ...analyzeOptionSpecs, ...importOptionSpecs };

const HELP = `Usage: lagbench analyze <log…> [options]

Finds the setpoint steps in each log, fits the settling response after every step with 1–3
exponentials and reports τ with its 95 % confidence interval, the final value, whether the
window covers 5 τ (settled), t63/t95/t99 and the fit quality. Several logs of one run (e.g. a
pressure logger and a flow logger) are merged onto one time base first.

Options:
${formatOptionHelp(analyzeOptionSpecs)}

Import options (as for 'lagbench inspect'):
${formatOptionHelp(importOptionSpecs)}

Examples:
  lagbench analyze sample-logs/pressure-controller.csv
  lagbench analyze sample-logs/syringe-pump-semicolon.csv --terms 1 --json --out pump.json
  lagbench analyze sample-logs/hydrostatic-head-spaces.txt --robust huber --dead-time
  lagbench analyze sample-logs/pressure-logger-iso.csv --setup flow-driven --min-dwell 3
  lagbench analyze sample-logs/pressure-logger-iso.csv sample-logs/flow-logger-iso.tsv   (two loggers, merged)
  lagbench analyze pressure-only.csv --steps pump-program.csv   (rows: time_s,flow_setpoint[uL/min])
  lagbench analyze regulator-run.csv --setup pressure-driven --flow-sensor inlet   (sensor between regulator and chip)
  lagbench analyze pump-two-chambers.csv --circuit ladder --json   (two compliant nodes: C1, C2, R_a, R_b)
  lagbench analyze chip-node.csv --circuit ladder --pressure-at chip   (sensor at the chip node: R_b and τ's only)
  lagbench analyze bubble-run.csv --chip chip.json --laplace   (small-bubble surface tension in the air volume)

Exit codes: 0 success, 2 bad input or usage (message names the file, line and column).
`;

async function loadSteps(path: string, io: CliIo, recording: Recording, opts: AnalyzeCliOptions): Promise<Pick<AnalyzeOptions, 'steps' | 'ramps'>> {
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
  return { steps: stepsFromProgram(list.entries, quantity, endS), ramps: rampsFromProgram(list.entries, endS) };
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

async function loadChip(path: string, io: CliIo): Promise<ChipDescription> {
  let text: string;
  try {
    text = await readFile(resolve(io.cwd, path), 'utf8');
  } catch {
    throw new InputError('file-not-found', 'The chip description cannot be read', 'Check the path given to --chip', { file: path });
  }
  return parseChipDescription(text, path);
}

async function analyzeOne(recording: Recording, opts: AnalyzeCliOptions, io: CliIo, chip?: ChipDescription): Promise<AnalysisWithPhysicsJson> {
  checkMinStepKind(recording, opts);
  const program = opts.stepsFile ? await loadSteps(opts.stepsFile, io, recording, opts) : undefined;
  const analysis = analyzeRecording(
    recording,
    {
      setup: opts.setup,
      responseChannel: opts.responseChannel,
      detection: { minStepSize: opts.minStep?.valueSi, minDwellS: opts.minDwellS, channel: opts.detectChannel },
      steps: program?.steps,
      ramps: program?.ramps,
      fit: { terms: opts.terms, deadTime: opts.deadTime, drift: opts.drift, robust: opts.robust },
      maxFitPoints: opts.maxFitPoints,
      sharedFits: opts.shared,
      software: { name: 'lagbench', version: VERSION },
    },
    defaultFitter,
  );
  // The physics stage (src/core/analyze/physics.ts): R, C, node pressure, nominal, trapped air.
  return addPhysics(analysis, recording, {
    chip,
    upstreamResistancePaSPerM3: opts.upstreamResistancePaSPerM3,
    flowSensor: opts.flowSensor,
    circuit: opts.circuit,
    pressureAt: opts.pressureAt,
    laplace: opts.laplace,
  });
}

export const analyzeCommand: Command = {
  name: 'analyze',
  summary: 'find the steps in pressure/flow logs and fit τ with 95 % confidence intervals',
  help: HELP,
  async run(args: string[], io: CliIo): Promise<number> {
    const { values, positionals } = parseCommandArgs(args, specs, 'analyze');
    const opts = analyzeOptionsFromValues(values);
    if (positionals.length === 0) throw new UsageError('give at least one log file.');
    const chip = opts.chipFile ? await loadChip(opts.chipFile, io) : undefined;
    const { recording } = await readLogsFromArgs(positionals, values, io, 'analyze');
    const result = await analyzeOne(recording, opts, io, chip);
    const text = opts.json ? `${JSON.stringify(result, null, 2)}\n` : withPhysicsSection(renderAnalysisTable(result), result);
    if (opts.out) {
      writeFileAtomic(resolve(io.cwd, opts.out), text);
      io.stderr(`lagbench analyze: wrote ${opts.out}\n`);
    } else {
      io.stdout(text);
    }
    return EXIT.ok;
  },
};
