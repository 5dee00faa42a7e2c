// @vitest-environment jsdom
import { describe, expect, it } from 'vitest';
import { act, renderHook } from '@testing-library/react';
import { DesignError, type Design } from '../../shared/rf/design';
import type { EngineClient } from '../../client/features/workspace/analysis/engine-client';
import { createMainThreadEngineClient } from '../../client/features/workspace/analysis/engine-client';
import type { AnalysisResult, ImpedancePath } from '../../client/features/workspace/analysis/engine-types';
import { useAnalysis } from '../../client/features/workspace/analysis/use-analysis';
import { chipAntennaDesign, outOfRangeDesign } from './analysis-fixtures';

/** A fake engine client: each analyze waits for the test; results are tagged with the design's name. */
function fakeClient() {
  const calls: { name: string; resolve: () => void; reject: (e: unknown) => void }[] = [];
  const client = {
    mode: 'main-thread',
    analyze(design: Design) {
      return new Promise((resolve, reject) => {
        calls.push({
          name: design.name,
          resolve: () => resolve({ result: { tag: design.name } as unknown as AnalysisResult, path: { segments: [] } as unknown as ImpedancePath }),
          reject,
        });
      });
    },
  } as unknown as EngineClient;
  return { client, calls };
}
const tagOf = (r: AnalysisResult | null) => (r as unknown as { tag: string } | null)?.tag ?? null;
const named = (name: string) => chipAntennaDesign({ name });

/** A design feed the test drives, like useRoomDesign's. */
function testFeed() {
  const listeners = new Set<(d: Design) => void>();
  return {
    feed: {
      subscribe(l: (d: Design) => void) {
        listeners.add(l);
        return () => listeners.delete(l);
      },
    },
    emit: (d: Design) => listeners.forEach((l) => l(d)),
  };
}

describe('useAnalysis', () => {
  it('sends a design from its feed at once, and does not send an older one a later render still shows', async () => {
    const { client, calls } = fakeClient();
    const { feed, emit } = testFeed();
    const { result, rerender } = renderHook(({ d }) => useAnalysis(d, client, feed), { initialProps: { d: named('a') } });
    await act(async () => calls[0].resolve());
    emit(named('b')); // outside act: no render has happened, the request is already out
    expect(calls.map((c) => c.name)).toEqual(['a', 'b']);
    rerender({ d: named('a2') }); // a render of an older reading does not go to the engine
    await act(async () => calls[1].resolve());
    expect(calls.map((c) => c.name)).toEqual(['a', 'b']);
    expect(tagOf(result.current.result)).toBe('b');
    expect(result.current.pending).toBe(false);
  });

  it('analyses the design and reports pending until the result arrives', async () => {
    const { client, calls } = fakeClient();
    const { result } = renderHook(() => useAnalysis(named('a'), client));
    expect(result.current.pending).toBe(true);
    expect(calls.map((c) => c.name)).toEqual(['a']);
    await act(async () => calls[0].resolve());
    expect(tagOf(result.current.result)).toBe('a');
    expect(result.current.pending).toBe(false);
    expect(result.current.error).toBeNull();
  });

  it('drops the designs superseded while the engine was busy and shows the newest', async () => {
    const { client, calls } = fakeClient();
    const { result, rerender } = renderHook(({ d }) => useAnalysis(d, client), { initialProps: { d: named('a') } });
    rerender({ d: named('b') });
    rerender({ d: named('c') });
    expect(calls.map((c) => c.name)).toEqual(['a']); // b and c wait; b is replaced by c
    await act(async () => calls[0].resolve());
    expect(tagOf(result.current.result)).toBe('a');
    expect(result.current.pending).toBe(true); // c is still to come
    expect(calls.map((c) => c.name)).toEqual(['a', 'c']);
    await act(async () => calls[1].resolve());
    expect(tagOf(result.current.result)).toBe('c');
    expect(result.current.pending).toBe(false);
  });

  it('does not re-analyse a new object with the same content', async () => {
    const { client, calls } = fakeClient();
    const { rerender } = renderHook(({ d }) => useAnalysis(d, client), { initialProps: { d: named('a') } });
    await act(async () => calls[0].resolve());
    rerender({ d: named('a') });
    rerender({ d: structuredClone(named('a')) });
    expect(calls).toHaveLength(1);
  });

  it('shows a DesignError as its sentence and keeps the last good result on screen', async () => {
    const { client, calls } = fakeClient();
    const { result, rerender } = renderHook(({ d }) => useAnalysis(d, client), { initialProps: { d: named('a') } });
    await act(async () => calls[0].resolve());
    rerender({ d: named('b') });
    await act(async () => calls[1].reject(new DesignError('elements[1].value', 'must be a positive number of henries')));
    expect(result.current.error).toBe('elements[1].value: must be a positive number of henries');
    expect(tagOf(result.current.result)).toBe('a');
    rerender({ d: named('c') });
    await act(async () => calls[2].resolve());
    expect(result.current.error).toBeNull();
  });

  it('clears everything for a null design', async () => {
    const { client, calls } = fakeClient();
    const { result, rerender } = renderHook(({ d }: { d: Design | null }) => useAnalysis(d, client), { initialProps: { d: named('a') as Design | null } });
    await act(async () => calls[0].resolve());
    rerender({ d: null });
    expect(result.current).toEqual({ result: null, path: null, error: null, pending: false });
  });

  it('runs the real engine on the main thread and reports an out-of-range load clearly', async () => {
    const client = createMainThreadEngineClient();
    const { result, rerender } = renderHook(({ d }) => useAnalysis(d, client), { initialProps: { d: chipAntennaDesign() } });
    await act(async () => new Promise((r) => setTimeout(r, 0)));
    expect(result.current.result?.frequenciesHz).toHaveLength(101);
    expect(result.current.path?.segments).toHaveLength(2);
    rerender({ d: outOfRangeDesign() });
    await act(async () => new Promise((r) => setTimeout(r, 0)));
    expect(result.current.error).toMatch(/^load\.points: frequency 2 GHz lies outside the table's range 2\.3 GHz–2\.6 GHz$/);
  });
});
