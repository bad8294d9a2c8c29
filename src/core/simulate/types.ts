/**
 * The lumped hydraulic network the simulator solves, the program of setpoints that drives it,
 * and what a simulation returns. SI throughout: pressures in Pa gauge, flows in m³/s,
 * resistances in Pa·s/m³, compliances in m³/Pa, volumes in m³, times in s.
 *
 * Electrical analogy (physics.md §1.1, §3.1): pressure ↔ voltage, flow ↔ current,
 * resistance ↔ resistor, compliance ↔ capacitor to ground (atmosphere).
 */

/** A node that stores liquid: C·dp/dt = Σ inflows. */
export interface CompliantNode {
  id: string;
  /** Linear compliance (walls, tubing, liquid, syringe), m³/Pa. May be 0 only if a gas volume is present. */
  complianceM3PerPa: number;
  /**
   * Trapped gas at this node: its volume at atmospheric pressure, m³. Isothermal ideal gas
   * (physics.md §3.3): V(p) = V_atm·p_atm/p_abs, so the gas adds C_gas(p) = V_atm·p_atm/p_abs²
   * with p_abs = p_atm + p. Makes the network nonlinear.
   */
  gasVolumeAtAtmM3?: number;
}

/** A resistance between two ends. An end is a node id, a source id, a head id or 'ground'. */
export interface Resistor {
  id: string;
  from: string;
  to: string;
  resistancePaSPerM3: number;
}

/** A pump: imposes a flow into a node. Its drive is a program channel (m³/s). */
export interface FlowSource {
  id: string;
  into: string;
  /** Name of the program channel giving the setpoint, m³/s. */
  drive: string;
  /** First-order lag of the delivered flow behind the setpoint, s (0 = ideal). */
  lagS?: number;
}

/** A pressure regulator: an end whose pressure follows a program channel (Pa gauge) with its own lag. */
export interface PressureSource {
  id: string;
  /** Name of the program channel giving the setpoint, Pa gauge. */
  drive: string;
  /** First-order lag of the delivered pressure behind the setpoint, s (0 = ideal). */
  lagS?: number;
  /** Constant added to the delivered pressure (e.g. the liquid head of its reservoir), Pa. */
  offsetPa?: number;
}

/** A reservoir whose liquid surface stands heightM above the reference: a constant pressure ρ·g·h. */
export interface HydrostaticHead {
  id: string;
  heightM: number;
  densityKgPerM3: number;
  /** Standard gravity 9.80665 m/s² (CGPM 1901, BIPM SI brochure) unless given. */
  gravityMPerS2?: number;
}

export interface Network {
  nodes: CompliantNode[];
  resistors: Resistor[];
  flowSources: FlowSource[];
  pressureSources: PressureSource[];
  heads: HydrostaticHead[];
  /** Ambient (atmospheric) pressure, Pa absolute; gas laws use p_abs = ambient + gauge. */
  ambientPressurePa: number;
}

/** One row of a program: at timeS the setpoint moves to valueSI, linearly over rampS (0 = a step). */
export interface ProgramPoint {
  timeS: number;
  valueSI: number;
  rampS: number;
}

export type DriveQuantity = 'pressure' | 'flow';

/** The setpoints of one drive over time. The first point is at t = 0 and sets the starting level. */
export interface ProgramChannel {
  name: string;
  quantity: DriveQuantity;
  points: ProgramPoint[];
}

export interface Program {
  channels: ProgramChannel[];
}

/** A lagged look at a node pressure, a resistor flow or a source output (a sensor's own first-order lag). */
export interface Probe {
  id: string;
  target: { kind: 'node' | 'resistor' | 'source'; id: string };
  /** First-order time constant, s (0 = none). */
  lagS: number;
}

export interface SimulationOptions {
  /** Output times (s, increasing). Either this or sampleRateHz + durationS. */
  timesS?: Float64Array;
  sampleRateHz?: number;
  durationS?: number;
  /** 'steady' (default): start from the steady state of the drives at t = 0; 'rest': all pressures 0. */
  initial?: 'steady' | 'rest';
  /** 'auto' (default): exact linear solver unless a node holds gas; 'nonlinear' forces the integrator. */
  method?: 'auto' | 'exact' | 'nonlinear';
  /** Integrator tolerances (nonlinear only): relative, and absolute in Pa. Defaults 1e-8 and 1e-8·pressure scale
   *  (global error then about 1e-6 of the pressure scale; it scales as tol^(2/3), a 2nd-order method). */
  relTol?: number;
  absTolPa?: number;
  probes?: Probe[];
}

/** True (noise-free) time series. */
export interface SimulationResult {
  timeS: Float64Array;
  /** Pressure per node id, Pa gauge. */
  nodePressurePa: Record<string, Float64Array>;
  /** Flow per resistor id, from → to, m³/s. */
  resistorFlowM3PerS: Record<string, Float64Array>;
  /** Delivered output per source id (Pa for pressure sources, m³/s for flow sources). */
  sourceOutput: Record<string, Float64Array>;
  /** Setpoint per program channel name, SI. */
  setpoint: Record<string, Float64Array>;
  /** Lagged probe values per probe id, SI. */
  probe: Record<string, Float64Array>;
  method: 'exact' | 'nonlinear';
  /** Integrator statistics (nonlinear): accepted and rejected steps. */
  stats: { acceptedSteps: number; rejectedSteps: number };
}
