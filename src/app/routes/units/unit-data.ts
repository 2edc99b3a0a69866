import type { QueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { overviewQuery } from '../../../features/history/api/get-overview';
import { unitQuery } from '../../../features/units/api/get-unit';

export const unitIdOf = (raw: string | undefined) => (raw && /^\d{1,10}$/.test(raw) ? Number(raw) : null);

/**
 * The unit page's data, bundled with the shell: the router runs this while it downloads the page's code (unit.tsx),
 * so the unit and its figures are asked for at the same time as the code that shows them.
 */
export const loader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const id = unitIdOf(params.id);
    if (id === null) return null;
    void queryClient.prefetchQuery(overviewQuery(id));
    await queryClient.prefetchQuery(unitQuery(id));
    return null;
  };
