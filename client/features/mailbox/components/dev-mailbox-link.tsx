import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { mailboxQueryOptions } from '../api/get-mailbox';

/** A link to the development mailbox, shown only where the server has one (never in production). */
export function DevMailboxLink({ children = 'Open the development mailbox', className }: { children?: string; className?: string }) {
  const mailbox = useQuery(mailboxQueryOptions());
  if (!mailbox.data) return null;
  return (
    <p className={className}>
      <Link to={paths.mailbox.getHref()} className="text-sm font-semibold text-violet-deep underline underline-offset-2">
        {children}
      </Link>
    </p>
  );
}
