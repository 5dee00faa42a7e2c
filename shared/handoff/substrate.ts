/**
 * The substrate the line dimensions are given on: the room's `design.substrate`, or, when the room
 * sets none, the assumed default of 1.6 mm FR-4 (εr 4.4, 35 µm copper), which the files say.
 */
import type { Design } from '../rf/design';
import { formatEngineering } from '../rf/units';
import type { Substrate } from '../rf/microstrip';

export const DEFAULT_SUBSTRATE: Readonly<Required<Substrate>> = Object.freeze({ epsilonR: 4.4, heightM: 1.6e-3, copperM: 35e-6 });

export interface SubstrateChoice {
  substrate: Required<Substrate>;
  /** true when the room sets no substrate and the FR-4 default is assumed. */
  assumed: boolean;
  /** "εr 4.4, height 1.6 mm, copper 35 µm", plus the assumption when assumed. */
  description: string;
}

export function substrateDescription(s: Required<Substrate>): string {
  const copper = s.copperM > 0 ? `copper ${formatEngineering(s.copperM, 'm')}` : 'zero-thickness copper';
  return `εr ${String(Number(s.epsilonR.toPrecision(4)))}, height ${formatEngineering(s.heightM, 'm')}, ${copper}`;
}

export function substrateOf(design: Design): SubstrateChoice {
  if (design.substrate) {
    const substrate = { epsilonR: design.substrate.epsilonR, heightM: design.substrate.heightM, copperM: design.substrate.copperM ?? 0 };
    return { substrate, assumed: false, description: `${substrateDescription(substrate)} (the room's substrate)` };
  }
  const substrate = { ...DEFAULT_SUBSTRATE };
  return {
    substrate,
    assumed: true,
    description: `${substrateDescription(substrate)}: assumed 1.6 mm FR-4, the room sets no substrate`,
  };
}
