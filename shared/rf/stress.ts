/**
 * Voltages and currents along the chain at one frequency, and the stress figures.
 *
 * Nodes: node 0 is the load (V = Z_load, I = 1 before scaling), node k + 1 the port side of
 * element k; each element maps [V; I] by its ABCD matrix. With drive power P available from a
 * port of impedance Zs, the source EMF is |Vs| = √(8·P·Re Zs) (peak phasors: P_avail =
 * |Vs|²/(8 Re Zs)) and all node values are scaled so that Vs = V_port + Zs·I_port.
 *
 * Per element (peak values):
 * - series lumped: current through = |I| (same both sides); voltage across = |V_port − V_load|.
 * - shunt lumped: voltage across = |V| (same both sides); current through = |I_port − I_load|.
 * - line, transformer, two-port: the larger of the two terminal values, for V and for I.
 * - open/shorted stub: at its terminals (the junction): voltage |V|, current into the stub |I_port − I_load|.
 */
import { impedanceRatio } from './cascade';
import { type Complex, type Design, type Element } from './design';
import { chainPlan, elementAbcdAt, type ChainPlan } from './elements';
import { loadImpedances } from './loads';

export interface ChainNodes {
  /** Node voltages, interleaved (count + 1 nodes, load first). */
  v: Float64Array;
  /** Node currents toward the load, interleaved. */
  i: Float64Array;
}

export interface ElementStress {
  id: string;
  voltagePeak: number;
  currentPeak: number;
}

/** Unscaled node voltages and currents (load current 1) of `elements` on load impedance `zLoad` at `hz`. */
export function chainNodesAt(elements: readonly Element[], zLoad: Complex, hz: number, compiled?: ChainPlan): ChainNodes {
  const m = elements.length;
  // A plan compiled for another grid will do unless it holds two-port tables (they are per grid point).
  const plan = compiled && compiled.tables.every((t) => t === null) ? compiled : chainPlan(elements, Float64Array.of(hz));
  const v = new Float64Array(2 * (m + 1));
  const i = new Float64Array(2 * (m + 1));
  v[0] = zLoad[0];
  v[1] = zLoad[1];
  i[0] = 1;
  const t = new Float64Array(8);
  for (let e = 0; e < m; e++) {
    elementAbcdAt(plan, e, hz, 0, t);
    const vr = v[2 * e], vi = v[2 * e + 1], ir = i[2 * e], ii = i[2 * e + 1];
    v[2 * e + 2] = t[0] * vr - t[1] * vi + t[2] * ir - t[3] * ii;
    v[2 * e + 3] = t[0] * vi + t[1] * vr + t[2] * ii + t[3] * ir;
    i[2 * e + 2] = t[4] * vr - t[5] * vi + t[6] * ir - t[7] * ii;
    i[2 * e + 3] = t[4] * vi + t[5] * vr + t[6] * ii + t[7] * ir;
    // Keep magnitudes in range (only ratios matter until the drive scaling).
    const mag = Math.abs(v[2 * e + 2]) + Math.abs(v[2 * e + 3]) + Math.abs(i[2 * e + 2]) + Math.abs(i[2 * e + 3]);
    if (mag > 1e150) {
      for (let k = 0; k <= 2 * e + 3; k++) {
        v[k] /= mag;
        i[k] /= mag;
      }
    }
  }
  return { v, i };
}

/** The impedance after each stage (load first), clamped to IMPEDANCE_OPEN_OHMS. */
export function nodeImpedances(nodes: ChainNodes): Complex[] {
  const out: Complex[] = [];
  const tmp = new Float64Array(2);
  for (let k = 0; k < nodes.v.length; k += 2) {
    const vr = nodes.v[k], vi = nodes.v[k + 1], ir = nodes.i[k], ii = nodes.i[k + 1];
    impedanceRatio(vr, vi, ir, ii, tmp, 0);
    out.push([tmp[0], tmp[1]]);
  }
  return out;
}

const abs = (re: number, im: number) => Math.hypot(re, im);

/** Peak voltage across and current through each element at `hz` with `powerW` available from the port. */
export function stressAt(design: Design, hz: number, powerW: number): ElementStress[] {
  const zl = loadImpedances(design.load, design.referenceOhms, Float64Array.of(hz));
  return stressFromNodes(design, chainNodesAt(design.elements, [zl[0], zl[1]], hz), powerW);
}

/** The stress figures from the chain's unscaled node values (chainNodesAt) at the frequency of interest. */
export function stressFromNodes(design: Design, nodes: ChainNodes, powerW: number): ElementStress[] {
  const { elements } = design;
  const zs = design.port?.impedance ?? [design.referenceOhms, 0];
  const m = elements.length;
  const { v, i } = nodes;
  // Vs (unscaled) = V_port + Zs·I_port; scale to |Vs| = √(8·P·Re Zs).
  const sr = v[2 * m] + zs[0] * i[2 * m] - zs[1] * i[2 * m + 1];
  const si = v[2 * m + 1] + zs[0] * i[2 * m + 1] + zs[1] * i[2 * m];
  const emf = Math.sqrt(8 * powerW * zs[0]);
  const unscaled = abs(sr, si);
  const k = unscaled > 0 ? emf / unscaled : 0;
  return elements.map((el, e) => {
    const a = 2 * e; // load side node
    const b = 2 * e + 2; // port side node
    const va = abs(v[a], v[a + 1]), vb = abs(v[b], v[b + 1]);
    const ia = abs(i[a], i[a + 1]), ib = abs(i[b], i[b + 1]);
    let voltage: number;
    let current: number;
    switch (el.kind) {
      case 'series-l':
      case 'series-c':
      case 'series-r':
        voltage = abs(v[b] - v[a], v[b + 1] - v[a + 1]);
        current = Math.max(ia, ib);
        break;
      case 'shunt-l':
      case 'shunt-c':
      case 'shunt-r':
      case 'open-stub':
      case 'short-stub':
        voltage = Math.max(va, vb);
        current = abs(i[b] - i[a], i[b + 1] - i[a + 1]);
        break;
      default:
        voltage = Math.max(va, vb);
        current = Math.max(ia, ib);
    }
    return { id: el.id, voltagePeak: finite(voltage * k), currentPeak: finite(current * k) };
  });
}

/** Stress figures are physical magnitudes: a non-finite value (never expected) is reported as 0 rather than NaN. */
function finite(x: number): number {
  return Number.isFinite(x) ? x : 0;
}
