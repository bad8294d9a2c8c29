/** Chart colours taken from the page's CSS variables, or the light palette for exported reports. */
export interface ChartColors {
  ink: string;
  muted: string;
  grid: string;
  data: string;
  data2: string;
  fit: string;
  step: string;
  accent: string;
  bad: string;
  warn: string;
  panel: string;
}

export const LIGHT_COLORS: ChartColors = {
  ink: '#18201d', muted: '#6d7a75', grid: '#dfe5e2', data: '#2c5f9e', data2: '#6b7d2a', fit: '#b1286a',
  step: '#c06a00', accent: '#0d7466', bad: '#b3261e', warn: '#9a5b00', panel: '#ffffff',
};

export function pageColors(): ChartColors {
  const cs = getComputedStyle(document.documentElement);
  const v = (name: string, fallback: string): string => cs.getPropertyValue(name).trim() || fallback;
  return {
    ink: v('--ink', LIGHT_COLORS.ink), muted: v('--muted', LIGHT_COLORS.muted), grid: v('--line', LIGHT_COLORS.grid),
    data: v('--data', LIGHT_COLORS.data), data2: v('--data-2', LIGHT_COLORS.data2), fit: v('--fit', LIGHT_COLORS.fit),
    step: v('--step', LIGHT_COLORS.step), accent: v('--accent', LIGHT_COLORS.accent), bad: v('--bad', LIGHT_COLORS.bad),
    warn: v('--warn', LIGHT_COLORS.warn), panel: v('--panel', LIGHT_COLORS.panel),
  };
}

/** Same colour with an alpha (hex #rrggbb only). */
export function withAlpha(hex: string, alpha: number): string {
  const m = /^#([0-9a-f]{6})$/i.exec(hex);
  if (!m || m[1] === undefined) return hex;
  const n = parseInt(m[1], 16);
  return `rgba(${(n >> 16) & 255}, ${(n >> 8) & 255}, ${n & 255}, ${alpha})`;
}
