/**
 * Applies one value of the design variable to the chip description's JSON, so the modified
 * design goes through the same validation and nominal prediction as a file the user wrote.
 */
import { InputError } from '../errors';
import type { VarySpec } from './vary';

type Json = Record<string, unknown>;

const SECTIONS = ['upstream', 'chip', 'downstream'];

function isObject(v: unknown): v is Json {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/** Every element object of the path, with its path text (`chip[1].branches[0][0]`). */
function elements(doc: Json): Array<{ path: string; el: Json }> {
  const out: Array<{ path: string; el: Json }> = [];
  const walk = (list: unknown, prefix: string): void => {
    if (!Array.isArray(list)) return;
    list.forEach((el, i) => {
      if (!isObject(el)) return;
      const p = `${prefix}[${i}]`;
      out.push({ path: p, el });
      if (Array.isArray(el.branches)) el.branches.forEach((b, j) => walk(b, `${p}.branches[${j}]`));
    });
  };
  const path = isObject(doc.path) ? doc.path : {};
  for (const s of SECTIONS) walk(path[s], s);
  return out;
}

/** The object the spec targets in the parsed JSON. */
export function findTarget(doc: Json, target: string): Json {
  if (target === 'fluid' || target === 'chipBody') {
    const o = doc[target];
    if (!isObject(o)) throw new InputError('bad-vary', `the description has no "${target}" object`, 'check the chip description');
    return o;
  }
  const all = elements(doc);
  const normalised = target.replace(/^path\./, '');
  const byPath = all.find((e) => e.path === normalised);
  if (byPath) return byPath.el;
  const byLabel = all.filter((e) => e.el.label === target);
  if (byLabel.length === 1) return (byLabel[0] as { el: Json }).el;
  if (byLabel.length > 1) throw new InputError('bad-vary', `${byLabel.length} elements are labelled '${target}'`, `use the place instead: ${byLabel.map((e) => e.path).join(', ')}`);
  const labels = all.map((e) => (typeof e.el.label === 'string' ? `'${e.el.label}' (${e.path})` : e.path));
  throw new InputError('bad-vary', `no element '${target}' in the description`, `known elements: ${labels.join(', ')}; or fluid, chipBody, bubble`);
}

/** A copy of the description text's JSON with the property set to `value` (SI number or category string). */
export function applyValue(doc: Json, spec: VarySpec, value: number | string): Json {
  const copy = JSON.parse(JSON.stringify(doc)) as Json;
  const target = findTarget(copy, spec.target);
  if (spec.property === 'volume' && !('volume' in target) && 'liquidVolume' in target) {
    throw new InputError('bad-vary', `'${spec.target}' has "liquidVolume", not "volume"`, `vary ${spec.target}.liquidVolume`);
  }
  // SI numbers are accepted by the description format (a bare temperature is kelvin).
  target[spec.property] = value;
  return copy;
}
