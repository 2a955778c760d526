import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { parseResponse } from '../../../lib/parse-response';
import { WeeklyReportSchema } from '../../../../shared/api/reports';

export interface ReportParams { week?: string; weeks: number; depot?: string }

export async function getWeeklyReport(p: ReportParams) {
  return parseResponse(WeeklyReportSchema, await api.get('/api/reports/weekly', { query: { ...p } }), 'weekly report');
}

export function useWeeklyReport(p: ReportParams) {
  return useQuery(queryOptions({ queryKey: ['reports', 'weekly', p], queryFn: () => getWeeklyReport(p), placeholderData: keepPreviousData }));
}
