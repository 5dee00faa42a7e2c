import type { QueryClient } from '@tanstack/react-query';
import { Link, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { buttonClass } from '../../components/button';
import { Loading } from '../../components/page-status';
import { paths } from '../../config/paths';
import { meQueryOptions } from '../../features/auth/api/get-me';
import { AuthLayout } from '../../features/auth/components/auth-layout';
import { invitationQueryOptions, useInvitation } from '../../features/invitations/api/get-invitation';
import { InvitationCard } from '../../features/invitations/components/invitation-card';

/** Open to anyone holding the link, signed in or not. */
export const clientLoader = (queryClient: QueryClient) => async ({ params }: LoaderFunctionArgs) => {
  await Promise.all([queryClient.prefetchQuery(meQueryOptions()), queryClient.prefetchQuery(invitationQueryOptions(params.token ?? ''))]);
  return null;
};

export default function InvitationRoute() {
  const token = useParams().token ?? '';
  const invitation = useInvitation(token);
  return (
    <AuthLayout
      title="An invitation to a room"
      footer={
        <Link to={paths.rooms.getHref()} className="font-bold text-teal-deep underline underline-offset-2">
          Your rooms
        </Link>
      }
    >
      {invitation.data ? (
        <InvitationCard token={token} invitation={invitation.data} />
      ) : invitation.isError ? (
        <div role="alert" className="flex flex-col gap-3">
          <p>{invitation.error.message}</p>
          <p className="text-sm text-ink-soft">Check that the whole link was copied from the e-mail, or ask the room’s owner to invite you again.</p>
          <Link to={paths.home.getHref()} className={buttonClass('secondary')}>
            Go to Matchloom
          </Link>
        </div>
      ) : (
        <Loading label="Reading the invitation…" />
      )}
    </AuthLayout>
  );
}
