import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { NotificationSettings, UpdateNotificationsBody } from '../../../../server/schemas/views';
import { api } from '../../../lib/api-client';
import { viewKeys } from './keys';

export const notificationsQuery = queryOptions({
  queryKey: viewKeys.notifications,
  queryFn: () => api.get<NotificationSettings>('/me/notifications'),
});

export const useNotificationSettings = () => useQuery(notificationsQuery);

export function useUpdateNotifications() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: UpdateNotificationsBody) => api.patch<NotificationSettings>('/me/notifications', body),
    onSuccess: (settings) => qc.setQueryData(viewKeys.notifications, settings),
  });
}
