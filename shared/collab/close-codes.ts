/**
 * Close codes of the room socket (`/collab/<roomId>`). Codes 4400–4499 are final: the y-websocket
 * client stops reconnecting and emits `closed` with the code and reason. Every other code is transient
 * (the client backs off and reconnects, then resynchronises).
 */
export const COLLAB_CLOSE = {
  /** A message that is not a well-formed y-websocket message (or of an unknown type). Final. */
  badMessage: 4400,
  /** No session cookie and no collab token, or one that is invalid, expired, or for another room. Final. */
  unauthenticated: 4401,
  /** Signed in, but not a member of this room (or removed from it while connected). Final. */
  forbidden: 4403,
  /** The room was deleted. Final. */
  roomGone: 4404,
  /** A message over the size limit, or an update that would grow the document past its limit. Final. */
  tooLarge: 4413,
  /** The server could not store an update; the client reconnects and resends it. Transient. */
  serverError: 1011,
  /** The server is shutting down. Transient. */
  goingAway: 1001,
  /**
   * You may edit again, but edits you made while you could not were dropped: reconnect so the server
   * takes them now and your document matches everyone's. Transient.
   */
  resync: 4100,
  /** The client fell too far behind in reading; it reconnects and resynchronises. Transient. */
  tooSlow: 4503,
} as const;

export type CollabCloseCode = (typeof COLLAB_CLOSE)[keyof typeof COLLAB_CLOSE];

/** True for close codes after which a client must not reconnect (4400–4499). */
export function isFinalCloseCode(code: number): boolean {
  return code >= 4400 && code < 4500;
}
