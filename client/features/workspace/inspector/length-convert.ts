/**
 * Switching a line's length between electrical degrees at a frequency and metres with a velocity
 * factor, keeping the same electrical length at that frequency: ℓ = (θ/360°)·v·c/f.
 */
import type { Design, Length } from '../../../../shared/rf/design';

const C0 = 299_792_458;

/**
 * A rough velocity factor for the board: 1/√εeff with εeff ≈ (εr + 1)/2 for microstrip (common
 * practice for a first estimate); 0.66 (solid-polyethylene coax, from memory) without a substrate.
 */
export function defaultVelocityFactor(design: Pick<Design, 'substrate'>): number {
  const er = design.substrate?.epsilonR;
  if (!er || !(er >= 1)) return 0.66;
  return Number((1 / Math.sqrt((er + 1) / 2)).toPrecision(3));
}

export function lengthInMeters(length: Length, velocityFactor: number): Length {
  if ('meters' in length) return length;
  const meters = (length.degrees / 360) * ((velocityFactor * C0) / length.atHz);
  return { meters: Number(meters.toPrecision(4)), velocityFactor };
}

export function lengthInDegrees(length: Length, atHz: number): Length {
  if ('degrees' in length) return length;
  const degrees = (360 * length.meters * atHz) / (length.velocityFactor * C0);
  return { degrees: Math.round(degrees * 100) / 100, atHz };
}
