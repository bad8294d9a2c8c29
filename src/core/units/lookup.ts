/**
 * Finding a unit from the text a logger wrote: spelling variants (µ as U+00B5 or Greek mu U+03BC or `u`,
 * `l` or `L`, `m3` or `m³`, `/` or `_per_`, `hr` for h), then conversion to SI.
 */
import { FLOW_UNITS, HEAD_UNITS, TIME_UNITS } from './flow-units';
import { PRESSURE_UNITS, type UnitDefinition } from './pressure-units';

/** What a unit measures. `head` is a liquid-column height, converted to pressure with ρ·g·h. */
export type UnitKind = 'pressure' | 'flow' | 'head' | 'time';

export interface FoundUnit {
  kind: UnitKind;
  unit: UnitDefinition;
}

const TABLES: ReadonlyArray<[UnitKind, readonly UnitDefinition[]]> = [
  ['pressure', PRESSURE_UNITS],
  ['flow', FLOW_UNITS],
  ['head', HEAD_UNITS],
  ['time', TIME_UNITS],
];

/**
 * Units whose letter case carries meaning (MPa is mega-, mPa would be milli-): matched case-sensitively only.
 */
const CASE_SENSITIVE = new Set(['MPa', 'm']);

/** Extra spellings (after {@link normaliseUnitText}, lower case) → canonical symbol. */
const ALIASES: Record<string, string> = {
  'ul/hr': 'µL/h',
  'ml/hr': 'mL/h',
  'nl/hr': 'nL/h',
  'lpm': 'L/min',
  'sec': 's',
  'secs': 's',
  'seconds': 's',
  'second': 's',
  'msec': 'ms',
  'millisecond': 'ms',
  'milliseconds': 'ms',
  'torr': 'Torr',
  'mmh₂o': 'mmH2O',
  'cmh₂o': 'cmH2O',
  'inh₂o': 'inH2O',
  'in.h2o': 'inH2O',
  'inwc': 'inH2O',
};

/**
 * Folds spelling variants: trims, maps the micro sign (U+00B5) and Greek mu (U+03BC) to `u`, superscript three
 * to `3`, `_per_` / ` per ` to `/`, removes spaces. Case is kept (see {@link lookupUnit}).
 */
export function normaliseUnitText(text: string): string {
  return text
    .trim()
    .replace(/[\u00B5\u03BC]/g, 'u')
    .replace(/\u00B3/g, '3')
    .replace(/_per_|\s+per\s+/gi, '/')
    .replace(/\s+/g, '');
}

const exactIndex = new Map<string, FoundUnit>();
const foldedIndex = new Map<string, FoundUnit>();
for (const [kind, table] of TABLES) {
  for (const unit of table) {
    const key = normaliseUnitText(unit.symbol);
    exactIndex.set(key, { kind, unit });
    if (!CASE_SENSITIVE.has(unit.symbol)) foldedIndex.set(key.toLowerCase(), { kind, unit });
  }
}
for (const [alias, symbol] of Object.entries(ALIASES)) {
  const target = exactIndex.get(normaliseUnitText(symbol));
  if (target) foldedIndex.set(alias, target);
}

/** The unit named by `text`, or null when it is not one Lagbench knows. */
export function lookupUnit(text: string): FoundUnit | null {
  const key = normaliseUnitText(text);
  if (key === '') return null;
  return exactIndex.get(key) ?? foldedIndex.get(key.toLowerCase()) ?? null;
}

/** Canonical symbols of every known unit of the given kinds, for error messages. */
export function knownUnitSymbols(kinds: readonly UnitKind[] = ['pressure', 'flow', 'head']): string[] {
  return TABLES.filter(([k]) => kinds.includes(k)).flatMap(([k, t]) =>
    t.map((u) => (k === 'head' ? `${u.symbol} (of liquid)` : u.symbol)),
  );
}

/** A sentence listing the known units, for the hint of an unknown-unit error. */
export function knownUnitsSentence(): string {
  return (
    `Known pressure units: ${knownUnitSymbols(['pressure']).join(', ')}; ` +
    `flow units: ${knownUnitSymbols(['flow']).join(', ')} (µ may be written µ, μ or u; L or l); ` +
    `liquid-head heights: ${knownUnitSymbols(['head']).join(', ')}`
  );
}
