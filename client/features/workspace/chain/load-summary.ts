/** A few words for the load on the canvas and in lists. */
import type { Load } from '../../../../shared/rf/design';
import { formatEngineering } from '../../../../shared/rf/units';

export function complexOhmsText([re, im]: readonly [number, number], digits = 3): string {
  const r = formatEngineering(re, 'Ω', { digits }).replace(/ ?Ω$/, '');
  const x = formatEngineering(Math.abs(im), 'Ω', { digits }).replace(/ ?Ω$/, '');
  return `${r} ${im < 0 ? '−' : '+'} j${x} Ω`;
}

export function loadSummary(load: Load): string {
  switch (load.kind) {
    case 'impedance':
      return complexOhmsText(load.ohms);
    case 'rlc':
      return `${load.topology} RLC`;
    case 'measured':
      return load.fileName ? load.fileName : 'measured';
    case 'table':
      return `table, ${load.points.length} points`;
  }
}
