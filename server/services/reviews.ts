/**
 * Review requests: when a snapshot is marked for review, every other member of its room who keeps
 * review e-mails on (users.notify_reviews) gets one message, each addressed to them alone.
 */
import type { Knex } from 'knex';
import type { Logger } from '../logger';
import type { Mailer } from '../mail/mailer';
import { reviewRequestMail } from '../mail/messages';
import { roomLink } from '../links';
import type { SnapshotView } from './snapshots';

/** Send the review request; returns how many messages the mail server accepted. */
export async function sendReviewRequests(
  deps: { knex: Knex; mailer: Mailer; logger: Logger },
  input: { snapshot: SnapshotView; requester: { id: string; displayName: string }; baseUrl: string },
): Promise<number> {
  const { snapshot } = input;
  const room = await deps.knex('rooms').where({ id: snapshot.roomId }).first('name');
  if (!room) return 0;
  const recipients = (await deps
    .knex('room_members as m')
    .join('users as u', 'u.id', 'm.user_id')
    .where('m.room_id', snapshot.roomId)
    .andWhere('u.notify_reviews', true)
    .andWhereNot('u.id', input.requester.id)
    .orderBy('u.email')
    .pluck('u.email')) as string[];
  let sent = 0;
  for (const to of recipients) {
    try {
      await deps.mailer.send(
        reviewRequestMail({
          to,
          roomName: room.name,
          snapshotLabel: snapshot.label,
          requesterName: input.requester.displayName,
          figures: snapshot.figures,
          link: roomLink(input.baseUrl, snapshot.roomId),
        }),
      );
      sent++;
    } catch (err) {
      deps.logger.warn({ err, snapshotId: snapshot.id }, 'a review request could not be mailed');
    }
  }
  return sent;
}
