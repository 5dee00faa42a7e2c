/**
 * Presence over the provider's awareness: publishes this user's identity, selection, pointer and
 * chart view, and lists everyone else in the room. Pointer updates are throttled so a moving mouse
 * does not flood the socket.
 */
import { useCallback, useEffect, useRef, useState } from 'react';
import type { WebsocketProvider } from 'y-websocket';
import { peersFrom, type ChartViewState, type Peer, type PresenceCursor, type PresenceUser } from './presence-state';

export interface Presence {
  peers: Peer[];
  setSelection(id: string | null): void;
  setCursor(cursor: PresenceCursor | null): void;
  setView(view: ChartViewState | null): void;
  setFollowing(userId: string | null): void;
}

const CURSOR_INTERVAL_MS = 50;

/**
 * Others' presence re-renders the screen at most this often (their pointers move all the time; a
 * render of the whole workspace per awareness message would hold the main thread while their
 * edits wait to be analysed and drawn). The first change after a quiet spell shows at once.
 */
export const PEERS_RENDER_INTERVAL_MS = 100;

export function usePresence(provider: WebsocketProvider | null, me: PresenceUser | null): Presence {
  const [peers, setPeers] = useState<Peer[]>([]);
  const pendingCursor = useRef<{ cursor: PresenceCursor | null; timer: ReturnType<typeof setTimeout> | null; last: number }>({
    cursor: null,
    timer: null,
    last: 0,
  });

  useEffect(() => {
    if (!provider) return;
    const awareness = provider.awareness;
    let shownAt = Number.NEGATIVE_INFINITY;
    let timer: ReturnType<typeof setTimeout> | null = null;
    const refresh = () => {
      timer = null;
      shownAt = performance.now();
      setPeers(peersFrom(awareness.getStates() as Map<number, unknown>, awareness.clientID));
    };
    // Our own pointer moves change only our own state: nothing to redraw for that.
    const onChange = (changes: { added: number[]; updated: number[]; removed: number[] }) => {
      const ids = [...changes.added, ...changes.updated, ...changes.removed];
      if (!ids.some((id) => id !== awareness.clientID) || timer) return;
      const wait = PEERS_RENDER_INTERVAL_MS - (performance.now() - shownAt);
      if (wait <= 0) refresh();
      else timer = setTimeout(refresh, wait);
    };
    awareness.on('change', onChange);
    refresh();
    return () => {
      awareness.off('change', onChange);
      if (timer) clearTimeout(timer);
      setPeers([]);
    };
  }, [provider]);

  useEffect(() => {
    if (!provider || !me) return;
    provider.awareness.setLocalStateField('user', me);
  }, [provider, me]);

  useEffect(() => {
    const pending = pendingCursor.current;
    return () => {
      if (pending.timer) clearTimeout(pending.timer);
    };
  }, []);

  const setField = useCallback(
    (field: string, value: unknown) => {
      if (provider && provider.awareness.getLocalState() !== null) provider.awareness.setLocalStateField(field, value);
    },
    [provider],
  );

  const setCursor = useCallback(
    (cursor: PresenceCursor | null) => {
      const p = pendingCursor.current;
      p.cursor = cursor;
      const flush = () => {
        p.timer = null;
        p.last = Date.now();
        setField('cursor', p.cursor);
      };
      if (p.timer) return;
      const wait = CURSOR_INTERVAL_MS - (Date.now() - p.last);
      if (wait <= 0 || cursor === null) flush();
      else p.timer = setTimeout(flush, wait);
    },
    [setField],
  );

  return {
    peers,
    setSelection: useCallback((id: string | null) => setField('selection', id), [setField]),
    setCursor,
    setView: useCallback((view: ChartViewState | null) => setField('view', view), [setField]),
    setFollowing: useCallback((userId: string | null) => setField('following', userId), [setField]),
  };
}
