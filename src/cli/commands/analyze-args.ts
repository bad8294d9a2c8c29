/**
 * Options of `lagbench analyze` besides the importer's (src/cli/import-options.ts): their specs for
 * parseCommandArgs and their translation into checked values. Every mistake is a UsageError (exit 2).
 */
import { parseResistance } from '../../core/circuits/parse-resistance';
import type { RobustLoss } from '../../core/fit/types';
import type { Setup } from '../../core/steps/types';
import { factorToSi, knownUnitsSentence, lookupUnit, type UnitKind } from '../../core/units/index';
import { booleanOption, numberOption, stringOption, type OptionSpecs, type OptionValues } from '../args';
import { UsageError } from '../io';

export interface AnalyzeCliOptions {
  setup?: Setup;
  stepsFile?: string;
  terms: 1 | 2 | 3 | 'auto';
  deadTime: boolean;
  drift: boolean;
  robust: RobustLoss;
  /** Smallest step, SI, and the kind of quantity its unit belongs to. */
  minStep?: { valueSi: number; kind: UnitKind; text: string };
  minDwellS?: number;
  detectChannel?: string;
  responseChannel?: string;
  maxFitPoints?: number;
  shared: boolean;
  json: boolean;
  out?: string;
  /** Chip description file (physics: nominal R and C, R_up, trapped air). */
  chipFile?: string;
  /** Upstream resistance R_up, Pa·s/m³ (pressure-driven C with an outlet sensor). */
  upstreamResistancePaSPerM3?: number;
  /** Pressure-driven: where the flow sensor sits (auto = from the response shape). */
  flowSensor: 'inlet' | 'outlet' | 'auto';
  /** One compliant node, or a two-node ladder (2-term fits read as C1, C2, R_a, R_b). */
  circuit: 'single' | 'ladder';
  /** Ladder: the node the pressure was sensed at (inlet = pump-side node 1, default; chip = node 2). */
  pressureAt: 'inlet' | 'chip';
  /** Include the Laplace pressure of small bubbles in the air volume from excess compliance. */
  laplace: boolean;
}

export const analyzeOptionSpecs: OptionSpecs = {
  setup: {
    type: 'string',
    valueName: '<name>',
    description: 'flow-driven (pump imposes Q; response = pressure) or pressure-driven (regulator imposes p; response = flow); default: from the setpoint channel',
  },
  steps: { type: 'string', valueName: '<file>', description: "step list instead of detection: CSV 'time_s,flow_setpoint[uL/min]' (first row = initial level)" },
  terms: { type: 'string', valueName: '<n>', description: '1, 2, 3 or auto (default auto: chosen by BIC)' },
  'dead-time': { type: 'boolean', description: 'also fit a dead time before the response starts' },
  drift: { type: 'boolean', description: 'also fit a linear drift of the response' },
  robust: { type: 'string', valueName: '<loss>', description: 'huber or tukey: down-weight spikes (default: plain least squares)' },
  'min-step': { type: 'string', valueName: '<value>', description: 'smallest drive change counted as a step, with unit: 0.5uL/min, "2 mbar" (default 8 × noise σ)' },
  'min-dwell': { type: 'string', valueName: '<s>', description: 'shortest time a level must hold, s (default 1 s on a drive channel, 5 s on the response)' },
  'detect-on': { type: 'string', valueName: '<channel>', description: 'channel to find the steps on (default: the setpoint, else the drive, else the response)' },
  response: { type: 'string', valueName: '<channel>', description: "channel to fit (default: the setup's response quantity)" },
  'max-fit-points': { type: 'string', valueName: '<n>', description: 'block-average longer windows to n points before fitting (default 5000; 0 = never)' },
  'no-shared': { type: 'boolean', description: 'skip the shared-τ fits of steps with the same direction and levels' },
  chip: { type: 'string', valueName: '<chip.json>', description: 'chip description: nominal R and C beside the measured ones, trapped air from excess C' },
  'upstream-resistance': {
    type: 'string',
    valueName: '<value>',
    description: 'R_up between a pressure source and the compliant node (bare number: Pa·s/m³; or "2 mbar/(uL/min)")',
  },
  'flow-sensor': {
    type: 'string',
    valueName: '<side>',
    description: 'pressure-driven: where the flow sensor sits, inlet (jumps, then decays) or outlet (rises); default auto (from the response shape, outlet when it cannot tell)',
  },
  circuit: {
    type: 'string',
    valueName: '<kind>',
    description: 'single (one compliant node, default) or ladder (two compliant nodes: flow-driven steps fitted with 2 terms give C1, C2, R_a, R_b; --terms defaults to 2)',
  },
  'pressure-at': {
    type: 'string',
    valueName: '<node>',
    description:
      'with --circuit ladder: where the pressure was sensed, inlet (default: the pump-side node 1; gives C1, C2, R_a, R_b) or chip (node 2: only R_b and the τ\'s are identifiable, C is not reported; docs/setups.md §4)',
  },
  laplace: {
    type: 'boolean',
    description: "with --chip: include the surface-tension (Laplace) pressure of a small spherical bubble in the trapped-air volume from excess compliance (the fluid's σ)",
  },
  json: { type: 'boolean', description: 'print the analysis as JSON (SI units; fields in README.md)' },
  out: { type: 'string', valueName: '<file>', description: 'write the output to <file> (atomically) instead of the terminal' },
};

/** Parses `--min-step` text such as `0.5uL/min`, `2 mbar` or `50Pa` to SI. */
export function parseValueWithUnit(text: string, flag: string): { valueSi: number; kind: UnitKind } {
  const m = /^\s*([+]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*?)\s*$/.exec(text);
  if (!m || (m[2] ?? '') === '') {
    throw new UsageError(`${flag} needs a number with a unit, e.g. ${flag} 0.5uL/min or ${flag} "2 mbar" (got '${text}').`);
  }
  const found = lookupUnit(m[2] as string);
  if (!found || found.kind === 'time') throw new UsageError(`${flag}: unknown unit '${m[2]}'. ${knownUnitsSentence()}.`);
  return { valueSi: Number(m[1]) * factorToSi(found), kind: found.kind };
}

/** Checked analyze options from the values parseCommandArgs returned. */
export function analyzeOptionsFromValues(values: OptionValues): AnalyzeCliOptions {
  const o: AnalyzeCliOptions = {
    terms: 'auto',
    deadTime: booleanOption(values, 'dead-time'),
    drift: booleanOption(values, 'drift'),
    robust: 'none',
    shared: !booleanOption(values, 'no-shared'),
    json: booleanOption(values, 'json'),
    flowSensor: 'auto',
    circuit: 'single',
    pressureAt: 'inlet',
    laplace: booleanOption(values, 'laplace'),
  };
  const flowSensor = stringOption(values, 'flow-sensor');
  if (flowSensor !== undefined) {
    if (flowSensor !== 'inlet' && flowSensor !== 'outlet' && flowSensor !== 'auto') throw new UsageError(`--flow-sensor must be inlet, outlet or auto (got '${flowSensor}').`);
    o.flowSensor = flowSensor;
  }
  const circuit = stringOption(values, 'circuit');
  if (circuit !== undefined) {
    if (circuit !== 'single' && circuit !== 'ladder') throw new UsageError(`--circuit must be single or ladder (got '${circuit}').`);
    o.circuit = circuit;
    // A ladder has two time constants: fit two terms unless the user chose the order.
    if (circuit === 'ladder' && stringOption(values, 'terms') === undefined) o.terms = 2;
  }
  const pressureAt = stringOption(values, 'pressure-at');
  if (pressureAt !== undefined) {
    if (pressureAt !== 'inlet' && pressureAt !== 'chip') throw new UsageError(`--pressure-at must be inlet or chip (got '${pressureAt}').`);
    if (o.circuit !== 'ladder') throw new UsageError('--pressure-at applies to --circuit ladder only (one node has only one pressure).');
    o.pressureAt = pressureAt;
  }
  const setup = stringOption(values, 'setup');
  if (setup !== undefined) {
    if (setup !== 'flow-driven' && setup !== 'pressure-driven') throw new UsageError(`--setup must be flow-driven or pressure-driven (got '${setup}').`);
    o.setup = setup;
  }
  o.stepsFile = stringOption(values, 'steps');
  const terms = stringOption(values, 'terms');
  if (terms !== undefined) {
    if (terms === 'auto') o.terms = 'auto';
    else if (terms === '1' || terms === '2' || terms === '3') o.terms = Number(terms) as 1 | 2 | 3;
    else throw new UsageError(`--terms must be 1, 2, 3 or auto (got '${terms}').`);
  }
  const robust = stringOption(values, 'robust');
  if (robust !== undefined) {
    if (robust !== 'huber' && robust !== 'tukey' && robust !== 'none') throw new UsageError(`--robust must be huber or tukey (got '${robust}').`);
    o.robust = robust;
  }
  const minStep = stringOption(values, 'min-step');
  if (minStep !== undefined) o.minStep = { ...parseValueWithUnit(minStep, '--min-step'), text: minStep };
  o.minDwellS = numberOption(values, 'min-dwell', { min: 0, exclusiveMin: true });
  o.detectChannel = stringOption(values, 'detect-on');
  o.responseChannel = stringOption(values, 'response');
  const maxPoints = numberOption(values, 'max-fit-points', { min: 0 });
  if (maxPoints !== undefined) {
    if (!Number.isInteger(maxPoints) || (maxPoints > 0 && maxPoints < 100)) {
      throw new UsageError(`--max-fit-points must be 0 (no averaging) or an integer ≥ 100 (got '${maxPoints}').`);
    }
    o.maxFitPoints = maxPoints;
  }
  o.out = stringOption(values, 'out');
  o.chipFile = stringOption(values, 'chip');
  const rUp = stringOption(values, 'upstream-resistance');
  if (rUp !== undefined) o.upstreamResistancePaSPerM3 = parseResistance(rUp);
  return o;
}
