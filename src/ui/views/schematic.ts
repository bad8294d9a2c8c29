/** Small circuit schematics of the two setups (our own drawing): source → node with C → R → outlet. */
import type { Setup } from '../../core/steps/types';

const SVG_NS = 'http://www.w3.org/2000/svg';

function node(tag: string, attrs: Record<string, string | number>, text?: string): SVGElement {
  const n = document.createElementNS(SVG_NS, tag);
  for (const [k, v] of Object.entries(attrs)) n.setAttribute(k, String(v));
  if (text) n.textContent = text;
  return n;
}

function resistor(x: number, y: number): SVGElement {
  const pts = [`${x},${y}`];
  for (let i = 0; i < 6; i++) pts.push(`${x + 5 + i * 6},${y + (i % 2 ? 6 : -6)}`);
  pts.push(`${x + 40},${y}`);
  return node('polyline', { points: pts.join(' ') });
}

export function setupSchematic(setup: Setup): SVGSVGElement {
  const svg = node('svg', { viewBox: '0 0 440 120', class: 'schematic', role: 'img', 'aria-label': setup === 'flow-driven' ? 'Flow-driven: pump sets Q into a compliant node, read by a pressure sensor, drained through the chip resistance R' : 'Pressure-driven: regulator sets p through R_up into a compliant node, drained through the chip R_down; flow sensed' }) as SVGSVGElement;
  const y = 40;
  if (setup === 'flow-driven') {
    svg.append(node('circle', { cx: 40, cy: y, r: 16 }), node('path', { d: `M32 ${y} L48 ${y} M43 ${y - 5} L48 ${y} L43 ${y + 5}` }), node('text', { x: 14, y: 80 }, 'pump sets Q'));
    svg.append(node('line', { x1: 56, y1: y, x2: 200, y2: y }));
  } else {
    svg.append(node('circle', { cx: 40, cy: y, r: 16 }), node('text', { x: 33, y: y + 4 }, 'p'), node('text', { x: 8, y: 80 }, 'regulator sets p'));
    svg.append(node('line', { x1: 56, y1: y, x2: 90, y2: y }), resistor(90, y), node('text', { x: 96, y: 24 }, 'R_up'), node('line', { x1: 130, y1: y, x2: 200, y2: y }));
  }
  // Compliant node with C to ground.
  svg.append(node('circle', { cx: 200, cy: y, r: 3.5, class: 'hl' }), node('line', { x1: 200, y1: y, x2: 200, y2: 70, class: 'hl' }),
    node('line', { x1: 186, y1: 70, x2: 214, y2: 70, class: 'hl' }), node('line', { x1: 186, y1: 77, x2: 214, y2: 77, class: 'hl' }),
    node('line', { x1: 200, y1: 77, x2: 200, y2: 95 }), node('line', { x1: 190, y1: 95, x2: 210, y2: 95 }), node('text', { x: 218, y: 78 }, 'C (walls, tubing, liquid, air)'));
  svg.append(node('line', { x1: 200, y1: y, x2: 270, y2: y }), resistor(270, y), node('text', { x: 270, y: 24 }, setup === 'flow-driven' ? 'R (chip)' : 'R_down (chip)'), node('line', { x1: 310, y1: y, x2: 380, y2: y }), node('text', { x: 384, y: y + 4 }, 'outlet'));
  svg.append(node('text', { x: 150, y: 24 }, setup === 'flow-driven' ? 'p sensed' : ''), node('text', { x: 318, y: 24 }, setup === 'pressure-driven' ? 'Q sensed' : ''));
  return svg;
}
