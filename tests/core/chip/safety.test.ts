import { describe, expect, it } from 'vitest';
import { checkPressureAgainstRatings, PRESSURE_SAFETY_CAUTION } from '../../../src/core/safety';

describe('checkPressureAgainstRatings', () => {
  it('checkPressureAgainstRatings picks the lowest stated rating and lists the exceeded parts', () => {
    const r = checkPressureAgainstRatings(2.5e5, { chip: 2e5, bonding: 3e5, tubing: 1e6 });
    expect(r.governing).toEqual({ part: 'chip', ratingPa: 2e5 });
    expect(r.exceeded).toEqual(['chip']);
    expect(r.unknown).toEqual(['fittings']);
    expect(r.fractionOfRating).toBeCloseTo(1.25, 12); // 2.5e5 / 2e5; 'fittings' unknown because not given
  });

  it('checkPressureAgainstRatings compares suction by magnitude and reports no rating as null', () => {
    // Rule of our own (common practice, no source): |−3e5| > 2e5 exceeds the rating.
    expect(checkPressureAgainstRatings(-3e5, { chip: 2e5 }).exceeded).toEqual(['chip']);
    expect(checkPressureAgainstRatings(1e5, {}).governing).toBeNull();
  });

  it('PRESSURE_SAFETY_CAUTION names ratings, eye protection and local rules', () => {
    // The customer's safety rule (team brief): ratings of chip, bonding, tubing, fittings; eye protection; local rules.
    for (const word of ['chip', 'bonding', 'tubing', 'fittings', 'eye protection', 'safety rules', 'local codes']) {
      expect(PRESSURE_SAFETY_CAUTION).toContain(word);
    }
  });
});
