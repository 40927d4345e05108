import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { CampaignOutlookAnswer, OutlookHistoryPoint } from '../../../../shared/api-types-downtime';
import { api } from '../../../lib/api';
import { campaignsQueryOptions } from './get-campaigns';

/**
 * `GET /api/projects/:projectId/campaigns/:campaignId/outlook?alpha=`: the live outlook from now.
 * Kept under the campaigns key, so marking progress or editing the campaign refreshes it.
 */
export const getOutlook = (projectId: string, campaignId: string, alpha: boolean) =>
  api<CampaignOutlookAnswer>(`/api/projects/${projectId}/campaigns/${campaignId}/outlook?${new URLSearchParams({ alpha: String(alpha) })}`);

export const outlookQueryOptions = (projectId: string, campaignId: string, alpha: boolean) =>
  queryOptions({
    queryKey: [...campaignsQueryOptions(projectId).queryKey, campaignId, 'outlook', { alpha }],
    queryFn: () => getOutlook(projectId, campaignId, alpha),
    staleTime: 60_000,
  });

export const useOutlook = (projectId: string, campaignId: string | null, alpha: boolean) =>
  useQuery({ ...outlookQueryOptions(projectId, campaignId ?? '', alpha), enabled: !!campaignId, placeholderData: keepPreviousData });

/** `GET .../outlook/history`: the outlook stored by each planning run, oldest first. */
export const getOutlookHistory = (projectId: string, campaignId: string) =>
  api<OutlookHistoryPoint[]>(`/api/projects/${projectId}/campaigns/${campaignId}/outlook/history`);

export const outlookHistoryQueryOptions = (projectId: string, campaignId: string) =>
  queryOptions({
    queryKey: [...campaignsQueryOptions(projectId).queryKey, campaignId, 'outlook-history'],
    queryFn: () => getOutlookHistory(projectId, campaignId),
    staleTime: 60_000,
  });

export const useOutlookHistory = (projectId: string, campaignId: string | null) =>
  useQuery({ ...outlookHistoryQueryOptions(projectId, campaignId ?? ''), enabled: !!campaignId });
