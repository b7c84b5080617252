import { useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import { Button } from '../../components/Button';
import { Panel } from '../../components/Panel';
import { StatusBadge } from '../../components/Status';
import { api, errorMessage } from '../../lib/api';

/** GET /api/health answers 200 when all is well and 503 naming what failed; both are answers. */
const healthResponse = z.object({
  status: z.string(),
  checks: z.record(z.string(), z.string()),
  errors: z.record(z.string(), z.string()).optional(),
});

const CHECKS: { key: string; label: string; what: string }[] = [
  { key: 'database', label: 'Database', what: 'Orders, users and history' },
  { key: 'redis', label: 'Queue and limiter', what: 'Background jobs, sign-in limits' },
  { key: 'mail', label: 'Mail', what: 'Customer notices' },
  { key: 'storage', label: 'File storage', what: 'Drawings, travelers, certificates' },
];

export function HealthPanel() {
  const health = useQuery({
    queryKey: ['health'],
    queryFn: ({ signal }) => api.get('/health', { schema: healthResponse, signal, acceptStatus: [503] }),
    refetchInterval: 30_000,
    staleTime: 10_000,
  });
  const checkedAt = health.dataUpdatedAt ? new Date(health.dataUpdatedAt).toLocaleTimeString('en-GB') : null;
  return (
    <Panel
      title="Service health"
      actions={
        <Button size="sm" variant="quiet" onClick={() => void health.refetch()} busy={health.isFetching}>
          Check again
        </Button>
      }
    >
      {health.isError ? (
        <StatusBadge kind="fault">Not reachable: {errorMessage(health.error)}</StatusBadge>
      ) : (
        <ul className="grid gap-2 sm:grid-cols-2" aria-label="Services">
          {CHECKS.map((c) => {
            const state = health.data?.checks[c.key];
            const reason = health.data?.errors?.[c.key];
            return (
              <li key={c.key} className="flex items-center justify-between gap-3 rounded-md border border-graphite-200 px-3 py-2" data-check={c.key}>
                <div>
                  <p className="font-semibold text-graphite-900">{c.label}</p>
                  <p className="text-sm text-graphite-500">{reason ?? c.what}</p>
                </div>
                {state === undefined ? (
                  <StatusBadge kind="idle">Checking</StatusBadge>
                ) : state === 'ok' ? (
                  <StatusBadge kind="good">Working</StatusBadge>
                ) : (
                  <StatusBadge kind="fault">Down</StatusBadge>
                )}
              </li>
            );
          })}
        </ul>
      )}
      {checkedAt && <p className="mt-3 text-sm text-graphite-500">Checked at {checkedAt}; checks again every 30 s.</p>}
    </Panel>
  );
}
