/**
 * Reading a header cell: the name and the unit, written `Name [unit]`, `Name (unit)`, `name_unit`,
 * `Name unit`, or on a second header row; and guessing the quantity from the name.
 */
import { lookupUnit } from '../units/lookup';
import { unquote } from './fields';

export interface HeaderCell {
  /** Header text as found (trimmed, without quotes). */
  header: string;
  /** Name part without the unit. */
  name: string;
  /** Unit text as written, '' when none. */
  unit: string;
}

/** Splits a header cell into name and unit. */
export function parseHeaderCell(cell: string): HeaderCell {
  const header = unquote(cell.trim());
  const bracket = /^(.*?)\s*\[([^\]]*)\]\s*$/.exec(header);
  if (bracket) return { header, name: (bracket[1] ?? '').trim(), unit: (bracket[2] ?? '').trim() };
  const paren = /^(.*?)\s*\(([^()]*)\)\s*$/.exec(header);
  if (paren) {
    const unit = (paren[2] ?? '').trim();
    // "(set)" or "(chip 3)" are part of the name; a short or slashed text is taken as a unit
    if (lookupUnit(unit) || /\//.test(unit) || (unit.length <= 6 && !/\s/.test(unit))) {
      return { header, name: (paren[1] ?? '').trim(), unit };
    }
  }
  // name_unit, possibly with a repeat suffix (`pressure_Pa_2`) and `_per_` / `_` for the slash (`flow_uL_min`)
  const repeat = /^(.*?)(_\d+)$/.exec(header);
  const body = repeat ? (repeat[1] ?? header) : header;
  const suffix = repeat ? (repeat[2] ?? '') : '';
  for (let i = body.indexOf('_'); i > 0; i = body.indexOf('_', i + 1)) {
    const candidate = body.slice(i + 1);
    if (lookupUnit(candidate) || lookupUnit(candidate.replace(/_/g, '/'))) {
      return { header, name: body.slice(0, i) + suffix, unit: candidate };
    }
  }
  const space = /^(.*\S)\s+(\S+)$/.exec(header);
  if (space && lookupUnit(space[2] ?? '')) return { header, name: (space[1] ?? '').trim(), unit: space[2] ?? '' };
  return { header, name: header, unit: '' };
}

/** Unit text of a units-row cell: `mbar`, `[mbar]` or `(mbar)`. */
export function unitsRowCell(cell: string): string {
  const t = unquote(cell.trim());
  const m = /^[[(](.*)[\])]$/.exec(t);
  const u = (m ? (m[1] ?? '') : t).trim();
  return /^[-\u2013\u2014]$/.test(u) ? '' : u; // a dash marks "no unit"
}

/** Whether a row reads as a row of units under the names: some cells known units, none a number. */
export function looksLikeUnitsRow(cells: string[]): boolean {
  let known = 0;
  for (const c of cells) {
    const u = unitsRowCell(c);
    if (u === '') continue;
    if (/^[+-]?[\d.,]+$/.test(u)) return false;
    if (lookupUnit(u) || lookupUnit(u.replace(/_/g, '/'))) known++;
  }
  return known > 0;
}

/** Name with separators folded to spaces, for word matching (`\b` does not split on `_`). */
function words(name: string): string {
  return name.toLowerCase().replace(/[_\-.]+/g, ' ');
}

export function nameSaysTime(name: string): boolean {
  return /^(time|t|zeit|timestamp|time ?stamp|date ?time|datetime|elapsed|elapsed time|clock|clock time|time of day|seconds|secs|sec|ms|t rel|relative time)$/.test(words(name).trim())
    || /\btime\b|\belapsed\b|\btimestamp\b/.test(words(name));
}

export function nameSaysSetpoint(name: string): boolean {
  return /set ?point|\bsetp\b|\bsp\b|target|command|\bcmd\b|demand|\bset\b|\bsoll\b/.test(words(name));
}

export function nameSaysHead(name: string): boolean {
  return /head|level|height|hydrostat|liquid column|water column/.test(words(name));
}

export function nameSaysPressure(name: string): boolean {
  return /press|druck|\bp\d*\b/.test(words(name));
}

export function nameSaysFlow(name: string): boolean {
  return /flow|\brate\b|\bq\d*\b|durchfluss|debit/.test(words(name));
}

/** Whether the name says elapsed time (vs a clock time of day). */
export function nameSaysElapsed(name: string): boolean {
  return /elapsed|since|relative|\brel\b|run time|duration/.test(words(name));
}

export function nameSaysClock(name: string): boolean {
  return /clock|time of day|\btod\b|wall/.test(words(name));
}
