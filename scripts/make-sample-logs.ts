/**
 * Regenerates the simulated demo logs in sample-logs/simulated/ (invented data for our demo scenario:
 * a small lab priming a batch of PDMS mixer chips). Run: npx tsx scripts/make-sample-logs.ts
 *
 * Every case writes its chip description, its program, the log(s) and <log>.truth.json side by side.
 * Also sample-logs/lot-A/: one log per chip of a small lot for `lagbench qc` (channel heights vary from
 * chip to chip; two chips carry trapped air).
 * Deterministic: fixed seeds and a fixed start date, so re-running gives identical bytes.
 */
import { mkdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { parseChipDescription } from '../src/core/chip/parse';
import { parseQuantity } from '../src/core/chip/quantity';
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

// ---- sample-logs/lot-A: a lot of six PDMS mixer chips for `lagbench qc` --------------------------------
const LOT = 'sample-logs/lot-A';
const LOT_PROGRAM = `# Invented demo program: the QC flow steps 2 -> 5 -> 10 -> 5 -> 2 uL/min, 30 s each.
time_s,flow[uL/min]
0,2
15,5
45,10
75,5
105,2
`;
/** Per chip: relative channel height (moulding variation, invented) and trapped air at 1 atm (m³). */
const LOT_CHIPS: Array<[string, number, number]> = [
  ['M2-001', 1.0, 0],
  ['M2-002', 0.985, 1.5e-9],
  ['M2-003', 1.02, 0],
  ['M2-004', 0.99, 0],
  ['M2-005', 1.01, 3e-9],
  ['M2-006', 0.975, 0],
];

/** The design with every channel height of the chip section scaled by `factor` (SI numbers written back). */
function scaledHeights(designText: string, factor: number): string {
  const doc = JSON.parse(designText) as { name: string; note: string; path: { chip: unknown[] } };
  const walk = (list: unknown[]): void => {
    for (const el of list) {
      const e = el as { height?: string | number; branches?: unknown[][] };
      if (e.height !== undefined) {
        const q = parseQuantity(String(e.height), 'length');
        if ('error' in q) throw new Error(q.error);
        e.height = Number((q.value * factor).toPrecision(6));
      }
      for (const b of e.branches ?? []) walk(b);
    }
  };
  walk(doc.path.chip);
  doc.note = `${doc.note} Channel heights ×${factor} of the design (invented moulding variation).`;
  return `${JSON.stringify(doc, null, 2)}\n`;
}

mkdirSync(LOT, { recursive: true });
writeFileAtomic(join(LOT, 'lot-A.program.csv'), LOT_PROGRAM);
const design = readFileSync('sample-logs/chips/pdms-mixer.json', 'utf8');
LOT_CHIPS.forEach(([id, factor, gas], i) => {
  const chipFile = join(LOT, `${id}.chip.json`);
  const text = scaledHeights(design, factor);
  writeFileAtomic(chipFile, text);
  const chip = parseChipDescription(text, chipFile);
  const program = parseProgramCsv(LOT_PROGRAM, join(LOT, 'lot-A.program.csv'));
  const log = `${id}.csv`;
  const result = simulateScenario(chip, program, {
    setup: 'flow-driven', seed: 201 + i, sampleRateHz: 10, noise: 'typical', jitterS: 0, fileNames: [log],
    build: { extraGasAtAtmM3: gas }, startEpochMs: Date.UTC(2026, 2, 3, 8, 0, 0) + i * 15 * 60_000,
  });
  const rec = result.logs[0]?.recording;
  if (!rec) throw new Error(`${id}: no log`);
  rec.metadata = { chip: id, lot: 'A', ...rec.metadata };
  writeFileAtomic(join(LOT, log), writeLog(rec, SIM_DIALECTS['bench-csv']?.dialect ?? {}));
  writeFileAtomic(join(LOT, `${log}.truth.json`), `${JSON.stringify(result.truth, null, 2)}\n`);
  console.log(`${join(LOT, log)}  ${(statSync(join(LOT, log)).size / 1024).toFixed(1)} KB`);
});
writeFileAtomic(
  join(LOT, 'README.md'),
  `# Lot A (invented demo data)

Simulated by \`scripts/make-sample-logs.ts\`: six PDMS mixer chips of the invented demo design
(\`../chips/pdms-mixer.json\`), each with its own channel heights (\`M2-00n.chip.json\`, a moulding variation
of -2.5 % to +2 %), run through the QC flow steps of \`lot-A.program.csv\`. M2-002 and M2-005 carry 1.5 µL and 3 µL
of trapped air. \`<log>.truth.json\` holds the true R, C, τ's and air of each. Not real measurements.

    npx lagbench qc sample-logs/lot-A --spec qc-specs/pdms-mixer-m2.json --lot A --operator "J. Doe"
`,
);
