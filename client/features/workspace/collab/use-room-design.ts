/**
 * The design, derived from the room document on every update. A document a peer left in a state
 * that does not parse keeps the last good design on screen and reports the reason (the JSON path
 * and what is wrong) for a banner.
 */
import { startTransition, useEffect, useMemo, useState } from 'react';
import type * as Y from 'yjs';
import { readDesign, readDesignInput } from '../../../../shared/collab/schema';
import { DesignError, type Design } from '../../../../shared/rf/design';

export interface RoomDesignState {
  design: Design | null;
  /** why the document does not read as a design right now (null when it does) */
  error: string | null;
}

/** Listeners told of each new design synchronously, inside the document update (before React renders it). */
export interface DesignFeed {
  subscribe(listener: (design: Design) => void): () => void;
}

export interface RoomDesign extends RoomDesignState {
  /** the same designs as `design`, delivered at once: live analysis starts from here, not after a render */
  feed: DesignFeed;
}

export type DesignReading = { ok: true; design: Design } | { ok: false; message: string };

/** One reading of the document: the design, or the sentence for the banner. */
export function readRoomDesign(doc: Y.Doc): DesignReading {
  try {
    return { ok: true, design: readDesign(doc) };
  } catch (e) {
    if (e instanceof DesignError) return { ok: false, message: e.message };
    return { ok: false, message: e instanceof Error ? e.message : 'the room document could not be read' };
  }
}

/** The document's content as a string (null when it cannot be read), to skip re-reading an unchanged one. */
function inputKey(doc: Y.Doc): string | null {
  try {
    return JSON.stringify(readDesignInput(doc));
  } catch {
    return null;
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
 * `ready` says the document holds the room's content (it has synced once); before that an empty
 * document is not an error.
 */
export function useRoomDesign(doc: Y.Doc | null, ready: boolean): RoomDesign {
  const [state, setState] = useState<RoomDesignState>({ design: null, error: null });
  const listeners = useMemo(() => new Set<(design: Design) => void>(), []);
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
    let last: Design | null = null;
    const refresh = () => {
      const key = inputKey(doc);
      if (key !== null && key === lastKey) return;
      const reading = readRoomDesign(doc);
      if (reading.ok) {
        lastKey = key;
        const design = shareUnchanged(last, reading.design);
        last = design;
        for (const listener of listeners) listener(design);
        // The screen's render of a new design may be interrupted (by the chart drawing the analysis
        // result the feed asked for); the feed already has it.
        startTransition(() => setState({ design, error: null }));
      } else {
        lastKey = null;
        if (ready) setState((s) => ({ design: s.design, error: reading.message }));
      }
    };
    refresh();
    doc.on('update', refresh);
    return () => {
      doc.off('update', refresh);
    };
  }, [doc, ready, listeners]);

  return useMemo(() => ({ ...state, feed }), [state, feed]);
}
