/**
 * The hand-off pack routes (any member of the room, observers too: exports are read-only):
 *   GET /api/rooms/:id/handoff.zip[?series=E12|E24|E48|E96]
 *   GET /api/rooms/:id/exports/:file   bom.csv[?series=], lines.csv, network.s2p, matched-input.s1p,
 *                                      design.matchloom.json, report.pdf[?series=]
 * Each answers as an attachment named from a slug of the room name. See README.md in this folder.
 */
import { Router, type Response } from 'express';
import { z } from 'zod';
import { signedInUser } from '../auth/session';
import { notFound } from '../errors';
import { requireRoomRole } from '../rooms/access';
import { check } from '../validate';
import { BOM_SERIES } from '../../shared/handoff/bom';
import { HANDOFF_FILES, handoffDownloadName, isHandoffFile, type HandoffFile } from '../../shared/handoff/files';
import { roomSlug } from '../../shared/handoff/slug';
import type { AppDeps } from '../app';
import { handoffFile, handoffZip, loadHandoffContext } from './pack';

const query = z.object({
  series: z
    .preprocess((v) => (typeof v === 'string' ? v.toUpperCase() : v), z.enum(BOM_SERIES, { error: `must be one of ${BOM_SERIES.join(', ')}` }))
    .optional(),
});

function sendAttachment(res: Response, fileName: string, contentType: string, body: Buffer): void {
  res.set({
    'Content-Type': contentType,
    'Content-Disposition': `attachment; filename="${fileName}"`,
    'Content-Length': String(body.byteLength),
    'Cache-Control': 'private, no-store',
    'X-Content-Type-Options': 'nosniff',
  });
  res.status(200).end(body);
}

export function handoffRoutes({ knex }: Pick<AppDeps, 'knex'>): Router {
  const r = Router();

  r.get('/rooms/:id/handoff.zip', async (req, res) => {
    const { roomId } = await requireRoomRole(knex, req.params.id, signedInUser(req).id);
    const { series } = check(query, req.query, 'query');
    const ctx = await loadHandoffContext(knex, roomId, { series });
    const body = await handoffZip(knex, ctx);
    sendAttachment(res, handoffDownloadName(roomSlug(ctx.roomName), 'handoff.zip'), 'application/zip', body);
  });

  r.get('/rooms/:id/exports/:file', async (req, res) => {
    const { roomId } = await requireRoomRole(knex, req.params.id, signedInUser(req).id);
    const name = req.params.file;
    if (!isHandoffFile(name)) throw notFound(`No such export. The pack has ${HANDOFF_FILES.join(', ')}.`);
    const file: HandoffFile = name;
    const { series } = check(query, req.query, 'query');
    const ctx = await loadHandoffContext(knex, roomId, { series });
    const { body, contentType } = await handoffFile(knex, ctx, file);
    sendAttachment(res, handoffDownloadName(roomSlug(ctx.roomName), file), contentType, body);
  });

  return r;
}
