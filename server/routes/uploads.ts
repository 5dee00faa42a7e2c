/**
 * Touchstone uploads of a room: upload (multipart, field `file`, at most 5 MiB), list, read, and use as
 * the load or as a two-port element (one document edit).
 */
import { Router, type Request, type Response } from 'express';
import multer from 'multer';
import { signedInUser } from '../auth/session';
import { HttpError, badRequest, notFound } from '../errors';
import { requireRoomRole } from '../rooms/access';
import { EDITOR_ROLES } from '../rooms/membership';
import { checkTouchstoneUpload, getUpload, insertUpload, listUploads } from '../services/uploads';
import { useUpload } from '../services/room-edits';
import { check, idParam } from '../validate';
import { formatBytes } from '../collab/limits';
import { TEAM_EVENTS } from '../../shared/collab/team-events';
import { UPLOAD_FIELD, UPLOAD_MAX_BYTES, uploadUseBodySchema } from '../../shared/api/uploads';
import type { AppDeps } from '../app';

const uploadNotFound = () => notFound('Upload not found.');

const receive = multer({
  storage: multer.memoryStorage(),
  defParamCharset: 'utf8',
  limits: { fileSize: UPLOAD_MAX_BYTES, files: 1, fields: 8, parts: 9, fieldSize: 4096 },
}).single(UPLOAD_FIELD);

/** The multer error as the API's 4xx. */
function uploadError(err: unknown): HttpError {
  if (err instanceof multer.MulterError) {
    switch (err.code) {
      case 'LIMIT_FILE_SIZE':
        return new HttpError(
          413,
          'too-large',
          `The file is larger than the ${formatBytes(UPLOAD_MAX_BYTES)} limit.`,
        );
      case 'LIMIT_UNEXPECTED_FILE':
      case 'LIMIT_FILE_COUNT':
        return badRequest(
          `${UPLOAD_FIELD}: send one Touchstone file in the multipart field "${UPLOAD_FIELD}"${err.field && err.field !== UPLOAD_FIELD ? ` (got a file in "${err.field}")` : ''}`,
          { field: UPLOAD_FIELD },
        );
      default:
        return new HttpError(400, 'bad-request', `The upload could not be read: ${err.message}.`);
    }
  }
  return new HttpError(
    400,
    'bad-request',
    `The upload could not be read: ${(err as Error)?.message ?? 'malformed multipart body'}.`,
  );
}

function receiveFile(req: Request, res: Response): Promise<Express.Multer.File> {
  return new Promise((resolve, reject) => {
    receive(req, res, (err: unknown) => {
      if (err) return reject(uploadError(err));
      if (!req.file)
        return reject(
          badRequest(
            `${UPLOAD_FIELD}: send the Touchstone file as multipart/form-data in the field "${UPLOAD_FIELD}"`,
            { field: UPLOAD_FIELD },
          ),
        );
      resolve(req.file);
    });
  });
}

function uploadId(v: unknown): string {
  const r = idParam.safeParse(v);
  if (!r.success) throw uploadNotFound();
  return r.data;
}

export function uploadRoutes({ knex, events, roomUpdates }: AppDeps): Router {
  const r = Router();

  r.post('/rooms/:id/uploads', async (req, res) => {
    const user = signedInUser(req);
    // The role is checked before the body is read, so an observer's file is never buffered.
    const { roomId } = await requireRoomRole(knex, req.params.id, user.id, EDITOR_ROLES);
    const file = await receiveFile(req, res);
    const checked = checkTouchstoneUpload(file.originalname, file.buffer);
    let upload;
    try {
      upload = await insertUpload(knex, { ...checked, roomId, uploaderId: user.id });
    } catch (e) {
      if ((e as { code?: string }).code === 'SQLITE_CONSTRAINT_FOREIGNKEY') throw notFound('Room not found.');
      throw e;
    }
    events.emit(roomId, TEAM_EVENTS.uploadCreated, { roomId, upload });
    res.status(201).json(upload);
  });

  r.get('/rooms/:id/uploads', async (req, res) => {
    const { roomId } = await requireRoomRole(knex, req.params.id, signedInUser(req).id);
    res.json(await listUploads(knex, roomId));
  });

  r.get('/rooms/:id/uploads/:uploadId', async (req, res) => {
    const { roomId } = await requireRoomRole(knex, req.params.id, signedInUser(req).id);
    const upload = await getUpload(knex, roomId, uploadId(req.params.uploadId));
    if (!upload) throw uploadNotFound();
    res.json(upload);
  });

  r.post('/rooms/:id/uploads/:uploadId/use', async (req, res) => {
    const user = signedInUser(req);
    const { roomId } = await requireRoomRole(knex, req.params.id, user.id, EDITOR_ROLES);
    const upload = await getUpload(knex, roomId, uploadId(req.params.uploadId));
    if (!upload) throw uploadNotFound();
    const body = check(uploadUseBodySchema, req.body);
    const outcome = await useUpload(
      { knex, sink: roomUpdates },
      { roomId, upload, as: body.as, elementId: body.elementId, userId: user.id },
    );
    res.json({ roomId, uploadId: upload.id, as: body.as, ...outcome });
  });

  return r;
}
