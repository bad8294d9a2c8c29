/** The renderer's state: what is open, what was detected, edited and computed. */
import type { ImportOptions } from '../core/import/types';
import type { Setup, Step } from '../core/steps/types';
import type { AnalysisView, Capabilities, FitSettings, RecordingSummary, SeriesSet, StepsResult } from './worker/protocol';
import type { StepEdit } from './steps-edit';

export type ViewName = 'import' | 'recording' | 'steps' | 'diagnosis' | 'report' | 'whatif' | 'signoff';
export const VIEWS: readonly ViewName[] = ['import', 'recording', 'steps', 'diagnosis', 'report', 'whatif', 'signoff'];

export interface OpenFile {
  path: string;
  name: string;
  bytes: Uint8Array;
  sha256: string;
}

export interface AppState {
  view: ViewName;
  capabilities: Capabilities | null;
  files: OpenFile[];
  importOptions: ImportOptions[];
  /** Start of the second log on the first log's time axis, s (null = align by absolute timestamps). */
  mergeOffsetS: number | null;
  recording: RecordingSummary | null;
  /** Why the last import failed (shown with the options that can fix it). */
  importError: string | null;
  overview: SeriesSet | null;
  setup: Setup;
  chip: OpenFile | null;
  detected: StepsResult | null;
  steps: Step[];
  stepEdits: StepEdit[];
  selectedStep: number | null;
  analysis: AnalysisView | null;
  analysisRuns: number;
  analyzing: boolean;
  fit: FitSettings;
  /** Step shown in the step-fit view. */
  fitStep: number;
}

export function initialState(): AppState {
  return {
    view: 'import',
    capabilities: null,
    files: [],
    importOptions: [],
    mergeOffsetS: null,
    recording: null,
    importError: null,
    overview: null,
    setup: 'flow-driven',
    chip: null,
    detected: null,
    steps: [],
    stepEdits: [],
    selectedStep: null,
    analysis: null,
    analysisRuns: 0,
    analyzing: false,
    fit: { terms: 'auto', deadTime: false, drift: false, robust: 'none' },
    fitStep: 0,
  };
}
