/**
 * Channel names `<quantity>_<SI unit>` (`pressure_Pa`, `flow_m3_per_s`), with `_2`, `_3` for repeats.
 * A channel of quantity `other` keeps its own unit, so it is named `other_<unit as written>` (or `other`).
 */
import { SI_UNIT_OF, type Quantity } from './types';

/** Base name of a channel before making it unique. */
export function channelBaseName(quantity: Quantity, originalUnit: string): string {
  if (quantity !== 'other') return `${quantity}_${SI_UNIT_OF[quantity]}`;
  const unit = originalUnit
    .normalize('NFKD')
    .replace(/[\u00B5\u03BC]/g, 'u')
    .replace(/\//g, '_per_')
    .replace(/[^A-Za-z0-9_]+/g, '')
    .replace(/^_+|_+$/g, '');
  return unit === '' ? 'other' : `other_${unit}`;
}

/** Makes names unique in order: the first keeps its name, later repeats get `_2`, `_3`, … */
export function uniqueNames(bases: readonly string[], taken: Iterable<string> = []): string[] {
  const used = new Set(taken);
  return bases.map((base) => {
    if (!used.has(base)) {
      used.add(base);
      return base;
    }
    for (let k = 2; ; k++) {
      const candidate = `${base}_${k}`;
      if (!used.has(candidate)) {
        used.add(candidate);
        return candidate;
      }
    }
  });
}
