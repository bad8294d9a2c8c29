/**
 * What a real sensor and logger do to a true signal, so simulated logs look like measured ones:
 * sampling with timing jitter, a first-order lag (done exactly in the network as a probe state),
 * offset and drift, Gaussian noise, occasional spikes, clipping at full scale and quantisation.
 * Everything random comes from a seeded generator: the same seed gives the same log, bit for bit.
 * The model is common practice for sensor data sheets (no single source); values are the user's.
 */
import { InputError } from '../errors';
import type { Rng } from '../stats';

/** Most samples one simulated logger may write (memory: a few hundred MB at this size). */
export const MAX_SAMPLES = 5_000_000;

export interface SensorModel {
  /** First-order time constant of the sensor, s (0 = none). */
  lagS: number;
  /** Standard deviation of white Gaussian noise, SI. */
  noiseSigma: number;
  /** Constant offset added to the reading, SI. */
  offsetSI: number;
  /** Linear drift of the reading, SI per s (from t = 0). */
  driftPerS: number;
  /** Probability that a sample is a spike. */
  spikeProbability: number;
  /** Typical spike height, SI (each spike is ±(0.5–1.5)× this). */
  spikeSizeSI: number;
  /** Readings are clipped to [−fullScale, +fullScale], SI; null = no clipping. */
  fullScaleSI: number | null;
  /** Resolution: readings are rounded to a multiple of this, SI (0 = none). */
  quantumSI: number;
}

export const IDEAL_SENSOR: SensorModel = {
  lagS: 0,
  noiseSigma: 0,
  offsetSI: 0,
  driftPerS: 0,
  spikeProbability: 0,
  spikeSizeSI: 0,
  fullScaleSI: null,
  quantumSI: 0,
};

/** Sample times of a logger: k/rate plus Gaussian jitter (σ = jitterS), clipped to ±0.45/rate so time stays increasing. */
export function jitteredTimes(rateHz: number, durationS: number, jitterS: number, rng: Rng): Float64Array {
  if (!(rateHz > 0 && Number.isFinite(rateHz))) throw new InputError('bad-sample-rate', `sample rate must be a positive number of Hz, got ${rateHz}`, 'e.g. 10');
  if (!(durationS > 0 && Number.isFinite(durationS))) throw new InputError('bad-duration', `duration must be a positive number of seconds, got ${durationS}`, 'e.g. 120');
  const n = Math.floor(durationS * rateHz + 1e-9) + 1;
  if (n > MAX_SAMPLES) throw new InputError('too-many-samples', `${n} samples per logger requested (${rateHz} Hz for ${durationS} s)`, `stay below ${MAX_SAMPLES}: lower the sample rate or the duration`);
  const t = new Float64Array(n);
  const cap = 0.45 / rateHz;
  for (let k = 0; k < n; k++) {
    const j = jitterS > 0 && k > 0 ? Math.max(-cap, Math.min(cap, jitterS * rng.normal())) : 0;
    // Jitter on a 1 µs grid: far below any sample period here, and it lets the exact solver reuse
    // its propagators (a few hundred distinct intervals instead of one per sample).
    t[k] = k / rateHz + Math.round(j * 1e6) / 1e6;
  }
  return t;
}

/** Applies offset, drift, noise, spikes, clipping and quantisation (in that order) to lagged true values. */
export function applySensor(trueValues: Float64Array, timeS: Float64Array, model: SensorModel, rng: Rng): Float64Array {
  const out = new Float64Array(trueValues.length);
  for (let k = 0; k < out.length; k++) {
    let v = (trueValues[k] as number) + model.offsetSI + model.driftPerS * (timeS[k] as number);
    if (model.noiseSigma > 0) v += model.noiseSigma * rng.normal();
    if (model.spikeProbability > 0 && rng.uniform() < model.spikeProbability) {
      const sign = rng.uniform() < 0.5 ? -1 : 1;
      v += sign * model.spikeSizeSI * (0.5 + rng.uniform());
    }
    if (model.fullScaleSI !== null) v = Math.max(-model.fullScaleSI, Math.min(model.fullScaleSI, v));
    if (model.quantumSI > 0) v = Math.round(v / model.quantumSI) * model.quantumSI;
    out[k] = v;
  }
  return out;
}
