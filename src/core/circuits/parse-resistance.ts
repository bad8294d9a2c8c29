/**
 * Parses a hydraulic resistance typed by a user (`--upstream-resistance`): a bare number is SI
 * (Pa·s/m³); a number followed by a unit of the display table (src/core/units/display.ts, e.g.
 * "2 mbar/(uL/min)", "1.2e13 Pa s/m3", "0.05 psi/(µL/min)") is converted to SI.
 */
import { InputError } from '../errors';
import { DISPLAY_UNITS } from '../units/display';

/** Spelling-insensitive key: drop spaces, middle dots and case; µ → u; ³ → 3. */
const key = (s: string): string =>
  s.replace(/[\s·*]/g, '').replace(/[µμ]/g, 'u').replace(/³/g, '3').toLowerCase();

/** Resistance in Pa·s/m³ from text; throws InputError naming the accepted units. */
export function parseResistance(text: string, what = '--upstream-resistance'): number {
  const m = /^\s*([+]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*?)\s*$/.exec(text);
  const units = DISPLAY_UNITS.resistance;
  const accepted = Object.keys(units).join(', ');
  if (!m) {
    throw new InputError('bad-resistance', `${what} '${text}' is not a positive number with an optional unit`, `Give e.g. 1.2e13 (Pa·s/m³) or "2 mbar/(uL/min)"; units: ${accepted}`);
  }
  const value = Number(m[1]);
  const unitText = m[2] ?? '';
  let perSi = 1;
  if (unitText !== '') {
    const found = Object.entries(units).find(([spelling, u]) => key(spelling) === key(unitText) || key(u.symbol) === key(unitText));
    if (!found) throw new InputError('unknown-resistance-unit', `${what}: unknown unit '${unitText}'`, `Use one of: ${accepted} (or a bare number in Pa·s/m³)`);
    perSi = found[1].perSi;
  }
  const si = value / perSi;
  if (!(si > 0) || !Number.isFinite(si)) {
    throw new InputError('bad-resistance', `${what} must be positive (got '${text}')`, 'Give the resistance of the tubing and sensors upstream of the chip');
  }
  return si;
}
