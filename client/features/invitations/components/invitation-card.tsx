import { Link, useNavigate } from 'react-router-dom';
import { Button, buttonClass } from '../../../components/button';
import { FormError } from '../../../components/form-field';
import { RoleBadge } from '../../../components/role-badge';
import { paths } from '../../../config/paths';
import { dateFrom, dateTimeLabel } from '../../../lib/format-time';
import { roleDescriptions } from '../../../lib/room-role';
import { useMe } from '../../auth/api/get-me';
import { useSignOut } from '../../auth/api/sign-out';
import { useAcceptInvitation } from '../api/accept-invitation';
import type { InvitationPreview } from '../api/get-invitation';

const sameAddress = (a: string, b: string) => a.trim().toLowerCase() === b.trim().toLowerCase();

/**
 * What an invitation link offers: the room, the role and who invited; then, depending on who is
 * here, Accept (signed in with the invited address), a way to switch accounts, or sign in / sign up
 * with that address and come back to this page.
 */
export function InvitationCard({ token, invitation }: { token: string; invitation: InvitationPreview }) {
  const navigate = useNavigate();
  const { data: me } = useMe();
  const here = paths.invitation.getHref(token);
  const accept = useAcceptInvitation({
    onSuccess: (result) => navigate(paths.room.getHref(result.roomId), { replace: true }),
  });
  const signOut = useSignOut({ onSuccess: () => window.location.assign(paths.auth.signIn.getHref(here)) });
  const expires = dateFrom(invitation.expiresAt);

  return (
    <div className="flex flex-col gap-4">
      <p>
        {invitation.invitedBy ? <strong>{invitation.invitedBy.displayName}</strong> : 'The room’s owner'} invites{' '}
        <span className="numeric font-semibold">{invitation.email}</span> to the room <strong>“{invitation.roomName}”</strong> with the role{' '}
        <RoleBadge role={invitation.role} /> ({roleDescriptions[invitation.role].toLowerCase()}).
      </p>
      {invitation.state === 'used' && (
        <p role="alert" className="rounded-lg border border-rule bg-paper-deep/60 px-3 py-2">
          This invitation has already been used. Each link works once; ask the room’s owner for a new one if you need it.
        </p>
      )}
      {invitation.state === 'expired' && (
        <p role="alert" className="rounded-lg border border-coral/40 bg-coral-soft px-3 py-2 text-coral-deep">
          This invitation expired{expires ? ` on ${dateTimeLabel(expires)}` : ''}. Ask the room’s owner to invite you again.
        </p>
      )}
      {invitation.state === 'pending' && (
        <>
          {expires && <p className="text-sm text-ink-soft">The link works until {dateTimeLabel(expires)}.</p>}
          {me && sameAddress(me.email, invitation.email) ? (
            <div className="flex flex-col gap-2">
              <FormError message={accept.error?.message} />
              <Button busy={accept.isPending} busyLabel="Joining…" onClick={() => accept.mutate({ token })}>
                Accept and open the room
              </Button>
            </div>
          ) : me ? (
            <div className="flex flex-col gap-3">
              <p role="alert" className="rounded-lg border border-amber/60 bg-amber-soft px-3 py-2">
                You are signed in as <span className="numeric font-semibold">{me.email}</span>, but this invitation is for{' '}
                <span className="numeric font-semibold">{invitation.email}</span>. Sign out, then sign in or sign up as {invitation.email}.
              </p>
              <Button variant="secondary" busy={signOut.isPending} busyLabel="Signing out…" onClick={() => signOut.mutate()}>
                Sign out and switch account
              </Button>
            </div>
          ) : (
            <div className="flex flex-col gap-3">
              <p>
                Sign in or sign up as <span className="numeric font-semibold">{invitation.email}</span> first; you will come back here to accept.
              </p>
              <div className="flex flex-wrap gap-2">
                <Link to={paths.auth.signIn.getHref(here)} className={buttonClass('primary')}>
                  Sign in as {invitation.email}
                </Link>
                <Link to={paths.auth.signUp.getHref(here, invitation.email)} className={buttonClass('secondary')}>
                  Sign up as {invitation.email}
                </Link>
              </div>
            </div>
          )}
        </>
      )}
    </div>
  );
}
