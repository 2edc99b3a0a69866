import type { QueryClient } from '@tanstack/react-query';
import { EmptyState, PageHeader } from '../../../components/ui/page';
import { LoadError } from '../../../components/ui/query-state';
import { Spinner } from '../../../components/ui/spinner';
import { isApiError } from '../../../lib/api-client';
import { mailboxQuery, useMailbox } from '../../../features/mail/api/get-mailbox';
import { MailboxView } from '../../../features/mail/components/mailbox-view';

export const loader = (queryClient: QueryClient) => async () => {
  await queryClient.prefetchQuery(mailboxQuery());
  return null;
};

/** Development only: what the local fake SMTP server received, so a person can read what Tightloop sends. */
export default function MailboxPage() {
  const mailbox = useMailbox();
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Mailbox"
        description="Every mail Tightloop sent while running on this machine. The server only keeps them in development."
      />
      {mailbox.isPending ? (
        <p className="flex items-center gap-3 text-ink-700">
          <Spinner /> Loading mail…
        </p>
      ) : mailbox.isError ? (
        <LoadError
          title="The mailbox could not be loaded"
          error={mailbox.error}
          message={
            isApiError(mailbox.error) && mailbox.error.status === 404
              ? 'This server runs in production, where mail goes to the real SMTP server and no mailbox exists.'
              : undefined
          }
          onRetry={() => void mailbox.refetch()}
          retrying={mailbox.isFetching}
        />
      ) : mailbox.data.length === 0 ? (
        <EmptyState title="No mail yet">
          Invite someone from People or ask for a password reset, and the mail appears here.
        </EmptyState>
      ) : (
        <MailboxView messages={mailbox.data} />
      )}
    </div>
  );
}
