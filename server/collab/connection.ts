/**
 * One open room socket: who it is, what they may do (their role can change while connected), and
 * sending with backpressure. Message handling lives in the room (room.ts).
 */
import { WebSocket } from 'ws';
import type { Role } from '../auth/tokens';
import { canEdit } from '../rooms/membership';
import { COLLAB_CLOSE } from '../../shared/collab/close-codes';

/** Close reasons are at most 123 bytes (RFC 6455). */
export function closeReason(text: string): string {
  let out = text;
  while (Buffer.byteLength(out) > 123) out = out.slice(0, -1);
  return out;
}

export class CollabConnection {
  /** Awareness client ids this socket speaks for. */
  readonly awarenessClients = new Set<number>();
  closed = false;
  /** Set by the ping sweep; cleared when a pong arrives. */
  awaitingPong = false;
  /** True once an update that would have changed the document was dropped (the client's copy has diverged). */
  diverged = false;
  /** True once the hub has set the role (a role change), so a stale database read must not undo it. */
  roleSetByHub = false;
  private closedListeners: ((conn: CollabConnection) => void)[] = [];

  constructor(
    readonly ws: WebSocket,
    readonly userId: string,
    public role: Role,
    private readonly maxBufferedBytes: number,
  ) {
    ws.on('pong', () => {
      this.awaitingPong = false;
    });
    ws.on('close', () => this.markClosed());
    ws.on('error', () => this.markClosed());
  }

  /** `fn` runs once, when the socket closes for any reason (at once if it already has). */
  whenClosed(fn: (conn: CollabConnection) => void): void {
    if (this.closed) fn(this);
    else this.closedListeners.push(fn);
  }

  /** Removed from the room: nothing it sent may be stored, even if already queued. */
  revoked = false;

  /** May this socket's updates be stored? (Queued updates of a socket that has since closed still count.) */
  mayWrite(): boolean {
    return !this.revoked && canEdit(this.role);
  }

  canWrite(): boolean {
    return !this.closed && this.mayWrite();
  }

  send(message: Uint8Array): void {
    if (this.closed || this.ws.readyState !== WebSocket.OPEN) return;
    if (this.ws.bufferedAmount > this.maxBufferedBytes) {
      this.close(COLLAB_CLOSE.tooSlow, 'too far behind; reconnect to resynchronise');
      return;
    }
    this.ws.send(message, (err) => {
      if (err) this.terminate();
    });
  }

  close(code: number, reason: string): void {
    if (this.closed) return;
    // The socket first: a failing close listener must not leave it open.
    try {
      this.ws.close(code, closeReason(reason));
    } catch {
      this.ws.terminate();
    }
    this.markClosed();
  }

  terminate(): void {
    this.ws.terminate();
    this.markClosed();
  }

  private markClosed(): void {
    if (this.closed) return;
    this.closed = true;
    const listeners = this.closedListeners;
    this.closedListeners = [];
    for (const fn of listeners) fn(this);
  }
}
