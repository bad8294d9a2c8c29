/**
 * Escaping for HTML text and attribute values. Every user string (file names, headers, metadata,
 * operator, chip ID, spec texts) goes through {@link escapeHtml} before it reaches a report.
 * Escaping &, <, >, " and ' covers element content and quoted attribute values
 * (OWASP Cross Site Scripting Prevention Cheat Sheet, output encoding for HTML contexts).
 */
const MAP: Record<string, string> = { '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' };

export function escapeHtml(text: unknown): string {
  return String(text ?? '').replace(/[&<>"']/g, (c) => MAP[c] ?? c);
}
