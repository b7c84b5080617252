import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
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
