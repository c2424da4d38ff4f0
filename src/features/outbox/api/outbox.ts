import { queryOptions, useQuery } from '@tanstack/react-query';
import type { OutboxMessage } from '../../../../server/schemas/outbox';
import { api } from '../../../lib/api-client';

export const outboxKeys = { all: ['outbox'] as const };

// Mail arrives at any time (a reset mail is sent after the answer): ask on open and every few seconds.
export const outboxQuery = queryOptions({
  queryKey: outboxKeys.all,
  queryFn: async () => (await api.get<{ messages: OutboxMessage[] }>('/outbox')).messages,
  staleTime: 0,
  refetchInterval: 3000,
});

export const useOutbox = () => useQuery(outboxQuery);
