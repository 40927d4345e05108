import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import type { CalendarFeedResponse } from './types';

/** `GET /api/me/calendar`: the caller's secret calendar feed address, or null. */
export const getCalendarFeed = () => api<CalendarFeedResponse>('/api/me/calendar');

export const calendarFeedQueryOptions = () => queryOptions({ queryKey: ['me', 'calendar'], queryFn: getCalendarFeed });

export const useCalendarFeed = () => useQuery(calendarFeedQueryOptions());
