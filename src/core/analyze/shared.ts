/** Grouping of steps that share direction and drive levels, for fits with common τ's. */
import type { Step } from '../steps/types';

/**
 * Groups of ≥ 2 steps with the same direction whose drive levels before and after agree within
 * `tolerance(step)` (SI). Greedy, in step order: a step joins the first group it matches.
 */
export function sameLevelGroups(steps: readonly Step[], tolerance: (s: Step) => number): Step[][] {
  const groups: Step[][] = [];
  for (const s of steps) {
    if (!Number.isFinite(s.drive.before) || !Number.isFinite(s.drive.after)) continue;
    const tol = tolerance(s);
    const g = groups.find((grp) => {
      const first = grp[0] as Step;
      return (
        first.direction === s.direction &&
        Math.abs(first.drive.before - s.drive.before) <= tol &&
        Math.abs(first.drive.after - s.drive.after) <= tol
      );
    });
    if (g) g.push(s);
    else groups.push([s]);
  }
  return groups.filter((g) => g.length >= 2);
}
