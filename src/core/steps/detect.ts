/**
 * `detectSteps`: steps of a recording, found on the drive channel (a setpoint, else the measured
 * pump flow / supply pressure) or, when the log holds only the response, on the response itself.
 * See level-changes.ts for the method.
 */
import { InputError } from '../errors';
import type { Channel, Recording } from '../recording/types';
import { chooseSetup, driveChannel, responseChannel } from './choose-channel';
import { findLevelChanges } from './level-changes';
import type { Step, StepDetection, StepDetectionOptions } from './types';

/**
 * Default dwell when none is given, s: 1 s on a drive channel, 5 s on a response (a settling
 * response needs a wider detector window than a commanded edge). Common practice, no source.
 */
export const DEFAULT_DWELL_S = { drive: 1, response: 5 } as const;

/**
 * The channel steps are searched on: `options.channel`, else the setup's drive channel (setpoint,
 * else measured drive), else its response. Throws InputError for an unknown name or no channels.
 */
export function detectionChannel(recording: Recording, options: Pick<StepDetectionOptions, 'channel' | 'setup' | 'responseChannel'> = {}): Channel {
  const setup = chooseSetup(recording, options.setup).setup;
  const response = responseChannel(recording, setup, options.responseChannel);
  let channel = options.channel !== undefined ? recording.channels.find((c) => c.name === options.channel) : undefined;
  if (options.channel !== undefined && !channel) {
    throw new InputError(
      'unknown-channel',
      `There is no channel '${options.channel}' to detect steps on`,
      `Use one of: ${recording.channels.map((c) => c.name).join(', ') || '(none)'}`,
    );
  }
  channel ??= driveChannel(recording, setup, response) ?? response ?? recording.channels[0];
  if (!channel) {
    throw new InputError('no-channels', 'The recording has no channels to detect steps on', 'Check the log header');
  }
  return channel;
}

/**
 * Finds the steps of `recording`. Throws InputError when `options.channel` names no channel.
 * Windows run from each onset to the next step or ramp, or to the end of the recording.
 */
export function detectSteps(recording: Recording, options: StepDetectionOptions = {}): StepDetection {
  const setup = chooseSetup(recording, options.setup).setup;
  const response = responseChannel(recording, setup, options.responseChannel);
  const channel = detectionChannel(recording, options);
  const origin: Step['origin'] = channel === response ? 'response' : 'drive';
  const found = findLevelChanges(recording.timeS, channel.values, {
    minStepSize: options.minStepSize,
    minDwellS: options.minDwellS,
    spikeWidthSamples: options.spikeWidthSamples,
    defaultDwellS: origin === 'drive' ? DEFAULT_DWELL_S.drive : DEFAULT_DWELL_S.response,
  });
  const endS = recording.timeS.length > 0 ? (recording.timeS[recording.timeS.length - 1] as number) : 0;
  const eventStarts = [...found.steps.map((s) => s.onsetS), ...found.ramps.map((r) => r.startS)].sort((a, b) => a - b);
  const steps: Step[] = found.steps.map((s, index) => ({
    index,
    onsetS: s.onsetS,
    drive: { channel: channel.name, quantity: channel.quantity, before: s.before, after: s.after },
    direction: s.after > s.before ? 'up' : 'down',
    windowEndS: eventStarts.find((e) => e > s.onsetS) ?? endS,
    origin,
    shape: s.shape,
  }));
  return {
    steps,
    ramps: found.ramps,
    channel: channel.name,
    quantity: channel.quantity,
    origin,
    noiseSigma: found.noiseSigma,
    minStepSize: found.minStepSize,
    minDwellS: found.minDwellS,
    warnings: found.warnings,
  };
}
