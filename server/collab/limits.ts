/** Bounds and timings of the collaboration hub. Tests and benchmarks may override any of them. */
export interface CollabLimits {
  /** Largest room-socket message accepted (bytes); larger closes the socket with 4413. */
  maxMessageBytes: number;
  /** Largest room document (encoded state, bytes); an update that would pass it closes with 4413. */
  maxDocumentBytes: number;
  /** Largest awareness (presence/cursor) message (bytes). */
  maxAwarenessBytes: number;
  /** Awareness client ids one connection may control (a browser tab uses one). */
  maxAwarenessClientsPerConnection: number;
  /** Compact the room's update log into its state after this many accepted updates. */
  compactEvery: number;
  /** Unload a room this long after its last client left (ms). */
  unloadDelayMs: number;
  /** Ping open sockets this often; one that misses a pong is dropped (ms). */
  pingIntervalMs: number;
  /** A socket with more than this queued for sending is closed (4503) and resynchronises. */
  maxBufferedBytes: number;
  /** Edits of one field by one person within this window merge into one room log entry (ms). */
  logCoalesceMs: number;
  /** Room log entries sent on join. */
  logHistory: number;
  /** Largest socket.io message (bytes). */
  maxEventBytes: number;
}

export const DEFAULT_LIMITS: CollabLimits = {
  maxMessageBytes: 1024 * 1024,
  maxDocumentBytes: 8 * 1024 * 1024,
  maxAwarenessBytes: 64 * 1024,
  maxAwarenessClientsPerConnection: 8,
  compactEvery: 200,
  unloadDelayMs: 5_000,
  pingIntervalMs: 30_000,
  maxBufferedBytes: 16 * 1024 * 1024,
  logCoalesceMs: 2_000,
  logHistory: 100,
  maxEventBytes: 64 * 1024,
};

/** "1.5 MiB" */
export function formatBytes(n: number): string {
  if (n >= 1024 * 1024) return `${Number((n / 1024 / 1024).toFixed(2))} MiB`;
  if (n >= 1024) return `${Number((n / 1024).toFixed(1))} KiB`;
  return `${n} B`;
}
