import type { QueryClient } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { Loading } from '../../components/page-status';
import { Wordmark } from '../../components/wordmark';
import { paths } from '../../config/paths';
import { mailboxQueryOptions, useMailbox } from '../../features/mailbox/api/get-mailbox';
import { MailboxList } from '../../features/mailbox/components/mailbox-list';

export const clientLoader = (queryClient: QueryClient) => async () => {
  await queryClient.prefetchQuery(mailboxQueryOptions());
  return null;
};

/** The development mailbox: what the local fake mail server received (only where the server offers it). */
export default function MailboxRoute() {
  const mailbox = useMailbox();
  return (
    <main className="mx-auto flex w-full max-w-3xl flex-col gap-5 px-4 py-8">
      <header className="flex flex-wrap items-center justify-between gap-3">
        <Link to={paths.home.getHref()} aria-label="Matchloom">
          <Wordmark />
        </Link>
        <span className="rounded-full border border-violet/40 bg-violet-soft px-3 py-0.5 text-xs font-bold tracking-wide text-violet-deep uppercase">development</span>
      </header>
      <div>
        <h1 className="text-2xl font-extrabold tracking-tight">Development mailbox</h1>
        <p className="mt-1 text-ink-soft">Mail the server sent (invitations, review requests), caught by its local mail server. Newest first.</p>
      </div>
      {mailbox.data === null ? (
        <p role="alert" className="rounded-xl border border-rule bg-card px-4 py-5">
          This server has no development mailbox: mail goes to a real mail server, or this is production.
        </p>
      ) : mailbox.data ? (
        <MailboxList messages={mailbox.data} />
      ) : mailbox.isError ? (
        <p role="alert" className="text-coral-deep">
          {mailbox.error.message}
        </p>
      ) : (
        <Loading label="Opening the mailbox…" />
      )}
    </main>
  );
}
