import { queryOptions, useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import { apiTokenRecord, issueTokenResponse, tokenListResponse, type IssueTokenRequest } from '../../contracts/tokens';
import { api } from '../../lib/api';
import { queryClient } from '../../lib/queryClient';

export const tokensQuery = queryOptions({
  queryKey: ['tokens'],
  queryFn: async ({ signal }) => (await api.get('/tokens', { schema: tokenListResponse, signal })).tokens,
});

/** The API document as the server builds it (OpenAPI 3.1); read loosely, for display. */
export type JsonSchema = {
  type?: string | string[];
  properties?: Record<string, JsonSchema>;
  required?: string[];
  items?: JsonSchema;
  enum?: unknown[];
  const?: unknown;
  anyOf?: JsonSchema[];
  oneOf?: JsonSchema[];
  allOf?: JsonSchema[];
  description?: string;
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number;
  exclusiveMaximum?: number;
  minLength?: number;
  maxLength?: number;
  pattern?: string;
  format?: string;
  default?: unknown;
  $ref?: string;
};
type MediaMap = Record<string, { schema?: JsonSchema }>;
export type OpenApiOperation = {
  tags?: string[];
  summary?: string;
  description?: string;
  operationId?: string;
  'x-roles'?: string[];
  parameters?: { name: string; in: string; required?: boolean; description?: string; schema?: JsonSchema }[];
  requestBody?: { content: MediaMap };
  responses: Record<string, { description: string; content?: MediaMap }>;
};
export type OpenApiDocument = { info: { title: string; version: string; description?: string }; servers?: { url: string }[]; paths: Record<string, Record<string, OpenApiOperation>> };

export const openApiQuery = queryOptions({
  queryKey: ['openapi'],
  queryFn: ({ signal }) => api.get('/openapi.json', { signal }) as Promise<OpenApiDocument>,
  staleTime: 10 * 60_000,
});

export function useIssueToken() {
  return useMutation({
    mutationFn: (input: IssueTokenRequest) => api.post('/tokens', input, { schema: issueTokenResponse }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tokensQuery.queryKey }),
  });
}

export function useRevokeToken() {
  return useMutation({
    mutationFn: (id: number) => api.post(`/tokens/${id}/revoke`, {}, { schema: z.object({ token: apiTokenRecord }) }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: tokensQuery.queryKey }),
  });
}
