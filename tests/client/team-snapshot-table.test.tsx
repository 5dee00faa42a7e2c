// @vitest-environment jsdom
import { cleanup, screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { Snapshot } from '../../shared/api/snapshots';
import { SnapshotTable } from '../../client/features/snapshots/components/snapshot-table';
import { snapshotRow } from '../../client/features/snapshots/components/snapshot-rows';
import { renderApp } from './support/render';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

const hour = 3_600_000;
const now = Date.UTC(2026, 11, 15, 12);

function snapshot(id: string, label: string, over: Partial<Snapshot> & { vswr?: number | null; fractional?: number | null; parts?: number } = {}): Snapshot {
  const { vswr = 1.5, fractional = 0.05, parts = 2, ...rest } = over;
  return {
    id,
    roomId: 'r1',
    label,
    createdAt: now - hour,
    createdBy: { id: 'u1', displayName: 'Demo Tuner' },
    forReview: false,
    figures: {
      partCount: parts,
      worstInBand: { vswr, returnLossDb: 14 },
      bandwidth: fractional === null ? null : { lowHz: 2.38e9, highHz: 2.38e9 * (1 + fractional), fractional },
      goalMet: vswr !== null && vswr <= 2,
      analysed: true,
    },
    ...rest,
  };
}

const labelsInOrder = () =>
  screen
    .getAllByRole('row')
    .slice(1)
    .map((row) => within(row).getAllByRole('cell')[0].textContent);

describe('SnapshotTable', () => {
  const snapshots = [
    snapshot('s1', 'first cut', { createdAt: now - 3 * hour, vswr: 2.6, fractional: null, parts: 2 }),
    snapshot('s2', 'E12 values', { createdAt: now - 2 * hour, vswr: 1.21, fractional: 0.08, parts: 2, forReview: true }),
    snapshot('s3', 'wideband four-part', {
      createdAt: now - 1 * hour,
      vswr: 1.6,
      fractional: 0.12,
      parts: 4,
      createdBy: { id: 'u2', displayName: 'Demo Owner' },
    }),
  ];

  it('lists newest first, then sorts by worst VSWR both ways when its header is pressed', async () => {
    renderApp(<SnapshotTable snapshots={snapshots} />);
    expect(labelsInOrder()).toEqual(['wideband four-part', 'E12 values', 'first cut']);
    const vswrHeader = screen.getByRole('button', { name: /Worst VSWR in band/ });
    await userEvent.click(vswrHeader);
    expect(labelsInOrder()).toEqual(['E12 values', 'wideband four-part', 'first cut']);
    expect(screen.getByRole('columnheader', { name: /Worst VSWR/ }).getAttribute('aria-sort')).toBe('ascending');
    await userEvent.click(vswrHeader);
    expect(labelsInOrder()).toEqual(['first cut', 'wideband four-part', 'E12 values']);
    expect(screen.getByRole('columnheader', { name: /Worst VSWR/ }).getAttribute('aria-sort')).toBe('descending');
  });

  it('sorts bandwidth widest first, with a snapshot that misses the goal at the centre last', async () => {
    renderApp(<SnapshotTable snapshots={snapshots} />);
    await userEvent.click(screen.getByRole('button', { name: /Bandwidth/ }));
    expect(labelsInOrder()).toEqual(['wideband four-part', 'E12 values', 'first cut']);
    await userEvent.click(screen.getByRole('button', { name: /Bandwidth/ }));
    expect(labelsInOrder()).toEqual(['E12 values', 'wideband four-part', 'first cut']);
  });

  it('filters by label or person, and by the review flag', async () => {
    renderApp(<SnapshotTable snapshots={snapshots} />);
    const filter = screen.getByLabelText('Filter by label or person');
    await userEvent.type(filter, 'owner');
    expect(labelsInOrder()).toEqual(['wideband four-part']);
    expect(screen.getByText('1 of 3 shown')).toBeTruthy();
    await userEvent.clear(filter);
    await userEvent.type(filter, 'e12');
    expect(labelsInOrder()).toEqual(['E12 values']);
    await userEvent.clear(filter);
    await userEvent.type(filter, 'no such thing');
    expect(screen.getByText('No snapshot matches the filter.')).toBeTruthy();
    await userEvent.clear(filter);

    await userEvent.click(screen.getByRole('checkbox', { name: 'For review only' }));
    expect(labelsInOrder()).toEqual(['E12 values']);
    await userEvent.click(screen.getByRole('checkbox', { name: 'For review only' }));
    expect(labelsInOrder()).toHaveLength(3);
  });

  it('pages through many snapshots', async () => {
    const many = Array.from({ length: 11 }, (_, i) => snapshot(`m${i}`, `step ${i}`, { createdAt: now - i * hour }));
    renderApp(<SnapshotTable snapshots={many} pageSize={5} />);
    expect(labelsInOrder()).toEqual(['step 0', 'step 1', 'step 2', 'step 3', 'step 4']);
    expect(screen.getByText('Page 1 of 3')).toBeTruthy();
    expect((screen.getByRole('button', { name: 'Previous' }) as HTMLButtonElement).disabled).toBe(true);
    await userEvent.click(screen.getByRole('button', { name: 'Next' }));
    await userEvent.click(screen.getByRole('button', { name: 'Next' }));
    expect(labelsInOrder()).toEqual(['step 10']);
    expect((screen.getByRole('button', { name: 'Next' }) as HTMLButtonElement).disabled).toBe(true);
  });

  it('has no actions column (and no buttons in the rows) without renderActions', () => {
    renderApp(<SnapshotTable snapshots={snapshots} />);
    expect(screen.queryByRole('columnheader', { name: 'Actions' })).toBeNull();
    for (const row of screen.getAllByRole('row').slice(1)) expect(within(row).queryAllByRole('button')).toHaveLength(0);
  });

  it('renders the caller’s actions in the last column', () => {
    renderApp(<SnapshotTable snapshots={snapshots} renderActions={(row) => <button type="button">Restore {row.label}</button>} />);
    expect(screen.getByRole('columnheader', { name: 'Actions' })).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Restore E12 values' })).toBeTruthy();
  });
});

describe('snapshotRow', () => {
  it('shows the band edges with four figures and the fractional bandwidth', () => {
    const row = snapshotRow(snapshot('a', 'x', { fractional: 0.057 }));
    // 2.38 GHz × 1.057 = 2.51566 GHz, shown to four significant figures (common practice).
    expect(row.bandwidthText).toBe('2.38 GHz – 2.516 GHz (5.7 %)');
    expect(row.worstVswrText).toBe('1.50');
  });

  it('says "not analysed" and never NaN when the figures are missing, and ∞ for a total reflection', () => {
    const bare = snapshotRow({ ...snapshot('a', 'x'), figures: null });
    expect([bare.bandwidthText, bare.worstVswrText, bare.partCount]).toEqual(['not analysed', 'not analysed', null]);
    const open = snapshotRow(snapshot('b', 'y', { vswr: null, fractional: null }));
    expect(open.worstVswr).toBe(Infinity);
    expect(open.worstVswrText).toBe('∞ (total reflection)');
    expect(open.bandwidthText).toBe('goal missed at the centre');
  });
});
