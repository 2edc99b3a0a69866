import { queryOptions, useQuery } from '@tanstack/react-query';
import { mailboxDto, MAILBOX_PAGE_SIZE, type ReceivedMailDto } from '../../../../shared/schemas/mail';
import { apiClient } from '../../../lib/api-client';
import { mailKeys } from './keys';

export async function getMailbox(signal?: AbortSignal): Promise<ReceivedMailDto[]> {
  return mailboxDto.parse(await apiClient.get(`/api/dev/mailbox?limit=${MAILBOX_PAGE_SIZE}`, { signal })).messages;
}

export function mailboxQuery() {
  return queryOptions({
    queryKey: mailKeys.mailbox(),
    queryFn: ({ signal }) => getMailbox(signal),
    // New mail arrives from the outbox worker a few seconds after the action that caused it.
    refetchInterval: 5_000,
  });
}

export function useMailbox() {
  return useQuery(mailboxQuery());
}
