/**
 * What-if sweeps for the desktop view, computed in the analysis worker: the core's parseVary, whatIf,
 * meetingRanges and whatIfStepResponses (src/core/whatif). This file only parses the drive text and
 * maps core results to the view model; every number comes from the core.
 */
import { parseQuantity } from '../../core/chip/quantity';
import { InputError } from '../../core/errors';
import type { Setup } from '../../core/nominal/types';
import { factorToSi, lookupUnit } from '../../core/units';
import { parseVary, whatIf, whatIfStepResponses } from '../../core/whatif';
import type { WhatIfRequest, WhatIfView } from './whatif-protocol';

/** Regulator pressure when none is given and the description has no operating pressure: 100 mbar (common practice, no source; as the CLI). */
const DEFAULT_PRESSURE_PA = 1e4;
/** Pump flow when none is given: 10 µL/min (as the CLI). */
const DEFAULT_FLOW_M3_PER_S = 10e-9 / 60;
/** Points per predicted response (enough for a smooth overlay). */
const RESPONSE_POINTS = 301;

/** Parses the drive: a flow such as "10 uL/min" (flow-driven) or a pressure such as "200 mbar"; null = default. */
export function parseDrive(text: string, setup: Setup): number | null {
  const t = text.trim();
  if (t === '') return null;
  if (setup === 'pressure-driven') {
    const q = parseQuantity(t, 'pressure');
    if ('error' in q) throw new InputError('bad-drive', `the regulator pressure '${t}': ${q.error}`, 'write a pressure such as 200 mbar');
    return q.value;
  }
  const m = /^\s*([-+]?(?:\d+\.?\d*|\.\d+)(?:[eE][-+]?\d+)?)\s*(.*)$/.exec(t);
  const unit = m?.[2]?.trim() ?? '';
  const found = unit === '' ? null : lookupUnit(unit);
  if (!m || unit === '' || found?.kind !== 'flow') throw new InputError('bad-drive', `the pump flow '${t}' is not a flow with a unit`, 'write a flow such as 10 uL/min');
  return Number(m[1]) * factorToSi(found);
}

export function runWhatIf(req: WhatIfRequest): WhatIfView {
  const spec = parseVary(req.vary);
  const target = req.targetT95S ?? undefined;
  const given = parseDrive(req.driveText, req.setup);
  const opts = (driveSI: number) => ({ setup: req.setup, driveSI, ...(target !== undefined ? { targetT95S: target } : {}) });
  let res = whatIf(req.chipText, req.chipName, spec, opts(given ?? (req.setup === 'flow-driven' ? DEFAULT_FLOW_M3_PER_S : DEFAULT_PRESSURE_PA)));
  if (given === null && req.setup === 'pressure-driven' && res.baseline.operatingPressurePa > 0) {
    res = whatIf(req.chipText, req.chipName, spec, opts(res.baseline.operatingPressurePa));
  }
  // Same length for every response so they overlay: 1.5 × the slowest nominal t95 (as the CLI's --responses).
  const slowest = Math.max(...res.rows.map((r) => r.t95S.nominal).filter((x) => Number.isFinite(x)));
  const durationS = Number.isFinite(slowest) && slowest > 0 ? 1.5 * slowest : 1;
  const curves = whatIfStepResponses(req.chipText, req.chipName, spec, { setup: req.setup, driveSI: res.driveSI }, { durationS, points: RESPONSE_POINTS });
  return {
    setup: res.setup,
    vary: { target: spec.target, property: spec.property, dimension: spec.dimension, text: spec.text },
    driveSI: res.driveSI,
    targetT95S: res.targetT95S,
    rows: res.rows.map((r) => ({
      value: r.value,
      resistanceTotalPaSPerM3: r.resistanceTotalPaSPerM3,
      complianceM3PerPa: r.complianceM3PerPa,
      tauS: r.tauS,
      t95S: r.t95S,
      steadyFlowM3PerS: r.steadyFlowM3PerS,
      steadySourcePressurePa: r.steadySourcePressurePa,
      meetsTarget: r.meetsTarget,
    })),
    meetingRanges: res.meetingRanges,
    curves: curves.map((c) => ({ value: c.value, tS: Array.from(c.timeS), fraction: Array.from(c.fraction) })),
    notes: res.baseline.notes,
  };
}
