/**
 * A value with a plausible low and high bound: the way every nominal quantity is carried.
 * Bounds come from stated property uncertainty (moduli ranges, fit constants, temperature
 * tolerance); they are ranges, not statistical confidence intervals.
 */
export interface ValueRange {
  low: number;
  nominal: number;
  high: number;
}

/** A range with all three values equal (no stated uncertainty). */
export function exact(value: number): ValueRange {
  return { low: value, nominal: value, high: value };
}

/** A range from a nominal value and a relative half-width (0.05 = ±5 %). */
export function relative(nominal: number, halfWidth: number): ValueRange {
  return { low: nominal * (1 - halfWidth), nominal, high: nominal * (1 + halfWidth) };
}

/** Sum of ranges, bound by bound (worst case: all lows together, all highs together). */
export function sumRanges(ranges: readonly ValueRange[]): ValueRange {
  const out = { low: 0, nominal: 0, high: 0 };
  for (const r of ranges) {
    out.low += r.low;
    out.nominal += r.nominal;
    out.high += r.high;
  }
  return out;
}

/** Multiplies each bound by a non-negative factor. */
export function scaleRange(r: ValueRange, factor: number): ValueRange {
  return { low: r.low * factor, nominal: r.nominal * factor, high: r.high * factor };
}

/** Sorts three values into a range whose low ≤ nominal ≤ high. */
export function ordered(a: number, nominal: number, b: number): ValueRange {
  return { low: Math.min(a, nominal, b), nominal, high: Math.max(a, nominal, b) };
}
