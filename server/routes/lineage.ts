/** A room's lineage (its tree of branches and snapshots) and the comparison of two of its designs. */
import { Router } from 'express';
import type { Knex } from 'knex';
import { signedInUser } from '../auth/session';
import { HttpError, notFound } from '../errors';
import { requireRoomRole, roomNotFound } from '../rooms/access';
import { getRole } from '../rooms/membership';
import { loadRoomDesign } from '../collab/store';
import { roomLineage } from '../services/lineage';
import { getSnapshot } from '../services/snapshots';
import { check } from '../validate';
import { compareQuerySchema, LIVE_REF, type CompareResult, type CompareSide } from '../../shared/api/compare';
import { designDiff } from '../../shared/api/design-diff';
import { DesignError, type Design } from '../../shared/rf/design';
import type { AppDeps } from '../app';

/** One side of a comparison: this room now, or a snapshot of any room the caller belongs to. */
async function compareSide(
  knex: Knex,
  ref: string,
  room: { id: string; name: string },
  userId: string,
): Promise<CompareSide & { design: Design }> {
  if (ref === LIVE_REF) {
    try {
      const design = await loadRoomDesign(knex, room.id);
      return { ref, kind: 'live', roomId: room.id, label: room.name, createdAt: null, design };
    } catch (e) {
      if (e instanceof DesignError)
        throw new HttpError(
          409,
          'invalid-design',
          `The room document does not hold a valid design: ${e.message}`,
          {
            path: e.path,
          },
        );
      throw e;
    }
  }
  const snapshot = await getSnapshot(knex, ref);
  if (!snapshot || !(await getRole(knex, snapshot.roomId, userId)))
    throw notFound(`Snapshot “${ref}” not found.`);
  return {
    ref,
    kind: 'snapshot',
    roomId: snapshot.roomId,
    label: snapshot.label,
    createdAt: snapshot.createdAt,
    design: snapshot.design,
  };
}

export function lineageRoutes({ knex }: AppDeps): Router {
  const r = Router();

  r.get('/rooms/:id/lineage', async (req, res) => {
    const user = signedInUser(req);
    const { roomId } = await requireRoomRole(knex, req.params.id, user.id);
    res.json(await roomLineage(knex, roomId, user.id));
  });

  r.get('/rooms/:id/compare', async (req, res) => {
    const user = signedInUser(req);
    const { roomId } = await requireRoomRole(knex, req.params.id, user.id);
    const query = check(compareQuerySchema, { a: req.query.a, b: req.query.b }, 'query');
    const room = (await knex('rooms').where({ id: roomId }).first('id', 'name')) as
      { id: string; name: string } | undefined;
    if (!room) throw roomNotFound();
    const a = await compareSide(knex, query.a, room, user.id);
    const b = await compareSide(knex, query.b, room, user.id);
    const result: CompareResult = { a, b, diff: designDiff(a.design, b.design) };
    res.json(result);
  });

  return r;
}
