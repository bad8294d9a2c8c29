/**
 * A program as piecewise-linear setpoints: steps are jumps, ramps are linear pieces.
 * The simulator integrates between breakpoints, where every drive is affine in time.
 */
import { InputError } from '../errors';
import type { Program, ProgramChannel } from './types';

/** A linear piece of one channel: value = v0 + slope·(t − startS) on [startS, endS). */
export interface Piece {
  startS: number;
  endS: number;
  v0: number;
  slope: number;
}

/** Linear pieces of a channel, covering [0, ∞). Validates order and ramp overlap. */
export function channelPieces(channel: ProgramChannel): Piece[] {
  const pts = channel.points;
  const first = pts[0];
  if (!first) {
    throw new InputError('empty-program', `program channel '${channel.name}' has no setpoints`, 'give at least one row, at time 0');
  }
  if (first.timeS !== 0) {
    throw new InputError('program-start', `program channel '${channel.name}' starts at ${first.timeS} s, not at 0`, 'add a first row at time 0 that sets the starting level');
  }
  const pieces: Piece[] = [];
  let level = first.valueSI;
  let t = 0;
  for (let k = 1; k < pts.length; k++) {
    const p = pts[k] as (typeof pts)[number];
    if (!(p.timeS >= t)) {
      throw new InputError('program-order', `program channel '${channel.name}': row ${k + 1} at ${p.timeS} s starts before the previous step or ramp has finished (${t} s)`, 'sort the rows by time and let each ramp end before the next row');
    }
    if (p.timeS > t) pieces.push({ startS: t, endS: p.timeS, v0: level, slope: 0 });
    if (p.rampS > 0) {
      pieces.push({ startS: p.timeS, endS: p.timeS + p.rampS, v0: level, slope: (p.valueSI - level) / p.rampS });
    }
    level = p.valueSI;
    t = p.timeS + p.rampS;
  }
  pieces.push({ startS: t, endS: Infinity, v0: level, slope: 0 });
  return pieces;
}

/** A compiled program: values and breakpoints of every channel. */
export interface CompiledProgram {
  names: string[];
  pieces: Piece[][];
  /** Sorted unique times (> 0) where any channel changes value or slope. */
  breakpointsS: number[];
}

export function compileProgram(program: Program): CompiledProgram {
  const names = program.channels.map((c) => c.name);
  const pieces = program.channels.map(channelPieces);
  const set = new Set<number>();
  for (const ps of pieces) for (const p of ps) if (p.startS > 0) set.add(p.startS);
  return { names, pieces, breakpointsS: [...set].sort((a, b) => a - b) };
}

/** The piece of a channel in force at time t (right-continuous: a step at t counts). */
export function pieceAt(pieces: Piece[], tS: number): Piece {
  let lo = 0;
  let hi = pieces.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if ((pieces[mid] as Piece).startS <= tS) lo = mid;
    else hi = mid - 1;
  }
  return pieces[lo] as Piece;
}

/** Value of a channel at t (right-continuous). */
export function valueAt(pieces: Piece[], tS: number): number {
  const p = pieceAt(pieces, tS);
  return p.v0 + p.slope * (tS - p.startS);
}

/** Value, in SI, of the named channel at t. */
export function programValue(program: CompiledProgram, name: string, tS: number): number {
  const i = program.names.indexOf(name);
  const ps = program.pieces[i];
  if (!ps) throw new InputError('unknown-drive', `the program has no channel '${name}'`, `give a program with a '${name}' column`);
  return valueAt(ps, tS);
}
