import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, ApiError } from '../../../lib/api';
import type { MailboxMessage } from './types';

/**
 * `GET /api/dev/mailbox` (admins): what the local mailbox received, newest first; null when
 * the route answers 404 (a real SMTP server is configured and nothing is caught).
 */
export async function getMailbox(): Promise<MailboxMessage[] | null> {
  try {
    return await api<MailboxMessage[]>('/api/dev/mailbox');
  } catch (err) {
    if (err instanceof ApiError && err.status === 404) return null;
    throw err;
  }
}

export const mailboxQueryOptions = () => queryOptions({ queryKey: ['dev', 'mailbox'], queryFn: getMailbox });

export const useMailbox = () => useQuery(mailboxQueryOptions());
