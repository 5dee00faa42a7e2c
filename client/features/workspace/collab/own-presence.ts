/**
 * FOR THE WORKSPACE ENGINEER: sendOwnPresenceOnly(provider), once, right after `new WebsocketProvider`.
 *
 * The y-websocket client (3.x) sends the server every presence (awareness) change it sees, its own and
 * everyone else's as they arrive, so in a room of N people one cursor move comes back to the server N − 1
 * times. The server drops those echoes (the client ids belong to other sockets), but each is a message to
 * read. With this, a provider sends only its own client's changes: its own state, its renewals and its
 * leaving. (Its own state on (re)connecting is sent by the provider itself, not through this handler.)
 */
import type { WebsocketProvider } from 'y-websocket';

interface AwarenessChanges {
  added: number[];
  updated: number[];
  removed: number[];
}
type AwarenessHandler = (changes: AwarenessChanges, origin: unknown) => void;

export function sendOwnPresenceOnly(provider: WebsocketProvider): void {
  const p = provider as unknown as { _awarenessUpdateHandler?: AwarenessHandler };
  const send = p._awarenessUpdateHandler;
  if (typeof send !== 'function') return; // another y-websocket: leave it as it is
  const awareness = provider.awareness;
  const ownOnly: AwarenessHandler = (changes, origin) => {
    const mine = (ids: number[]) => ids.filter((id) => id === awareness.clientID);
    const own = { added: mine(changes.added), updated: mine(changes.updated), removed: mine(changes.removed) };
    if (own.added.length + own.updated.length + own.removed.length > 0) send(own, origin);
  };
  awareness.off('update', send);
  awareness.on('update', ownOnly);
  // destroy() takes off whatever handler this property holds.
  p._awarenessUpdateHandler = ownOnly;
}
