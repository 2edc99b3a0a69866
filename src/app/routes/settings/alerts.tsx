import type { QueryClient } from '@tanstack/react-query';
import { EmptyState, PageHeader } from '../../../components/ui/page';
import { Spinner } from '../../../components/ui/spinner';
import { subscriptionsQuery, useSubscriptions } from '../../../features/alerts/api/subscriptions';
import { SubscriptionsForm } from '../../../features/alerts/components/subscriptions-form';
import { LoadError } from '../../../components/ui/query-state';

export const loader = (queryClient: QueryClient) => async () => {
  await queryClient.prefetchQuery(subscriptionsQuery());
  return null;
};

export default function AlertSettingsPage() {
  const subs = useSubscriptions();
  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Alerts by e-mail"
        description="Choose which alerts reach your inbox: your role’s default, every site, or the sites you tick. Every alert mail also has a link to stop that kind."
      />
      {subs.isPending ? (
        <p className="flex items-center gap-3 text-ink-700">
          <Spinner /> Loading your alert settings…
        </p>
      ) : subs.isError ? (
        <LoadError
          title="Your alert settings could not be loaded"
          error={subs.error}
          onRetry={() => void subs.refetch()}
          retrying={subs.isFetching}
        />
      ) : subs.data.sites.length === 0 ? (
        <EmptyState title="No sites yet">
          Alerts follow sites. Once sites are registered, they are listed here.
        </EmptyState>
      ) : (
        <SubscriptionsForm data={subs.data} />
      )}
    </div>
  );
}
