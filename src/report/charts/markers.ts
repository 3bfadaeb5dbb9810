import { px } from '../svg.js';
import type { Marker } from './palette.js';

/** A point marker of about `r` radius centred on (x, y); `hollow` draws the outline only. */
export function marker(kind: Marker, x: number, y: number, r: number, colour: string, hollow = false): string {
  const paint = hollow ? `fill="#ffffff" stroke="${colour}" stroke-width="1.5"` : `fill="${colour}" stroke="#ffffff" stroke-width="0.8"`;
  switch (kind) {
    case 'circle':
      return `<circle cx="${px(x)}" cy="${px(y)}" r="${px(r)}" ${paint}/>`;
    case 'square':
      return `<rect x="${px(x - r * 0.9)}" y="${px(y - r * 0.9)}" width="${px(r * 1.8)}" height="${px(r * 1.8)}" ${paint}/>`;
    case 'triangle':
      return `<path d="M${px(x)} ${px(y - r * 1.15)} L${px(x + r)} ${px(y + r * 0.6)} L${px(x - r)} ${px(y + r * 0.6)} Z" ${paint}/>`;
    case 'diamond':
      return `<path d="M${px(x)} ${px(y - r * 1.2)} L${px(x + r)} ${px(y)} L${px(x)} ${px(y + r * 1.2)} L${px(x - r)} ${px(y)} Z" ${paint}/>`;
  }
}
