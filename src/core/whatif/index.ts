/** What-if sweeps of one design variable: predicted τ, t₉₅, steady state and step responses. */
export { parseVary, SWEEPABLE, type VarySpec } from './vary';
export { whatIf, meetingRanges, type WhatIfOptions, type WhatIfResult, type WhatIfRow } from './sweep';
export { whatIfStepResponses, type StepResponse, type ResponseOptions } from './responses';
export { applyValue, findTarget } from './apply';
