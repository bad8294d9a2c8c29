/**
 * The pressure-safety caution shown wherever a user sets or reads pressures (CLI human output,
 * reports, the app), and a check of a pressure against the ratings stated in a chip description.
 * Pure: no I/O.
 */

/** One shared text, shown verbatim wherever pressures are set or displayed. */
export const PRESSURE_SAFETY_CAUTION =
  'Caution: pressurised fluidics can fail suddenly. Stay inside the pressure ratings of the chip, its bonding, ' +
  'the tubing and the fittings (the lowest rating governs); wear eye protection; and defer to your lab\'s own ' +
  'safety rules and local codes.';

/** The parts of a set-up that carry a pressure rating (gauge, Pa). */
export type RatedPart = 'chip' | 'bonding' | 'tubing' | 'fittings';

/** Maximum gauge pressures (Pa) the user stated for each part; absent = not stated. */
export type PressureRatingsPa = Partial<Record<RatedPart, number>>;

/** Result of checking one pressure against the stated ratings. */
export interface PressureRatingCheck {
  /** The gauge pressure checked, Pa. */
  pressurePa: number;
  /** The lowest stated rating (the one that governs), or null when no rating is stated. */
  governing: { part: RatedPart; ratingPa: number } | null;
  /** Parts whose rating the pressure exceeds. */
  exceeded: RatedPart[];
  /** Parts without a stated rating (the user should find them out). */
  unknown: RatedPart[];
  /** pressure / governing rating (1 = at the limit), or null without a rating. */
  fractionOfRating: number | null;
}

const PARTS: RatedPart[] = ['chip', 'bonding', 'tubing', 'fittings'];

/**
 * Checks a gauge pressure (Pa) against the stated ratings. The magnitude counts: suction
 * (negative gauge) is compared by absolute value, a conservative reading for bonds and fittings.
 */
export function checkPressureAgainstRatings(pressurePa: number, ratings: PressureRatingsPa): PressureRatingCheck {
  const magnitude = Math.abs(pressurePa);
  let governing: PressureRatingCheck['governing'] = null;
  const exceeded: RatedPart[] = [];
  const unknown: RatedPart[] = [];
  for (const part of PARTS) {
    const ratingPa = ratings[part];
    if (ratingPa === undefined) {
      unknown.push(part);
      continue;
    }
    if (magnitude > ratingPa) exceeded.push(part);
    if (governing === null || ratingPa < governing.ratingPa) governing = { part, ratingPa };
  }
  return {
    pressurePa,
    governing,
    exceeded,
    unknown,
    fractionOfRating: governing ? magnitude / governing.ratingPa : null,
  };
}
