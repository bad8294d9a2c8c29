/**
 * A seeded synthetic flow-driven log with a known answer. Physics (physics.md §4.2, §3.3): a pump sets
 * Q into a compliant node drained through R, so after each step p(t) = p∞ + (p₀ − p∞)·e^(−t/τ) with
 * τ = R·C. The node's compliance is walls + liquid (C_rigid) plus a trapped air pocket that follows the
 * isothermal gas law, C_gas = V_atm·p_atm/p_abs² (so C falls at higher pressure: the fingerprint).
 * Each step uses the compliance at its mean absolute pressure over its window — the same definition the
 * analysis uses — found by fixed-point iteration. Written as a lab logger would: comment lines,
 * semicolons, units in brackets. All values invented for the demo scenario.
 */
import { createRng } from '../../src/core/stats/rng';

export interface SyntheticRun {
  text: string;
  /** τ of each step, s (true values). */
  tauS: number[];
  /** Onsets of the flow steps, s. */
  onsetsS: number[];
  rPaSPerM3: number;
  cRigidM3PerPa: number;
  /** Trapped air at atmospheric pressure, m³. */
  vAtmM3: number;
  ambientPa: number;
}

export const SAMPLE_RATE_HZ = 10;

/**
 * R = 3e13 Pa·s/m³ (5 mbar per µL/min), C_rigid = 1e-13 m³/Pa, V_atm = 5 µL at p_atm = 101300 Pa
 * (the ambient of sample-logs/chips/pdms-mixer.json), flow 0→10→20→30→20→10→0 µL/min every 60 s,
 * 10 Hz, noise σ = 0.4 mbar.
 */
export function flowDrivenRun(seed = 20261201): SyntheticRun {
  const rateHz = SAMPLE_RATE_HZ;
  const r = 3e13;
  const cRigid = 1e-13;
  const vAtm = 5e-9;
  const pAtm = 101300;
  const levelsUlMin = [0, 10, 20, 30, 20, 10, 0];
  const qOf = (ulMin: number): number => (ulMin * 1e-9) / 60;
  const onsets = levelsUlMin.slice(1).map((_, i) => (i + 1) * 60 - 30);
  const endS = (onsets[onsets.length - 1] as number) + 60;
  const n = Math.round(endS * rateHz);
  const t = Float64Array.from({ length: n + 1 }, (_, i) => i / rateHz);
  const levelAt = (i: number): number => {
    let k = 0;
    while (k < onsets.length && (t[i] as number) >= (onsets[k] as number) - 1e-9) k++;
    return k;
  };
  let taus = onsets.map(() => r * (cRigid + vAtm / pAtm));
  let p = new Float64Array(n + 1);
  for (let iter = 0; iter < 8; iter++) {
    p = new Float64Array(n + 1);
    for (let i = 1; i <= n; i++) {
      const k = levelAt(i);
      const target = r * qOf(levelsUlMin[k] as number);
      const tau = k === 0 ? 1 : (taus[k - 1] as number);
      p[i] = target + ((p[i - 1] as number) - target) * Math.exp(-1 / rateHz / tau);
    }
    // Mean absolute pressure of each step over [onset, next onset) → its compliance → its τ.
    taus = onsets.map((on, k) => {
      const end = onsets[k + 1] ?? endS;
      let s = 0;
      let m = 0;
      for (let i = 0; i <= n; i++) if ((t[i] as number) >= on && (t[i] as number) < end) { s += p[i] as number; m++; }
      const pAbs = pAtm + s / m;
      return r * (cRigid + (vAtm * pAtm) / (pAbs * pAbs));
    });
  }
  const rng = createRng(seed);
  const lines = ['# Lab: invented demo lab (Lagbench synthetic test data)', '# Chip: PDMS mixer M-07 (invented), air pocket left after priming', 'time [s];flow setpoint [uL/min];pressure [mbar]'];
  for (let i = 0; i <= n; i++) {
    const q = levelsUlMin[levelAt(i)] as number;
    lines.push(`${(t[i] as number).toFixed(2)};${q.toFixed(3)};${((p[i] as number) / 100 + 0.4 * rng.normal()).toFixed(4)}`);
  }
  return { text: `${lines.join('\n')}\n`, tauS: taus, onsetsS: onsets, rPaSPerM3: r, cRigidM3PerPa: cRigid, vAtmM3: vAtm, ambientPa: pAtm };
}
