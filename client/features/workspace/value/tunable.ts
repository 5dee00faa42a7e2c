/**
 * The one number of each element that live tuning moves (drag, wheel, arrow keys): the value of a
 * lumped part, the length of a line or stub, the ratio of a transformer. A measured two-port has
 * none.
 */
import type { Element, Length } from '../../../../shared/rf/design';
import type { Unit } from '../../../../shared/rf/units';
import { kindInfo } from '../chain/element-catalog';

/** `°` is an electrical length; everything else is an SI unit of shared/rf/units. */
export type TunableUnit = Unit | '°';

export interface Tunable {
  /** the element field written back */
  field: 'value' | 'length' | 'ratio';
  unit: TunableUnit;
  /** log steps are relative (L, C, R, ratio, physical length); linear steps add (degrees) */
  scale: 'log' | 'linear';
  /** E-series stepping makes sense for this value (lumped parts) */
  preferredValues: boolean;
  /** what a screen reader hears: "inductance", "electrical length" */
  quantity: string;
  current: number;
  /** the field value that puts `next` into the element */
  fieldValue(next: number): unknown;
}

const QUANTITY: Partial<Record<Unit, string>> = { H: 'inductance', F: 'capacitance', Ω: 'resistance' };

export function tunableOf(e: Element): Tunable | null {
  switch (e.kind) {
    case 'series-l':
    case 'series-c':
    case 'series-r':
    case 'shunt-l':
    case 'shunt-c':
    case 'shunt-r': {
      const unit = kindInfo(e.kind).unit ?? '';
      return {
        field: 'value',
        unit,
        scale: 'log',
        preferredValues: true,
        quantity: QUANTITY[unit] ?? 'value',
        current: e.value,
        fieldValue: (v) => v,
      };
    }
    case 'line':
    case 'open-stub':
    case 'short-stub':
      return lengthTunable(e.length);
    case 'transformer':
      return {
        field: 'ratio',
        unit: '',
        scale: 'log',
        preferredValues: false,
        quantity: 'turns ratio',
        current: e.ratio,
        fieldValue: (v) => v,
      };
    case 'two-port':
      return null;
  }
}

function lengthTunable(length: Length): Tunable {
  if ('degrees' in length) {
    return {
      field: 'length',
      unit: '°',
      scale: 'linear',
      preferredValues: false,
      quantity: 'electrical length',
      current: length.degrees,
      fieldValue: (v) => ({ ...length, degrees: v }),
    };
  }
  return {
    field: 'length',
    unit: 'm',
    scale: 'log',
    preferredValues: false,
    quantity: 'physical length',
    current: length.meters,
    fieldValue: (v) => ({ ...length, meters: v }),
  };
}
