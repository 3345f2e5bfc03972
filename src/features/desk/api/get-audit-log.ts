import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { apiPaths } from '@/config/paths';
import { api } from '@/lib/api-client';
import { type AuditListParams, queryKeys } from '@/lib/query-keys';
import { type AuditPage, auditPageSchema } from '../lib/audit';

export function getAuditLog(params: AuditListParams, signal?: AbortSignal): Promise<AuditPage> {
  return api.get(apiPaths.audit(), auditPageSchema, {
    query: {
      action: params.action.trim(),
      entityType: params.entityType.trim(),
      actorId: params.actorId ?? undefined,
      from: params.from,
      to: params.to,
      limit: params.limit,
      offset: params.offset,
    },
    signal,
  });
}

export const auditLogQueryOptions = (params: AuditListParams) =>
  queryOptions({
    queryKey: queryKeys.audit.list(params),
    queryFn: ({ signal }) => getAuditLog(params, signal),
    placeholderData: keepPreviousData,
  });

export function useAuditLog(params: AuditListParams) {
  return useQuery(auditLogQueryOptions(params));
}
