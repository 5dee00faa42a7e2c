/**
 * Links to the app in mail: `PUBLIC_URL` when set; otherwise the page the request came from (its
 * Origin, which the origin check has already accepted: the Vite port in development), else the host
 * the request was sent to.
 */
import type { Request } from 'express';
import type { Config } from './config';

export function appBaseUrl(req: Request, config: Pick<Config, 'publicUrl'>): string {
  if (config.publicUrl) return config.publicUrl.replace(/\/+$/, '');
  const origin = req.get('origin');
  if (origin && URL.canParse(origin) && /^https?:$/.test(new URL(origin).protocol))
    return new URL(origin).origin;
  return `${req.protocol}://${req.get('host') ?? 'localhost'}`;
}

export const roomLink = (base: string, roomId: string) => `${base}/rooms/${encodeURIComponent(roomId)}`;
export const invitationLink = (base: string, token: string) => `${base}/invitations/${token}`;
