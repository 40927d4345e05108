import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { calendarFeedQueryOptions } from './get-calendar-feed';

/** `DELETE /api/me/calendar`: revokes the feed address; phones subscribed to it get nothing more. */
export const revokeCalendarFeed = () => api<void>('/api/me/calendar', { method: 'DELETE' });

export function useRevokeCalendarFeed() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: revokeCalendarFeed,
    onSuccess: () => {
      qc.setQueryData(calendarFeedQueryOptions().queryKey, { url: null });
      return qc.invalidateQueries({ queryKey: calendarFeedQueryOptions().queryKey });
    },
  });
}
