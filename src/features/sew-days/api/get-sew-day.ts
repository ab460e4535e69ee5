import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SewDayDetailDto } from '@shared/schemas/sewdays';
import { api } from '@/lib/api-client';
import { sewDayKeys } from './sew-day-keys';

export const getSewDay = (sewDayId: number) => api.get<SewDayDetailDto>(`/sew-days/${sewDayId}`);
export const sewDayQueryOptions = (sewDayId: number) =>
  queryOptions({ queryKey: sewDayKeys.detail(sewDayId), queryFn: () => getSewDay(sewDayId) });
export const useSewDay = (sewDayId: number) => useQuery(sewDayQueryOptions(sewDayId));

/** The calendar file of a sew day (a plain link: the browser downloads it with the session cookie). */
export const sewDayCalendarUrl = (sewDayId: number) => `/api/sew-days/${sewDayId}/calendar.ics`;
