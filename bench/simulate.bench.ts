/**
 * Simulator throughput: samples per second of `simulateScenario` on the bundled PDMS mixer chip,
 * exact solver (linear) and Rosenbrock integrator (3 µL trapped air), with and without sampling jitter.
 */
import { readFileSync } from 'node:fs';
import { parseChipDescription } from '../src/core/chip/parse';
import { parseProgramCsv } from '../src/core/simulate/program-csv';
import { simulateScenario } from '../src/core/simulate/scenario';

export default function bench(): void {
  const chip = parseChipDescription(readFileSync('sample-logs/chips/pdms-mixer.json', 'utf8'), 'pdms-mixer.json');
  const program = parseProgramCsv(readFileSync('sample-logs/programs/flow-steps.csv', 'utf8'), 'flow-steps.csv');
  console.log('simulate: 1 kHz logger, 300 s, PDMS mixer chip, flow-steps program');
  for (const [label, gas, jitter] of [
    ['exact, no jitter', 0, 0],
    ['exact, jitter 2 % of the period', 0, undefined],
    ['gas (Rosenbrock), no jitter', 3e-9, 0],
  ] as const) {
    const t0 = performance.now();
    const r = simulateScenario(chip, program, { setup: 'flow-driven', seed: 1, sampleRateHz: 1000, durationS: 300, ...(jitter === undefined ? {} : { jitterS: jitter }), build: { extraGasAtAtmM3: gas } });
    const ms = performance.now() - t0;
    const n = r.logs[0]?.recording.timeS.length ?? 0;
    console.log(`  ${label.padEnd(34)} ${n} samples in ${(ms / 1000).toFixed(2)} s = ${((n / ms) * 1000).toExponential(2)} samples/s; integrator steps ${r.logs[0]?.truth.stats.acceptedSteps ?? 0}`);
  }
}
