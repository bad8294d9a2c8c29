/**
 * Values with units as written in chip descriptions: an SI number (12e-6) or a string with a unit
 * ("250 um", "1.6 mm", "1/16 in", "5 uL", "2 MPa", "3 bar", "22 C"). Conversions to SI are exact
 * definitions (physics.md §5) unless a comment says otherwise.
 */

export type Dimension =
  | 'length'
  | 'volume'
  | 'pressure'
  | 'temperature'
  | 'temperature-difference'
  | 'viscosity'
  | 'compressibility'
  | 'resistance'
  | 'compliance'
  | 'density'
  | 'dimensionless';

/** Unit spellings (after normalisation: µ/μ → u, spaces, · and * removed, ^ removed) → SI factor. */
const PRESSURE: Record<string, number> = {
  // No lower-case "mpa"/"gpa": milli- vs mega-pascal would be a guess; those must be written MPa, GPa.
  pa: 1, hpa: 100, kpa: 1e3, mbar: 100, bar: 1e5,
  psi: 6894.757293168361, atm: 101325, mmhg: 133.322387415, cmh2o: 98.0665,
};
// Case matters for the SI prefixes m (milli) vs M (mega); pressures are matched case-sensitively first.
const PRESSURE_EXACT: Record<string, number> = { Pa: 1, hPa: 100, kPa: 1e3, MPa: 1e6, GPa: 1e9, mbar: 100, bar: 1e5, psi: 6894.757293168361, atm: 101325, mmHg: 133.322387415, cmH2O: 98.0665 };
const LENGTH: Record<string, number> = { m: 1, cm: 1e-2, mm: 1e-3, um: 1e-6, micron: 1e-6, microns: 1e-6, nm: 1e-9, in: 0.0254, inch: 0.0254 };
const VOLUME: Record<string, number> = {
  m3: 1, l: 1e-3, L: 1e-3, ml: 1e-6, mL: 1e-6, ul: 1e-9, uL: 1e-9, nl: 1e-12, nL: 1e-12, pl: 1e-15, pL: 1e-15, cm3: 1e-6, mm3: 1e-9,
};
const VISCOSITY: Record<string, number> = { Pas: 1, mPas: 1e-3, uPas: 1e-6, cP: 1e-3, cp: 1e-3, P: 0.1 };
const TIME: Record<string, number> = { s: 1, min: 60, h: 3600 };

/** Splits "a/b" at the top-level slash (parentheses respected). */
function splitRatio(unit: string): [string, string] | null {
  let depth = 0;
  for (let k = 0; k < unit.length; k++) {
    const c = unit[k];
    if (c === '(') depth++;
    else if (c === ')') depth--;
    else if (c === '/' && depth === 0) return [unit.slice(0, k), unit.slice(k + 1)];
  }
  return null;
}

const unwrap = (u: string): string => (u.startsWith('(') && u.endsWith(')') ? u.slice(1, -1) : u);

function pressureFactor(u: string): number | undefined {
  return PRESSURE_EXACT[u] ?? (u === u.toLowerCase() ? PRESSURE[u] : undefined);
}

/** Flow units: volume/time, e.g. uL/min, mL/h, m3/s. */
function flowFactor(u: string): number | undefined {
  const parts = splitRatio(unwrap(u));
  if (!parts) return undefined;
  const v = VOLUME[parts[0]];
  const t = TIME[parts[1]];
  return v !== undefined && t !== undefined ? v / t : undefined;
}

function unitFactor(unit: string, dim: Dimension): number | undefined {
  switch (dim) {
    case 'length':
      return LENGTH[unit];
    case 'volume':
      return VOLUME[unit];
    case 'pressure':
      return pressureFactor(unit);
    case 'temperature-difference':
      return unit === 'K' || unit === 'C' || unit === '°C' || unit === 'degC' ? 1 : undefined;
    case 'viscosity':
      return VISCOSITY[unit];
    case 'compressibility': {
      const parts = splitRatio(unit);
      if (!parts || (parts[0] !== '1' && parts[0] !== '')) return undefined;
      return (() => {
        const p = pressureFactor(unwrap(parts[1]));
        return p === undefined ? undefined : 1 / p;
      })();
    }
    case 'resistance': {
      // pressure/flow ("mbar/(uL/min)"), pressure·time/volume ("Pas/m3", "mbars/uL")
      const parts = splitRatio(unit);
      if (!parts) return undefined;
      const p = pressureFactor(parts[0]);
      const q = flowFactor(parts[1]);
      if (p !== undefined && q !== undefined) return p / q;
      const v = VOLUME[parts[1]];
      const m = /^(.*?)(s|min)$/.exec(parts[0]);
      if (v !== undefined && m) {
        const pp = pressureFactor(m[1] as string);
        if (pp !== undefined) return (pp * (TIME[m[2] as string] as number)) / v;
      }
      return undefined;
    }
    case 'compliance': {
      const parts = splitRatio(unit);
      if (!parts) return undefined;
      const v = VOLUME[parts[0]];
      const p = pressureFactor(parts[1]);
      return v !== undefined && p !== undefined ? v / p : undefined;
    }
    case 'density':
      return ({ 'kg/m3': 1, 'g/mL': 1e3, 'g/ml': 1e3, 'g/cm3': 1e3, 'kg/L': 1e3, 'g/L': 1 } as Record<string, number>)[unit];
    case 'temperature':
    case 'dimensionless':
      return undefined;
  }
}

/** Unit examples per dimension, for error messages. */
export const UNIT_EXAMPLES: Record<Dimension, string> = {
  length: '"250 um", "1.6 mm", "10 cm", "1/16 in" or metres as a number',
  volume: '"5 uL", "2 mL", "300 nL" or m³ as a number',
  pressure: '"2 bar", "300 mbar", "50 kPa", "2 MPa", "30 psi" or Pa as a number',
  temperature: '"22 C" or "295.15 K" (a bare number is kelvin)',
  'temperature-difference': '"1 K" (a bare number is kelvin)',
  viscosity: '"1.2 mPa s", "1.2 cP" or Pa·s as a number',
  compressibility: '"4.6e-10 1/Pa", "0.46 1/GPa" or 1/Pa as a number',
  resistance: '"2.3 mbar/(uL/min)", "1.4e13 Pa s/m3" or Pa·s/m³ as a number',
  compliance: '"0.01 uL/mbar", "98 nL/kPa", "5 uL/bar" or m³/Pa as a number',
  density: '"1.05 g/mL", "1050 kg/m3" or kg/m³ as a number',
  dimensionless: 'a plain number such as 0.3',
};

/** Normalises a unit spelling: micro signs → u, drops spaces, middle dots, asterisks, carets. */
function normaliseUnit(raw: string): string {
  return raw.replace(/[µμ]/g, 'u').replace(/[\s·⋅*^]/g, '').replace(/³/g, '3').replace(/²/g, '2');
}

/**
 * Parses "value unit" into SI. Returns the SI value, or an error sentence (caller locates it).
 * Fractions are allowed for the number ("1/16 in").
 */
export function parseQuantity(text: string, dim: Dimension): { value: number } | { error: string } {
  const m = /^\s*([-+]?(?:\d+\/\d+|(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?))\s*(.*?)\s*$/.exec(text);
  if (!m) return { error: `"${text}" does not start with a number` };
  const numText = m[1] as string;
  const slash = numText.indexOf('/');
  const number = slash > 0 ? Number(numText.slice(0, slash)) / Number(numText.slice(slash + 1)) : Number(numText);
  const unitRaw = m[2] as string;
  if (!Number.isFinite(number)) return { error: `"${text}" is not a finite number` };
  if (unitRaw === '') return { value: number };
  const unit = normaliseUnit(unitRaw);
  if (dim === 'temperature') {
    if (unit === 'K') return { value: number };
    if (unit === 'C' || unit === '°C' || unit === 'degC') return { value: number + 273.15 };
    return { error: `unknown temperature unit "${unitRaw}"` };
  }
  const factor = unitFactor(unit, dim);
  if (factor === undefined) return { error: `unknown ${dim} unit "${unitRaw}"` };
  return { value: number * factor };
}
