/** Contract of step detection (src/core/steps): shared by analysis, physics and the UI. */
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
}

export interface StepDetectionOptions {
  /** Smallest |change| of the drive counted as a step, SI; default from the noise (≥ 8 σ). */
  minStepSize?: number;
  /** Shortest time a new level must hold, s; default 10 samples. */
  minDwellS?: number;
  /** Channel to detect on; default: a setpoint channel, else the drive, else the response. */
  channel?: string;
}
