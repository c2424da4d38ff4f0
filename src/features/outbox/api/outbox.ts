import { queryOptions, useQuery } from '@tanstack/react-query';
import type { OutboxMessage } from '../../../../server/schemas/outbox';
import { api } from '../../../lib/api-client';

export const outboxKeys = { all: ['outbox'] as const };

// Mail arrives at any time: always ask again when the page opens.
export const outboxQuery = queryOptions({
  queryKey: outboxKeys.all,
  queryFn: async () => (await api.get<{ messages: OutboxMessage[] }>('/outbox')).messages,
  staleTime: 0,
});

export const useOutbox = () => useQuery(outboxQuery);
