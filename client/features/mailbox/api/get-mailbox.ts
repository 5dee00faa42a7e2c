import { queryOptions, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { mailboxMessageSchema, type MailboxMessage } from '../../../../shared/api/mailbox';
import { api, isApiError, parseResponse } from '../../../lib/api-client';
import { queryKeys } from '../../../lib/query-keys';

export type { MailboxMessage };

/**
 * `GET /api/dev/mailbox` (outside production): the mail the local fake mail server received, newest
 * first; `null` where the server does not offer it (404 in production).
 */
export async function getMailbox({ signal }: { signal?: AbortSignal } = {}): Promise<MailboxMessage[] | null> {
  try {
    return parseResponse(z.array(mailboxMessageSchema))(await api.get('/api/dev/mailbox', { signal }));
  } catch (error) {
    if (isApiError(error) && error.status === 404) return null;
    throw error;
  }
}

export const mailboxQueryOptions = () =>
  queryOptions({
    queryKey: queryKeys.mailbox,
    queryFn: ({ signal }) => getMailbox({ signal }),
    staleTime: 0,
    meta: { notice: false },
  });

export const useMailbox = () => useQuery({ ...mailboxQueryOptions(), refetchInterval: 5_000 });
