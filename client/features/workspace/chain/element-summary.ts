/** Short texts describing an element: its value label on the canvas and its line in lists. */
import type { Element, Length } from '../../../../shared/rf/design';
import { formatEngineering } from '../../../../shared/rf/units';
import { formatValueText } from '../value/value-text';
import { elementName, kindInfo } from './element-catalog';

export function lengthText(length: Length): string {
  if ('degrees' in length) return `${formatValueText(length.degrees, '°', 3)} at ${formatEngineering(length.atHz, 'Hz', { digits: 4 })}`;
  return `${formatEngineering(length.meters, 'm', { digits: 3 })}, v ${formatValueText(length.velocityFactor, '', 3)}`;
}

/** The value as the canvas shows it under the name: "3.3 nH", "50 Ω · 45°", "1 : 1.5". */
export function elementValueLabel(e: Element): string {
  switch (e.kind) {
    case 'series-l':
    case 'series-c':
    case 'series-r':
    case 'shunt-l':
    case 'shunt-c':
    case 'shunt-r':
      return formatValueText(e.value, kindInfo(e.kind).unit ?? '', 3);
    case 'line':
    case 'open-stub':
    case 'short-stub': {
      const len = 'degrees' in e.length ? formatValueText(e.length.degrees, '°', 3) : formatEngineering(e.length.meters, 'm', { digits: 3 });
      return `${formatEngineering(e.z0, 'Ω', { digits: 3 })} · ${len}`;
    }
    case 'transformer':
      return `1 : ${formatValueText(e.ratio, '', 3)}`;
    case 'two-port':
      return e.flipped ? 'S2P, flipped' : 'S2P';
  }
}

/** One line for lists and screen readers: "L1, series L, 3.3 nH". */
export function elementDescription(e: Element): string {
  const info = kindInfo(e.kind);
  const extras: string[] = [];
  if ('q' in e && e.q !== undefined) extras.push(`Q ${formatValueText(e.q, '', 3)}`);
  if (e.tolerance) extras.push(toleranceText(e));
  if (e.locked) extras.push('locked');
  return [elementName(e), info.name.charAt(0).toLowerCase() + info.name.slice(1), elementValueLabel(e), ...extras].join(', ');
}

export function toleranceText(e: Element): string {
  const t = e.tolerance;
  if (!t) return '';
  const spread = t.distribution === 'normal' ? ' (normal, 3σ)' : '';
  if (t.relative !== undefined) return `±${formatValueText(t.relative * 100, '', 3)} %${spread}`;
  const unit = 'value' in e ? (kindInfo(e.kind).unit ?? '') : '';
  return `±${formatValueText(t.absolute ?? 0, unit, 3)}${spread}`;
}
