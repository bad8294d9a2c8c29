/**
 * `lagbench simulate <chip.json> --program <file> --out <log>`: a realistic log of the chip in a
 * set-up, driven by a step program, in any dialect the importer reads, plus `<log>.truth.json`
 * with the true R, C, τ's and trapped air. Thin: the work is in src/core/simulate.
 */
import { readFile } from 'node:fs/promises';
import { basename, resolve } from 'node:path';
import { parseChipDescription } from '../../core/chip/parse';
import { parseQuantity } from '../../core/chip/quantity';
import { InputError } from '../../core/errors';
import { writeLog } from '../../core/logformat';
import { SETUPS, type Setup } from '../../core/nominal/types';
import { PRESSURE_SAFETY_CAUTION } from '../../core/safety';
import { SIM_DIALECTS, SIM_DIALECT_NAMES } from '../../core/simulate/dialects';
import { parseProgramCsv } from '../../core/simulate/program-csv';
import { simulateScenario, type NoiseLevel, type ScenarioOptions } from '../../core/simulate/scenario';
import { formatNumber, fromSi, TRADE_UNITS } from '../../core/units/display';
import { factorToSi, lookupUnit } from '../../core/units';
import { writeFileAtomic } from '../../io/atomic-write';
import { booleanOption, formatOptionHelp, numberOption, parseCommandArgs, stringOption, type OptionSpecs } from '../args';
import { UsageError, type CliIo, type Command } from '../io';

const NOISE: NoiseLevel[] = ['none', 'low', 'typical', 'high'];

const specs: OptionSpecs = {
  program: { type: 'string', short: 'p', valueName: '<file.csv>', description: 'step program: time_s,<flow|pressure>[unit][,ramp_s] rows (required)' },
  out: { type: 'string', short: 'o', valueName: '<log>', description: 'log to write (required; written atomically); the truth goes to <log>.truth.json' },
  setup: { type: 'string', valueName: '<name>', description: 'flow-driven (default; the program needs a flow column) or pressure-driven (a pressure column)' },
  dialect: { type: 'string', valueName: '<name>', description: `log layout: ${SIM_DIALECT_NAMES.join(', ')} (default bench-csv)` },
  seed: { type: 'string', valueName: '<n>', description: 'random seed for noise, jitter and spikes (default 1; same seed → same bytes)' },
  'sample-rate': { type: 'string', valueName: '<Hz>', description: 'logger sample rate (default 10)' },
  duration: { type: 'string', valueName: '<s>', description: 'length of the log (default: program end + 6 slowest τ, at least 10 s more)' },
  noise: { type: 'string', valueName: '<level>', description: 'sensor imperfections: none, low, typical (default), high' },
  'pressure-noise': { type: 'string', valueName: '<p>', description: 'pressure noise σ, e.g. "0.2 mbar" (bare number: Pa)' },
  'flow-noise': { type: 'string', valueName: '<q>', description: 'flow noise σ, e.g. "0.01 uL/min" (bare number: m³/s)' },
  jitter: { type: 'string', valueName: '<s>', description: 'σ of the sampling-time jitter, s (default: from --noise, 0.5–5 % of the sample period)' },
  'sensor-lag': { type: 'string', valueName: '<s>', description: 'first-order lag of the sensors, s' },
  'source-lag': { type: 'string', valueName: '<s>', description: 'first-order lag of the pump or regulator, s (default 0)' },
  bubble: { type: 'string', valueName: '<volume>', description: 'extra trapped air at the compliant node, volume at 1 atm, e.g. "2 uL"' },
  'outlet-height': { type: 'string', valueName: '<h>', description: 'outlet liquid surface above the node, e.g. "10 cm" (hydrostatic back-pressure)' },
  nodes: { type: 'string', valueName: '<n>', description: 'one (default: all compliance at one node) or two (upstream and chip compliance apart: a ladder)' },
  'pressure-at': { type: 'string', valueName: '<node>', description: 'with --nodes two: the node the pressure sensor reads, inlet (default: the pump-side node, what analyze --circuit ladder needs) or chip' },
  'flow-sensor': { type: 'string', valueName: '<where>', description: 'outlet (default), inlet or none' },
  'flow-out': { type: 'string', valueName: '<log>', description: 'write the flow on a second logger to this file (own rate and clock)' },
  'flow-rate': { type: 'string', valueName: '<Hz>', description: 'sample rate of the second logger (default: half of --sample-rate)' },
  'clock-offset': { type: 'string', valueName: '<s>', description: 'how far the second logger’s clock runs ahead (default 0)' },
  json: { type: 'boolean', description: 'print the truth as JSON instead of a summary' },
};

const help = `lagbench simulate <chip.json> --program <file.csv> --out <log> [options]

Simulates the chip of <chip.json> in a flow-driven or pressure-driven set-up (lumped network with the
nominal R and C, trapped air as a pressure-dependent gas compliance), driven by a step program, and writes
what a logger would have recorded — sample jitter, noise, quantisation, spikes, clipping — in one of the log
layouts the importer reads. Beside it, <log>.truth.json holds the true R, C (by source), τ's, trapped air and
program, so that 'lagbench analyze' on the log can be checked against the truth. Simulated logs are
invented data: say so wherever you use them.

Program file (CSV): the first row at time 0 sets the starting level; later rows step (or ramp over ramp_s):
  time_s,flow[uL/min],ramp_s
  0,0
  10,5
  70,10,2

Two nodes (--nodes two): the upstream compliance (syringe, tubing) sits at the pump-side inlet node and the
chip's at the chip node (a ladder, docs/setups.md §4). The pressure is logged at the inlet node unless
--pressure-at chip; truth.json records it as "pressure_at". 'analyze --circuit ladder' needs the inlet
(node-1) pressure: from the chip-node pressure the ladder elements cannot all be identified.

Options:
${formatOptionHelp(specs)}

Examples:
  lagbench simulate sample-logs/chips/pdms-mixer.json --program sample-logs/programs/flow-steps.csv --out sim.csv
  lagbench simulate sample-logs/chips/pdms-mixer.json --program sample-logs/programs/flow-steps.csv --out bubble.csv --bubble "3 uL" --seed 7
  lagbench simulate sample-logs/chips/glass-chip-pressure.json --setup pressure-driven --program sample-logs/programs/pressure-steps.csv --out p.tsv --dialect iso-tab
`;

function quantityOption(text: string | undefined, dim: 'pressure' | 'length' | 'volume', option: string): number | undefined {
  if (text === undefined) return undefined;
  const q = parseQuantity(text, dim);
  if ('error' in q) throw new UsageError(`--${option}: ${q.error}`, 'simulate');
  return q.value;
}

function flowOption(text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  const m = /^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*)$/.exec(text);
  const unitText = (m?.[2] ?? '').trim();
  const found = unitText === '' ? null : lookupUnit(unitText);
  if (!m || (unitText !== '' && found?.kind !== 'flow')) throw new UsageError(`--flow-noise: '${text}' is not a flow such as "0.01 uL/min"`, 'simulate');
  return Number(m[1]) * (found ? factorToSi(found) : 1);
}

async function readText(io: CliIo, file: string, what: string): Promise<string> {
  try {
    return await readFile(resolve(io.cwd, file), 'utf8');
  } catch (e) {
    throw new InputError('unreadable-file', `cannot read the ${what}: ${(e as Error).message}`, 'check the path', { file });
  }
}

export const simulateCommand: Command = {
  name: 'simulate',
  summary: 'write a realistic simulated log (and its truth) from a chip description and a step program',
  help,
  async run(args, io) {
    const { values, positionals } = parseCommandArgs(args, specs, 'simulate');
    if (positionals.length !== 1) throw new UsageError(positionals.length === 0 ? 'missing the chip description file' : `expected one chip description, got ${positionals.length}`, 'simulate');
    const chipFile = positionals[0] as string;
    const programFile = stringOption(values, 'program');
    const outArg = stringOption(values, 'out');
    if (!programFile) throw new UsageError('--program <file.csv> is required', 'simulate');
    if (!outArg) throw new UsageError('--out <log> is required', 'simulate');
    const setup = (stringOption(values, 'setup') ?? 'flow-driven') as Setup;
    if (!SETUPS.includes(setup)) throw new UsageError(`unknown --setup '${setup}'; use ${SETUPS.join(' or ')}`, 'simulate');
    const dialectName = stringOption(values, 'dialect') ?? 'bench-csv';
    const dialect = SIM_DIALECTS[dialectName];
    if (!dialect) throw new UsageError(`unknown --dialect '${dialectName}'; use ${SIM_DIALECT_NAMES.join(', ')}`, 'simulate');
    const noise = (stringOption(values, 'noise') ?? 'typical') as NoiseLevel;
    if (!NOISE.includes(noise)) throw new UsageError(`unknown --noise '${noise}'; use ${NOISE.join(', ')}`, 'simulate');
    const nodes = stringOption(values, 'nodes') ?? 'one';
    if (nodes !== 'one' && nodes !== 'two') throw new UsageError(`unknown --nodes '${nodes}'; use one or two`, 'simulate');
    const pressureAt = stringOption(values, 'pressure-at') ?? 'inlet';
    if (pressureAt !== 'inlet' && pressureAt !== 'chip') throw new UsageError(`unknown --pressure-at '${pressureAt}'; use inlet or chip`, 'simulate');
    if (nodes === 'one' && stringOption(values, 'pressure-at') !== undefined) throw new UsageError('--pressure-at needs --nodes two (one node has only one pressure)', 'simulate');
    const flowSensor = stringOption(values, 'flow-sensor') ?? 'outlet';
    if (flowSensor !== 'outlet' && flowSensor !== 'inlet' && flowSensor !== 'none') throw new UsageError(`unknown --flow-sensor '${flowSensor}'; use outlet, inlet or none`, 'simulate');
    const seed = numberOption(values, 'seed') ?? 1;
    if (!Number.isInteger(seed)) throw new UsageError('--seed must be a whole number', 'simulate');
    const rate = numberOption(values, 'sample-rate', { min: 0, exclusiveMin: true, max: 100_000 }) ?? 10;
    const flowOut = stringOption(values, 'flow-out');
    const out = resolve(io.cwd, outArg);
    for (const input of [chipFile, programFile]) {
      if (resolve(io.cwd, input) === out || (flowOut && resolve(io.cwd, input) === resolve(io.cwd, flowOut))) {
        throw new UsageError(`the output would overwrite the input ${input}; choose another file name`, 'simulate');
      }
    }

    const chip = parseChipDescription(await readText(io, chipFile, 'chip description'), chipFile);
    const program = parseProgramCsv(await readText(io, programFile, 'program'), programFile);
    const duration = numberOption(values, 'duration', { min: 0, exclusiveMin: true });
    const pressureNoise = quantityOption(stringOption(values, 'pressure-noise'), 'pressure', 'pressure-noise');
    const flowNoise = flowOption(stringOption(values, 'flow-noise'));
    const sensorLag = numberOption(values, 'sensor-lag', { min: 0 });
    const jitter = numberOption(values, 'jitter', { min: 0 });
    const sourceLag = numberOption(values, 'source-lag', { min: 0 });
    const bubble = quantityOption(stringOption(values, 'bubble'), 'volume', 'bubble');
    const outletHeight = quantityOption(stringOption(values, 'outlet-height'), 'length', 'outlet-height');
    const options: ScenarioOptions = {
      setup,
      seed,
      sampleRateHz: rate,
      noise,
      flowSensor,
      fileNames: flowOut ? [basename(outArg), basename(flowOut)] : [basename(outArg)],
      build: {
        nodes,
        pressureAt,
        ...(sourceLag !== undefined ? { sourceLagS: sourceLag } : {}),
        ...(bubble !== undefined ? { extraGasAtAtmM3: bubble } : {}),
        ...(outletHeight !== undefined ? { outletHeightM: outletHeight } : {}),
      },
      ...(duration !== undefined ? { durationS: duration } : {}),
      ...(pressureNoise !== undefined ? { pressureNoisePa: pressureNoise } : {}),
      ...(flowNoise !== undefined ? { flowNoiseM3PerS: flowNoise } : {}),
      ...(sensorLag !== undefined ? { sensorLagS: sensorLag } : {}),
      ...(jitter !== undefined ? { jitterS: jitter } : {}),
      ...(flowOut
        ? { separateFlowLogger: { sampleRateHz: numberOption(values, 'flow-rate', { min: 0, exclusiveMin: true }) ?? rate / 2, clockOffsetS: numberOption(values, 'clock-offset') ?? 0 } }
        : {}),
    };
    const result = simulateScenario(chip, program, options);
    const outputs = flowOut && result.logs.length > 1 ? [outArg, flowOut] : [outArg];
    outputs.forEach((file, i) => {
      const log = result.logs[i];
      if (log) writeFileAtomic(resolve(io.cwd, file), writeLog(log.recording, dialect.dialect));
    });
    const truthFile = `${outArg}.truth.json`;
    writeFileAtomic(resolve(io.cwd, truthFile), `${JSON.stringify(result.truth, null, 2)}\n`);
    if (booleanOption(values, 'json')) {
      io.stdout(`${JSON.stringify(result.truth, null, 2)}\n`);
      return 0;
    }
    const t = result.truth;
    const u = TRADE_UNITS;
    const f = (v: number, unit: typeof u.pressure): string => `${formatNumber(fromSi(v, unit), 4)} ${unit.symbol}`;
    const lines = [
      ...outputs.map((file, i) => `wrote ${file}: ${result.logs[i]?.recording.timeS.length ?? 0} rows, ${formatNumber(result.durationS, 4)} s, dialect ${dialectName}`),
      `wrote ${truthFile}`,
      `Simulated (invented data): ${chip.name}, ${setup}, seed ${seed}`,
      `True R: upstream ${f(t.resistance_Pa_s_per_m3.upstream, u.resistance)}, chip + downstream ${f(t.resistance_Pa_s_per_m3.downstream, u.resistance)}, total ${f(t.resistance_Pa_s_per_m3.total, u.resistance)}`,
      `True C at ${f(t.operating_pressure_Pa, u.pressure)} gauge: ${f(t.compliance_m3_per_Pa.total_at_operating_pressure, u.compliance)} (gas ${f(t.compliance_m3_per_Pa.gas_at_operating_pressure, u.compliance)})`,
      `Trapped air: ${formatNumber(t.trapped_air.volume_m3_at_atm * 1e9, 4)} µL at 1 atm`,
      `Time constants at the operating pressure: ${t.tau_s.map((x) => `${formatNumber(x, 4)} s`).join(', ')}; t95 ≈ ${formatNumber(t.t95_s, 4)} s`,
      ...(t.pressure_at === 'node' ? [] : [`Pressure logged at the ${t.pressure_at} node (${t.pressure_at === 'inlet' ? 'pump side: node 1 of the ladder' : 'chip side: node 2 of the ladder'})`]),
      `Steps: ${t.steps.length}; sensed pressure up to ${f(Math.max(0, ...t.steps.map((s) => Math.max(s.node_pressure_after_Pa, s.node_pressure_before_Pa))), u.pressure)}`,
      '',
      PRESSURE_SAFETY_CAUTION,
    ];
    io.stdout(`${lines.join('\n')}\n`);
    return 0;
  },
};
