// Invented demo designs for the analysis and drawing tests (the 2.4 GHz chip antenna of PRODUCT.md).
import { parseDesign, type Design } from '../../shared/rf/design';

/** The chip antenna as an invented series RLC, matched by an invented shunt-C / series-L pair. */
export function chipAntennaDesign(overrides: Record<string, unknown> = {}): Design {
  return parseDesign({
    format: 'matchloom-design',
    version: 1,
    name: '2.4 GHz module antenna',
    referenceOhms: 50,
    load: { kind: 'rlc', topology: 'series', r: 12, l: 1.5e-9, c: 2e-12 },
    band: { startHz: 2.4e9, stopHz: 2.4835e9, centerHz: 2.44e9 },
    sweep: { startHz: 2.0e9, stopHz: 3.0e9, points: 101, spacing: 'linear' },
    goal: { maxVswr: 2 },
    elements: [
      { id: 'c1', kind: 'shunt-c', value: 1.2e-12 },
      { id: 'l1', kind: 'series-l', value: 2.7e-9 },
    ],
    ...overrides,
  });
}

/** A table load that does not cover the sweep: analyze throws a DesignError naming the range. */
export function outOfRangeDesign(): Design {
  return chipAntennaDesign({ load: { kind: 'table', points: [[2.3e9, 20, 5], [2.6e9, 25, 10]] } });
}
