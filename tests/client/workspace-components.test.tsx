// @vitest-environment jsdom
import { cleanup, render, renderHook, screen, act, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import * as Y from 'yjs';
import { createDesignDoc, readDesign, setElementField } from '../../shared/collab/schema';
import { analyze } from '../../shared/rf/analyze';
import { parseDesign } from '../../shared/rf/design';
import { chipAntennaDesign, whipE12Design } from '../../shared/demo/designs';
import { ValueField } from '../../client/features/workspace/value/value-field';
import { ElementInspector, type ElementActions } from '../../client/features/workspace/inspector/element-inspector';
import { FiguresPanel } from '../../client/features/workspace/figures/figures-panel';
import { useLocalUndo } from '../../client/features/workspace/collab/use-local-undo';
import { useDesignEdits } from '../../client/features/workspace/collab/use-design-edits';
import { LIVE_RENDER_INTERVAL_MS, useRoomDesign } from '../../client/features/workspace/collab/use-room-design';

afterEach(() => cleanup());

describe('ValueField', () => {
  it('commits a value typed in engineering notation and shows it formatted', async () => {
    const onCommit = vi.fn();
    const { rerender } = render(<ValueField label="Value (H)" value={1e-9} unit="H" rules={{ positive: true }} onCommit={onCommit} />);
    const input = screen.getByLabelText('Value (H)');
    expect((input as HTMLInputElement).value).toBe('1 nH');
    await userEvent.clear(input);
    await userEvent.type(input, '3.3n{Enter}');
    expect(onCommit).toHaveBeenCalledWith(3.3e-9);
    rerender(<ValueField label="Value (H)" value={3.3e-9} unit="H" rules={{ positive: true }} onCommit={onCommit} />);
    expect((input as HTMLInputElement).value).toBe('3.3 nH');
  });

  it('keeps a bad entry in the field with the reason beside it, and Escape goes back', async () => {
    const onCommit = vi.fn();
    render(<ValueField label="Value (F)" value={1.2e-12} unit="F" rules={{ positive: true }} onCommit={onCommit} />);
    const input = screen.getByLabelText('Value (F)') as HTMLInputElement;
    await userEvent.clear(input);
    await userEvent.type(input, '2.2 nH');
    await userEvent.tab();
    expect(onCommit).not.toHaveBeenCalled();
    expect(input.value).toBe('2.2 nH');
    expect(input.getAttribute('aria-invalid')).toBe('true');
    expect(screen.getByRole('alert').textContent).toMatch(/henries.*expected farads/);
    await userEvent.click(input);
    await userEvent.keyboard('{Escape}');
    expect(input.value).toBe('1.2 pF');
    expect(screen.queryByRole('alert')).toBeNull();
  });

  it('clears an optional value with an empty field', async () => {
    const onCommit = vi.fn();
    render(<ValueField label="Q" value={40} unit="" optional onCommit={onCommit} />);
    await userEvent.clear(screen.getByLabelText('Q'));
    await userEvent.tab();
    expect(onCommit).toHaveBeenCalledWith(undefined);
  });

  it('tunes with the arrow keys: 2 % a step, Shift 10 %, E-series when chosen', async () => {
    const onTune = vi.fn();
    const { rerender } = render(<ValueField label="Value (H)" value={10e-9} unit="H" onCommit={() => undefined} tuning={{ scale: 'log', series: null, onTune }} />);
    const input = screen.getByLabelText('Value (H)');
    await userEvent.click(input);
    await userEvent.keyboard('{ArrowUp}');
    expect(onTune).toHaveBeenLastCalledWith(10.2e-9);
    await userEvent.keyboard('{Shift>}{ArrowDown}{/Shift}');
    expect(onTune.mock.calls[1][0]).toBe(9.091e-9); // 10 nH / 1.1, kept to four figures
    rerender(<ValueField label="Value (H)" value={10e-9} unit="H" onCommit={() => undefined} tuning={{ scale: 'log', series: 'E12', onTune }} />);
    await userEvent.keyboard('{ArrowUp}');
    expect(onTune).toHaveBeenLastCalledWith(12e-9); // IEC 60063 E12: 10 -> 12
  });

  it('does not tune or commit when read-only', async () => {
    const onTune = vi.fn();
    const onCommit = vi.fn();
    render(<ValueField label="Value (H)" value={10e-9} unit="H" readOnly onCommit={onCommit} tuning={{ scale: 'log', series: null, onTune }} />);
    const input = screen.getByLabelText('Value (H)');
    await userEvent.click(input);
    await userEvent.keyboard('{ArrowUp}5');
    await userEvent.tab();
    expect(onTune).not.toHaveBeenCalled();
    expect(onCommit).not.toHaveBeenCalled();
  });
});

const noActions: ElementActions = {
  setField: vi.fn(),
  setFields: vi.fn(),
  tuneField: vi.fn(),
  remove: vi.fn(),
  duplicate: vi.fn(),
  move: vi.fn(),
};

describe('ElementInspector', () => {
  const design = parseDesign(whipE12Design());
  it('for an observer renders every field read-only and no button', () => {
    render(<ElementInspector design={design} element={design.elements[0]} editable={false} series={null} actions={noActions} />);
    expect(screen.queryAllByRole('button')).toHaveLength(0);
    const fields = [...document.querySelectorAll('input, select, textarea')] as HTMLInputElement[];
    expect(fields.length).toBeGreaterThan(3);
    expect(fields.filter((f) => !f.readOnly && !f.disabled)).toHaveLength(0);
  });

  it('for a tuner writes a typed value, the lock and a tolerance through the actions', async () => {
    const actions = { ...noActions, setField: vi.fn() };
    render(<ElementInspector design={design} element={design.elements[0]} editable series={null} actions={actions} />);
    const value = screen.getByLabelText('Value (F)');
    await userEvent.clear(value);
    await userEvent.type(value, '22p{Enter}');
    expect(actions.setField).toHaveBeenCalledWith('c-series', 'value', 22e-12);
    await userEvent.click(screen.getByRole('checkbox', { name: /Locked/ }));
    expect(actions.setField).toHaveBeenCalledWith('c-series', 'locked', true);
    await userEvent.selectOptions(screen.getByLabelText('Kind'), 'none');
    expect(actions.setField).toHaveBeenCalledWith('c-series', 'tolerance', undefined);
    await userEvent.click(screen.getByRole('button', { name: 'Duplicate' }));
    expect(actions.duplicate).toHaveBeenCalledWith('c-series');
  });
});

describe('FiguresPanel', () => {
  it('shows the unmatched demo load without NaN or Infinity, with the cautions beside the stress', () => {
    const design = parseDesign(chipAntennaDesign());
    const result = analyze(design);
    render(<FiguresPanel design={design} result={result} error={null} />);
    const text = document.body.textContent ?? '';
    expect(text).not.toMatch(/NaN|Infinity/);
    expect(text).toMatch(/no match at the centre/);
    expect(text).toMatch(/misses the goal/);
    expect(screen.getByRole('complementary', { name: 'Cautions for transmitting designs' }).textContent).toMatch(/defer to local regulations/);
  });

  it('shows bandwidth, the limit gauge and each part’s stress for a matched design', () => {
    const design = parseDesign({
      ...chipAntennaDesign(),
      elements: [
        { id: 'L1', kind: 'series-l', value: 0.93e-9 },
        { id: 'C1', kind: 'shunt-c', value: 1.74e-12 },
      ],
    });
    render(<FiguresPanel design={design} result={analyze(design)} error={null} />);
    expect(screen.getByTestId('figure-bandwidth').textContent).toMatch(/MHz \(\d+(\.\d+)? %\)/);
    expect(screen.getByTestId('figure-worst').textContent).toMatch(/meets the goal/);
    expect(screen.getByRole('meter').getAttribute('aria-valuenow')).toMatch(/^\d+$/);
    expect(screen.getByRole('rowheader', { name: 'L1' })).toBeTruthy();
    expect(document.body.textContent).toMatch(/\d V/);
    expect(document.body.textContent).toMatch(/\d mA/);
  });
});

describe('per-user undo through the screen’s edits', () => {
  /** Two peers whose documents pass every update to each other, as the room socket does. */
  function twoPeers() {
    const a = createDesignDoc(whipE12Design());
    const b = new Y.Doc();
    Y.applyUpdate(b, Y.encodeStateAsUpdate(a));
    a.on('update', (u: Uint8Array, origin: unknown) => origin !== 'remote' && Y.applyUpdate(b, u, 'remote'));
    b.on('update', (u: Uint8Array, origin: unknown) => origin !== 'remote' && Y.applyUpdate(a, u, 'remote'));
    return { a, b };
  }

  it('undo takes back only this user’s edit, never a collaborator’s', () => {
    const { a, b } = twoPeers();
    const ua = renderHook(() => useLocalUndo(a, 'user-a'));
    const ub = renderHook(() => useLocalUndo(b, 'user-b'));
    const ea = renderHook(() => useDesignEdits(a, ua.result.current, true));
    const eb = renderHook(() => useDesignEdits(b, ub.result.current, true));
    ea.rerender();
    eb.rerender();
    act(() => ea.result.current.setField('c-series', 'value', 22e-12));
    act(() => eb.result.current.setField('c-shunt', 'value', 10e-12));
    const values = (doc: Y.Doc) => readDesign(doc).elements.map((e) => ('value' in e ? e.value : null));
    expect(values(a)).toEqual([22e-12, 10e-12]);
    expect(values(b)).toEqual([22e-12, 10e-12]);
    act(() => ua.result.current!.undo());
    expect(values(a)).toEqual([18e-12, 10e-12]);
    expect(values(b)).toEqual([18e-12, 10e-12]);
    expect(ub.result.current!.canUndo).toBe(true);
    act(() => ub.result.current!.undo());
    expect(values(b)).toEqual([18e-12, 12e-12]);
  });

  it('an observer’s screen writes nothing, and an invalid patch is refused with the reason', () => {
    const doc = createDesignDoc(whipE12Design());
    const undo = renderHook(() => useLocalUndo(doc, 'user-o'));
    const observer = renderHook(() => useDesignEdits(doc, undo.result.current, false));
    const before = Y.encodeStateVector(doc);
    act(() => observer.result.current.setField('c-series', 'value', 1e-12));
    expect(observer.result.current.add('series-l')).toBeNull();
    expect(Y.encodeStateVector(doc)).toEqual(before);

    const tuner = renderHook(() => useDesignEdits(doc, undo.result.current, true));
    expect(tuner.result.current.applyPatch({ band: { startHz: 5e8, stopHz: 4e8 } })).toMatch(/band\.stopHz/);
    expect(tuner.result.current.applyPatch({ goal: { maxVswr: 1.5 } })).toBeNull();
    expect(readDesign(doc).goal).toEqual({ maxVswr: 1.5 });
  });

  it('adds elements with fresh ids next to the port and duplicates beside the original', () => {
    const doc = createDesignDoc(whipE12Design());
    const undo = renderHook(() => useLocalUndo(doc, 'user-t'));
    const edits = renderHook(() => useDesignEdits(doc, undo.result.current, true));
    let id: string | null = null;
    act(() => {
      id = edits.result.current.add('series-l');
    });
    // the id carries a random suffix (two tuners adding at once never collide); the label is L1
    expect(id).toMatch(/^L1-[a-z2-9]{4}$/);
    let copy: string | null = null;
    act(() => {
      copy = edits.result.current.duplicate('c-series');
    });
    // C1 and C2 are labels already in use in the whip room, so the copy is labelled C3.
    expect(copy).toMatch(/^C3-[a-z2-9]{4}$/);
    expect(readDesign(doc).elements.map((e) => e.id)).toEqual(['c-series', copy, 'c-shunt', id]);
    expect(readDesign(doc).elements.map((e) => e.label ?? null)).toEqual(['C1', 'C3', 'C2', 'L1']);
    act(() => undo.result.current!.undo());
    expect(readDesign(doc).elements.map((e) => e.id)).toEqual(['c-series', 'c-shunt', id]);
  });
});

describe('useRoomDesign', () => {
  it('keeps the last good design and names the problem when a peer writes nonsense', async () => {
    const doc = createDesignDoc(whipE12Design());
    const hook = renderHook(() => useRoomDesign(doc, true));
    expect(hook.result.current.design?.elements).toHaveLength(2);
    act(() => setElementField(doc, 'c-shunt', 'value', -1));
    expect(hook.result.current.error).toMatch(/^elements\[1\]\.value: must be a positive number of farads/);
    expect(hook.result.current.design?.elements[1]).toMatchObject({ id: 'c-shunt', value: 12e-12 });
    act(() => setElementField(doc, 'c-shunt', 'value', 15e-12));
    // (a design right after another renders once the live-render interval has passed)
    await waitFor(() => expect(hook.result.current.error).toBeNull());
    expect(hook.result.current.design?.elements[1]).toMatchObject({ value: 15e-12 });
  });

  it('shows a burst of designs at most once per interval, and always the last one', async () => {
    const doc = createDesignDoc(whipE12Design());
    let renders = 0;
    const hook = renderHook(() => {
      renders++;
      return useRoomDesign(doc, true);
    });
    const seen: number[] = [];
    const stop = hook.result.current.feed.subscribe((d) => void seen.push((d.elements[1] as { value: number }).value));
    const before = renders;
    const started = performance.now();
    // 20 steps of a drag, 5 ms apart: the feed hears each, the screen renders a few times at most
    for (let i = 1; i <= 20; i++) {
      act(() => setElementField(doc, 'c-shunt', 'value', (12 + i) * 1e-12));
      await new Promise((r) => setTimeout(r, 5));
    }
    expect(seen).toHaveLength(20);
    await waitFor(() => expect(hook.result.current.design?.elements[1]).toMatchObject({ value: 32e-12 }));
    const elapsed = performance.now() - started;
    expect(renders - before).toBeLessThanOrEqual(Math.ceil(elapsed / LIVE_RENDER_INTERVAL_MS) + 1);
    expect(renders - before).toBeLessThan(20);
    stop();
  });

  it('does not call an empty document an error before it has synced', () => {
    const hook = renderHook(() => useRoomDesign(new Y.Doc(), false));
    expect(hook.result.current.design).toBeNull();
    expect(hook.result.current.error).toBeNull();
  });

  it('tells its feed of each new design inside the document update, before React renders it', async () => {
    const doc = createDesignDoc(whipE12Design());
    const hook = renderHook(() => useRoomDesign(doc, true));
    const seen: number[] = [];
    const stop = hook.result.current.feed.subscribe((d) => void seen.push((d.elements[1] as { value: number }).value));
    setElementField(doc, 'c-shunt', 'value', 15e-12);
    // no act(): the listener ran synchronously with the edit
    expect(seen).toEqual([15e-12]);
    stop();
    act(() => setElementField(doc, 'c-shunt', 'value', 18e-12));
    expect(seen).toEqual([15e-12]);
    await waitFor(() => expect(hook.result.current.design?.elements[1]).toMatchObject({ value: 18e-12 }));
  });
});
