/**
 * The room's shared document, kept in sync over the collaboration socket (y-websocket protocol
 * at `/collab/<roomId>`).
 *
 * Each (re)connection first fetches a fresh collab token (they live 60 s), so a connection that
 * drops after a minute still comes back. Close codes 4400–4499 are the server's final word (the
 * user was removed from the room or lost access): we stop and report `denied`.
 */
import { useEffect, useState } from 'react';
import * as Y from 'yjs';
import { WebsocketProvider } from 'y-websocket';
import { sendOwnPresenceOnly } from './own-presence';
import { isApiError } from '../../../lib/api-client';
import { getCollabToken } from './collab-token';

export type RoomDocStatus = 'connecting' | 'connected' | 'disconnected' | 'denied';

export interface RoomDocState {
  doc: Y.Doc | null;
  provider: WebsocketProvider | null;
  status: RoomDocStatus;
  /** true once the document has been received from the server (and while connected) */
  synced: boolean;
  /** once synced at least once: the document holds the room's design, not an empty start */
  everSynced: boolean;
}

export interface RoomDocOptions {
  /** `ws(s)://host/collab` by default (same origin) */
  serverUrl?: string;
  fetchToken?: (roomId: string, signal: AbortSignal) => Promise<string>;
}

export function collabServerUrl(loc: Pick<Location, 'protocol' | 'host'> = window.location): string {
  return `${loc.protocol === 'https:' ? 'wss' : 'ws'}://${loc.host}/collab`;
}

const isFinalClose = (code: number | undefined) => code !== undefined && code >= 4400 && code < 4500;

/** Reconnect delay after `attempts` failures: 250 ms doubling, at most 5 s. */
export function reconnectDelayMs(attempts: number): number {
  return Math.min(5000, 250 * Math.pow(2, Math.max(0, attempts)));
}

export function useRoomDoc(roomId: string, options: RoomDocOptions = {}): RoomDocState {
  const { serverUrl, fetchToken = getCollabToken } = options;
  const [state, setState] = useState<RoomDocState>({
    doc: null,
    provider: null,
    status: 'connecting',
    synced: false,
    everSynced: false,
  });

  useEffect(() => {
    const doc = new Y.Doc();
    const provider = new WebsocketProvider(serverUrl ?? collabServerUrl(), roomId, doc, { connect: false, disableBc: true });
    sendOwnPresenceOnly(provider);
    const abort = new AbortController();
    let attempts = 0;
    let timer: ReturnType<typeof setTimeout> | undefined;
    let stopped = false;
    let everSynced = false;

    const update = (patch: Partial<RoomDocState>) => {
      if (!stopped) setState((s) => ({ ...s, ...patch }));
    };
    const deny = () => {
      stopped = true;
      provider.disconnect();
      setState((s) => ({ ...s, status: 'denied', synced: false }));
    };

    const connect = async () => {
      if (stopped) return;
      update({ status: 'connecting' });
      try {
        provider.params = { token: await fetchToken(roomId, abort.signal) };
      } catch (e) {
        if (stopped || abort.signal.aborted) return;
        if (isApiError(e) && (e.status === 401 || e.status === 403 || e.status === 404)) return deny();
        // The API is unreachable for now: try again later (the cookie alone may also do).
        attempts++;
        update({ status: 'disconnected' });
        timer = setTimeout(() => void connect(), reconnectDelayMs(attempts));
        return;
      }
      if (!stopped) provider.connect();
    };

    const onStatus = ({ status }: { status: 'connected' | 'disconnected' | 'connecting' }) => {
      if (status !== 'connecting') update({ status, ...(status === 'disconnected' ? { synced: false } : {}) });
    };
    const onSync = (synced: boolean) => {
      if (synced) {
        attempts = 0;
        everSynced = true;
      }
      update({ synced, everSynced });
    };
    const onClose = (event: CloseEvent | null) => {
      if (stopped) return;
      if (isFinalClose(event?.code)) return deny();
      // Take over reconnecting so the next attempt carries a fresh token. The provider emits this
      // before it lets go of the old socket, so act on the next tick.
      attempts++;
      setTimeout(() => {
        if (stopped) return;
        provider.disconnect();
        timer = setTimeout(() => void connect(), reconnectDelayMs(attempts));
      }, 0);
    };

    // The browser knows before the socket does: going offline closes it now (the edits made while
    // offline stay in the document and merge on reconnect); coming back reconnects at once, with a
    // fresh token, instead of waiting out the back-off.
    const onOffline = () => {
      if (!stopped) provider.ws?.close();
    };
    const onOnline = () => {
      if (stopped || provider.wsconnected) return;
      attempts = 0;
      clearTimeout(timer);
      provider.disconnect();
      void connect();
    };

    provider.on('status', onStatus);
    window.addEventListener('offline', onOffline);
    window.addEventListener('online', onOnline);
    provider.on('sync', onSync);
    provider.on('connection-close', onClose);
    setState({ doc, provider, status: 'connecting', synced: false, everSynced: false });
    void connect();

    return () => {
      stopped = true;
      abort.abort();
      clearTimeout(timer);
      window.removeEventListener('offline', onOffline);
      window.removeEventListener('online', onOnline);
      provider.off('status', onStatus);
      provider.off('sync', onSync);
      provider.off('connection-close', onClose);
      provider.destroy();
      doc.destroy();
    };
  }, [roomId, serverUrl, fetchToken]);

  return state;
}
