/**
 * What the room screen knows about each element kind of the contract: its name in the palette,
 * where it sits in the schematic, and the unit of its main value.
 */
import type { Element, ElementKind } from '../../../../shared/rf/design';
import type { Unit } from '../../../../shared/rf/units';

/** Where an element sits in the schematic: inline on the rail, or hanging from it to ground. */
export type Placement = 'series' | 'shunt' | 'line' | 'stub' | 'transformer' | 'two-port';

export interface KindInfo {
  kind: ElementKind;
  /** palette and list name: "Series L" */
  name: string;
  /** longer description for screen readers and tooltips */
  description: string;
  placement: Placement;
  /** unit of `value` for lumped parts */
  unit?: Unit;
}

export const KIND_INFO: Record<ElementKind, KindInfo> = {
  'series-l': { kind: 'series-l', name: 'Series L', description: 'series inductor', placement: 'series', unit: 'H' },
  'series-c': { kind: 'series-c', name: 'Series C', description: 'series capacitor', placement: 'series', unit: 'F' },
  'series-r': { kind: 'series-r', name: 'Series R', description: 'series resistor', placement: 'series', unit: 'Ω' },
  'shunt-l': { kind: 'shunt-l', name: 'Shunt L', description: 'shunt inductor to ground', placement: 'shunt', unit: 'H' },
  'shunt-c': { kind: 'shunt-c', name: 'Shunt C', description: 'shunt capacitor to ground', placement: 'shunt', unit: 'F' },
  'shunt-r': { kind: 'shunt-r', name: 'Shunt R', description: 'shunt resistor to ground', placement: 'shunt', unit: 'Ω' },
  line: { kind: 'line', name: 'Line', description: 'transmission-line section in series', placement: 'line' },
  'open-stub': { kind: 'open-stub', name: 'Open stub', description: 'open-ended shunt stub', placement: 'stub' },
  'short-stub': { kind: 'short-stub', name: 'Shorted stub', description: 'shorted shunt stub', placement: 'stub' },
  transformer: { kind: 'transformer', name: 'Transformer', description: 'ideal transformer', placement: 'transformer' },
  'two-port': { kind: 'two-port', name: 'Two-port', description: 'measured two-port (Touchstone .s2p)', placement: 'two-port' },
};

/** Palette order: the parts an engineer reaches for first come first. */
export const PALETTE_KINDS: readonly ElementKind[] = [
  'series-l',
  'series-c',
  'shunt-l',
  'shunt-c',
  'series-r',
  'shunt-r',
  'line',
  'open-stub',
  'short-stub',
  'transformer',
  'two-port',
];

export function kindInfo(kind: ElementKind): KindInfo {
  return KIND_INFO[kind];
}

/** The name shown for an element: its label, or else its id. */
export function elementName(e: Pick<Element, 'id' | 'label'>): string {
  return e.label && e.label.trim() ? e.label.trim() : e.id;
}
