/**
 * simulateScenario: a chip description + set-up + program → simulated logs as real loggers would
 * write them, and the truth to compare an analysis against. The sensor settings default to levels
 * relative to the signal span (common practice, no source; the numbers are invented for demo logs).
 */
import type { ChipDescription } from '../chip/types';
import { InputError } from '../errors';
import type { Setup } from '../nominal/types';
import { buildNetwork, IDS, type BuildOptions, type BuiltNetwork } from './build-network';
import { simulateLogs, type LoggedChannel, type LoggerSpec, type SimulatedLog } from './logger';
import { programEndS } from './program-csv';
import { IDEAL_SENSOR, type SensorModel } from './sensor';
import { simulate } from './simulate';
import { nodeComplianceAt, timeConstantsAt } from './truth';
import type { Network, Program } from './types';

export type NoiseLevel = 'none' | 'low' | 'typical' | 'high';

/** Sensor imperfections per noise level, as fractions of the signal span (invented, common practice). */
const LEVELS: Record<NoiseLevel, { noise: number; quantum: number; spikeP: number; spike: number; offset: number; drift: number; jitter: number; lagS: number }> = {
  none: { noise: 0, quantum: 0, spikeP: 0, spike: 0, offset: 0, drift: 0, jitter: 0, lagS: 0 },
  low: { noise: 0.001, quantum: 1e-4, spikeP: 0, spike: 0, offset: 0.001, drift: 0, jitter: 0.005, lagS: 0 },
  typical: { noise: 0.003, quantum: 2e-4, spikeP: 5e-4, spike: 0.03, offset: 0.002, drift: 0, jitter: 0.02, lagS: 0.005 },
  high: { noise: 0.01, quantum: 1e-3, spikeP: 2e-3, spike: 0.1, offset: 0.005, drift: 2e-6, jitter: 0.05, lagS: 0.02 },
};

export interface ScenarioOptions {
  setup: Setup;
  seed: number;
  sampleRateHz: number;
  /** Default: end of the program + 6 slowest time constants (at least 10 s more). */
  durationS?: number;
  noise?: NoiseLevel;
  /** Overrides of the pressure / flow noise σ (SI). */
  pressureNoisePa?: number;
  flowNoiseM3PerS?: number;
  /** Sensor first-order lag, s (overrides the level's). */
  sensorLagS?: number;
  /** Sampling-time jitter σ, s (overrides the level's, which is a fraction of the sample period). */
  jitterS?: number;
  build?: BuildOptions;
  /** Which flow the flow sensor sees (default outlet; 'none' for no flow sensor). */
  flowSensor?: 'outlet' | 'inlet' | 'none';
  /** Log the node pressure (default true). */
  pressureSensor?: boolean;
  /** Log the flow on a second logger with its own rate and clock. */
  separateFlowLogger?: { sampleRateHz: number; clockOffsetS: number };
  /** File names of the log(s), for Recording.sources and the truth. */
  fileNames?: [string] | [string, string];
  /** True time 0 as Unix epoch ms. Default 2026-03-02T09:00:00Z (a fixed date keeps outputs reproducible). */
  startEpochMs?: number;
}

export interface StepTruth {
  onset_s: number;
  ramp_s: number;
  drive_before: number;
  drive_after: number;
  node_pressure_before_Pa: number;
  node_pressure_after_Pa: number;
  outlet_flow_before_m3_per_s: number;
  outlet_flow_after_m3_per_s: number;
  /** Small-signal time constants at the mean node pressure of the step, s (descending). */
  tau_s: number[];
  /** Compliance of all nodes at the mean node pressures of the step, m³/Pa. */
  compliance_m3_per_Pa: number;
  /**
   * With trapped gas the compliance changes during the step: its values at the pressures before and
   * after, sorted, m³/Pa (equal when the network is linear). A one-exponential fit lands in between.
   */
  compliance_range_m3_per_Pa: [number, number];
  /** Slowest small-signal τ at the pressures before and after, sorted, s. */
  tau_range_s: [number, number];
  /** What Δ(drive)/Δ(response) identifies: R_down (flow-driven) or R_up + R_down (pressure-driven), Pa·s/m³. */
  resistance_identified_Pa_s_per_m3: number;
}

export interface ScenarioTruth {
  format: 'lagbench-sim-truth/1';
  note: string;
  chip: { file: string; name: string };
  setup: Setup;
  seed: number;
  /** Node the logged pressure is read at: 'node' (one node) or, with two nodes, 'inlet' (pump side) or 'chip'. */
  pressure_at: 'node' | 'inlet' | 'chip';
  ambient_pressure_Pa: number;
  operating_pressure_Pa: number;
  resistance_Pa_s_per_m3: { upstream: number; downstream: number; total: number; thevenin: number };
  compliance_m3_per_Pa: {
    linear: number;
    gas_at_operating_pressure: number;
    total_at_operating_pressure: number;
    breakdown: Array<{ element: string; source: string; compliance_m3_per_Pa: number; counted: boolean }>;
  };
  trapped_air: { volume_m3_at_atm: number; volume_m3_at_operating_pressure: number };
  tau_s: number[];
  t95_s: number;
  source_lag_s: number;
  outlet_height_m: number;
  steps: StepTruth[];
  program: Program;
  network: Network;
  loggers: Array<{ file: string; sample_rate_Hz: number; jitter_s: number; clock_offset_s: number; start_epoch_ms: number; channels: Array<{ name: string; quantity: string; looks_at: string; sensor: SensorModel }> }>;
}

export interface ScenarioResult {
  logs: SimulatedLog[];
  truth: ScenarioTruth;
  built: BuiltNetwork;
  durationS: number;
}

const sorted = (a: number, b: number): [number, number] => (a <= b ? [a, b] : [b, a]);

const DEFAULT_START_MS = Date.UTC(2026, 2, 2, 9, 0, 0);

/** Steady pressures (every node, and the sensed node as p) and outlet flow at a constant drive. */
function steadyAt(net: Network, drive: string, quantity: 'flow' | 'pressure', value: number, sensedNodeId: string): { p: number; q: number; all: Record<string, number> } {
  const res = simulate(net, { channels: [{ name: drive, quantity, points: [{ timeS: 0, valueSI: value, rampS: 0 }] }] }, { timesS: Float64Array.of(0) });
  const all: Record<string, number> = {};
  for (const [id, v] of Object.entries(res.nodePressurePa)) all[id] = v[0] as number;
  return { p: all[sensedNodeId] as number, q: (res.resistorFlowM3PerS[IDS.downstream] as Float64Array)[0] as number, all };
}

/** Sum of the node compliances at the given node pressures, m³/Pa. */
function totalCompliance(net: Network, pressures: Record<string, number>): number {
  return net.nodes.reduce((sum, n) => sum + nodeComplianceAt(net, n.id, pressures[n.id] ?? 0), 0);
}

const meanOf = (a: Record<string, number>, b: Record<string, number>): Record<string, number> =>
  Object.fromEntries(Object.keys(a).map((k) => [k, ((a[k] as number) + (b[k] as number)) / 2]));

function sensorFor(level: NoiseLevel, span: number, noiseOverride: number | undefined, lagS: number | undefined): SensorModel {
  const l = LEVELS[level];
  const s = span > 0 ? span : 1;
  return {
    lagS: lagS ?? l.lagS,
    noiseSigma: noiseOverride ?? l.noise * s,
    offsetSI: l.offset * s,
    driftPerS: l.drift * s,
    spikeProbability: l.spikeP,
    spikeSizeSI: l.spike * s,
    fullScaleSI: level === 'none' ? null : 2 * s,
    quantumSI: l.quantum * s,
  };
}

export function simulateScenario(chip: ChipDescription, program: Program, options: ScenarioOptions): ScenarioResult {
  const built = buildNetwork(chip, options.setup, options.build ?? {});
  const net = built.network;
  const drive = program.channels.find((c) => c.name === built.drive);
  if (!drive) {
    throw new InputError('program-drive', `a ${options.setup} set-up needs a '${built.drive}' column in the program`, `write the program with a ${built.drive}[${built.drive === 'flow' ? 'uL/min' : 'mbar'}] column`);
  }
  const level = options.noise ?? 'typical';
  const nominal = built.nominal;
  const pOp = nominal.operatingPressurePa;

  // Spans and per-step truth from the steady states at each drive level.
  const levels = drive.points.map((p) => p.valueSI);
  const steady = levels.map((v) => steadyAt(net, built.drive, drive.quantity, v, built.sensedNodeId));
  const pSpan = Math.max(...steady.map((s) => Math.abs(s.p)));
  const qSpan = Math.max(...steady.map((s) => Math.abs(s.q)), ...(options.setup === 'flow-driven' ? levels.map(Math.abs) : []));
  const rUp = nominal.resistance.upstreamPaSPerM3.nominal;
  const rDown = nominal.resistance.downstreamPaSPerM3.nominal;
  const steps: StepTruth[] = drive.points.slice(1).map((pt, k) => {
    const before = steady[k] as ReturnType<typeof steadyAt>;
    const after = steady[k + 1] as ReturnType<typeof steadyAt>;
    const mean = meanOf(before.all, after.all);
    return {
      onset_s: pt.timeS,
      ramp_s: pt.rampS,
      drive_before: levels[k] as number,
      drive_after: pt.valueSI,
      node_pressure_before_Pa: before.p,
      node_pressure_after_Pa: after.p,
      outlet_flow_before_m3_per_s: before.q,
      outlet_flow_after_m3_per_s: after.q,
      tau_s: timeConstantsAt(net, [built.drive], mean),
      compliance_m3_per_Pa: totalCompliance(net, mean),
      compliance_range_m3_per_Pa: sorted(totalCompliance(net, before.all), totalCompliance(net, after.all)),
      tau_range_s: sorted(timeConstantsAt(net, [built.drive], before.all)[0] ?? 0, timeConstantsAt(net, [built.drive], after.all)[0] ?? 0),
      // Flow-driven: Δp∞/ΔQ at the sensed node is the resistance downstream of it (R_up + R_down from the inlet node).
      resistance_identified_Pa_s_per_m3: options.setup === 'flow-driven' ? (built.sensedNodeId === IDS.inlet ? rUp + rDown : rDown) : rUp + rDown,
    };
  });
  const tauOp = timeConstantsAt(net, [built.drive], Object.fromEntries(net.nodes.map((n) => [n.id, pOp])));
  const slowest = Math.max(...tauOp.filter(Number.isFinite), ...steps.flatMap((s) => s.tau_s.filter(Number.isFinite)));
  const durationS = options.durationS ?? programEndS(program) + Math.max(10, 6 * slowest);

  const pressureSensor = sensorFor(level, pSpan, options.pressureNoisePa, options.sensorLagS);
  const flowSensor = sensorFor(level, qSpan, options.flowNoiseM3PerS, options.sensorLagS);
  const flowWhere = options.flowSensor ?? 'outlet';
  const pressureCh: LoggedChannel[] = options.pressureSensor === false ? [] : [{ quantity: 'pressure', target: built.pressureTarget, sensor: pressureSensor }];
  const flowCh: LoggedChannel[] = flowWhere === 'none' ? [] : [{ quantity: 'flow', target: flowWhere === 'outlet' ? built.flowTarget : built.inletFlowTarget, sensor: flowSensor }];
  const setpointCh: LoggedChannel = { quantity: built.drive === 'flow' ? 'flow_setpoint' : 'pressure_setpoint', target: { kind: 'setpoint', channel: built.drive }, sensor: IDEAL_SENSOR };
  const names = options.fileNames ?? ['simulated.csv', 'simulated-flow.csv'];
  const jitter = (rate: number): number => options.jitterS ?? LEVELS[level].jitter / rate;
  const loggers: LoggerSpec[] = [];
  if (options.separateFlowLogger && flowCh.length > 0) {
    loggers.push({ name: names[0], sampleRateHz: options.sampleRateHz, jitterS: jitter(options.sampleRateHz), clockOffsetS: 0, channels: [...pressureCh, setpointCh] });
    const r2 = options.separateFlowLogger.sampleRateHz;
    loggers.push({ name: names[1] ?? 'simulated-flow.csv', sampleRateHz: r2, jitterS: jitter(r2), clockOffsetS: options.separateFlowLogger.clockOffsetS, channels: flowCh });
  } else {
    loggers.push({ name: names[0], sampleRateHz: options.sampleRateHz, jitterS: jitter(options.sampleRateHz), clockOffsetS: 0, channels: [...pressureCh, ...flowCh, setpointCh] });
  }
  const startEpochMs = options.startEpochMs ?? DEFAULT_START_MS;
  const logs = simulateLogs(net, program, loggers, { durationS, seed: options.seed, startEpochMs });

  const pAbs = nominal.nodeAbsolutePressurePa;
  const gasOp = (built.gasVolumeAtAtmM3 * nominal.ambientPressurePa) / (pAbs * pAbs);
  const truth: ScenarioTruth = {
    format: 'lagbench-sim-truth/1',
    note: 'Invented data from the Lagbench simulator (demo scenario: a small lab priming a batch of PDMS mixer chips). Not a real measurement.',
    chip: { file: chip.fileName, name: chip.name },
    setup: options.setup,
    seed: options.seed,
    pressure_at: net.nodes.length < 2 ? 'node' : built.sensedNodeId === IDS.inlet ? 'inlet' : 'chip',
    ambient_pressure_Pa: nominal.ambientPressurePa,
    operating_pressure_Pa: pOp,
    resistance_Pa_s_per_m3: { upstream: rUp, downstream: rDown, total: nominal.resistance.totalPaSPerM3.nominal, thevenin: nominal.resistance.theveninPaSPerM3.nominal },
    compliance_m3_per_Pa: {
      linear: built.linearComplianceM3PerPa,
      gas_at_operating_pressure: gasOp,
      total_at_operating_pressure: built.linearComplianceM3PerPa + gasOp,
      breakdown: nominal.compliance.breakdown.map((c) => ({ element: c.element, source: c.source, compliance_m3_per_Pa: c.complianceM3PerPa.nominal, counted: c.counted })),
    },
    trapped_air: { volume_m3_at_atm: built.gasVolumeAtAtmM3, volume_m3_at_operating_pressure: (built.gasVolumeAtAtmM3 * nominal.ambientPressurePa) / pAbs },
    tau_s: tauOp,
    t95_s: (tauOp[0] ?? 0) * Math.log(20),
    source_lag_s: options.build?.sourceLagS ?? 0,
    outlet_height_m: options.build?.outletHeightM ?? 0,
    steps,
    program,
    network: net,
    loggers: loggers.map((l, i) => ({
      file: l.name,
      sample_rate_Hz: l.sampleRateHz,
      jitter_s: l.jitterS,
      clock_offset_s: l.clockOffsetS,
      start_epoch_ms: (logs[i] as SimulatedLog).recording.startEpochMs ?? 0,
      channels: l.channels.map((c, k) => ({
        name: (logs[i] as SimulatedLog).recording.channels[k]?.name ?? '',
        quantity: c.quantity,
        looks_at: c.target.kind === 'setpoint' ? `setpoint ${c.target.channel}` : `${c.target.kind} ${c.target.id}`,
        sensor: c.sensor,
      })),
    })),
  };
  return { logs, truth, built, durationS };
}
