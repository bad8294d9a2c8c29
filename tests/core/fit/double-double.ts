/**
 * Double-double arithmetic (≈ 32 significant digits; Dekker 1971, "A floating-point technique for
 * extending the available precision"; Hida, Li & Bailey 2001, QD library) — just enough to evaluate
 * the Lanczos1 residuals, whose sum of squares (1.4e-25) lies below the rounding floor of doubles.
 * A value is the unevaluated sum hi + lo with |lo| ≤ ulp(hi)/2.
 */
export type DD = [number, number];

const SPLITTER = 134217729; // 2^27 + 1

function twoSum(a: number, b: number): DD {
  const s = a + b;
  const bb = s - a;
  return [s, a - (s - bb) + (b - bb)];
}

function quickTwoSum(a: number, b: number): DD {
  const s = a + b;
  return [s, b - (s - a)];
}

function split(a: number): DD {
  const c = SPLITTER * a;
  const hi = c - (c - a);
  return [hi, a - hi];
}

function twoProd(a: number, b: number): DD {
  const p = a * b;
  const [ah, al] = split(a);
  const [bh, bl] = split(b);
  return [p, ah * bh - p + ah * bl + al * bh + al * bl];
}

export function add(a: DD, b: DD): DD {
  const [s, e] = twoSum(a[0], b[0]);
  const [t, f] = twoSum(a[1], b[1]);
  let [hi, lo] = quickTwoSum(s, e + t);
  [hi, lo] = quickTwoSum(hi, lo + f);
  return [hi, lo];
}

export function neg(a: DD): DD {
  return [-a[0], -a[1]];
}

export function mul(a: DD, b: DD): DD {
  const [p, e] = twoProd(a[0], b[0]);
  return quickTwoSum(p, e + (a[0] * b[1] + a[1] * b[0]));
}

export function div(a: DD, b: DD): DD {
  const q1 = a[0] / b[0];
  const r = add(a, neg(mul([q1, 0], b)));
  const q2 = r[0] / b[0];
  const r2 = add(r, neg(mul([q2, 0], b)));
  const q3 = r2[0] / b[0];
  return add(quickTwoSum(q1, q2), [q3, 0]);
}

const LN2: DD = [0.6931471805599453, 2.3190468138462996e-17];

/** exp(a): a = k·ln 2 + r, exp(r/1024) by Taylor series, squared ten times, times 2^k. */
export function exp(a: DD): DD {
  const k = Math.round(a[0] / LN2[0]);
  let r = add(a, neg(mul([k, 0], LN2)));
  r = [r[0] / 1024, r[1] / 1024];
  let term: DD = [1, 0];
  let sum: DD = [1, 0];
  for (let i = 1; i < 20; i++) {
    term = div(mul(term, r), [i, 0]);
    sum = add(sum, term);
    if (Math.abs(term[0]) < 1e-36) break;
  }
  for (let i = 0; i < 10; i++) sum = mul(sum, sum);
  const scale = 2 ** k;
  return [sum[0] * scale, sum[1] * scale];
}

/** Exact decimal → double-double for Fortran-style numbers with ≤ 15 significant digits (e.g. "2.513400000000E+00"). */
export function parseDD(text: string): DD {
  const m = text.trim().match(/^([+-]?)(\d*)\.?(\d*)(?:[eEdD]([+-]?\d+))?$/);
  if (!m) throw new Error(`not a number: ${text}`);
  const digits = (m[2] ?? '') + (m[3] ?? '');
  const mantissa = Number(digits);
  if (!Number.isSafeInteger(mantissa)) throw new Error(`too many digits for an exact mantissa: ${text}`);
  const exponent = Number(m[4] ?? 0) - (m[3] ?? '').length;
  let v: DD = [mantissa, 0];
  if (exponent > 0) v = mul(v, [10 ** exponent, 0]);
  else if (exponent < 0) v = div(v, [10 ** -exponent, 0]);
  return m[1] === '-' ? neg(v) : v;
}
