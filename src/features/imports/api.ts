import { queryOptions, useMutation } from '@tanstack/react-query';
import { importColumnsResponse, importCommitted, importReport, type ImportKind } from '../../contracts/imports';
import { api, apiUpload } from '../../lib/api';
import { queryClient } from '../../lib/queryClient';

/** The columns of an import in the signed-in user's units (they change with the units). */
export const importColumnsQuery = (kind: ImportKind, units: string) =>
  queryOptions({
    queryKey: ['imports', kind, 'columns', units],
    queryFn: async ({ signal }) => (await api.get(`/imports/${kind}/columns`, { schema: importColumnsResponse, signal })).columns,
    staleTime: 10 * 60_000,
  });

export const templateHref = (kind: ImportKind) => `/api/imports/${kind}/template.csv`;

type Send = { kind: ImportKind; file: File; onProgress?: (fraction: number) => void };
const formOf = (file: File) => {
  const f = new FormData();
  f.append('file', file);
  return f;
};
const progress = (on?: (fraction: number) => void) => (on ? (sent: number, total: number) => on(total ? sent / total : 0) : undefined);

/** POST …/dry-run: the row-by-row report; nothing is written. */
export function useDryRun() {
  return useMutation({
    mutationFn: ({ kind, file, onProgress }: Send) => apiUpload(`/imports/${kind}/dry-run`, formOf(file), { schema: importReport, onProgress: progress(onProgress) }),
  });
}

/** POST …/commit: everything in one transaction, or nothing. */
export function useCommitImport() {
  return useMutation({
    mutationFn: ({ kind, file, onProgress }: Send) => apiUpload(`/imports/${kind}/commit`, formOf(file), { schema: importCommitted, onProgress: progress(onProgress) }),
    onSuccess: (_r, { kind }) => queryClient.invalidateQueries({ queryKey: [kind === 'spools' ? 'spools' : kind] }),
  });
}
