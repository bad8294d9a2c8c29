/**
 * `lagbench predict <chip.json>`: nominal R, C by source, τ and t₉₅ from a chip description,
 * in the trade's units (or SI) with the pressure-safety caution, or as JSON in SI.
 */
import { readFile } from 'node:fs/promises';
import { resolve } from 'node:path';
import { parseChipDescription } from '../../core/chip/parse';
import { parseQuantity } from '../../core/chip/quantity';
import { InputError } from '../../core/errors';
import { nominalPredictionToJson } from '../../core/nominal/json';
import { predictNominal } from '../../core/nominal/predict';
import type { ValueRange } from '../../core/nominal/range';
import { SETUPS, type NominalPrediction, type Setup } from '../../core/nominal/types';
import { checkPressureAgainstRatings, PRESSURE_SAFETY_CAUTION, type RatedPart } from '../../core/safety';
import { DISPLAY_UNITS, formatNumber, fromSi, SI_UNITS, TRADE_UNITS, type DisplayUnit, type UnitSystem } from '../../core/units/display';
import { booleanOption, formatOptionHelp, parseCommandArgs, stringOption, type OptionSpecs } from '../args';
import { UsageError, type CliIo, type Command } from '../io';
import type { ChipDescription } from '../../core/chip/types';

const OPTIONS: OptionSpecs = {
  setup: { type: 'string', valueName: '<name>', description: 'flow-driven (default; pump → node → chip, τ = R_down·C) or pressure-driven (regulator → R_up → node → R_down, τ = C·R_up·R_down/(R_up+R_down))' },
  units: { type: 'string', valueName: '<system>', description: 'trade (default: mbar, µL/min, mbar/(µL/min), nL/mbar) or si' },
  'compliance-unit': { type: 'string', valueName: '<unit>', description: 'nL/mbar (= µL/bar), uL/bar, uL/mbar, nL/kPa or m3/Pa' },
  pressure: { type: 'string', valueName: '<value>', description: 'gauge pressure at the compliant node, e.g. "300 mbar" (bare number: Pa); overrides "operatingPressure"; sets gas compliance' },
  json: { type: 'boolean', description: 'machine-readable output in SI (resistance_Pa_s_per_m3, compliance_m3_per_Pa, breakdown[], tau_s, t95_s with ranges)' },
};

const HELP = `Usage: lagbench predict <chip.json> [options]

Predicts the nominal hydraulic resistance R, the compliance C broken down by source, and the
settling time constant τ and t95 of the set-up described in <chip.json> (format:
docs/chip-description.md). Every value comes with a [low, nominal, high] range from property
uncertainty.

Options:
${formatOptionHelp(OPTIONS)}

Examples:
  lagbench predict sample-logs/chips/pdms-mixer.json
  lagbench predict chip.json --setup pressure-driven --pressure "500 mbar"
  lagbench predict chip.json --units si --json
`;

function parse(args: string[]): { file: string; setup: Setup; units: UnitSystem; json: boolean; pressurePa?: number } {
  const { values, positionals } = parseCommandArgs(args, OPTIONS, 'predict');
  if (positionals.length !== 1) throw new UsageError(positionals.length === 0 ? 'missing the chip description file' : `expected one chip description file, got ${positionals.length}`, 'predict');
  const setupText = stringOption(values, 'setup') ?? 'flow-driven';
  if (!(SETUPS as readonly string[]).includes(setupText)) throw new UsageError(`unknown --setup '${setupText}'; use ${SETUPS.join(' or ')}`, 'predict');
  const system = stringOption(values, 'units') ?? 'trade';
  if (system !== 'trade' && system !== 'si') throw new UsageError(`unknown --units '${system}'; use trade or si`, 'predict');
  let units: UnitSystem = system === 'si' ? SI_UNITS : TRADE_UNITS;
  const cu = stringOption(values, 'compliance-unit');
  if (cu !== undefined) {
    const unit = DISPLAY_UNITS.compliance[cu.replace(/[µμ]/g, 'u')];
    if (!unit) throw new UsageError(`unknown --compliance-unit '${cu}'; use ${Object.keys(DISPLAY_UNITS.compliance).join(', ')}`, 'predict');
    units = { ...units, compliance: unit };
  }
  let pressurePa: number | undefined;
  const pressureText = stringOption(values, 'pressure');
  if (pressureText !== undefined) {
    const q = parseQuantity(pressureText, 'pressure');
    if ('error' in q) throw new UsageError(`--pressure: ${q.error}; write e.g. "300 mbar" or a number in Pa`, 'predict');
    pressurePa = q.value;
  }
  return { file: positionals[0] as string, setup: setupText as Setup, units, json: booleanOption(values, 'json'), ...(pressurePa === undefined ? {} : { pressurePa }) };
}

const fmt = (valueSi: number, unit: DisplayUnit, digits = 3): string => formatNumber(fromSi(valueSi, unit), digits);
const fmtRange = (r: ValueRange, unit: DisplayUnit): [string, string, string] => [fmt(r.low, unit), fmt(r.nominal, unit), fmt(r.high, unit)];

/** Left column padded, three right-aligned numbers, optional trailing text. */
function row(label: string, cells: [string, string, string], tail = ''): string {
  const name = label.length > 48 ? `${label.slice(0, 47)}…` : label;
  return `  ${name.padEnd(48)} ${cells.map((c) => c.padStart(10)).join(' ')}${tail ? `  ${tail}` : ''}`;
}

function header(title: string, unit: DisplayUnit): string {
  return `${title.padEnd(50)} ${'low'.padStart(10)} ${'nominal'.padStart(10)} ${'high'.padStart(10)}   [${unit.symbol}]`;
}

function humanReport(chip: ChipDescription, p: NominalPrediction, u: UnitSystem): string {
  const lines: string[] = [];
  const tC = p.fluid.temperatureK - 273.15;
  lines.push(`Nominal prediction: ${chip.name}`);
  lines.push(`File: ${chip.fileName}`);
  if (chip.note) lines.push(`Note: ${chip.note}`);
  const mu = p.fluid.viscosityPaS;
  lines.push(
    `Fluid: ${p.fluid.name} at ${tC.toFixed(1)} °C; viscosity ${formatNumber(mu.nominal * 1e3, 4)} mPa·s ` +
      `(${formatNumber(mu.low * 1e3, 4)}–${formatNumber(mu.high * 1e3, 4)}) [${p.fluid.viscosityTag}]; ` +
      `κ_T ${formatNumber(p.fluid.compressibilityPerPa.nominal, 4)} 1/Pa [${p.fluid.compressibilityTag}]`,
  );
  lines.push(
    p.setup === 'flow-driven'
      ? 'Set-up: flow-driven — pump → compliant node → chip → outlet; τ = R_down · C'
      : 'Set-up: pressure-driven — regulator → R_up → compliant node → R_down → outlet; τ = C · R_up R_down / (R_up + R_down)',
  );
  lines.push(`Pressure at the node: ${fmt(p.operatingPressurePa, u.pressure, 4)} ${u.pressure.symbol} gauge, ${fmt(p.nodeAbsolutePressurePa, u.pressure, 5)} ${u.pressure.symbol} absolute`);
  lines.push('');
  lines.push(header('Resistance', u.resistance));
  for (const item of p.resistance.items) lines.push(row(`${item.section}: ${item.element}`, fmtRange(item.resistancePaSPerM3, u.resistance)));
  lines.push(row('upstream R_up', fmtRange(p.resistance.upstreamPaSPerM3, u.resistance)));
  lines.push(row('chip + downstream R_down', fmtRange(p.resistance.downstreamPaSPerM3, u.resistance)));
  lines.push(row('total (Δp/Q at steady state)', fmtRange(p.resistance.totalPaSPerM3, u.resistance)));
  lines.push(row('seen by the compliant node', fmtRange(p.resistance.theveninPaSPerM3, u.resistance)));
  lines.push('');
  lines.push(header('Compliance by source', u.compliance));
  for (const c of p.compliance.breakdown) {
    lines.push(row(`${c.section}: ${c.element} (${c.source})`, fmtRange(c.complianceM3PerPa, u.compliance), `[${c.tag}]${c.counted ? '' : ' not counted'}`));
  }
  lines.push(row('total at the node', fmtRange(p.compliance.totalM3PerPa, u.compliance)));
  lines.push('');
  lines.push(header('Settling', u.time));
  lines.push(row('time constant τ', fmtRange(p.tauS, u.time)));
  lines.push(row('t95 (to 95 % of the final value)', fmtRange(p.t95S, u.time)));
  if (p.warnings.length > 0) {
    lines.push('', 'Warnings:');
    for (const w of p.warnings) lines.push(`  - ${w.message}`);
  }
  lines.push('', 'Notes:');
  for (const n of p.notes) lines.push(`  - ${n}`);
  for (const c of p.compliance.breakdown) if (c.note) lines.push(`  - ${c.element} (${c.source}): ${c.note}`);
  lines.push('', ...ratingLines(chip, p, u), '', PRESSURE_SAFETY_CAUTION);
  return `${lines.join('\n')}\n`;
}

function ratingLines(chip: ChipDescription, p: NominalPrediction, u: UnitSystem): string[] {
  const parts: RatedPart[] = ['chip', 'bonding', 'tubing', 'fittings'];
  const stated = parts.map((part) => {
    const v = chip.ratingsPa[part];
    return `${part} ${v === undefined ? 'not stated' : `${fmt(v, u.pressure)} ${u.pressure.symbol}`}`;
  });
  const out = [`Pressure ratings (gauge): ${stated.join(', ')}.`];
  const check = checkPressureAgainstRatings(p.operatingPressurePa, chip.ratingsPa);
  if (check.governing) {
    out.push(`Lowest rating: ${check.governing.part}, ${fmt(check.governing.ratingPa, u.pressure)} ${u.pressure.symbol}; the node pressure is ${formatNumber((check.fractionOfRating ?? 0) * 100, 2)} % of it.`);
  }
  if (check.exceeded.length > 0) out.push(`WARNING: the node pressure exceeds the stated rating of: ${check.exceeded.join(', ')}. Do not run at this pressure.`);
  if (check.unknown.length > 0) out.push(`Find out the missing ratings (${check.unknown.join(', ')}) before pressurising.`);
  return out;
}

async function readText(path: string): Promise<string> {
  try {
    return await readFile(path, 'utf8');
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    throw new InputError('unreadable-file', code === 'ENOENT' ? 'The chip description file does not exist' : `The chip description file cannot be read (${code ?? String(e)})`, 'Check the path', { file: path });
  }
}

export const predictCommand: Command = {
  name: 'predict',
  summary: 'Nominal R, compliance by source, τ and t95 from a chip description',
  help: HELP,
  async run(args: string[], io: CliIo): Promise<number> {
    const opts = parse(args);
    const path = resolve(io.cwd, opts.file);
    const chip = parseChipDescription(await readText(path), opts.file);
    const prediction = predictNominal(chip, opts.setup, opts.pressurePa === undefined ? {} : { operatingPressurePa: opts.pressurePa });
    if (opts.json) {
      const check = checkPressureAgainstRatings(prediction.operatingPressurePa, chip.ratingsPa);
      const json = {
        chip: { name: chip.name, file: chip.fileName },
        ...nominalPredictionToJson(prediction),
        pressure_ratings_Pa: chip.ratingsPa,
        pressure_check: { exceeded: check.exceeded, unknown: check.unknown, governing: check.governing ? { part: check.governing.part, rating_Pa: check.governing.ratingPa } : null },
        safety_caution: PRESSURE_SAFETY_CAUTION,
      };
      io.stdout(`${JSON.stringify(json, null, 2)}\n`);
    } else {
      io.stdout(humanReport(chip, prediction, opts.units));
    }
    return 0;
  },
};
