/**
 * Display units (the trade's units; SI inside). Factors: 1 bar = 1e5 Pa, 1 mbar = 100 Pa (BIPM SI
 * brochure, 9th ed., Table 8); 1 µL = 1e-9 m³, 1 nL = 1e-12 m³ (SI prefixes, same brochure).
 */
import type { Quantity } from '../../core/recording/types';

export const PA_PER_MBAR = 100;
export const M3S_PER_UL_MIN = 1e-9 / 60;
export const M3_PER_NL = 1e-12;
export const M3_PER_UL = 1e-9;

export interface DisplayUnit {
  label: string;
  /** Multiply an SI value by this to get the display value. */
  fromSi: number;
}

export function displayUnitOf(quantity: Quantity): DisplayUnit {
  switch (quantity) {
    case 'pressure':
    case 'pressure_setpoint':
    case 'hydrostatic_head':
      return { label: 'mbar', fromSi: 1 / PA_PER_MBAR };
    case 'flow':
    case 'flow_setpoint':
      return { label: 'µL/min', fromSi: 1 / M3S_PER_UL_MIN };
    default:
      return { label: '', fromSi: 1 };
  }
}

export const isPressureQuantity = (q: Quantity): boolean => q === 'pressure' || q === 'pressure_setpoint' || q === 'hydrostatic_head';
export const isFlowQuantity = (q: Quantity): boolean => q === 'flow' || q === 'flow_setpoint';

/** Resistance in mbar/(µL/min). */
export const RESISTANCE_UNIT: DisplayUnit = { label: 'mbar/(µL/min)', fromSi: M3S_PER_UL_MIN / PA_PER_MBAR };
/** Compliance in nL/mbar. */
export const COMPLIANCE_UNIT: DisplayUnit = { label: 'nL/mbar', fromSi: PA_PER_MBAR / M3_PER_NL };

/** A volume in nL below 1 µL, else µL. */
export function volumeUnitFor(m3: number): DisplayUnit {
  return Math.abs(m3) < 1e-9 ? { label: 'nL', fromSi: 1 / M3_PER_NL } : { label: 'µL', fromSi: 1 / M3_PER_UL };
}

/** A number with `digits` significant digits, no exponent for ordinary magnitudes. */
export function fmt(value: number, digits = 3): string {
  if (!Number.isFinite(value)) return Number.isNaN(value) ? '—' : value > 0 ? '∞' : '−∞';
  if (value === 0) return '0';
  const abs = Math.abs(value);
  if (abs >= 1e6 || abs < 1e-4) return value.toExponential(digits - 1).replace('-', '−');
  const s = value.toPrecision(digits);
  return (s.includes('e') ? Number(s).toString() : s).replace('-', '−');
}

/** "v [lo, hi] unit" with one display unit. */
export function fmtCi(value: number, ci: readonly [number, number], unit: DisplayUnit, digits = 3): string {
  const f = unit.fromSi;
  return `${fmt(value * f, digits)} [${fmt(ci[0] * f, digits)}, ${fmt(ci[1] * f, digits)}]${unit.label ? ` ${unit.label}` : ''}`;
}

/** Seconds, chosen for readability: ms below 1 s. */
export function fmtSeconds(s: number, digits = 3): string {
  if (!Number.isFinite(s)) return fmt(s);
  return Math.abs(s) < 1 ? `${fmt(s * 1000, digits)} ms` : `${fmt(s, digits)} s`;
}

export function fmtBytes(n: number): string {
  if (n < 1024) return `${n} B`;
  if (n < 1024 ** 2) return `${(n / 1024).toFixed(1)} KiB`;
  return `${(n / 1024 ** 2).toFixed(1)} MiB`;
}

export const QUANTITY_LABEL: Record<Quantity, string> = {
  pressure: 'Pressure',
  flow: 'Flow',
  pressure_setpoint: 'Pressure setpoint',
  flow_setpoint: 'Flow setpoint',
  hydrostatic_head: 'Hydrostatic head',
  other: 'Other',
};
