import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { z, type ZodType } from 'zod';
import { isApiError } from './api';

/**
 * Puts the server's per-field messages (ApiError.fields) beside the form's fields. Returns the
 * messages that belong to no field of this form (show those above the form).
 */
export function applyServerErrors<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>, formFields: readonly Path<T>[]): string[] {
  if (!isApiError(error)) return [error instanceof Error ? error.message : 'Something went wrong'];
  const leftover: string[] = [];
  let placed = 0;
  for (const [field, message] of Object.entries(error.fields)) {
    if ((formFields as readonly string[]).includes(field)) {
      setError(field as Path<T>, { type: 'server', message });
      placed++;
    } else leftover.push(field === '_' ? message : `${field}: ${message}`);
  }
  // The overall message explains what the fields alone do not (a rule, a conflict, a failure).
  if (placed === 0 || error.code === 'rule' || error.code === 'conflict') leftover.unshift(error.message);
  return [...new Set(leftover)];
}

/**
 * A zod schema for a form whose values are not yet the request (text in the user's units, a
 * toggle the request does not have): `toRequest` turns the values into the request, and the
 * contract schema judges it. Its issues keep their request paths, so a form that names its
 * fields like the request (`lines.0.requirement.bobbin.length`) shows each message beside its
 * field — the same place the server's `fields` go. `rewrite` may restate a message (for example
 * in the user's units).
 */
export function throughContract<In, S extends ZodType>(
  toRequest: (values: In) => unknown,
  contract: S,
  rewrite?: (issue: { path: PropertyKey[]; message: string; code: string; input?: unknown }) => string | undefined,
  /** For a form not shaped like its request: a request path → the form's path. */
  mapPath?: (path: PropertyKey[], values: In) => PropertyKey[],
) {
  return z
    .custom<In>((v) => typeof v === 'object' && v !== null, 'The form is empty')
    .transform((values, ctx): z.output<S> => {
      const r = contract.safeParse(toRequest(values));
      if (r.success) return r.data;
      for (const issue of r.error.issues) {
        ctx.addIssue({ code: 'custom', path: mapPath ? mapPath(issue.path, values) : issue.path, message: rewrite?.(issue) ?? issue.message });
      }
      return z.NEVER;
    });
}

/** Every dotted path in a form's values, parents included (`lines`, `lines.0`, `lines.0.title` …). */
export function formPaths(values: unknown, prefix = ''): string[] {
  if (values === null || typeof values !== 'object' || values instanceof File || values instanceof Date) return prefix ? [prefix] : [];
  const out: string[] = prefix ? [prefix] : [];
  for (const [k, v] of Object.entries(values as Record<string, unknown>)) out.push(...formPaths(v, prefix ? `${prefix}.${k}` : k));
  return out;
}

/** Text as typed → a number; empty → undefined; a comma counts as the decimal mark; junk → NaN. */
export function parseNumber(s: string | undefined): number | undefined {
  const t = (s ?? '').trim().replace(/\s/g, '').replace(',', '.');
  if (t === '') return undefined;
  return /^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(t) ? Number(t) : NaN;
}
