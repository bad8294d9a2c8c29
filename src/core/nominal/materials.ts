/**
 * Elastic moduli of tubing and chip materials at room temperature, with the ranges used for
 * compliance bounds (physics.md §3.8; tags as there). Low modulus → high compliance.
 */
import type { SourceTag } from '../fluids/types';

export interface Material {
  /** Our identifier, used in chip descriptions. */
  id: string;
  label: string;
  /** Young's modulus, Pa: lowest plausible, nominal, highest plausible. */
  modulusPa: { low: number; nominal: number; high: number };
  /** Poisson ratio, nominal. */
  poisson: number;
  tag: SourceTag;
  source: string;
}

const MPa = 1e6;
const GPa = 1e9;

export const MATERIALS: readonly Material[] = [
  { id: 'pdms', label: 'PDMS (10:1 two-part elastomer)', modulusPa: { low: 1.32 * MPa, nominal: 2.0 * MPa, high: 2.97 * MPa }, poisson: 0.49, tag: 'S', source: 'Johnston et al., J. Micromech. Microeng. 24, 035017 (2014): 1.32–2.97 MPa for curing at 25–200 °C; nominal 2.0 MPa [P]' },
  { id: 'silicone', label: 'silicone rubber tubing', modulusPa: { low: 2 * MPa, nominal: 3 * MPa, high: 4 * MPa }, poisson: 0.49, tag: 'S', source: '~2–4 MPa (Shore A 50–78), 2024 PMC table' },
  { id: 'soft-pvc', label: 'flexible (plasticised) PVC', modulusPa: { low: 3 * MPa, nominal: 10 * MPa, high: 30 * MPa }, poisson: 0.45, tag: 'M', source: '~3–30 MPa, hardness dependent [M]' },
  { id: 'ldpe', label: 'low-density polyethylene', modulusPa: { low: 0.25 * GPa, nominal: 0.3 * GPa, high: 0.35 * GPa }, poisson: 0.45, tag: 'S', source: '0.25–0.35 GPa (flexural, encyclopedia plastics table); ν [M]' },
  { id: 'hdpe', label: 'high-density polyethylene', modulusPa: { low: 1 * GPa, nominal: 1.25 * GPa, high: 1.5 * GPa }, poisson: 0.45, tag: 'S', source: '1–1.5 GPa; ν [M]' },
  { id: 'ptfe', label: 'PTFE', modulusPa: { low: 0.4 * GPa, nominal: 0.5 * GPa, high: 0.8 * GPa }, poisson: 0.46, tag: 'S', source: '0.4–0.8 GPa, typ. 0.5 (fluoropolymer table, PMC table); ν [M]' },
  { id: 'fep', label: 'FEP', modulusPa: { low: 0.35 * GPa, nominal: 0.5 * GPa, high: 0.7 * GPa }, poisson: 0.48, tag: 'S', source: '0.35–0.7 GPa (fluoropolymer table); ν [M]' },
  { id: 'peek', label: 'PEEK', modulusPa: { low: 3.5 * GPa, nominal: 3.6 * GPa, high: 4 * GPa }, poisson: 0.4, tag: 'S', source: '3.6 GPa (3.5–4); ν [M]' },
  { id: 'stainless-steel', label: 'stainless steel 304/316', modulusPa: { low: 193 * GPa, nominal: 195 * GPa, high: 200 * GPa }, poisson: 0.29, tag: 'M', source: '193–200 GPa [M]' },
  { id: 'glass', label: 'glass (borosilicate, fused silica, soda-lime)', modulusPa: { low: 50 * GPa, nominal: 63 * GPa, high: 90 * GPa }, poisson: 0.2, tag: 'S', source: 'glass 50–90 GPa (2021 IJMS review); borosilicate ~63 GPa [M]' },
  { id: 'silicon', label: 'silicon (100) wafer', modulusPa: { low: 130 * GPa, nominal: 150 * GPa, high: 169 * GPa }, poisson: 0.28, tag: 'S', source: 'Hopcroft, Nix & Kenny, J. MEMS 19, 229 (2010): 130 GPa <100>, 169 GPa <110>' },
  { id: 'pmma', label: 'PMMA', modulusPa: { low: 2.4 * GPa, nominal: 3.0 * GPa, high: 3.3 * GPa }, poisson: 0.37, tag: 'S', source: '2.4–3.3 GPa, typ. 3.0; ν [M]' },
  { id: 'polycarbonate', label: 'polycarbonate', modulusPa: { low: 2.3 * GPa, nominal: 2.38 * GPa, high: 2.4 * GPa }, poisson: 0.37, tag: 'S', source: '2.3–2.4 GPa; ν [M]' },
  { id: 'coc', label: 'cyclic olefin copolymer/polymer', modulusPa: { low: 2.0 * GPa, nominal: 2.6 * GPa, high: 3.2 * GPa }, poisson: 0.35, tag: 'M', source: '~2.0–3.2 GPa, grade dependent [M]' },
];

export const MATERIAL_IDS: readonly string[] = MATERIALS.map((m) => m.id);

/** The material with this id, or undefined. */
export function findMaterial(id: string): Material | undefined {
  return MATERIALS.find((m) => m.id === id);
}

/**
 * Young's modulus (MPa) of an elastomer from its Shore A hardness S:
 * E = 0.0981 (56 + 7.62336 S) / (0.137505 (254 − 2.54 S)).
 * Source: A. N. Gent (1958) [M, physics.md §3.8]; about ±50 %.
 */
export function shoreAToModulusPa(shoreA: number): number {
  return ((0.0981 * (56 + 7.62336 * shoreA)) / (0.137505 * (254 - 2.54 * shoreA))) * MPa;
}
