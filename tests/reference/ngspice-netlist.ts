// Writes a Matchloom chain as an ngspice AC netlist: lumped parts as R, L, C; lines and stubs as
// lossless T lines (TD = βl/ω); open stubs as T lines with a floating far end, shorted stubs with the
// far end on ground. A 1 A AC current source drives the port node, so V(port) is Zin.
import { type Design } from '../../shared/rf/design';
import { lineElectrical } from '../../shared/rf/elements';

export function ngspiceNetlist(design: Design, sweep: { points: number; startHz: number; stopHz: number }): string {
  const lines: string[] = ['* Matchloom chain (reference check)'];
  const load = design.load;
  if (load.kind === 'rlc' && load.topology === 'series') {
    lines.push(`RL n0 nl1 ${load.r}`);
    lines.push(load.l ? `LL nl1 nl2 ${load.l}` : 'VL nl1 nl2 0');
    lines.push(load.c ? `CL nl2 0 ${load.c}` : 'VC nl2 0 0');
  } else if (load.kind === 'rlc') {
    lines.push(`RL n0 0 ${load.r}`);
    if (load.l) lines.push(`LL n0 0 ${load.l}`);
    if (load.c) lines.push(`CL n0 0 ${load.c}`);
  } else if (load.kind === 'impedance' && load.ohms[1] === 0) {
    lines.push(`RL n0 0 ${load.ohms[0]}`);
  } else throw new Error('ngspiceNetlist: only rlc and resistive loads');

  let node = 'n0';
  let k = 0;
  const next = () => `n${++k}`;
  for (const e of design.elements) {
    const id = e.id.replace(/[^A-Za-z0-9]/g, '');
    switch (e.kind) {
      case 'series-l':
      case 'series-c':
      case 'series-r': {
        const to = next();
        lines.push(`${e.kind === 'series-l' ? 'L' : e.kind === 'series-c' ? 'C' : 'R'}${id} ${to} ${node} ${e.value}`);
        node = to;
        break;
      }
      case 'shunt-l':
      case 'shunt-c':
      case 'shunt-r':
        lines.push(`${e.kind === 'shunt-l' ? 'L' : e.kind === 'shunt-c' ? 'C' : 'R'}${id} ${node} 0 ${e.value}`);
        break;
      case 'line':
      case 'open-stub':
      case 'short-stub': {
        if (e.lossDbPerM) throw new Error('ngspiceNetlist: lossless lines only');
        const td = lineElectrical(e).radiansPerHz / (2 * Math.PI);
        if (e.kind === 'line') {
          const to = next();
          lines.push(`T${id} ${to} 0 ${node} 0 Z0=${e.z0} TD=${td}`);
          node = to;
        } else if (e.kind === 'open-stub') lines.push(`T${id} ${node} 0 far${id} 0 Z0=${e.z0} TD=${td}`);
        else lines.push(`T${id} ${node} 0 0 0 Z0=${e.z0} TD=${td}`);
        break;
      }
      default:
        throw new Error(`ngspiceNetlist: ${e.kind} not supported`);
    }
  }
  lines.push(`IP 0 ${node} DC 0 AC 1`);
  lines.push('.control');
  lines.push('set wr_singlescale');
  lines.push('set wr_vecnames');
  lines.push('option numdgt=15');
  lines.push(`ac lin ${sweep.points} ${sweep.startHz} ${sweep.stopHz}`);
  lines.push(`wrdata OUTFILE vr(${node}) vi(${node})`);
  lines.push('quit 0');
  lines.push('.endc');
  lines.push('.end');
  return `${lines.join('\n')}\n`;
}
