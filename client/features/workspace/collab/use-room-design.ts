/**
 * The design, derived from the room document on every update. A document a peer left in a state
 * that does not parse keeps the last good design on screen and reports the reason (the JSON path
 * and what is wrong) for a banner.
 */
import { startTransition, useEffect, useMemo, useState } from 'react';
import type * as Y from 'yjs';
import { readDesign, readDesignInput } from '../../../../shared/collab/schema';
import { DesignError, reparseDesign, type Design, type ParsedDesign } from '../../../../shared/rf/design';

export interface RoomDesignState {
  design: Design | null;
  /** why the document does not read as a design right now (null when it does) */
  error: string | null;
}

/**
 * Told of each new design synchronously, inside the document update (before React renders it). A
 * listener may return a promise of its work for that design (the live analysis: settled once its
 * result is drawn); the screen's render of the design waits for it (see LIVE_RENDER_MAX_WAIT_MS).
 */
export type DesignListener = (design: Design) => void | Promise<unknown>;

export interface DesignFeed {
  subscribe(listener: DesignListener): () => void;
}

export interface RoomDesign extends RoomDesignState {
  /** the same designs as `design`, delivered at once: live analysis starts from here, not after a render */
  feed: DesignFeed;
}

export type DesignReading = { ok: true; design: Design } | { ok: false; message: string };

function readingError(e: unknown): DesignReading {
  if (e instanceof DesignError) return { ok: false, message: e.message };
  return { ok: false, message: e instanceof Error ? e.message : 'the room document could not be read' };
}

/** One reading of the document: the design, or the sentence for the banner. */
export function readRoomDesign(doc: Y.Doc): DesignReading {
  try {
    return { ok: true, design: readDesign(doc) };
  } catch (e) {
    return readingError(e);
  }
}

/**
 * The document's content as read (unchecked) and as a string, or the reason it cannot be read;
 * the string skips re-checking an unchanged document.
 */
function readInput(doc: Y.Doc): { input: Record<string, unknown>; key: string } | { error: DesignReading } {
  try {
    const input = readDesignInput(doc) as unknown as Record<string, unknown>;
    return { input, key: JSON.stringify(input) };
  } catch (e) {
    return { error: readingError(e) };
  }
}

/** `input` checked as a design, reusing the previous reading's checked elements (`reparseDesign`). */
function checkInput(input: Record<string, unknown>, prev: ParsedDesign | null): DesignReading {
  try {
    return { ok: true, design: reparseDesign(prev, input) };
  } catch (e) {
    return readingError(e);
  }
}

/**
 * `next`, with every top-level field and element that reads the same as in `prev` replaced by
 * `prev`'s object (and `prev` itself when nothing changed).
 */
export function shareUnchanged(prev: Design | null, next: Design): Design {
  if (!prev) return next;
  const same = (a: unknown, b: unknown) => a === b || JSON.stringify(a) === JSON.stringify(b);
  const prevById = new Map(prev.elements.map((e) => [e.id, e]));
  let elementsSame = prev.elements.length === next.elements.length;
  const elements = next.elements.map((e, i) => {
    const old = prevById.get(e.id);
    const kept = old && same(old, e) ? old : e;
    if (kept !== prev.elements[i]) elementsSame = false;
    return kept;
  });
  const out: Record<string, unknown> = {};
  let allSame = elementsSame && Object.keys(prev).length === Object.keys(next).length;
  for (const [k, v] of Object.entries(next)) {
    if (k === 'elements') {
      out[k] = elementsSame ? prev.elements : elements;
      continue;
    }
    const old = (prev as unknown as Record<string, unknown>)[k];
    if (same(old, v)) out[k] = old;
    else {
      out[k] = v;
      allSame = false;
    }
  }
  return allSame ? prev : (out as unknown as Design);
}

/**
 * While new designs arrive closer together than this (a value being dragged here, or a peer's drag
 * relayed), the screen re-renders the design at most once per interval, the newest one, and the
 * last of a burst always; a design after a quiet spell renders at once. The feed still gets every
 * design synchronously, so the live analysis, the Smith chart and the sweep plot follow each step:
 * only the rest of the screen (chain canvas labels, side panel) trails by up to this much. A render
 * of the whole workspace per pointer event would otherwise hold the main thread for most of the
 * time between two events, and the analysis results would queue behind it.
 */
export const LIVE_RENDER_INTERVAL_MS = 100;

/**
 * The render of a new design also waits until the feed's listeners have finished with it (the
 * chart and the plot have drawn its analysis), so that it never stands between an edit and its
 * drawing; but never longer than this after it was due.
 */
export const LIVE_RENDER_MAX_WAIT_MS = 150;

export interface RenderThrottle {
  /** a new design; `settled` resolves when the feed's work for it is done (null: nothing to wait for) */
  offer(design: Design, settled: Promise<unknown> | null): void;
  /** render the waiting design now */
  flush(): void;
  dispose(): void;
}

/**
 * Renders (calls `show` with) the newest offered design: once its `settled` has resolved (or
 * `maxWaitMs` has passed) and at least `intervalMs` after the previous render. A design offered
 * after a quiet spell renders as soon as its work settles.
 */
export function createRenderThrottle(
  show: (design: Design) => void,
  { intervalMs = LIVE_RENDER_INTERVAL_MS, maxWaitMs = LIVE_RENDER_MAX_WAIT_MS } = {},
): RenderThrottle {
  let shownAt = Number.NEGATIVE_INFINITY;
  let timer: ReturnType<typeof setTimeout> | null = null;
  let waiting: { design: Design; settled: Promise<unknown> | null } | null = null;
  /** true while a due render waits for the newest design's work */
  let holding = false;
  let disposed = false;

  const render = () => {
    const next = waiting;
    waiting = null;
    if (!next || disposed) return;
    shownAt = performance.now();
    show(next.design);
  };
  const due = async () => {
    timer = null;
    holding = true;
    const deadline = performance.now() + maxWaitMs;
    // wait for the newest design's work; a newer design arriving meanwhile is waited for in turn
    for (let w = waiting; w?.settled && !disposed; ) {
      const left = deadline - performance.now();
      if (left <= 0) break;
      let stop: ReturnType<typeof setTimeout> | undefined;
      await Promise.race([w.settled.catch(() => undefined), new Promise((r) => (stop = setTimeout(r, left)))]);
      clearTimeout(stop);
      if (waiting === w) break;
      w = waiting;
    }
    holding = false;
    render();
  };
  return {
    offer(design, settled) {
      waiting = { design, settled };
      if (timer || holding || disposed) return;
      const wait = intervalMs - (performance.now() - shownAt);
      if (wait <= 0) void due();
      else timer = setTimeout(() => void due(), wait);
    },
    flush() {
      if (timer) clearTimeout(timer);
      timer = null;
      render();
    },
    dispose() {
      disposed = true;
      if (timer) clearTimeout(timer);
      timer = null;
    },
  };
}

/**
 * `ready` says the document holds the room's content (it has synced once); before that an empty
 * document is not an error.
 */
export function useRoomDesign(doc: Y.Doc | null, ready: boolean): RoomDesign {
  const [state, setState] = useState<RoomDesignState>({ design: null, error: null });
  const listeners = useMemo(() => new Set<DesignListener>(), []);
  const feed = useMemo<DesignFeed>(
    () => ({
      subscribe(listener) {
        listeners.add(listener);
        return () => listeners.delete(listener);
      },
    }),
    [listeners],
  );

  useEffect(() => {
    if (!doc) {
      setState({ design: null, error: null });
      return;
    }
    // One reading per document update; an unchanged document is not re-validated, and a new design
    // keeps the previous one's unchanged parts (same objects), so memoised views of them skip work.
    let lastKey: string | null = null;
    let last: ParsedDesign | null = null;
    // the screen's renders of new designs: after their analysis is drawn, throttled while they stream in
    const renders = createRenderThrottle((design) =>
      // The screen's render of a new design may be interrupted (by the chart drawing the analysis
      // result the feed asked for); the feed already has it.
      startTransition(() => setState({ design, error: null })),
    );
    const refresh = () => {
      const read = readInput(doc);
      if ('key' in read && read.key === lastKey) return;
      const reading = 'key' in read ? checkInput(read.input, last) : read.error;
      if (reading.ok) {
        // (a reading is good only when the document could be read: `read` has the input)
        const { input, key } = read as { input: Record<string, unknown>; key: string };
        lastKey = key;
        const design = shareUnchanged(last?.design ?? null, reading.design);
        last = { input, design };
        const work: Promise<unknown>[] = [];
        for (const listener of listeners) {
          const done = listener(design);
          if (done) work.push(done);
        }
        renders.offer(design, work.length ? Promise.all(work) : null);
      } else {
        lastKey = null;
        // the last good design a render was waiting for shows with the banner
        renders.flush();
        if (ready) setState((s) => ({ design: s.design, error: reading.message }));
      }
    };
    refresh();
    doc.on('update', refresh);
    return () => {
      doc.off('update', refresh);
      renders.dispose();
    };
  }, [doc, ready, listeners]);

  return useMemo(() => ({ ...state, feed }), [state, feed]);
}
