import { useState } from 'react';
import { Button } from '../../../components/button';
import { RoleBadge } from '../../../components/role-badge';
import { roleLabel, roomRoleSchema, roomRoles } from '../../../lib/room-role';
import { useRemoveMember } from '../api/remove-member';
import { useUpdateMemberRole } from '../api/update-member-role';
import type { Invitation, Member } from '../api/member';

export interface MemberListProps {
  roomId: string;
  members: readonly Member[];
  invitations?: readonly Invitation[];
  /** The signed-in user's id, so their own row is marked (and not edited from here). */
  currentUserId: string;
  /** Only an owner gets controls; everyone else sees a plain list. */
  canManage: boolean;
}

function MemberControls({ roomId, member }: { roomId: string; member: Member }) {
  const [confirming, setConfirming] = useState(false);
  const updateRole = useUpdateMemberRole(roomId);
  const removeMember = useRemoveMember(roomId);
  const who = member.displayName || member.email;

  return (
    <div className="flex shrink-0 items-center gap-2">
      <label className="sr-only" htmlFor={`role-${member.userId}`}>
        Role of {who}
      </label>
      <select
        id={`role-${member.userId}`}
        value={member.role}
        disabled={updateRole.isPending}
        onChange={(event) => {
          const role = roomRoleSchema.parse(event.target.value);
          if (role !== member.role) updateRole.mutate({ roomId, userId: member.userId, role });
        }}
        className="rounded-lg border border-rule bg-card px-2.5 py-1.5 text-sm font-semibold text-ink hover:border-ink-faint"
      >
        {roomRoles.map((role) => (
          <option key={role} value={role}>
            {roleLabel(role)}
          </option>
        ))}
      </select>
      {confirming ? (
        <span className="flex items-center gap-1.5">
          <Button
            variant="danger"
            size="sm"
            busy={removeMember.isPending}
            busyLabel="Removing…"
            onClick={() => removeMember.mutate({ roomId, userId: member.userId }, { onSettled: () => setConfirming(false) })}
          >
            Remove {who}
          </Button>
          <Button variant="quiet" size="sm" onClick={() => setConfirming(false)}>
            Keep
          </Button>
        </span>
      ) : (
        <Button variant="quiet" size="sm" onClick={() => setConfirming(true)} aria-label={`Remove ${who} from the room`}>
          Remove
        </Button>
      )}
    </div>
  );
}

/** The room's members; the owner may change roles and remove people, others only read. */
export function MemberList({ roomId, members, invitations = [], currentUserId, canManage }: MemberListProps) {
  return (
    <div className="flex flex-col gap-4">
      <ul aria-label="Members" className="divide-y divide-rule overflow-hidden rounded-xl border border-rule bg-card">
        {members.map((member) => {
          const isMe = member.userId === currentUserId;
          return (
            <li key={member.userId} className="flex flex-wrap items-center justify-between gap-3 px-4 py-3" data-member-email={member.email}>
              <div className="min-w-0">
                <p className="font-bold">
                  {member.displayName || member.email}
                  {isMe && <span className="ml-2 text-sm font-semibold text-ink-faint">(you)</span>}
                </p>
                <p className="numeric truncate text-sm text-ink-soft">{member.email}</p>
              </div>
              {canManage && !isMe ? <MemberControls roomId={roomId} member={member} /> : <RoleBadge role={member.role} />}
            </li>
          );
        })}
      </ul>
      {invitations.length > 0 && (
        <section aria-labelledby="invitations-title">
          <h3 id="invitations-title" className="mb-2 text-sm font-bold text-ink-soft">
            Invited, not signed up yet
          </h3>
          <ul aria-label="Invitations" className="divide-y divide-rule rounded-xl border border-dashed border-rule bg-card/60">
            {invitations.map((invitation) => (
              <li key={invitation.id} className="flex items-center justify-between gap-3 px-4 py-2">
                <span className="numeric text-sm">{invitation.email}</span>
                <RoleBadge role={invitation.role} />
              </li>
            ))}
          </ul>
        </section>
      )}
    </div>
  );
}
