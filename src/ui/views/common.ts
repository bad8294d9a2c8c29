/** Pieces shared by the views: headings, notices, the pressure caution, empty states. */
import { PRESSURE_SAFETY_CAUTION } from '../../core/safety';
import type { Warning } from '../../core/errors';
import { el } from '../helpers/dom';

export function viewHead(id: string, title: string, subtitle: string, ...actions: HTMLElement[]): HTMLElement {
  return el('div', { class: 'view-head' }, el('div', {}, el('h2', { id, text: title }), el('p', { class: 'muted', text: subtitle })), el('div', { class: 'inline' }, ...actions));
}

export function caution(): HTMLElement {
  return el('div', { class: 'caution', role: 'note', 'data-testid': 'pressure-caution' }, el('span', { text: PRESSURE_SAFETY_CAUTION }));
}

export function notice(kind: 'info' | 'warn' | 'bad' | 'unavailable', text: string): HTMLElement {
  return el('div', { class: `notice ${kind === 'info' ? '' : kind}`, role: kind === 'bad' ? 'alert' : undefined, text });
}

export function warningsList(warnings: readonly Warning[]): HTMLElement | null {
  if (!warnings.length) return null;
  return el('ul', { class: 'warn-list' }, ...warnings.map((w) => el('li', { text: `${w.message}${w.count && w.count > 1 ? ` (${w.count}×)` : ''}` })));
}

export function emptyState(title: string, body: string, ...actions: HTMLElement[]): HTMLElement {
  return el('div', { class: 'empty' }, el('strong', { text: title }), el('p', { text: body }), el('div', { class: 'inline' }, ...actions));
}

export function button(label: string, onClick: () => void, cls = 'btn', attrs: Record<string, string> = {}): HTMLButtonElement {
  const b = el('button', { type: 'button', class: cls, ...attrs }, label);
  b.addEventListener('click', onClick);
  return b;
}

export function canvasBox(cls: string, label: string, testid: string): { box: HTMLElement; canvas: HTMLCanvasElement } {
  const canvas = el('canvas', { role: 'img', 'aria-label': label, 'data-testid': testid });
  return { box: el('div', { class: `chart-box ${cls}` }, canvas), canvas };
}
