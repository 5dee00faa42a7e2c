/**
 * The demo scenario (PRODUCT.md; all data invented, see shared/demo/designs.ts): three accounts, the
 * 2.4 GHz chip-antenna room (with an invented bench `.s1p` of the antenna among its uploads, not in use:
 * the room starts with the RLC load), the 433 MHz whip room with two snapshots and a review note from
 * the observer, and one branch of it.
 * Idempotent: when the demo owner account exists, nothing is written (so a room the team deleted stays
 * deleted across restarts). Everything is written in one transaction.
 */
import type { Knex } from 'knex';
import { createDesignDoc } from '../../shared/collab/schema';
import * as Y from 'yjs';
import {
  CHIP_ANTENNA_ROOM,
  DEMO_PASSWORD,
  DEMO_USERS,
  WHIP_BRANCH_ROOM,
  WHIP_ROOM,
  chipAntennaDesign,
  whipE12Design,
  whipFirstCutDesign,
  whipLowCostDesign,
} from '../../shared/demo/designs';
import { createPasswordHasher, DEFAULT_BCRYPT_COST } from '../../server/auth/passwords';
import { createUser, findUserByEmail } from '../../server/services/users';
import { createRoomIn } from '../../server/services/rooms';
import { insertSnapshot } from '../../server/services/snapshots';
import { checkTouchstoneUpload, insertUpload } from '../../server/services/uploads';
import { createNote } from '../../server/services/notes';
import { CHIP_ANTENNA_S1P_NAME, chipAntennaTouchstone } from '../../shared/demo/chip-antenna-touchstone';
import type { Role } from '../../server/auth/tokens';
import type { DesignInput } from '../../shared/rf/design';

const HOUR = 60 * 60 * 1000;

function stateOf(design: DesignInput): Uint8Array {
  const doc = createDesignDoc(design);
  const state = Y.encodeStateAsUpdate(doc);
  doc.destroy();
  return state;
}

export async function seedDemo(
  knex: Knex,
  options: { bcryptCost?: number } = {},
): Promise<{ created: boolean }> {
  if (await findUserByEmail(knex, DEMO_USERS[0].email)) return { created: false };
  const hasher = createPasswordHasher(options.bcryptCost ?? DEFAULT_BCRYPT_COST);
  const hashes = await Promise.all(DEMO_USERS.map(() => hasher.hash(DEMO_PASSWORD)));

  return knex.transaction(async (trx) => {
    // A second process may have seeded while we were hashing.
    if (await findUserByEmail(trx, DEMO_USERS[0].email)) return { created: false };
    const users: { userId: string; role: Role }[] = [];
    for (const [i, u] of DEMO_USERS.entries()) {
      const user = await createUser(trx, {
        email: u.email,
        displayName: u.displayName,
        passwordHash: hashes[i],
      });
      users.push({ userId: user.id, role: u.role });
    }
    const owner = users[0].userId;
    const others = users.slice(1);
    const now = Date.now();

    const chipRoom = await createRoomIn(trx, {
      name: CHIP_ANTENNA_ROOM,
      ownerId: owner,
      design: chipAntennaDesign(),
      members: others,
      now: now - 1 * HOUR,
    });
    await insertUpload(trx, {
      ...checkTouchstoneUpload(CHIP_ANTENNA_S1P_NAME, Buffer.from(chipAntennaTouchstone())),
      roomId: chipRoom,
      uploaderId: users[1].userId,
      now: now - 0.5 * HOUR,
    });

    const whipRoom = await createRoomIn(trx, {
      name: WHIP_ROOM,
      ownerId: owner,
      design: whipE12Design(),
      members: others,
      now: now - 5 * HOUR,
    });
    await insertSnapshot(trx, {
      roomId: whipRoom,
      label: 'first cut',
      design: whipFirstCutDesign(),
      state: stateOf(whipFirstCutDesign()),
      createdBy: users[1].userId,
      now: now - 4 * HOUR,
    });
    const e12 = await insertSnapshot(trx, {
      roomId: whipRoom,
      label: 'E12 values',
      design: whipE12Design(),
      state: stateOf(whipE12Design()),
      createdBy: users[1].userId,
      now: now - 3 * HOUR,
    });

    await createNote(trx, {
      roomId: whipRoom,
      authorId: users[2].userId,
      elementId: 'c-shunt',
      body: 'Could ±5 % on C2 push the band edges past VSWR 1.5 once the enclosure detunes the whip? A yield run before the hand-off would settle it.',
      now: now - 2.5 * HOUR,
    });

    await createRoomIn(trx, {
      name: WHIP_BRANCH_ROOM,
      ownerId: owner,
      design: whipLowCostDesign(),
      parentSnapshotId: e12,
      members: others,
      now: now - 2 * HOUR,
    });
    return { created: true };
  });
}
