/** `POST /api/rooms/:id/collab-token`: a short-lived token (60 s) for the room's collaboration socket. */
import { z } from 'zod';
import { api, parseResponse } from '../../../lib/api-client';

const tokenSchema = z.object({ token: z.string().min(1) });

export async function getCollabToken(roomId: string, signal?: AbortSignal): Promise<string> {
  const body = parseResponse(tokenSchema)(await api.post(`/api/rooms/${encodeURIComponent(roomId)}/collab-token`, undefined, { signal }));
  return body.token;
}
