// @vitest-environment jsdom
import { cleanup, render, screen, within } from '@testing-library/react';
import { afterEach, describe, expect, it } from 'vitest';
import { designDiff } from '../../shared/api/design-diff';
import { whipE12Design, whipFirstCutDesign, whipLowCostDesign } from '../../shared/demo/designs';
import { parseDesign, type Design } from '../../shared/rf/design';
import { DiffList } from '../../client/features/compare/components/diff-list';
import { diffRows, elementSummary, formatDiffValue } from '../../client/features/compare/components/diff-rows';

afterEach(cleanup);

const rowsOf = (table: HTMLElement) =>
  within(table)
    .getAllByRole('row')
    .slice(1)
    .map((row) => [within(row).getByRole('rowheader').textContent, ...within(row).getAllByRole('cell').map((c) => c.textContent)]);

describe('diffRows', () => {
  it('names each changed part value in engineering units, old beside new', () => {
    const a = parseDesign(whipFirstCutDesign());
    const b = parseDesign(whipE12Design());
    const rows = diffRows(designDiff(a, b), a, b);
    // The first cut has the exact L-section values; E12 rounds them (18.67 pF -> 18 pF, 13.05 pF -> 12 pF) and adds Q and ±5 %.
    expect(rows.map((r) => [r.subject, r.before, r.after])).toEqual([
      ['C1 (series C): Q', '—', '400'],
      ['C1 (series C): tolerance', '—', '±5 %'],
      ['C1 (series C): value', '18.67 pF', '18 pF'],
      ['C2 (shunt C): Q', '—', '400'],
      ['C2 (shunt C): tolerance', '—', '±5 %'],
      ['C2 (shunt C): value', '13.05 pF', '12 pF'],
    ]);
  });

  it('lists design fields, removed, added and moved elements', () => {
    const a = parseDesign(whipE12Design());
    const base = whipE12Design();
    const b: Design = parseDesign({
      ...base,
      name: '433 MHz whip — with a trap',
      band: { ...base.band, stopHz: 435e6 },
      load: { kind: 'rlc', topology: 'series', r: 12, l: 33e-9, c: 9e-12 },
      elements: [
        { id: 'c-shunt', kind: 'shunt-c', value: 12e-12, label: 'C2', q: 400, tolerance: { relative: 0.05 } },
        { id: 'c-series', kind: 'series-c', value: 18e-12, label: 'C1', q: 400, tolerance: { relative: 0.05 } },
        { id: 'l-new', kind: 'series-l', value: 4.7e-9, label: 'L3', q: 40 },
      ],
    });
    const rows = diffRows(designDiff(a, b), a, b);
    expect(rows.map((r) => [r.kind, r.subject, r.before, r.after])).toEqual([
      ['field', 'Band stop', '434.79 MHz', '435 MHz'],
      ['field', 'Load L', '30 nH', '33 nH'],
      ['field', 'Design name', '“433 MHz whip antenna”', '“433 MHz whip — with a trap”'],
      ['added', 'L3 (series L) added', '—', 'series L 4.7 nH, Q 40 (position 3)'],
      // Two elements swapped: the shared diff keeps the longest run in place and names the other as moved.
      ['moved', 'C2 (shunt C) moved', 'position 2', 'position 1'],
    ]);
  });

  it('formats lines, stubs, transformers and measurements without NaN', () => {
    expect(elementSummary({ id: 's', kind: 'open-stub', z0: 50, length: { degrees: 45, atHz: 2.44e9 } })).toBe('open stub Z0 50 Ω, 45° at 2.44 GHz');
    expect(elementSummary({ id: 't', kind: 'transformer', ratio: 1.414 })).toBe('transformer 1 : 1.414');
    expect(formatDiffValue('length.meters', 0.0123)).toBe('12.3 mm');
    expect(formatDiffValue('load.ohms', [18, -8])).toBe('18 − j8 Ω');
    expect(formatDiffValue('load.touchstone', '! comment\n# Hz S RI R 50\n1e9 0.1 0\n2e9 0.2 0\n')).toBe('Touchstone data (3 lines)');
    expect(formatDiffValue('value', Number.NaN, 'series-l')).toBe('—');
    expect(formatDiffValue('locked', true)).toBe('yes');
    expect(formatDiffValue('tolerance', { absolute: 1e-13, distribution: 'normal' }, 'shunt-c')).toBe('±100 fF (normal, 3σ)');
    expect(formatDiffValue('length', { meters: 0.0123, velocityFactor: 0.66 })).toBe('12.3 mm, velocity factor 0.66');
    expect(formatDiffValue('drive', { powerW: 0.025 })).toBe('Drive power 25 mW');
    // Dimensionless values never take a prefix ("660m" for 0.66 would misread).
    expect(formatDiffValue('q', 0.5)).toBe('0.5');
    expect(formatDiffValue('load.ohms', [0.25, 0.5])).toBe('0.25 + j0.5 Ω');
  });
});

describe('DiffList', () => {
  it('shows the two sides in their own columns, headed by their names', () => {
    const a = parseDesign(whipE12Design());
    const b = parseDesign(whipLowCostDesign());
    render(<DiffList diff={designDiff(a, b)} a={a} b={b} aLabel="“E12 values”" bLabel="Live room" />);
    const table = screen.getByRole('table', { name: 'Differences' });
    expect(within(table).getAllByRole('columnheader').map((h) => h.textContent)).toEqual(['What', '“E12 values”', 'Live room']);
    expect(rowsOf(table)).toEqual([
      ['designDesign name', '“433 MHz whip antenna”', '“433 MHz whip — low-cost branch”'],
      ['changedC1 (series C): Q', '400', '200'],
      ['changedC1 (series C): tolerance', '±5 %', '±10 %'],
      ['changedC2 (shunt C): Q', '400', '200'],
      ['changedC2 (shunt C): tolerance', '±5 %', '±10 %'],
    ]);
  });

  it('says so when nothing differs', () => {
    const a = parseDesign(whipE12Design());
    render(<DiffList diff={designDiff(a, a)} a={a} b={a} aLabel="a" bLabel="b" />);
    expect(screen.getByRole('status').textContent).toContain('The two designs are the same');
    expect(screen.queryByRole('table')).toBeNull();
  });
});
