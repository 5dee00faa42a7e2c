/**
 * The design, derived from the room document on every update. A document a peer left in a state
 * that does not parse keeps the last good design on screen and reports the reason (the JSON path
 * and what is wrong) for a banner.
 */
import { useEffect, useState } from 'react';
import type * as Y from 'yjs';
import { readDesign } from '../../../../shared/collab/schema';
import { DesignError, type Design } from '../../../../shared/rf/design';

export interface RoomDesignState {
  design: Design | null;
  /** why the document does not read as a design right now (null when it does) */
  error: string | null;
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

/**
 * `ready` says the document holds the room's content (it has synced once); before that an empty
 * document is not an error.
 */
export function useRoomDesign(doc: Y.Doc | null, ready: boolean): RoomDesignState {
  const [state, setState] = useState<RoomDesignState>({ design: null, error: null });

  useEffect(() => {
    if (!doc) {
      setState({ design: null, error: null });
      return;
    }
    const refresh = () => {
      const reading = readRoomDesign(doc);
      if (reading.ok) setState({ design: reading.design, error: null });
      else if (ready) setState((s) => ({ design: s.design, error: reading.message }));
    };
    refresh();
    doc.on('update', refresh);
    return () => {
      doc.off('update', refresh);
    };
  }, [doc, ready]);

  return state;
}
