/** Number formatting shared by verdict reasons, tables and reports. */

/** A number with `digits` significant digits; exponent form outside [1e-3, 1e6). */
export function formatNumber(x: number | null | undefined, digits = 4): string {
  if (x === null || x === undefined || Number.isNaN(x)) return '—';
  if (!Number.isFinite(x)) return x > 0 ? '∞' : '−∞';
  if (x === 0) return '0';
  const a = Math.abs(x);
  if (a >= 1e-3 && a < 1e6) return String(Number(x.toPrecision(digits)));
  const [m, e] = x.toExponential(digits - 1).split('e');
  return `${String(Number(m))}e${Number(e)}`;
}
