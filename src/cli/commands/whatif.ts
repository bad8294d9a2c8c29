/**
 * `lagbench whatif <chip.json> --vary <element>.<property>=<from>:<to>[:<steps>]`: predicted τ, t₉₅,
 * R, C and the steady state across a sweep of one design variable, and the range that meets a target
 * settling time. Thin: the work is in src/core/whatif.
 */
import { readFile } from 'node:fs/promises';
import { resolve } from 'node:path';
import { parseQuantity } from '../../core/chip/quantity';
import { InputError } from '../../core/errors';
import { SETUPS, type Setup } from '../../core/nominal/types';
import { PRESSURE_SAFETY_CAUTION } from '../../core/safety';
import { factorToSi, lookupUnit } from '../../core/units';
import { formatNumber, fromSi, SI_UNITS, TRADE_UNITS, type UnitSystem } from '../../core/units/display';
import { parseVary, whatIf, whatIfStepResponses, type VarySpec, type WhatIfResult } from '../../core/whatif';
import { writeFileAtomic } from '../../io/atomic-write';
import { booleanOption, formatOptionHelp, numberOption, parseCommandArgs, stringOption, type OptionSpecs } from '../args';
import { UsageError, type Command } from '../io';

const specs: OptionSpecs = {
  vary: { type: 'string', valueName: '<spec>', description: 'design variable: <element>.<property>=<from>:<to>[:<steps>] or =<v1>,<v2>,… (required)' },
  setup: { type: 'string', valueName: '<name>', description: 'flow-driven (default) or pressure-driven' },
  flow: { type: 'string', valueName: '<q>', description: 'pump flow for the steady state, e.g. "10 uL/min" (flow-driven; default 10 uL/min)' },
  pressure: { type: 'string', valueName: '<p>', description: 'regulator pressure, e.g. "200 mbar" (pressure-driven; default the operating pressure, else 100 mbar)' },
  'target-t95': { type: 'string', valueName: '<s>', description: 'target settling time t95 in s: mark the values that meet it and the range that does' },
  'source-lag': { type: 'string', valueName: '<s>', description: 'lag of the pump or regulator, s (shows in the network τ column)' },
  units: { type: 'string', valueName: '<system>', description: 'trade (default: mbar, µL/min, nL/mbar) or si' },
  responses: { type: 'string', valueName: '<file.csv>', description: 'also write the predicted step responses (fraction of final value) per sweep value as CSV' },
  json: { type: 'boolean', description: 'machine-readable output in SI' },
};

const help = `lagbench whatif <chip.json> --vary <spec> [options]

"How slow will this be, and what should I change?" Sweeps one design variable of the chip description and
predicts, for each value, the total resistance, the compliance at the node, the settling time constant τ and
t95 (with the ranges from property uncertainty), and the steady flow and source pressure for a given drive.
With --target-t95 it marks the values that settle in time and the range of the variable that does
(interpolated between sweep points).

The element is its label in the description (quote it if it has spaces), its place (upstream[1], chip[0],
chip[1].branches[0][0]), fluid, chipBody, or bubble (extra trapped air at the node, volume at 1 atm).
Sweepable properties: length, width, height, diameter, innerDiameter, outerDiameter, volume, liquidVolume,
gasVolume, temperature, modulus; and as lists: material, kind (syringe glass/plastic), preset (fluid).

Options:
${formatOptionHelp(specs)}

Examples:
  lagbench whatif sample-logs/chips/pdms-mixer.json --vary "PTFE feed line.length=10cm:2m:8" --target-t95 10
  lagbench whatif sample-logs/chips/pdms-mixer.json --vary "bubble.volume=0:10uL:6" --json
  lagbench whatif sample-logs/chips/pdms-mixer-soft-tubing.json --vary "soft silicone sleeve.material=silicone,ptfe,peek"
  lagbench whatif sample-logs/chips/pdms-mixer.json --vary "1 mL plastic syringe.kind=plastic,glass" --target-t95 5
`;

function valueText(v: number | string, spec: VarySpec): string {
  if (typeof v === 'string') return v;
  switch (spec.dimension) {
    case 'length':
      return `${formatNumber(v * 1e3, 4)} mm`;
    case 'volume':
      return `${formatNumber(v * 1e9, 4)} µL`;
    case 'temperature':
      return `${formatNumber(v - 273.15, 4)} °C`;
    case 'pressure':
      return `${formatNumber(v / 1e6, 4)} MPa`;
    default:
      return formatNumber(v, 4);
  }
}

function table(res: WhatIfResult, u: UnitSystem): string {
  const head = [
    res.vary.text.split('=')[0] ?? 'value',
    `R total [${u.resistance.symbol}]`,
    `C [${u.compliance.symbol}]`,
    `τ [s] (low–high)`,
    't95 [s]',
    res.setup === 'flow-driven' ? `p source [${u.pressure.symbol}]` : `Q steady [${u.flow.symbol}]`,
    ...(res.targetT95S === null ? [] : ['meets target']),
  ];
  const rows = res.rows.map((r) => [
    valueText(r.value, res.vary),
    formatNumber(fromSi(r.resistanceTotalPaSPerM3, u.resistance), 4),
    formatNumber(fromSi(r.complianceM3PerPa.nominal, u.compliance), 4),
    `${formatNumber(r.tauS.nominal, 3)} (${formatNumber(r.tauS.low, 3)}–${formatNumber(r.tauS.high, 3)})`,
    formatNumber(r.t95S.nominal, 3),
    res.setup === 'flow-driven' ? formatNumber(fromSi(r.steadySourcePressurePa, u.pressure), 4) : formatNumber(fromSi(r.steadyFlowM3PerS, u.flow), 4),
    ...(r.meetsTarget === null ? [] : [r.meetsTarget ? 'yes' : 'no']),
  ]);
  const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? '').length)));
  const line = (cells: string[]): string => `  ${cells.map((c, i) => (i === 0 ? c.padEnd(widths[i] ?? 0) : c.padStart(widths[i] ?? 0))).join('  ')}`;
  return [line(head), ...rows.map(line)].join('\n');
}

function toJson(res: WhatIfResult): unknown {
  return {
    setup: res.setup,
    vary: { target: res.vary.target, property: res.vary.property, dimension: res.vary.dimension, text: res.vary.text },
    drive_si: res.driveSI,
    drive_unit: res.setup === 'flow-driven' ? 'm3_per_s' : 'Pa',
    target_t95_s: res.targetT95S,
    rows: res.rows.map((r) => ({
      value: r.value,
      resistance_total_Pa_s_per_m3: r.resistanceTotalPaSPerM3,
      resistance_seen_by_node_Pa_s_per_m3: r.resistanceTheveninPaSPerM3,
      compliance_m3_per_Pa: r.complianceM3PerPa,
      tau_s: r.tauS,
      t95_s: r.t95S,
      network_tau_s: r.networkTauS,
      steady_flow_m3_per_s: r.steadyFlowM3PerS,
      steady_source_pressure_Pa: r.steadySourcePressurePa,
      meets_target: r.meetsTarget,
    })),
    meeting_ranges: res.meetingRanges,
    notes: res.baseline.notes,
  };
}

export const whatifCommand: Command = {
  name: 'whatif',
  summary: 'predict τ, t95 and steady state across a sweep of one design variable',
  help,
  async run(args, io) {
    const { values, positionals } = parseCommandArgs(args, specs, 'whatif');
    if (positionals.length !== 1) throw new UsageError(positionals.length === 0 ? 'missing the chip description file' : `expected one chip description, got ${positionals.length}`, 'whatif');
    const varyText = stringOption(values, 'vary');
    if (!varyText) throw new UsageError('--vary <element>.<property>=<from>:<to>[:<steps>] is required', 'whatif');
    const setup = (stringOption(values, 'setup') ?? 'flow-driven') as Setup;
    if (!SETUPS.includes(setup)) throw new UsageError(`unknown --setup '${setup}'; use ${SETUPS.join(' or ')}`, 'whatif');
    const system = stringOption(values, 'units') ?? 'trade';
    if (system !== 'trade' && system !== 'si') throw new UsageError(`unknown --units '${system}'; use trade or si`, 'whatif');
    const u = system === 'si' ? SI_UNITS : TRADE_UNITS;
    const file = positionals[0] as string;
    let text: string;
    try {
      text = await readFile(resolve(io.cwd, file), 'utf8');
    } catch (e) {
      throw new InputError('unreadable-file', `cannot read the chip description: ${(e as Error).message}`, 'check the path', { file });
    }
    const spec = parseVary(varyText);
    let driveSI: number;
    if (setup === 'flow-driven') {
      const q = stringOption(values, 'flow') ?? '10 uL/min';
      const m = /^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*)$/.exec(q);
      const unit = m?.[2]?.trim() ?? '';
      const found = unit === '' ? null : lookupUnit(unit);
      if (!m || (unit !== '' && found?.kind !== 'flow')) throw new UsageError(`--flow: '${q}' is not a flow such as "10 uL/min"`, 'whatif');
      driveSI = Number(m[1]) * (found ? factorToSi(found) : 1);
    } else {
      const p = stringOption(values, 'pressure');
      if (p !== undefined) {
        const q = parseQuantity(p, 'pressure');
        if ('error' in q) throw new UsageError(`--pressure: ${q.error}`, 'whatif');
        driveSI = q.value;
      } else driveSI = Number.NaN;
    }
    const sourceLag = numberOption(values, 'source-lag', { min: 0 });
    const target = numberOption(values, 'target-t95', { min: 0, exclusiveMin: true });
    const build = sourceLag !== undefined ? { sourceLagS: sourceLag } : {};
    let res = whatIf(text, file, spec, { setup, driveSI: Number.isNaN(driveSI) ? 1e4 : driveSI, ...(target !== undefined ? { targetT95S: target } : {}), build });
    if (Number.isNaN(driveSI)) {
      // Default regulator pressure: the description's operating pressure, else 100 mbar (common practice, no source).
      const op = res.baseline.operatingPressurePa;
      res = whatIf(text, file, spec, { setup, driveSI: op > 0 ? op : 1e4, ...(target !== undefined ? { targetT95S: target } : {}), build });
    }
    const respFile = stringOption(values, 'responses');
    if (respFile) {
      const slowest = Math.max(...res.rows.map((r) => r.t95S.nominal));
      const curves = whatIfStepResponses(text, file, spec, { setup, driveSI: res.driveSI, build }, { durationS: 1.5 * slowest, points: 301 });
      const head = ['time_s', ...curves.map((c) => `fraction at ${typeof c.value === 'number' ? valueText(c.value, spec) : c.value}`)];
      const lines = [head.map((h) => (h.includes(',') ? `"${h}"` : h)).join(',')];
      for (let k = 0; k < (curves[0]?.timeS.length ?? 0); k++) {
        lines.push([curves[0]?.timeS[k] ?? 0, ...curves.map((c) => c.fraction[k] ?? Number.NaN)].map((v) => String(Number(v.toPrecision(8)))).join(','));
      }
      writeFileAtomic(resolve(io.cwd, respFile), `${lines.join('\n')}\n`);
    }
    if (booleanOption(values, 'json')) {
      io.stdout(`${JSON.stringify(toJson(res), null, 2)}\n`);
      return 0;
    }
    const out: string[] = [];
    out.push(`What if: ${spec.text} (${setup}; drive ${setup === 'flow-driven' ? `${formatNumber(fromSi(res.driveSI, u.flow), 4)} ${u.flow.symbol}` : `${formatNumber(fromSi(res.driveSI, u.pressure), 4)} ${u.pressure.symbol}`})`);
    out.push(table(res, u));
    if (res.targetT95S !== null) {
      out.push('');
      if (res.meetingRanges.length > 0) {
        out.push(`t95 ≤ ${formatNumber(res.targetT95S, 4)} s for ${spec.target}.${spec.property} in ${res.meetingRanges.map(([a, b]) => `${valueText(a, spec)} … ${valueText(b, spec)}`).join(' and ')} (nominal; ends interpolated between sweep points)`);
      } else {
        const ok = res.rows.filter((r) => r.meetsTarget).map((r) => valueText(r.value, spec));
        out.push(ok.length > 0 ? `t95 ≤ ${formatNumber(res.targetT95S, 4)} s with: ${ok.join(', ')}` : `No value in the sweep reaches t95 ≤ ${formatNumber(res.targetT95S, 4)} s.`);
      }
    }
    if (respFile) out.push(`wrote ${respFile}: predicted step responses (fraction of the final value)`);
    out.push('', 'Notes:', ...res.baseline.notes.map((n) => `  - ${n}`), '', PRESSURE_SAFETY_CAUTION);
    io.stdout(`${out.join('\n')}\n`);
    return 0;
  },
};
