/**
 * Reader for the NIST StRD nonlinear regression files in /work/shared/reference/nist-strd/
 * (CRLF line ends, data columns y then x). Everything, including the certified values, is parsed
 * from the file itself, using the line ranges the file's own header gives.
 */
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

export interface NistParameter {
  start1: number;
  start2: number;
  certified: number;
  certifiedSd: number;
}

export interface NistProblem {
  name: string;
  x: Float64Array;
  y: Float64Array;
  /** The data as written in the file (for extended-precision checks). */
  xText: string[];
  yText: string[];
  parameters: NistParameter[];
  rss: number;
  residualSd: number;
  dof: number;
  n: number;
}

const here = dirname(fileURLToPath(import.meta.url));
/** ../shared/reference/nist-strd relative to the repository root (tests/core/fit → ../../..). */
export const NIST_DIR = resolve(here, '../../../../shared/reference/nist-strd');
export const NIST_AVAILABLE = existsSync(join(NIST_DIR, 'Misra1a.dat'));

function num(s: string): number {
  const v = Number(s.replace(/[dD]/, 'E'));
  if (!Number.isFinite(v)) throw new Error(`not a number: ${s}`);
  return v;
}

export function readNist(name: string): NistProblem {
  const text = readFileSync(join(NIST_DIR, `${name}.dat`), 'latin1');
  const lines = text.split(/\r?\n/);
  const range = (label: string): [number, number] => {
    const line = lines.find((l) => l.includes(label) && /\(lines\s+\d+\s+to\s+\d+\)/.test(l));
    const m = line?.match(/\(lines\s+(\d+)\s+to\s+(\d+)\)/);
    if (!m) throw new Error(`${name}: no "${label}" line range`);
    return [Number(m[1]), Number(m[2])];
  };
  const [c0] = range('Certified Values');
  const [d0, d1] = range('Data');
  const parameters: NistParameter[] = [];
  let k = c0 - 1;
  for (; k < lines.length; k++) {
    const m = lines[k]!.match(/^\s*b(\d+)\s*=\s*(\S+)\s+(\S+)\s+(\S+)\s+(\S+)\s*$/);
    if (!m) break;
    parameters.push({ start1: num(m[2]!), start2: num(m[3]!), certified: num(m[4]!), certifiedSd: num(m[5]!) });
  }
  const field = (label: string): number => {
    const line = lines.find((l) => l.trim().startsWith(label));
    if (!line) throw new Error(`${name}: no "${label}"`);
    return num(line.split(':')[1]!.trim());
  };
  const n = d1 - d0 + 1;
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  const xText: string[] = [];
  const yText: string[] = [];
  for (let i = 0; i < n; i++) {
    const parts = lines[d0 - 1 + i]!.trim().split(/\s+/);
    yText.push(parts[0]!);
    xText.push(parts[1]!);
    y[i] = num(parts[0]!);
    x[i] = num(parts[1]!);
  }
  return {
    name,
    x,
    y,
    xText,
    yText,
    parameters,
    rss: field('Residual Sum of Squares'),
    residualSd: field('Residual Standard Deviation'),
    dof: field('Degrees of Freedom'),
    n: field('Number of Observations'),
  };
}

/** Log relative error, the StRD accuracy measure: −log10(|q − c|/|c|), capped at 11. */
export function lre(q: number, c: number): number {
  if (q === c) return 11;
  if (!Number.isFinite(q)) return 0;
  return Math.min(11, -Math.log10(Math.abs(q - c) / Math.abs(c)));
}
