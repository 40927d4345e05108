import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { calendarFeedQueryOptions } from './get-calendar-feed';
import type { CalendarFeedResponse } from './types';

/** `POST /api/me/calendar`: creates the feed address, or replaces it (the old one stops working). */
export const createCalendarFeed = () => api<CalendarFeedResponse>('/api/me/calendar', { method: 'POST', json: {} });

export function useCreateCalendarFeed() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createCalendarFeed,
    onSuccess: (data) => qc.setQueryData(calendarFeedQueryOptions().queryKey, data),
  });
}
