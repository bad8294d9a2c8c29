/**
 * simulate(network, program, options): true (noise-free) pressures and flows of a lumped
 * network driven by a program of setpoints. Linear networks are solved exactly per program
 * segment (exact.ts); networks with trapped gas by the adaptive Rosenbrock integrator
 * (rosenbrock.ts).
 */
import { InputError } from '../errors';
import { assemble, evalAffine, hasGas, massAt, type Assembled } from './assemble';
import { SegmentPropagator } from './exact';
import { assembleAt } from './forcing';
import { luFactor, luSolve } from './matrix';
import { compileProgram, pieceAt, type CompiledProgram } from './program';
import { integrateSegment, SegmentRhs } from './rosenbrock';
import type { Network, Program, SimulationOptions, SimulationResult } from './types';

/** Output times from the options: explicit, or k/sampleRateHz for k = 0 … ⌊duration·rate⌋. */
export function outputTimes(options: SimulationOptions): Float64Array {
  if (options.timesS) {
    const t = options.timesS;
    for (let i = 0; i < t.length; i++) {
      const v = t[i] as number;
      if (!(Number.isFinite(v) && v >= 0) || (i > 0 && !(v > (t[i - 1] as number)))) {
        throw new InputError('bad-times', `output time ${i + 1} (${v} s) is negative, not a number or not after the previous one`, 'give increasing times ≥ 0');
      }
    }
    return t;
  }
  const rate = options.sampleRateHz;
  const dur = options.durationS;
  if (!(rate !== undefined && rate > 0 && Number.isFinite(rate))) throw new InputError('bad-sample-rate', `sample rate must be a positive number of Hz, got ${rate}`, 'e.g. 10');
  if (!(dur !== undefined && dur > 0 && Number.isFinite(dur))) throw new InputError('bad-duration', `duration must be a positive number of seconds, got ${dur}`, 'e.g. 120');
  const count = Math.floor(dur * rate + 1e-9) + 1;
  if (count > 50_000_000) throw new InputError('too-many-samples', `${count} samples requested`, 'lower the sample rate or the duration');
  const t = new Float64Array(count);
  for (let k = 0; k < count; k++) t[k] = k / rate;
  return t;
}

/** Drive values and slopes of the segment that starts at tS. */
function drivesAt(prog: CompiledProgram, tS: number): { u0: Float64Array; u1: Float64Array } {
  const n = prog.names.length;
  const u0 = new Float64Array(n);
  const u1 = new Float64Array(n);
  prog.pieces.forEach((ps, d) => {
    const p = pieceAt(ps, tS);
    u0[d] = p.v0 + p.slope * (tS - p.startS);
    u1[d] = p.slope;
  });
  return { u0, u1 };
}

/** Steady state K·x + B·u + h = 0 (independent of the compliances, gas included). */
export function steadyState(sys: Assembled, u: Float64Array): Float64Array {
  const n = sys.nState;
  const rhs = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let r = sys.h[i] as number;
    for (let d = 0; d < sys.nDrive; d++) r += (sys.B[i * sys.nDrive + d] as number) * (u[d] as number);
    rhs[i] = -r;
  }
  // Row equilibration first: node rows are O(1/R) ~ 1e-13 while lag rows are O(1/τ) ~ 1e2, and the
  // singularity test of the LU is relative to the largest entry.
  const k = { n, a: new Float64Array(sys.K.a) };
  for (let i = 0; i < n; i++) {
    let m = 0;
    for (let j = 0; j < n; j++) m = Math.max(m, Math.abs(k.a[i * n + j] as number));
    if (m === 0) continue;
    for (let j = 0; j < n; j++) k.a[i * n + j] = (k.a[i * n + j] as number) / m;
    rhs[i] = (rhs[i] as number) / m;
  }
  const lu = luFactor(k);
  if (lu.singular) {
    throw new InputError('no-steady-state', 'the network has no steady state: some node has no resistive path to ground, a head or a pressure source', "connect every node through resistances to an outlet, or use initial 'rest'");
  }
  return luSolve(lu, rhs);
}

/**
 * Simulates `network` driven by `program` and returns the true (noise-free) pressures (Pa gauge) per
 * node, flows (m³/s) per resistor, source outputs, setpoints and lagged probes at the output times.
 * Starts from the steady state of the drives at t = 0 unless `initial: 'rest'`. Linear networks:
 * exact per program segment (exact.ts); a node with trapped gas: adaptive Rosenbrock (rosenbrock.ts),
 * relative tolerance 1e-8 by default. Throws InputError for an inconsistent network or program.
 *
 * @example
 * const res = simulate(net, { channels: [{ name: 'flow', quantity: 'flow', points: [{ timeS: 0, valueSI: 1e-10, rampS: 0 }] }] },
 *   { sampleRateHz: 10, durationS: 60 });
 * res.nodePressurePa['node']; // Float64Array, Pa
 */
export function simulate(network: Network, program: Program, options: SimulationOptions): SimulationResult {
  const prog = compileProgram(program);
  const sys = assemble(network, prog.names, options.probes ?? []);
  const times = outputTimes(options);
  const nOut = times.length;
  const method = options.method === 'exact' || options.method === 'nonlinear' ? options.method : hasGas(sys) ? 'nonlinear' : 'exact';
  if (method === 'exact' && hasGas(sys)) {
    throw new InputError('nonlinear-network', 'the exact solver cannot take a node with trapped gas (its compliance depends on pressure)', "use method 'auto' or 'nonlinear'");
  }

  const start = drivesAt(prog, 0);
  const n = sys.nState;
  let x: Float64Array = options.initial === 'rest' ? new Float64Array(n) : steadyState(sys, start.u0);
  // All states in one flat array (sample-major): no per-sample allocation on long, fast logs.
  const states = new Float64Array(nOut * n);
  const stats = { acceptedSteps: 0, rejectedSteps: 0 };

  // Segments: [0, b1), [b1, b2), … up to the last output time.
  const tEnd = nOut > 0 ? (times[nOut - 1] as number) : 0;
  const bounds = [0, ...prog.breakpointsS.filter((b) => b < tEnd), tEnd];
  let k = 0;
  while (k < nOut && (times[k] as number) === 0) states.set(x, n * k++);

  const absTol = method === 'nonlinear' ? tolerances(sys, prog, options) : new Float64Array(0);
  let h = Number.NaN;
  const mass = new Float64Array(n);
  for (let seg = 0; seg + 1 < bounds.length; seg++) {
    const t0 = bounds[seg] as number;
    const t1 = bounds[seg + 1] as number;
    if (!(t1 > t0)) continue;
    const { u0, u1 } = drivesAt(prog, t0);
    const firstK = k;
    const targets: number[] = [];
    while (k < nOut && (times[k] as number) <= t1 && ((times[k] as number) < t1 || seg + 2 === bounds.length)) targets.push((times[k++] as number) - t0);
    const lastIsEnd = targets.length > 0 && targets[targets.length - 1] === t1 - t0;
    if (!lastIsEnd) targets.push(t1 - t0);
    if (method === 'exact') {
      massAt(sys, x, mass);
      const prop = new SegmentPropagator(sys, assembleAt(sys, mass, u0, u1));
      let s = 0;
      let next: Float64Array = new Float64Array(n);
      for (let i = 0; i < targets.length; i++) {
        const tg = targets[i] as number;
        prop.step(x, s, tg - s, next);
        [x, next] = [next, x];
        s = tg;
        if (firstK + i < k) states.set(x, n * (firstK + i));
      }
    } else {
      const rhs = new SegmentRhs(sys, u0, u1);
      if (!Number.isFinite(h)) h = initialStep(rhs, x, t1 - t0);
      const res = integrateSegment(rhs, x, targets, h, { relTol: options.relTol ?? 1e-8, absTol }, stats, (i, xs) => {
        if (firstK + i < k) states.set(xs, n * (firstK + i));
      });
      x = res.x;
      h = res.h;
    }
  }
  return collect(sys, prog, network, times, states, method, stats);
}

/** Initial step: a small fraction of the fastest local time scale (the controller grows it quickly). */
function initialStep(rhs: SegmentRhs, x: Float64Array, span: number): number {
  const n = x.length;
  const f = new Float64Array(n);
  rhs.f(0, x, f);
  const j = rhs.jacobian(x, f);
  let norm = 0;
  for (let i = 0; i < n; i++) {
    let s = 0;
    for (let c = 0; c < n; c++) s += Math.abs(j[i * n + c] as number);
    norm = Math.max(norm, s);
  }
  return Math.min(span, norm > 0 ? 1e-3 / norm : span);
}

/** Absolute tolerance per state: 1e-8 of the largest steady value of its kind (pressure or flow) over the program. */
function tolerances(sys: Assembled, prog: CompiledProgram, options: SimulationOptions): Float64Array {
  let pScale = 1;
  let qScale = 0;
  const levels = [0, ...prog.breakpointsS];
  for (const t of levels) {
    const { u0 } = drivesAt(prog, t);
    let xs: Float64Array;
    try {
      xs = steadyState(sys, u0);
    } catch {
      xs = new Float64Array(sys.nState);
    }
    for (let i = 0; i < sys.nState; i++) {
      const v = Math.abs(xs[i] as number);
      if (sys.isFlowState[i]) qScale = Math.max(qScale, v);
      else pScale = Math.max(pScale, v);
    }
    for (const q of sys.resistorFlow.values()) qScale = Math.max(qScale, Math.abs(evalAffine(q, xs, u0)));
  }
  if (qScale === 0) qScale = 1e-12;
  const tol = new Float64Array(sys.nState);
  for (let i = 0; i < sys.nState; i++) tol[i] = sys.isFlowState[i] ? 1e-8 * qScale : (options.absTolPa ?? 1e-8 * pScale);
  return tol;
}

function collect(
  sys: Assembled,
  prog: CompiledProgram,
  network: Network,
  times: Float64Array,
  states: Float64Array,
  method: 'exact' | 'nonlinear',
  stats: { acceptedSteps: number; rejectedSteps: number },
): SimulationResult {
  const nOut = times.length;
  const series = (): Float64Array => new Float64Array(nOut);
  const nodePressurePa: Record<string, Float64Array> = {};
  const resistorFlowM3PerS: Record<string, Float64Array> = {};
  const sourceOutput: Record<string, Float64Array> = {};
  const setpoint: Record<string, Float64Array> = {};
  const probe: Record<string, Float64Array> = {};
  for (const n of network.nodes) nodePressurePa[n.id] = series();
  for (const id of sys.resistorFlow.keys()) resistorFlowM3PerS[id] = series();
  for (const id of sys.sourceOutput.keys()) sourceOutput[id] = series();
  for (const name of prog.names) setpoint[name] = series();
  for (const id of sys.probe.keys()) probe[id] = series();
  const n = sys.nState;
  const u = new Float64Array(prog.names.length);
  for (let k = 0; k < nOut; k++) {
    const x = states.subarray(n * k, n * (k + 1));
    const t = times[k] as number;
    prog.pieces.forEach((ps, d) => {
      const p = pieceAt(ps, t);
      u[d] = p.v0 + p.slope * (t - p.startS);
    });
    for (const [id, i] of sys.nodeIndex) (nodePressurePa[id] as Float64Array)[k] = x[i] as number;
    for (const [id, e] of sys.resistorFlow) (resistorFlowM3PerS[id] as Float64Array)[k] = evalAffine(e, x, u);
    for (const [id, e] of sys.sourceOutput) (sourceOutput[id] as Float64Array)[k] = evalAffine(e, x, u);
    prog.names.forEach((name, d) => ((setpoint[name] as Float64Array)[k] = u[d] as number));
    for (const [id, e] of sys.probe) (probe[id] as Float64Array)[k] = evalAffine(e, x, u);
  }
  return { timeS: times, nodePressurePa, resistorFlowM3PerS, sourceOutput, setpoint, probe, method, stats };
}
