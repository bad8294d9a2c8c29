/**
 * The recording: what every importer produces and every analysis consumes.
 * SI inside: time in s, pressure in Pa (gauge), flow in m³/s.
 */
import type { Warning } from '../errors';

/** What a channel measures or commands. */
export type Quantity =
  | 'pressure'
  | 'flow'
  | 'pressure_setpoint'
  | 'flow_setpoint'
  | 'hydrostatic_head'
  | 'other';

/** SI unit of each quantity as written in exports and JSON (`pressure_Pa`). */
export const SI_UNIT_OF: Readonly<Record<Quantity, string>> = {
  pressure: 'Pa',
  flow: 'm3_per_s',
  pressure_setpoint: 'Pa',
  flow_setpoint: 'm3_per_s',
  hydrostatic_head: 'Pa',
  other: '1',
};

/** One measured or commanded signal on the recording's time base. */
export interface Channel {
  /** Stable name unique in the recording, e.g. `pressure_Pa`, `flow_m3_per_s_2`. */
  name: string;
  quantity: Quantity;
  /** The header text exactly as found in the file (after trimming). */
  originalHeader: string;
  /** The unit as written in the file (`mbar`, `µL/min`), or '' when none. */
  originalUnit: string;
  /** Values in SI (Pa gauge, m³/s); NaN where a sample is missing. */
  values: Float64Array;
  /** Which input file it came from (index into Recording.sources). */
  sourceIndex: number;
  /**
   * The channel's own samples, present when `values` were interpolated from a slower log onto the
   * recording's time base (merge). `timeS` is on the recording's axis. Interpolated samples are not
   * independent measurements, so fits use these instead, or their error bars would be too narrow.
   */
  native?: { timeS: Float64Array; values: Float64Array };
}

/** A whole imported run on one time base. */
export interface Recording {
  /** Seconds from the first sample, strictly increasing. */
  timeS: Float64Array;
  /** Absolute time of timeS = 0 as Unix epoch milliseconds (UTC), when known. */
  startEpochMs: number | null;
  channels: Channel[];
  /** `key: value` pairs found before the header, per source, merged (first wins). */
  metadata: Record<string, string>;
  /** Names of the files (or streams) this recording came from. */
  sources: string[];
  warnings: Warning[];
}
