/**
 * Designs for new rooms and for the demo scenario of PRODUCT.md. All values are invented: a ceramic chip
 * antenna on a 1.6 mm FR-4 sensor board, modelled as a series RLC, and a short 433 MHz whip matched with
 * a two-capacitor L-section. Shared so the client, the seed and the tests use the same data.
 */
import type { DesignInput, Element } from '../rf/design';

export const DEMO_PASSWORD = 'matchloom-demo';

export const DEMO_USERS = [
  { email: 'owner@demo.test', displayName: 'Demo Owner', role: 'owner' },
  { email: 'tuner@demo.test', displayName: 'Demo Tuner', role: 'tuner' },
  { email: 'observer@demo.test', displayName: 'Demo Observer', role: 'observer' },
] as const;

/** FR-4, 1.6 mm, 35 µm copper. */
const FR4 = { epsilonR: 4.4, heightM: 1.6e-3, copperM: 35e-6 };

/** A new room's design: a matched 50 Ω placeholder load, the 2.4 GHz ISM band, no elements yet. */
export function defaultDesign(name = 'Untitled design'): DesignInput {
  return {
    format: 'matchloom-design',
    version: 1,
    name,
    referenceOhms: 50,
    load: { kind: 'impedance', ohms: [50, 0] },
    band: { startHz: 2.4e9, stopHz: 2.4835e9, centerHz: 2.44175e9 },
    sweep: { startHz: 2.0e9, stopHz: 2.9e9, points: 501, spacing: 'linear' },
    goal: { maxVswr: 2 },
    elements: [],
  };
}

export const CHIP_ANTENNA_ROOM = '2.4 GHz sensor module antenna';
export const WHIP_ROOM = '433 MHz whip antenna';
export const WHIP_BRANCH_ROOM = '433 MHz whip — low-cost branch';

/**
 * The chip antenna, modelled (invented values) as R = 18 Ω, L = 3.9 nH, C = 1.3 pF in series: about
 * 18 + j8 Ω across the band, VSWR near 2.9, so the mismatch shows before any element is added.
 */
export function chipAntennaDesign(): DesignInput {
  return {
    format: 'matchloom-design',
    version: 1,
    name: CHIP_ANTENNA_ROOM,
    referenceOhms: 50,
    port: { impedance: [50, 0] },
    load: { kind: 'rlc', topology: 'series', r: 18, l: 3.9e-9, c: 1.3e-12 },
    band: { startHz: 2.4e9, stopHz: 2.4835e9, centerHz: 2.44175e9 },
    sweep: { startHz: 2.0e9, stopHz: 2.9e9, points: 501, spacing: 'linear' },
    goal: { maxVswr: 2 },
    elements: [],
    drive: { powerW: 0.1 },
    substrate: FR4,
  };
}

/** The whip (invented): R = 12 Ω, L = 30 nH, C = 9 pF in series, about 12 + j41 Ω at 433.92 MHz. */
function whipBase(name: string, elements: Element[]): DesignInput {
  return {
    format: 'matchloom-design',
    version: 1,
    name,
    referenceOhms: 50,
    load: { kind: 'rlc', topology: 'series', r: 12, l: 30e-9, c: 9e-12 },
    band: { startHz: 433.05e6, stopHz: 434.79e6, centerHz: 433.92e6 },
    sweep: { startHz: 400e6, stopHz: 470e6, points: 351, spacing: 'linear' },
    goal: { maxVswr: 2 },
    elements,
    drive: { powerW: 0.025 },
    substrate: FR4,
  };
}

/** Snapshot "first cut": the exact L-section values (series C next to the load, shunt C at the port). */
export function whipFirstCutDesign(): DesignInput {
  return whipBase(WHIP_ROOM, [
    { id: 'c-series', kind: 'series-c', value: 18.67e-12, label: 'C1' },
    { id: 'c-shunt', kind: 'shunt-c', value: 13.05e-12, label: 'C2' },
  ]);
}

/** Snapshot "E12 values" and the room's current state: nearest E12 parts, ±5 %; VSWR about 1.2 in band. */
export function whipE12Design(): DesignInput {
  return whipBase(WHIP_ROOM, [
    { id: 'c-series', kind: 'series-c', value: 18e-12, label: 'C1', q: 400, tolerance: { relative: 0.05 } },
    { id: 'c-shunt', kind: 'shunt-c', value: 12e-12, label: 'C2', q: 400, tolerance: { relative: 0.05 } },
  ]);
}

/** The branch: the same E12 values in cheaper ±10 % parts. */
export function whipLowCostDesign(): DesignInput {
  return whipBase(WHIP_BRANCH_ROOM, [
    { id: 'c-series', kind: 'series-c', value: 18e-12, label: 'C1', q: 200, tolerance: { relative: 0.1 } },
    { id: 'c-shunt', kind: 'shunt-c', value: 12e-12, label: 'C2', q: 200, tolerance: { relative: 0.1 } },
  ]);
}
