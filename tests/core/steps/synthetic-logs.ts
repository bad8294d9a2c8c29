/**
 * Seeded synthetic logs for step-detection and analysis tests. The response of a first-order
 * circuit to a piecewise-constant drive is the closed form of physics.md §4.1/§4.2:
 * between programme changes, y(t) = y∞ + (y(tₖ) − y∞)·exp(−(t − tₖ)/τ), with y∞ = gain·drive.
 * The data are invented (demo scenario: priming PDMS mixer chips).
 */
import type { Channel, Quantity, Recording } from '../../../src/core/recording/types';

/** mulberry32 (Tommy Ettinger, public domain; from memory): a small seeded uniform generator. */
export function seededUniform(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Standard normal draws by Box–Muller (Box & Muller, Ann. Math. Stat. 29 (1958) 610). */
export function seededNormal(seed: number): () => number {
  const u = seededUniform(seed);
  return () => {
    const u1 = Math.max(u(), 1e-300);
    return Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u());
  };
}

export interface ProgramEntry {
  timeS: number;
  value: number;
}

export interface SyntheticLogSpec {
  sampleRateHz: number;
  durationS: number;
  /** Drive programme: value from timeS on (first entry at 0 = initial level). */
  program: ProgramEntry[];
  /** Linear ramps of the drive instead of steps: from→to over [startS, endS]. */
  ramps?: { startS: number; endS: number; from: number; to: number }[];
  driveQuantity: Quantity;
  responseQuantity: Quantity;
  /** Response = gain · drive at steady state (e.g. R for flow-driven: p = Q·R). */
  gain: number;
  tauS: number;
  /** A second, equal-or-different lag in series (an S-shaped start, physics.md §4.4); none when absent. */
  secondTauS?: number;
  /** Noise σ of the response and of the measured drive, SI. */
  responseNoise: number;
  driveNoise?: number;
  /** Response drift, SI per s. */
  responseDriftPerS?: number;
  /** Fraction of samples replaced by single-sample spikes of ±spikeSize. */
  spikeFraction?: number;
  spikeSize?: number;
  /** Include the drive channel (false: response only). */
  includeDrive?: boolean;
  seed: number;
}

function driveAt(spec: SyntheticLogSpec, t: number): number {
  for (const r of spec.ramps ?? []) {
    if (t >= r.startS && t <= r.endS) return r.from + ((r.to - r.from) * (t - r.startS)) / (r.endS - r.startS);
  }
  let v = spec.program[0]?.value ?? 0;
  for (const p of spec.program) if (p.timeS <= t) v = p.value;
  for (const r of spec.ramps ?? []) if (t > r.endS && !spec.program.some((p) => p.timeS > r.endS && p.timeS <= t)) v = r.to;
  return v;
}

/** Builds the recording: drive channel (clean setpoint unless driveNoise) and first-order response. */
export function syntheticLog(spec: SyntheticLogSpec): Recording {
  const n = Math.round(spec.durationS * spec.sampleRateHz);
  const dt = 1 / spec.sampleRateHz;
  const timeS = new Float64Array(n);
  const drive = new Float64Array(n);
  const response = new Float64Array(n);
  const noise = seededNormal(spec.seed);
  const spikes = seededUniform(spec.seed + 1);
  let y = spec.gain * driveAt(spec, 0);
  let y2 = y;
  const decay = Math.exp(-dt / spec.tauS);
  const decay2 = spec.secondTauS ? Math.exp(-dt / spec.secondTauS) : 0;
  for (let i = 0; i < n; i++) {
    const t = i * dt;
    timeS[i] = t;
    const d = driveAt(spec, t);
    if (i > 0) {
      // Exact discretisation of dy/dt = (gain·d − y)/τ with d held over the sample interval (§4.1 closed form).
      const yPrev = y;
      y = spec.gain * d + (y - spec.gain * d) * decay;
      // Second lag driven by the first one's output (held over the interval: first-order-hold accuracy is not needed here).
      if (spec.secondTauS) y2 = yPrev + (y2 - yPrev) * decay2;
    }
    drive[i] = d + (spec.driveNoise ? spec.driveNoise * noise() : 0);
    let r = (spec.secondTauS ? y2 : y) + spec.responseNoise * noise() + (spec.responseDriftPerS ?? 0) * t;
    if (spec.spikeFraction && spikes() < spec.spikeFraction) r += (spikes() < 0.5 ? -1 : 1) * (spec.spikeSize ?? 0);
    response[i] = r;
  }
  const channel = (name: string, quantity: Quantity, values: Float64Array): Channel => ({
    name,
    quantity,
    originalHeader: name,
    originalUnit: '',
    values,
    sourceIndex: 0,
  });
  const channels: Channel[] = [];
  if (spec.includeDrive !== false) channels.push(channel(`${spec.driveQuantity}_si`, spec.driveQuantity, drive));
  channels.push(channel(`${spec.responseQuantity}_si`, spec.responseQuantity, response));
  return { timeS, startEpochMs: null, channels, metadata: {}, sources: ['synthetic'], warnings: [] };
}

/** 1 µL/min in m³/s (physics.md §5, exact). */
export const UL_PER_MIN = 1e-9 / 60;
/** 1 mbar in Pa (physics.md §5, exact). */
export const MBAR = 100;
