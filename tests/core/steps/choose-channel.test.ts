/**
 * Setup and channel choice. The pairing of drive and response per setup is physics.md §4.2 (a pump
 * imposes Q, the pressure responds; the outlet flow follows with the same τ) and §4.3 (a pressure
 * source; the flow and the node pressure respond with τ = C·R1·R2/(R1+R2)).
 */
import { describe, expect, it } from 'vitest';
import { chooseSetup, driveChannel, responseChannel } from '../../../src/core/steps/choose-channel';
import type { Quantity, Recording } from '../../../src/core/recording/types';

function recordingWith(...quantities: Quantity[]): Recording {
  return {
    timeS: new Float64Array(0),
    startEpochMs: null,
    channels: quantities.map((quantity, i) => ({
      name: `${quantity}_${i}`,
      quantity,
      originalHeader: quantity,
      originalUnit: '',
      values: new Float64Array(0),
      sourceIndex: 0,
    })),
    metadata: {},
    sources: ['x'],
    warnings: [],
  };
}

describe('chooseSetup', () => {
  it('chooseSetup(log) follows the setpoint channel, a liquid head, or the only measured quantity', () => {
    expect(chooseSetup(recordingWith('flow_setpoint', 'pressure'))).toMatchObject({ setup: 'flow-driven', assumed: false });
    expect(chooseSetup(recordingWith('pressure_setpoint', 'flow'))).toMatchObject({ setup: 'pressure-driven', assumed: false });
    expect(chooseSetup(recordingWith('hydrostatic_head', 'flow'))).toMatchObject({ setup: 'pressure-driven', assumed: false });
    expect(chooseSetup(recordingWith('pressure'))).toMatchObject({ setup: 'flow-driven', assumed: true });
    expect(chooseSetup(recordingWith('flow'))).toMatchObject({ setup: 'pressure-driven', assumed: true });
    expect(chooseSetup(recordingWith('pressure', 'flow'))).toMatchObject({ setup: 'pressure-driven', assumed: true });
    expect(chooseSetup(recordingWith('pressure'), 'pressure-driven')).toEqual({ setup: 'pressure-driven', reason: 'given', assumed: false });
  });
});

describe('responseChannel / driveChannel', () => {
  it('responseChannel(flow-driven) is the pressure; driveChannel is the flow setpoint, else the measured flow', () => {
    const r = recordingWith('flow_setpoint', 'flow', 'pressure');
    expect(responseChannel(r, 'flow-driven')?.name).toBe('pressure_2');
    expect(driveChannel(r, 'flow-driven', responseChannel(r, 'flow-driven'))?.name).toBe('flow_setpoint_0');
    const noSetpoint = recordingWith('flow', 'pressure');
    expect(driveChannel(noSetpoint, 'flow-driven', responseChannel(noSetpoint, 'flow-driven'))?.name).toBe('flow_0');
  });

  it('responseChannel(setpoint but no response quantity) falls back to the measured drive quantity (§4.2 outlet flow)', () => {
    const pump = recordingWith('flow_setpoint', 'flow');
    expect(responseChannel(pump, 'flow-driven')?.name).toBe('flow_1');
    const controller = recordingWith('pressure_setpoint', 'pressure');
    expect(responseChannel(controller, 'pressure-driven')?.name).toBe('pressure_1');
    // Without a setpoint nothing says the measured drive is a response.
    expect(responseChannel(recordingWith('flow'), 'flow-driven')).toBeUndefined();
  });

  it('driveChannel(pressure-driven, liquid head) takes the head as the pressure drive', () => {
    const r = recordingWith('hydrostatic_head', 'flow');
    expect(driveChannel(r, 'pressure-driven', responseChannel(r, 'pressure-driven'))?.name).toBe('hydrostatic_head_0');
  });
});
