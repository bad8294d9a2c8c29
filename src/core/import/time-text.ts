/**
 * Reading time written as text: ISO 8601 date-times and hh:mm:ss(.sss) clock or elapsed times.
 * ISO 8601:2019 (basic profile as in RFC 3339) allows a comma or a dot before the fraction of a second.
 */

const ISO_RE = /^(\d{4})-(\d{2})-(\d{2})[T ](\d{2}):(\d{2})(?::(\d{2})(?:[.,](\d+))?)?\s*(Z|z|[+-]\d{2}(?::?\d{2})?)?$/;
const HMS_RE = /^(\d{1,3}):(\d{2})(?::(\d{2})(?:[.,](\d+))?)?$/;

/** An ISO timestamp split into whole epoch seconds and a fraction, to keep sub-millisecond digits exact. */
export interface IsoTime {
  /** Whole seconds since 1970-01-01T00:00:00Z (zone applied when present). */
  epochWholeS: number;
  /** Fraction of a second, 0 ≤ f < 1. */
  fractionS: number;
  hasZone: boolean;
}

/** Parses an ISO 8601 date-time; `defaultOffsetMin` applies when it has no zone. Null if not ISO. */
export function parseIsoTime(text: string, defaultOffsetMin = 0): IsoTime | null {
  const m = ISO_RE.exec(text.trim());
  if (!m) return null;
  const [, y, mo, d, h, mi, s, frac, zone] = m;
  const month = Number(mo);
  const day = Number(d);
  const hour = Number(h);
  const minute = Number(mi);
  const second = s === undefined ? 0 : Number(s);
  if (month < 1 || month > 12 || day < 1 || day > 31 || hour > 24 || minute > 59 || second > 60) return null;
  let offsetMin = defaultOffsetMin;
  if (zone !== undefined && zone !== 'Z' && zone !== 'z') {
    const sign = zone.startsWith('-') ? -1 : 1;
    const digits = zone.slice(1).replace(':', '');
    offsetMin = sign * (Number(digits.slice(0, 2)) * 60 + Number(digits.slice(2) || '0'));
  } else if (zone !== undefined) {
    offsetMin = 0;
  }
  const ms = Date.UTC(Number(y), month - 1, day, hour, minute, second);
  return {
    epochWholeS: ms / 1000 - offsetMin * 60,
    fractionS: frac === undefined ? 0 : Number(`0.${frac}`),
    hasZone: zone !== undefined,
  };
}

/** hh:mm:ss(.sss) split into whole seconds and the fraction (kept apart so differences stay exact). */
export function parseHmsParts(text: string): { wholeS: number; fractionS: number } | null {
  const m = HMS_RE.exec(text.trim());
  if (!m) return null;
  const [, h, mi, s, frac] = m;
  const minutes = Number(mi);
  const seconds = s === undefined ? 0 : Number(s);
  if (minutes > 59 || seconds > 60) return null;
  return { wholeS: Number(h) * 3600 + minutes * 60 + seconds, fractionS: frac === undefined ? 0 : Number(`0.${frac}`) };
}

/** Parses hh:mm:ss(.sss) or hh:mm to seconds; null if not that form. Hours may exceed 23 (elapsed time). */
export function parseHmsSeconds(text: string): number | null {
  const p = parseHmsParts(text);
  return p === null ? null : p.wholeS + p.fractionS;
}

const DATE_RE = /^(\d{4})-(\d{2})-(\d{2})$/;

/** Which text time form a field has, if any: ISO date-time, hh:mm:ss, or a date alone (YYYY-MM-DD). */
export function textTimeKind(field: string): 'iso' | 'hms' | 'date' | null {
  const t = field.trim().replace(/^"|"$/g, '');
  if (ISO_RE.test(t)) return 'iso';
  if (HMS_RE.test(t)) return 'hms';
  if (DATE_RE.test(t)) return 'date';
  return null;
}

/** A calendar date (YYYY-MM-DD) in a metadata value, as epoch ms of its midnight UTC, or null. */
export function parseIsoDate(text: string): number | null {
  const m = DATE_RE.exec(text.trim().replace(/^"|"$/g, ''));
  if (!m) return null;
  const month = Number(m[2]);
  const day = Number(m[3]);
  if (month < 1 || month > 12 || day < 1 || day > 31) return null;
  return Date.UTC(Number(m[1]), month - 1, day);
}
