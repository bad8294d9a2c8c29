/**
 * Which channel is the drive (what the instrument imposes) and which the response (what the
 * device answers), per setup:
 * - flow-driven: a pump imposes the flow Q; the response is the pressure;
 * - pressure-driven: a regulator imposes the pressure p; the response is the flow.
 */
import type { Channel, Quantity, Recording } from '../recording/types';
import type { Setup } from './types';

/** Quantity of the drive setpoint, the measured drives and the response for each setup. */
export const SETUP_QUANTITIES: Readonly<Record<Setup, { setpoint: Quantity; drive: readonly Quantity[]; response: Quantity }>> = {
  'flow-driven': { setpoint: 'flow_setpoint', drive: ['flow'], response: 'pressure' },
  // A liquid head (reservoir height) is a pressure source too (p = ρ·g·h, converted at import).
  'pressure-driven': { setpoint: 'pressure_setpoint', drive: ['pressure', 'hydrostatic_head'], response: 'flow' },
};

export interface SetupChoice {
  setup: Setup;
  /** Why this setup: 'given', or a sentence about what in the log decided it. */
  reason: string;
  /** True when nothing in the log decided it (a guess the user should confirm). */
  assumed: boolean;
}

const firstOf = (recording: Recording, quantity: Quantity): Channel | undefined =>
  recording.channels.find((c) => c.quantity === quantity);

/**
 * The setup: given, or inferred from the setpoint channel present (flow_setpoint → flow-driven,
 * pressure_setpoint → pressure-driven), a liquid-head channel (pressure-driven), or the only measured
 * quantity (pressure alone is the response of a pump; flow alone the response of a regulator). With
 * both measured and no setpoint, pressure-driven is assumed (pressure controllers usually log the
 * flow sensor too; common practice, no source) and flagged as assumed.
 */
export function chooseSetup(recording: Recording, given?: Setup): SetupChoice {
  if (given) return { setup: given, reason: 'given', assumed: false };
  const has = (q: Quantity): boolean => firstOf(recording, q) !== undefined;
  if (has('flow_setpoint') && !has('pressure_setpoint')) {
    return { setup: 'flow-driven', reason: 'the log has a flow setpoint channel', assumed: false };
  }
  if (has('pressure_setpoint') && !has('flow_setpoint')) {
    return { setup: 'pressure-driven', reason: 'the log has a pressure setpoint channel', assumed: false };
  }
  if (has('pressure_setpoint') && has('flow_setpoint')) {
    return { setup: 'pressure-driven', reason: 'the log has both setpoint channels; assumed pressure-driven', assumed: true };
  }
  if (has('hydrostatic_head')) {
    return { setup: 'pressure-driven', reason: 'the log has a liquid-head channel (a hydrostatic pressure source)', assumed: false };
  }
  if (has('pressure') && !has('flow')) {
    return { setup: 'flow-driven', reason: 'the log has only a pressure channel (the response to a pump)', assumed: true };
  }
  if (has('flow') && !has('pressure')) {
    return { setup: 'pressure-driven', reason: 'the log has only a flow channel (the response to a regulator)', assumed: true };
  }
  return { setup: 'pressure-driven', reason: 'the log has pressure and flow but no setpoint; assumed pressure-driven', assumed: true };
}

/**
 * The response channel of a setup: `name` when given; else the first channel of the setup's response
 * quantity; else, when the log has the setpoint, the measured drive quantity — its settling towards the
 * setpoint has the same τ (physics.md §4.2: the outlet flow after a pump step, Q_out = Q0·(1 − e^{−t/RC});
 * §4.3: the node pressure after a regulator step). Undefined when none exists.
 */
export function responseChannel(recording: Recording, setup: Setup, name?: string): Channel | undefined {
  if (name !== undefined) return recording.channels.find((c) => c.name === name);
  const q = SETUP_QUANTITIES[setup];
  const primary = firstOf(recording, q.response);
  if (primary) return primary;
  if (!firstOf(recording, q.setpoint)) return undefined;
  return recording.channels.find((c) => q.drive.includes(c.quantity) && c.quantity !== 'hydrostatic_head');
}

/**
 * The drive channel of a setup: its setpoint channel, else a measured drive quantity that is not the
 * response (e.g. the supply pressure or liquid head next to a flow response), else undefined (detect on the response).
 */
export function driveChannel(recording: Recording, setup: Setup, response: Channel | undefined): Channel | undefined {
  const q = SETUP_QUANTITIES[setup];
  const setpoint = firstOf(recording, q.setpoint);
  if (setpoint) return setpoint;
  return recording.channels.find((c) => q.drive.includes(c.quantity) && c !== response);
}
