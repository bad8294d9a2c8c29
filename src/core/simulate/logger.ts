/**
 * simulateLogs: runs the network once per logger at that logger's own (jittered) sample times and
 * turns the true signals into Recordings as a real logger would have written them.
 */
import type { Channel, Quantity, Recording } from '../recording/types';
import { channelBaseName, uniqueNames } from '../recording/channel-names';
import { createRng } from '../stats';
import { applySensor, jitteredTimes, type SensorModel } from './sensor';
import { simulate } from './simulate';
import type { Network, Probe, Program, SimulationResult } from './types';

export interface LoggedChannel {
  quantity: Extract<Quantity, 'pressure' | 'flow' | 'pressure_setpoint' | 'flow_setpoint'>;
  /** What the sensor looks at: a node pressure, resistor flow or source output; or a program channel (setpoints). */
  target: Probe['target'] | { kind: 'setpoint'; channel: string };
  sensor: SensorModel;
  /** Header text to record as the channel's original header (default: the channel name). */
  header?: string;
}

export interface LoggerSpec {
  /** Name of the file this logger writes (Recording.sources). */
  name: string;
  sampleRateHz: number;
  /** Standard deviation of the sampling-time jitter, s. */
  jitterS: number;
  /** How far this logger's clock is ahead of true time, s (two loggers rarely agree). */
  clockOffsetS: number;
  channels: LoggedChannel[];
  /** Resolution of the written timestamps, s (default 1 ms, or 10 µs above 200 Hz): loggers round their clocks. */
  timeResolutionS?: number;
}

export interface SimulateLogsOptions {
  durationS: number;
  seed: number;
  /** True time 0 as Unix epoch ms (UTC). */
  startEpochMs: number;
  initial?: 'steady' | 'rest';
}

export interface SimulatedLog {
  recording: Recording;
  /** The noise-free simulation at this logger's sample times. */
  truth: SimulationResult;
}

/** Seed of the i-th logger's generator, derived from the user's seed (common practice, no source). */
function loggerSeed(seed: number, i: number): number {
  return (Math.imul(seed | 0, 0x2545f491) ^ Math.imul(i + 1, 0x9e3779b9)) | 0;
}

export function simulateLogs(network: Network, program: Program, loggers: LoggerSpec[], options: SimulateLogsOptions): SimulatedLog[] {
  return loggers.map((logger, li) => {
    const rng = createRng(loggerSeed(options.seed, li));
    const timesS = jitteredTimes(logger.sampleRateHz, options.durationS, logger.jitterS, rng);
    const probes: Probe[] = [];
    logger.channels.forEach((c, ci) => {
      if (c.target.kind !== 'setpoint') probes.push({ id: `ch${ci}`, target: c.target, lagS: c.sensor.lagS });
    });
    const truth = simulate(network, program, { timesS, probes, initial: options.initial ?? 'steady' });
    const names = uniqueNames(logger.channels.map((c) => channelBaseName(c.quantity, '')));
    const channels: Channel[] = logger.channels.map((c, ci) => {
      const source = c.target.kind === 'setpoint' ? truth.setpoint[c.target.channel] : truth.probe[`ch${ci}`];
      if (!source) throw new Error(`logger channel ${ci} has no signal`);
      const name = names[ci] as string;
      return {
        name,
        quantity: c.quantity,
        originalHeader: c.header ?? name,
        originalUnit: c.quantity.startsWith('pressure') ? 'Pa' : 'm3/s',
        values: applySensor(source, timesS, c.sensor, rng),
        sourceIndex: 0,
      };
    });
    const t0 = timesS[0] ?? 0;
    const res = logger.timeResolutionS ?? (logger.sampleRateHz > 200 ? 1e-5 : 1e-3);
    // Integer ticks divided by a power of ten give the double nearest the decimal, so the written text is short.
    const ticksPerS = Math.round(1 / res);
    const written = new Float64Array(timesS.length);
    let lastTick = -Infinity;
    for (let k = 0; k < timesS.length; k++) {
      let tick = Math.round(((timesS[k] as number) - t0) * ticksPerS);
      if (!(tick > lastTick)) tick = lastTick + 1;
      lastTick = tick;
      written[k] = tick / ticksPerS;
    }
    const recording: Recording = {
      timeS: written,
      startEpochMs: options.startEpochMs + (t0 + logger.clockOffsetS) * 1000,
      channels,
      metadata: { simulated: 'yes (invented data, Lagbench simulator)', seed: String(options.seed) },
      sources: [logger.name],
      warnings: [],
    };
    return { recording, truth };
  });
}
