import type { QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Loading } from '../../components/page-status';
import { useMe } from '../../features/auth/api/get-me';
import { useInvitations } from '../../features/members/api/get-invitations';
import { membersQueryOptions, useMembers } from '../../features/members/api/get-members';
import { AddMemberForm } from '../../features/members/components/add-member-form';
import { MemberList } from '../../features/members/components/member-list';
import { DevMailboxLink } from '../../features/mailbox/components/dev-mailbox-link';
import { useRoom } from '../../features/rooms/api/get-room';
import { RoomHeader } from '../../features/rooms/components/room-header';
import { isSignedIn } from '../auth-loader';
import { roomLoader } from '../room-loader';

export const clientLoader = (queryClient: QueryClient) => async (args: LoaderFunctionArgs) => {
  if (!(await isSignedIn(queryClient))) return null;
  await Promise.all([roomLoader(queryClient)(args), queryClient.prefetchQuery(membersQueryOptions(args.params.roomId ?? ''))]);
  return null;
};

export default function MembersRoute() {
  const roomId = useParams().roomId ?? '';
  const { data: room } = useRoom(roomId);
  const { data: me } = useMe();
  const members = useMembers(roomId);
  const isOwner = room?.role === 'owner';
  const invitations = useInvitations(roomId, { enabled: isOwner });
  if (!room || !me) return <Loading />;
  return (
    <div className="flex max-w-3xl flex-col gap-6">
      <RoomHeader room={room} subtitle="Members" />
      {isOwner ? (
        <section aria-labelledby="add-member-title" className="rounded-2xl border border-rule bg-card p-5 shadow-xs">
          <h2 id="add-member-title" className="mb-1 text-lg font-extrabold">
            Add someone
          </h2>
          <p className="mb-4 text-sm text-ink-soft">
            Tuners edit the chain, load, band and goal; observers watch live and leave notes. Someone without an account gets an
            invitation by e-mail.
          </p>
          <AddMemberForm roomId={room.id} />
          <DevMailboxLink className="mt-3">Development: read the invitation mail the server sent</DevMailboxLink>
        </section>
      ) : (
        <p className="rounded-xl border border-rule bg-paper-deep/60 px-4 py-3 text-sm text-ink-soft">
          Only the room’s owner adds people and changes roles.
        </p>
      )}
      <section aria-labelledby="members-title">
        <h2 id="members-title" className="mb-3 text-lg font-extrabold">
          Who is in this room
        </h2>
        {members.data ? (
          <MemberList
            roomId={room.id}
            members={members.data}
            invitations={isOwner ? invitations.data : undefined}
            currentUserId={me.id}
            canManage={isOwner}
          />
        ) : members.isError ? (
          <p role="alert" className="text-coral-deep">
            {members.error.message}
          </p>
        ) : (
          <Loading label="Loading the members…" />
        )}
      </section>
    </div>
  );
}
