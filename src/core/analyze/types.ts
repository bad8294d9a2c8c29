/**
 * The analysis result: exactly the JSON that `lagbench analyze --json` prints (snake_case, SI,
 * units in the names; documented field by field in README.md). Non-finite numbers are null.
 * Later stages add to it (e.g. `physics` per step) without changing the fields below.
 */
import type { RobustLoss, SharedTauFit, TransientData, TransientFit, TransientFitOptions } from '../fit/types';
import type { Quantity } from '../recording/types';
import type { Ramp, Setup, Step, StepDetectionOptions } from '../steps/types';

/** The fitting functions the pipeline calls (src/core/fit); injectable so tests can count calls. */
export interface Fitter {
  fitTransient(data: TransientData, options: TransientFitOptions): TransientFit;
  /** Shared-τ fit of several windows; optional (no shared fits without it). */
  fitSharedTaus?: (windows: TransientData[], options: TransientFitOptions) => SharedTauFit;
}

export interface AnalyzeOptions {
  /** Setup; inferred from the channels when absent (and said so in `setup_reason`). */
  setup?: Setup;
  /** Response channel name; default: the first channel of the setup's response quantity. */
  responseChannel?: string;
  /** Step detection options (ignored with `steps`). */
  detection?: StepDetectionOptions;
  /** User steps (e.g. from a step list); skips detection. */
  steps?: Step[];
  /** Ramps of the user's programme (reported, not fitted); only with `steps`. */
  ramps?: Ramp[];
  /** Options passed to every transient fit. */
  fit?: TransientFitOptions;
  /** Most points passed to one fit; longer windows are block-averaged. Default 5000; 0 = never. */
  maxFitPoints?: number;
  /** Fit same-direction, same-level steps together with shared τ's. Default true when the fitter can. */
  sharedFits?: boolean;
  /** Called with the fraction done (0–1) and the stage. */
  onProgress?: (fraction: number, stage: string) => void;
  /** Software identity recorded in the result. */
  software?: { name: string; version: string };
}

export type Ci95 = [number | null, number | null];

export interface WarningJson {
  code: string;
  message: string;
  count?: number;
}

export interface TermJson {
  tau_s: number | null;
  tau_se_s: number | null;
  tau_ci95_s: Ci95;
  /** aᵢ, response units (Pa or m³/s). */
  amplitude: number | null;
  amplitude_se: number | null;
  amplitude_ci95: Ci95;
}

export interface OrderCandidateJson {
  terms: number;
  ssr: number | null;
  dof: number;
  bic: number | null;
  aicc: number | null;
  f_test_p: number | null;
  acceptable: boolean;
}

export interface FitJson {
  model: { terms: number; dead_time: boolean; drift: boolean; robust: RobustLoss };
  rmse: number | null;
  r2: number | null;
  converged: boolean;
  stop_reason: string;
  iterations: number;
  n: number;
  dof: number;
  noise_sigma: number | null;
  residual_lag1: number | null;
  runs_z: number | null;
  flags: { code: string; message: string }[];
  /** `screened_out`: why 2 terms were not fitted (the order screen), else null; that candidate then has null ssr/bic/aicc. */
  order_selection: { criterion: string; chosen_terms: number; candidates: OrderCandidateJson[]; screened_out: string | null } | null;
  parameter_names: string[];
  correlation: (number | null)[][];
  /** Samples per fitted point (block averaging of long windows; 1 = none). */
  samples_per_point: number;
}

export interface StepJson {
  index: number;
  /** Onset and window end on the log's time base, s. */
  start_s: number;
  end_s: number;
  origin: Step['origin'];
  shape: Step['shape'] | null;
  direction: Step['direction'];
  drive: { quantity: Quantity; channel: string | null; unit: string; before: number | null; after: number | null };
  response: { quantity: Quantity; channel: string; unit: string };
  /** Samples in the window given to the fit. */
  n_samples: number;
  terms: TermJson[];
  /** Final value y∞ of the response, response units. */
  y_inf: number | null;
  y_inf_se: number | null;
  y_inf_ci95: Ci95;
  dead_time_s: number | null;
  dead_time_se_s: number | null;
  dead_time_ci95_s: Ci95 | null;
  /** Linear drift b, response units per s (null unless fitted). */
  drift_per_s: number | null;
  drift_ci95_per_s: Ci95 | null;
  settled: boolean | null;
  window_in_taus: number | null;
  t63_s: number | null;
  t95_s: number | null;
  t99_s: number | null;
  /** The fit, or null when none could be made (see warnings). */
  fit: FitJson | null;
  /** True when the data cannot support the result (fit flagged inconclusive, not converged or missing). */
  inconclusive: boolean;
  warnings: WarningJson[];
  /** Filled by the physics stage (resistance, compliance, trapped air); absent until then. */
  physics?: Record<string, unknown>;
}

export interface SharedFitJson {
  direction: Step['direction'];
  /** Drive levels of the first step of the group, SI (the others agree within 2 % of the step or 3 σ). */
  drive_before: number | null;
  drive_after: number | null;
  step_indices: number[];
  model: { terms: number; dead_time: boolean; drift: boolean; robust: RobustLoss };
  /** Common time constants, ascending. */
  terms: { tau_s: number | null; tau_se_s: number | null; tau_ci95_s: Ci95 }[];
  dead_time_s: number | null;
  dead_time_ci95_s: Ci95 | null;
  /** Per step of the group (same order as step_indices): final value and amplitudes, response units. */
  windows: { step_index: number; y_inf: number | null; y_inf_ci95: Ci95; amplitudes: (number | null)[]; rmse: number | null; n: number }[];
  converged: boolean;
  stop_reason: string;
  iterations: number;
  n: number;
  dof: number;
  flags: { code: string; message: string }[];
}

export interface RampJson {
  start_s: number;
  end_s: number;
  before: number | null;
  after: number | null;
}

export interface AnalysisJson {
  software: { name: string; version: string };
  files: string[];
  setup: Setup;
  /** 'given', or why this setup was inferred. */
  setup_reason: string;
  detection: {
    origin: Step['origin'];
    channel: string | null;
    quantity: Quantity;
    unit: string;
    min_step_size: number | null;
    min_dwell_s: number | null;
  };
  /** Noise σ (MAD of first differences), SI, of the response and of the channel steps were found on. */
  noise_sigma: { response: number | null; response_unit: string; detection: number | null; detection_unit: string };
  steps: StepJson[];
  ramps: RampJson[];
  shared_fits: SharedFitJson[];
  warnings: WarningJson[];
}
