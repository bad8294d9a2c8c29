/**
 * The setup schematics, shared by docs/setups.md and the app (a test keeps the two identical).
 * Box-drawing text: `─[R]─` resistance, `┴ C` compliance to ground, `(Q)` flow source, `(P)` pressure
 * source, `●` sensed node, `⏚` outlet at atmosphere.
 */

export interface SetupSchematic {
  title: string;
  /** Monospaced drawing, lines joined by \n. */
  drawing: string;
  /** The key formulas, with the physics.md section. */
  formulas: string[];
}

export type SchematicName = 'flow-driven' | 'pressure-driven' | 'flow-balance' | 'ladder';

export const SETUP_SCHEMATICS: Readonly<Record<SchematicName, SetupSchematic>> = {
  'flow-driven': {
    title: 'Flow-driven: a pump imposes Q, pressure sensed at the compliant inlet node',
    drawing: [
      '  pump            compliant inlet node              chip',
      '  (Q) ─────────────────●──────────────────────────[ R ]──── ⏚',
      '                       │ p sensed here',
      '                       ┴ C   (tubing, syringe, inlet, gas)',
    ].join('\n'),
    formulas: ['R = Δp∞/ΔQ', 'C = τ/R', 'τ = R·C (physics.md §4.2)'],
  },
  'pressure-driven': {
    title: 'Pressure-driven: a regulator or head imposes p through R_up into the node, the chip R_down drains it',
    drawing: [
      '  regulator or      upstream           compliant node          chip',
      '  head              (tubing, sensor)',
      '  (P) ──────────────[ R_up ]──────────────●──────────────────[ R_down ]────── ⏚',
      '         Q₁ sensed here (inlet)           │                                Q₂ sensed here (outlet)',
      '                                          ┴ C',
    ].join('\n'),
    formulas: ['R_total = Δp/ΔQ∞', 'R_up = Δp/ΔQ(0⁺) (inlet sensor)', 'τ = C·R_up·R_down/(R_up + R_down)', 'C = τ·R_total/(R_up·R_down) (physics.md §4.3)'],
  },
  'flow-balance': {
    title: 'Pressure and flow both logged: the volume balance cross-check',
    drawing: [
      '  Q_in ──►──●──►── Q_out          Q_in − Q_out = C·dp/dt   (§3.1, C = dV/dp)',
      '            │ p',
      '            ┴ C',
    ].join('\n'),
    formulas: ['∫(Q_in − Q_out)dt = C·(p − p₀)', 'C = slope of the volume on p (physics.md §3.1)'],
  },
  'ladder': {
    title: 'Two compliant nodes in a ladder',
    drawing: [
      '  source                node 1 (sensed)              node 2',
      '  (Q) or (P)─[R1]──────────●──────────[ R_a = R2 ]──────●──────────[ R_b = R3 ]──── ⏚',
      '                           │ p₁                         │',
      '                           ┴ C1                         ┴ C2',
    ].join('\n'),
    formulas: ['τ₁τ₂ = b₂, τ₁ + τ₂ = b₁, τz = (τ₁a₂ + τ₂a₁)/(a₁ + a₂)', 'flow source: C1, C2, R_a, R_b from the node-1 response alone', 'pressure source: one known element (R1) (physics.md §4.4)'],
  },
};
