/** Contract of step detection (src/core/steps): shared by analysis, physics and the UI. */
import type { Warning } from '../errors';
import type { Quantity } from '../recording/types';

export interface Step {
  /** 0-based order in the recording. */
  index: number;
  /** Onset time on the recording's time base (s). */
  onsetS: number;
  drive: {
    /** Channel name the step was found on, or null for a user step list. */
    channel: string | null;
    quantity: Quantity;
    /** Drive level before and after the step, SI. */
    before: number;
    after: number;
  };
  direction: 'up' | 'down';
  /** Analysis window on the recording's time base: [onsetS, next onset or end). */
  windowEndS: number;
  /** Where the step came from. */
  origin: 'drive' | 'response' | 'user';
  /**
   * How the level changed (detected steps only): 'abrupt' = within a few samples (a commanded
   * setpoint), 'gradual' = a settling curve (the onset is then the last sample still at the old level).
   */
  shape?: StepShape;
}

export type StepShape = 'abrupt' | 'gradual';

/** How the fluid is driven: a pump imposes the flow, or a regulator imposes the pressure. */
export type Setup = 'flow-driven' | 'pressure-driven';

/**
 * A change of level that is not a step: a (near) linear ramp, e.g. a ramp programme of the
 * pressure controller. Reported so the user sees it, never fitted as a step response.
 */
export interface Ramp {
  /** Start and end on the recording's time base (s). */
  startS: number;
  endS: number;
  /** Level before and after, SI. */
  before: number;
  after: number;
}

/** Everything step detection found, with what it assumed. */
export interface StepDetection {
  steps: Step[];
  ramps: Ramp[];
  /** Channel searched (null for a user step list). */
  channel: string | null;
  quantity: Quantity;
  origin: Step['origin'];
  /** Noise σ of the searched channel, SI (MAD of first differences; 0 for a clean setpoint). */
  noiseSigma: number;
  /** Step size threshold and dwell actually used (defaults resolved). */
  minStepSize: number;
  minDwellS: number;
  warnings: Warning[];
}

export interface StepDetectionOptions {
  /** Smallest |change| of the drive counted as a step, SI; default from the noise (≥ 8 σ). */
  minStepSize?: number;
  /** Shortest time a new level must hold, s; default 10 samples. */
  minDwellS?: number;
  /** Channel to detect on; default: a setpoint channel, else the drive, else the response. */
  channel?: string;
  /** Response channel name when not the setup's default (decides whether steps are found on the response). */
  responseChannel?: string;
  /** Which setup the log comes from; picks the drive channel when several exist. Default: inferred. */
  setup?: Setup;
  /** Width of the running-median spike filter, samples (odd). Default 5 (removes spikes of ≤ 2 samples). */
  spikeWidthSamples?: number;
}
