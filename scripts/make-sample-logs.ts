/**
 * Regenerates the simulated demo logs in sample-logs/simulated/ (invented data for our demo scenario:
 * a small lab priming a batch of PDMS mixer chips). Run: npx tsx scripts/make-sample-logs.ts
 *
 * Every case writes its chip description, its program, the log(s) and <log>.truth.json side by side.
 * Deterministic: fixed seeds and a fixed start date, so re-running gives identical bytes.
 */
import { mkdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { parseChipDescription } from '../src/core/chip/parse';
import { writeLog } from '../src/core/logformat';
import { SIM_DIALECTS } from '../src/core/simulate/dialects';
import { parseProgramCsv } from '../src/core/simulate/program-csv';
import { simulateScenario, type ScenarioOptions } from '../src/core/simulate/scenario';
import { writeFileAtomic } from '../src/io/atomic-write';

const OUT = 'sample-logs/simulated';
const MAX_BYTES = 300 * 1024;

interface Case {
  name: string;
  chipFile: string;
  program: string;
  dialect: keyof typeof SIM_DIALECTS;
  ext: string;
  options: Omit<ScenarioOptions, 'fileNames'>;
  /** Second logger's file name suffix (two-file case). */
  secondExt?: string;
}

const FLOW_STEPS = `# Invented demo program: syringe-pump flow steps while priming (flow-driven).
time_s,flow[uL/min]
0,2
20,5
60,10
100,5
140,2
`;

const FLOW_LEVELS = `# Invented demo program: flow steps at several pressure levels (gas compliance falls as 1/p_abs²).
time_s,flow[uL/min]
0,2
20,10
60,20
100,40
140,20
180,10
`;

const PRESSURE_STEPS = `# Invented demo program: regulator pressure steps (pressure-driven).
time_s,pressure[mbar]
0,50
15,150
45,300
75,150
105,50
`;

const SLOW_STEPS = `# Invented demo program: slow settling on soft tubing (flow-driven).
time_s,flow[uL/min]
0,2
20,8
80,4
140,2
`;

const CASES: Case[] = [
  {
    name: 'mixer-b01-flow', chipFile: 'sample-logs/chips/pdms-mixer.json', program: FLOW_STEPS, dialect: 'bench-csv', ext: 'csv',
    options: { setup: 'flow-driven', seed: 101, sampleRateHz: 10, noise: 'typical', jitterS: 0 },
  },
  {
    name: 'mixer-b04-bubble', chipFile: 'sample-logs/chips/pdms-mixer.json', program: FLOW_LEVELS, dialect: 'ms-csv', ext: 'csv',
    options: { setup: 'flow-driven', seed: 104, sampleRateHz: 10, noise: 'typical', jitterS: 0, build: { extraGasAtAtmM3: 4e-9 } },
  },
  {
    name: 'mixer-soft-tubing', chipFile: 'sample-logs/chips/pdms-mixer-soft-tubing.json', program: SLOW_STEPS, dialect: 'eu-semicolon', ext: 'csv',
    options: { setup: 'flow-driven', seed: 105, sampleRateHz: 5, noise: 'typical', jitterS: 0 },
  },
  {
    name: 'regulator-bench', chipFile: 'sample-logs/simulated/regulator-bench.chip.json', program: PRESSURE_STEPS, dialect: 'iso-tab', ext: 'tsv',
    options: { setup: 'pressure-driven', seed: 106, sampleRateHz: 20, noise: 'typical', jitterS: 0, build: { sourceLagS: 0.03 } },
  },
  {
    name: 'two-loggers', chipFile: 'sample-logs/simulated/regulator-bench.chip.json', program: PRESSURE_STEPS, dialect: 'iso-tab', ext: 'tsv', secondExt: 'tsv',
    options: { setup: 'pressure-driven', seed: 107, sampleRateHz: 10, noise: 'typical', jitterS: 0, separateFlowLogger: { sampleRateHz: 20, clockOffsetS: 1.8 } },
  },
];

mkdirSync(OUT, { recursive: true });
for (const c of CASES) {
  const chipText = readFileSync(c.chipFile, 'utf8');
  const chipOut = c.chipFile.startsWith(OUT) ? c.chipFile : join(OUT, `${c.name}.chip.json`);
  if (chipOut !== c.chipFile) writeFileAtomic(chipOut, chipText);
  const programFile = join(OUT, `${c.name}.program.csv`);
  writeFileAtomic(programFile, c.program);
  const chip = parseChipDescription(chipText, chipOut);
  const program = parseProgramCsv(c.program, programFile);
  const first = c.secondExt ? `${c.name}-pressure.${c.ext}` : `${c.name}.${c.ext}`;
  const second = `${c.name}-flow.${c.secondExt ?? c.ext}`;
  const result = simulateScenario(chip, program, { ...c.options, fileNames: c.secondExt ? [first, second] : [first] });
  const files = c.secondExt ? [first, second] : [first];
  files.forEach((f, i) => {
    const log = result.logs[i];
    if (!log) throw new Error(`${c.name}: no log ${i}`);
    writeFileAtomic(join(OUT, f), writeLog(log.recording, SIM_DIALECTS[c.dialect]?.dialect ?? {}));
  });
  writeFileAtomic(join(OUT, `${first}.truth.json`), `${JSON.stringify(result.truth, null, 2)}\n`);
  for (const f of [...files, `${first}.truth.json`]) {
    const size = statSync(join(OUT, f)).size;
    if (size > MAX_BYTES) throw new Error(`${f} is ${size} bytes, over the ${MAX_BYTES} limit`);
    console.log(`${join(OUT, f)}  ${(size / 1024).toFixed(1)} KB`);
  }
}
