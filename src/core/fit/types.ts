/**
 * Contract of the transient fitter (src/core/fit). Shared by step analysis, physics,
 * QC and the UI: change it only together with its users.
 *
 * Model, for t ≥ t_d (t relative to the step onset t₀, in s):
 *   y(t) = y∞ + Σᵢ aᵢ·exp(−(t − t_d)/τᵢ) + b·t     (b only with drift)
 * and y(t) = y∞ + Σᵢ aᵢ + b·t for t < t_d (the pre-step level held during the dead time).
 */

/** One window of data to fit: time relative to the step onset (s) and the response in SI. */
export interface TransientData {
  /** Seconds since the step onset; increasing. */
  tS: Float64Array;
  /** Response values in SI (Pa or m³/s). NaN samples are ignored. */
  y: Float64Array;
}

export type RobustLoss = 'none' | 'huber' | 'tukey';

export interface TransientFitOptions {
  /** Number of exponential terms, or 'auto' (choose 1–3 by BIC, F-test shown). Default 'auto'. */
  terms?: 1 | 2 | 3 | 'auto';
  /** Fit a dead time t_d ≥ 0. Default false. */
  deadTime?: boolean;
  /** Fit a linear drift b (units of y per s). Default false. */
  drift?: boolean;
  /** Outlier-robust loss by iteratively reweighted least squares. Default 'none'. */
  robust?: RobustLoss;
  /** Known noise standard deviation in y units; estimated from the data when absent. */
  noiseSigma?: number;
  /** Cap on optimiser iterations per start. */
  maxIterations?: number;
  /**
   * Automatic order only: skip the 2-term fit when the 1-term residuals are random and no second term
   * could win by BIC (order-screen.ts). Default true; false fits every order (the reference behaviour).
   */
  orderScreen?: boolean;
}

/** A fitted parameter with its uncertainty (SI units, named by the parameter). */
export interface Estimate {
  value: number;
  /** Standard error (1σ) from the scaled covariance at the optimum. */
  standardError: number;
  /** 95 % confidence interval [lo, hi] from the t-quantile with the fit's degrees of freedom. */
  ci95: [number, number];
}

export interface ExponentialTerm {
  tauS: Estimate;
  /** aᵢ in units of y (y∞ + a is the value at t = t_d). */
  amplitude: Estimate;
}

/** Machine-readable flags; every flag also appears as a readable warning. */
export type FitFlagCode =
  | 'not-converged'
  | 'parameter-at-bound'
  | 'tau-below-resolution'
  | 'tau-beyond-window'
  | 'not-settled'
  | 'residual-structure'
  | 'degenerate-taus'
  | 'too-few-points'
  | 'inconclusive';

export interface FitFlag {
  code: FitFlagCode;
  message: string;
}

export interface OrderCandidate {
  terms: number;
  ssr: number;
  dof: number;
  bic: number;
  aicc: number;
  /** p-value of the F-test of this order against the next lower one (null for 1 term). */
  fTestP: number | null;
  /**
   * Whether this candidate was usable (converged, non-degenerate). A 2-term candidate ruled out by the
   * screen (`orderSelection.screenedOut`) is listed with acceptable false and NaN ssr/bic/aicc (not fitted).
   */
  acceptable: boolean;
}

export interface TransientFit {
  model: { terms: number; deadTime: boolean; drift: boolean; robust: RobustLoss };
  yInf: Estimate;
  /** Sorted by τ ascending. */
  terms: ExponentialTerm[];
  deadTimeS: Estimate | null;
  driftPerS: Estimate | null;
  /** Parameter order of `correlation`, e.g. ['yInf', 'a1', 'tau1_s', 't_d_s']. */
  parameterNames: string[];
  /** Correlation matrix of the parameters (row-major, parameterNames order). */
  correlation: number[][];
  converged: boolean;
  /** Why the optimiser stopped, in words (e.g. 'relative step below 1e-10'). */
  stopReason: string;
  iterations: number;
  /** Points used (after dropping NaN). */
  n: number;
  dof: number;
  /** Root-mean-square residual, y units (unweighted). */
  rmse: number;
  r2: number;
  /** Noise σ used for weights, y units (given or estimated). */
  noiseSigma: number;
  /** Lag-1 autocorrelation of the residuals. */
  residualLag1: number;
  /** Wald–Wolfowitz runs test z-score of the residual signs. */
  runsZ: number;
  /** Window length divided by the slowest τ. */
  windowInTaus: number;
  /** Window covers ≥ 5 slowest τ (plateau observed, not extrapolated). */
  settled: boolean;
  /** Times after t₀ (s) to reach 63.2 %, 95 %, 99 % of the total change, from the model. */
  t63S: number;
  t95S: number;
  t99S: number;
  flags: FitFlag[];
  orderSelection: {
    criterion: 'BIC';
    candidates: OrderCandidate[];
    chosenTerms: number;
    /** Why higher orders were not fitted, when the screen (order-screen.ts) ruled them out; absent otherwise. */
    screenedOut?: string;
  } | null;
}

/** Options of {@link SharedTauFit} fits: as for one window; `noiseSigma`, when given, applies to every window. */
export type SharedTauFitOptions = TransientFitOptions;

/** Per-window part of a shared-τ fit (SI, units of that window's response). */
export interface SharedWindowFit {
  yInf: Estimate;
  /** Amplitudes in the order of `tausS`. */
  amplitudes: Estimate[];
  driftPerS: Estimate | null;
  /** Points used. */
  n: number;
  rmse: number;
  /** Noise σ used to weight this window, y units. */
  noiseSigma: number;
}

/** Several windows fitted together with common time constants (and a common dead time). */
export interface SharedTauFit {
  model: TransientFit['model'];
  /** Common time constants, ascending. */
  tausS: Estimate[];
  deadTimeS: Estimate | null;
  windows: SharedWindowFit[];
  converged: boolean;
  stopReason: string;
  iterations: number;
  /** Points used in all windows. */
  n: number;
  dof: number;
  flags: FitFlag[];
  orderSelection: TransientFit['orderSelection'];
}
