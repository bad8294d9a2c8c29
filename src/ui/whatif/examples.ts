/**
 * Example files bundled into the renderer (Vite `?raw`: the exact text), so the what-if and sign-off
 * views work without a file dialog. All describe the invented demo scenario of sample-logs/.
 */
import pdmsMixer from '../../../sample-logs/chips/pdms-mixer.json?raw';
import softTubing from '../../../sample-logs/chips/pdms-mixer-soft-tubing.json?raw';
import glassChip from '../../../sample-logs/chips/glass-chip-pressure.json?raw';
import bubbleChip from '../../../sample-logs/simulated/mixer-b04-bubble.chip.json?raw';
import regulatorBench from '../../../sample-logs/simulated/regulator-bench.chip.json?raw';
import specM2 from '../../../qc-specs/pdms-mixer-m2.json?raw';
import specSettling from '../../../qc-specs/pdms-mixer-m2-settling.json?raw';
import specAir from '../../../qc-specs/pdms-mixer-m2-trapped-air.json?raw';

export interface BundledFile {
  name: string;
  text: string;
}

export const EXAMPLE_CHIPS: readonly BundledFile[] = [
  { name: 'chips/pdms-mixer.json', text: pdmsMixer },
  { name: 'chips/pdms-mixer-soft-tubing.json', text: softTubing },
  { name: 'chips/glass-chip-pressure.json', text: glassChip },
  { name: 'simulated/mixer-b04-bubble.chip.json', text: bubbleChip },
  { name: 'simulated/regulator-bench.chip.json', text: regulatorBench },
];

export const EXAMPLE_SPECS: readonly BundledFile[] = [
  { name: 'qc-specs/pdms-mixer-m2.json', text: specM2 },
  { name: 'qc-specs/pdms-mixer-m2-settling.json', text: specSettling },
  { name: 'qc-specs/pdms-mixer-m2-trapped-air.json', text: specAir },
];
