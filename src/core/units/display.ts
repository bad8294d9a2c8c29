/**
 * Display units for results (human output, reports): the trade's units or SI. Values are stored in
 * SI and converted only here, at the edge. Factors are exact from the unit definitions
 * (1 mbar = 100 Pa, 1 µL = 1e-9 m³, 1 min = 60 s) and match physics.md §5 [N]:
 * 1 mbar/(µL/min) = 6e12 Pa·s/m³; 1 µL/mbar = 1e-11 m³/Pa; 1 nL/mbar = 1 µL/bar = 1e-14 m³/Pa.
 */

/** Quantities we display. */
export type DisplayQuantity = 'pressure' | 'flow' | 'resistance' | 'compliance' | 'volume' | 'time';

export interface DisplayUnit {
  /** Symbol as printed. */
  symbol: string;
  /** Multiply an SI value by this to get the value in this unit. */
  perSi: number;
}

/** Display units by spelling (ASCII spellings accepted on the command line). */
export const DISPLAY_UNITS: Readonly<Record<DisplayQuantity, Readonly<Record<string, DisplayUnit>>>> = {
  pressure: {
    Pa: { symbol: 'Pa', perSi: 1 },
    kPa: { symbol: 'kPa', perSi: 1e-3 },
    mbar: { symbol: 'mbar', perSi: 1e-2 },
    bar: { symbol: 'bar', perSi: 1e-5 },
    psi: { symbol: 'psi', perSi: 1 / 6894.757293168361 },
  },
  flow: {
    'm3/s': { symbol: 'm³/s', perSi: 1 },
    'uL/min': { symbol: 'µL/min', perSi: 6e10 },
    'nL/min': { symbol: 'nL/min', perSi: 6e13 },
    'uL/s': { symbol: 'µL/s', perSi: 1e9 },
    'mL/h': { symbol: 'mL/h', perSi: 3.6e9 },
  },
  resistance: {
    'Pa s/m3': { symbol: 'Pa·s/m³', perSi: 1 },
    'mbar/(uL/min)': { symbol: 'mbar/(µL/min)', perSi: 1 / 6e12 },
    'psi/(uL/min)': { symbol: 'psi/(µL/min)', perSi: 1 / (6894.757293168361 * 6e10) },
  },
  compliance: {
    'm3/Pa': { symbol: 'm³/Pa', perSi: 1 },
    'nL/mbar': { symbol: 'nL/mbar', perSi: 1e14 },
    'uL/bar': { symbol: 'µL/bar', perSi: 1e14 },
    'uL/mbar': { symbol: 'µL/mbar', perSi: 1e11 },
    'nL/kPa': { symbol: 'nL/kPa', perSi: 1e15 },
  },
  volume: {
    m3: { symbol: 'm³', perSi: 1 },
    uL: { symbol: 'µL', perSi: 1e9 },
    nL: { symbol: 'nL', perSi: 1e12 },
  },
  time: {
    s: { symbol: 's', perSi: 1 },
    ms: { symbol: 'ms', perSi: 1e3 },
    min: { symbol: 'min', perSi: 1 / 60 },
  },
};

/** A unit system: which unit each quantity is shown in. */
export type UnitSystem = Readonly<Record<DisplayQuantity, DisplayUnit>>;

const U = DISPLAY_UNITS;

/** The trade's units (mbar, µL/min, mbar/(µL/min), nL/mbar, µL, s). */
export const TRADE_UNITS: UnitSystem = {
  pressure: U.pressure.mbar as DisplayUnit,
  flow: U.flow['uL/min'] as DisplayUnit,
  resistance: U.resistance['mbar/(uL/min)'] as DisplayUnit,
  compliance: U.compliance['nL/mbar'] as DisplayUnit,
  volume: U.volume.uL as DisplayUnit,
  time: U.time.s as DisplayUnit,
};

/** SI units. */
export const SI_UNITS: UnitSystem = {
  pressure: U.pressure.Pa as DisplayUnit,
  flow: U.flow['m3/s'] as DisplayUnit,
  resistance: U.resistance['Pa s/m3'] as DisplayUnit,
  compliance: U.compliance['m3/Pa'] as DisplayUnit,
  volume: U.volume.m3 as DisplayUnit,
  time: U.time.s as DisplayUnit,
};

/** Converts an SI value into the display unit. */
export function fromSi(valueSi: number, unit: DisplayUnit): number {
  return valueSi * unit.perSi;
}

/** Converts a display-unit value back to SI. */
export function toSi(value: number, unit: DisplayUnit): number {
  return value / unit.perSi;
}

/**
 * Formats a value with `digits` significant digits: fixed notation between 1e-3 and 1e6,
 * otherwise scientific (so SI values like 1.4e13 stay readable).
 */
export function formatNumber(value: number, digits = 3): string {
  if (!Number.isFinite(value)) return String(value);
  if (value === 0) return '0';
  const a = Math.abs(value);
  if (a >= 1e-3 && a < 1e6) return Number(value.toPrecision(digits)).toString();
  return value.toExponential(digits - 1);
}

/** "12.3 mbar" from an SI value. */
export function formatQuantity(valueSi: number, unit: DisplayUnit, digits = 3): string {
  return `${formatNumber(fromSi(valueSi, unit), digits)} ${unit.symbol}`;
}
